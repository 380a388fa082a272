import fs from 'node:fs';
import path from 'node:path';
import { type Browser, type BrowserContext, chromium, type Page } from 'playwright-core';

/** Where the app under test runs (the API serves the built web app at / and the API under /api). */
export const BASE_URL = (process.env.KW_BASE_URL ?? 'http://127.0.0.1:3000').replace(/\/$/, '');

/** Screenshots go to <repo>/artifacts/screenshots (git-ignored), found from this file's place. */
export const SCREENSHOT_DIR = path.resolve(__dirname, '..', '..', '..', 'artifacts', 'screenshots');

export function launchBrowser(): Promise<Browser> {
  return chromium.launch({
    executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
    args: [
      '--headless',
      '--no-sandbox',
      // No GPU here: WebGL (the studio's 3D preview) renders in software through SwiftShader.
      '--use-angle=swiftshader',
      '--enable-unsafe-swiftshader',
      '--ignore-gpu-blocklist',
      '--disable-quic',
      '--no-first-run',
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-sync',
    ],
  });
}

export async function newContext(browser: Browser): Promise<BrowserContext> {
  const context = await browser.newContext({ viewport: { width: 1280, height: 800 }, baseURL: BASE_URL });
  context.setDefaultTimeout(20_000);
  return context;
}

/** Fills in the sign-in form and submits it, as a person would. */
export async function signIn(page: Page, email: string, password: string): Promise<void> {
  await page.goto('/sign-in');
  await page.getByRole('textbox', { name: /E-mail/ }).fill(email);
  await page.getByLabel(/^Password/).fill(password);
  await page.getByRole('button', { name: 'Sign in' }).click();
}

/**
 * Signs in and waits for a home page. If the form shows an error instead (for example the demo users were
 * not seeded), fails at once with the message on screen rather than after a long timeout.
 */
export async function signInToHome(page: Page, email: string, password: string): Promise<void> {
  await signIn(page, email, password);
  const outcome = page.locator('[data-testid^="home-"], [data-testid="form-error"]').first();
  await outcome.waitFor({ state: 'visible' });
  if ((await outcome.getAttribute('data-testid')) === 'form-error') {
    throw new Error(`sign-in as ${email} failed: "${(await outcome.textContent())?.trim()}"`);
  }
}

/** True when a Fira Sans face has really loaded and the element's computed font starts with it. */
export async function firaSansApplied(
  page: Page,
  selector: string,
): Promise<{ loaded: boolean; family: string }> {
  return page.evaluate(async (sel) => {
    await document.fonts.ready;
    const loaded = [...document.fonts].some(
      (f) => f.family.replace(/["']/g, '') === 'Fira Sans' && f.status === 'loaded',
    );
    const el = document.querySelector(sel) ?? document.body;
    return { loaded, family: getComputedStyle(el).fontFamily };
  }, selector);
}

/**
 * Reads the WebGL canvas's pixels (the preview keeps its drawing buffer) and counts distinct colours on a
 * sparse grid: a blank or single-colour canvas gives 1, a rendered model many.
 */
export async function canvasColourCount(
  page: Page,
  selector: string,
): Promise<{ width: number; height: number; colours: number }> {
  return page.evaluate((sel) => {
    const canvas = document.querySelector(sel);
    if (!(canvas instanceof HTMLCanvasElement)) throw new Error(`no canvas at ${sel}`);
    const gl = canvas.getContext('webgl2') ?? canvas.getContext('webgl');
    if (!gl) throw new Error('the canvas has no WebGL context');
    const width = gl.drawingBufferWidth;
    const height = gl.drawingBufferHeight;
    const pixels = new Uint8Array(width * height * 4);
    gl.readPixels(0, 0, width, height, gl.RGBA, gl.UNSIGNED_BYTE, pixels);
    const seen = new Set<string>();
    for (let i = 0; i < pixels.length; i += 4 * 31)
      seen.add(`${pixels[i]},${pixels[i + 1]},${pixels[i + 2]}`);
    return { width, height, colours: seen.size };
  }, selector);
}

/** A test file's browser session: the page of the running test, and a way to start over as someone else. */
export interface PageSession {
  /** Closes the test's context and opens a fresh one (no cookies, no storage); hands its new page on. */
  restart(): Promise<void>;
}

/**
 * Registers the jest hooks every browser test file needs: one Chromium per file (and the screenshot folder),
 * a fresh context and page per test, all closed afterwards. `onPage` receives each new page.
 */
export function openPagePerTest(onPage: (page: Page) => void): PageSession {
  let browser: Browser | undefined;
  let context: BrowserContext | undefined;
  const open = async () => {
    context = await newContext(browser!);
    onPage(await context.newPage());
  };

  beforeAll(async () => {
    browser = await launchBrowser();
    fs.mkdirSync(SCREENSHOT_DIR, { recursive: true });
  });
  afterAll(async () => {
    await browser?.close();
  });
  beforeEach(open);
  afterEach(async () => {
    await context?.close();
  });

  return {
    restart: async () => {
      await context?.close();
      await open();
    },
  };
}
