import fs from 'node:fs';
import path from 'node:path';
import { type Browser, type BrowserContext, type Page } from 'playwright-core';
import {
  BASE_URL,
  canvasColourCount,
  launchBrowser,
  newContext,
  SCREENSHOT_DIR,
  signInToHome,
} from './browser';
import { DEMO_PASSWORD, demoUser } from './demo-users';

/*
 * One job's way through the workshop, each step by the role that takes it, in real Chromium against the real
 * API and database: the hobbyist designs and requests, the fabricator prepares, the supervisor approves, the
 * fabricator releases, the operator acknowledges the safety notices and records the cut. The steps share the
 * job, so they run in order.
 */

let browser: Browser;
let context: BrowserContext;
let page: Page;
let jobPath = '';
const designName = `Octahedron hexagons ${Date.now().toString(36)}`;

beforeAll(async () => {
  browser = await launchBrowser();
  fs.mkdirSync(SCREENSHOT_DIR, { recursive: true });
});

afterAll(async () => {
  await browser?.close();
});

beforeEach(async () => {
  context = await newContext(browser);
  page = await context.newPage();
});

afterEach(async () => {
  await context?.close();
});

const shot = (name: string) =>
  page.screenshot({ path: path.join(SCREENSHOT_DIR, `${name}.png`), fullPage: true });

async function openJob(role: 'fabricator' | 'supervisor' | 'operator') {
  await signInToHome(page, demoUser(role).email, DEMO_PASSWORD);
  await page.goto(jobPath);
  await page.getByTestId('job-detail').waitFor();
}

async function takeAction(label: string, expectedState: string) {
  await page.getByTestId('job-actions').getByRole('button', { name: label }).click();
  await page.getByRole('dialog').getByRole('button', { name: 'Confirm' }).click();
  await page.getByTestId('job-detail').getByTestId('job-state').filter({ hasText: expectedState }).waitFor();
}

describe(`A job from design to cut, in Chromium at ${BASE_URL}`, () => {
  it('lets a hobbyist design a model, see it in 3D and request a cut job', async () => {
    await signInToHome(page, demoUser('hobbyist').email, DEMO_PASSWORD);
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Designs' }).click();
    await page.getByRole('table', { name: 'Designs' }).waitFor();
    await page.getByRole('link', { name: 'New design' }).click();
    await page.getByTestId('design-studio').waitFor();

    // The default spec (octahedron planes carrying hexagons) is built in the browser and drawn with WebGL.
    const canvas = page.locator('[data-testid="preview-3d"] canvas[data-rendered-key]');
    await canvas.waitFor();
    const pixels = await canvasColourCount(page, '[data-testid="preview-3d"] canvas');
    expect(pixels.width).toBeGreaterThan(100);
    expect(pixels.colours).toBeGreaterThan(5);
    expect(await page.getByTestId('model-facts').textContent()).toMatch(/Pieces8/);

    // A field error blocks the preview's input, not the page: 2 sides is no polygon.
    await page.getByLabel('Sides (n)').fill('2');
    await page.getByText('At least 3 sides').waitFor();
    await page.getByLabel('Sides (n)').fill('6');
    await page
      .getByTestId('report-valid')
      .or(page.getByText(/^Report \(0 errors/))
      .first()
      .waitFor();

    await page.getByLabel('Name').fill(designName);
    await page.getByRole('button', { name: 'Save design' }).click();
    await page.waitForURL(/\/designs\/[0-9a-f-]{36}$/);
    await shot('design-studio');

    await page.getByRole('button', { name: 'Request a cut job' }).click();
    const dialog = page.getByRole('dialog', { name: 'Request a cut job' });
    await dialog.getByLabel('Copies').fill('0');
    await dialog.getByRole('button', { name: 'Request the cut' }).click();
    await dialog.getByText('At least 1 copy').waitFor();
    await dialog.getByLabel('Copies').fill('1');
    await dialog.getByLabel('Notes for the workshop').fill('Two colours if there are any.');
    await dialog.getByRole('button', { name: 'Request the cut' }).click();
    await page.waitForURL(/\/jobs\/[0-9a-f-]{36}$/);
    jobPath = new URL(page.url()).pathname;
    await page.getByTestId('job-state').filter({ hasText: 'requested' }).waitFor();
    await shot('job-requested');
  });

  it('measures how soon the 3D preview follows an edit of a 30-piece design', async () => {
    await signInToHome(page, demoUser('hobbyist').email, DEMO_PASSWORD);
    await page.goto('/designs/new');
    await page.locator('[data-testid="preview-3d"] canvas[data-rendered-key]').waitFor();
    await page.getByLabel('Solid').selectOption('rhombic-triacontahedron');
    await page.getByLabel('Sides (n)').fill('5');
    await page.getByLabel('Step (k)').fill('2');
    await page.getByLabel('Size').fill('0.5');
    await page.getByTestId('model-facts').getByText('30', { exact: true }).waitFor();
    await page.locator('canvas[data-rendered-key*="rhombic-triacontahedron"]').waitFor();

    const timings: number[] = [];
    for (const size of ['0.51', '0.52', '0.53', '0.54', '0.55']) {
      timings.push(
        await page.evaluate(async (value) => {
          const input = document.querySelector<HTMLInputElement>('input[name="size"]');
          const canvas = document.querySelector<HTMLCanvasElement>('[data-testid="preview-3d"] canvas');
          if (!input || !canvas) throw new Error('studio not on screen');
          const before = canvas.getAttribute('data-rendered-key');
          const setter = Object.getOwnPropertyDescriptor(HTMLInputElement.prototype, 'value')?.set;
          const started = performance.now();
          setter?.call(input, value);
          input.dispatchEvent(new Event('input', { bubbles: true }));
          return new Promise<number>((resolve, reject) => {
            const timeout = setTimeout(() => reject(new Error('the preview did not update')), 15000);
            const poll = () => {
              if (canvas.getAttribute('data-rendered-key') !== before) {
                clearTimeout(timeout);
                resolve(performance.now() - started);
              } else requestAnimationFrame(poll);
            };
            requestAnimationFrame(poll);
          });
        }, size),
      );
    }
    const sorted = [...timings].sort((a, b) => a - b);
    const median = sorted[Math.floor(sorted.length / 2)] ?? NaN;
    // Reported, not asserted tightly (the target is 100 ms; these machines render WebGL in software).
    console.log(
      `preview update after an edit, 30-piece design: median ${median.toFixed(0)} ms (runs: ${timings.map((t) => t.toFixed(0)).join(', ')} ms)`,
    );
    expect(median).toBeLessThan(5000);
    await shot('design-studio-30-pieces');
  });

  it('lets the fabricator find the requested job and prepare it', async () => {
    await signInToHome(page, demoUser('fabricator').email, DEMO_PASSWORD);
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Jobs' }).click();
    await page.getByRole('group', { name: 'State' }).getByRole('button', { name: 'requested' }).click();
    await page.getByRole('link', { name: designName }).waitFor();
    await shot('jobs-board');
    await page.getByRole('link', { name: designName }).click();
    await page.getByTestId('job-detail').waitFor();
    expect(new URL(page.url()).pathname).toBe(jobPath);

    await page
      .getByTestId('job-actions')
      .getByRole('button', { name: /^Prepare/ })
      .click();
    const dialog = page.getByRole('dialog', { name: 'Prepare the job' });
    // Nothing chosen: the form says what is missing.
    await dialog.getByRole('button', { name: 'Prepare' }).click();
    await dialog.getByText('Choose a material').waitFor();
    await dialog.getByLabel('Material').selectOption({ label: 'Cast acrylic 3 mm' });
    await dialog.getByLabel('Machine profile (approved version)').selectOption({ index: 1 });
    await dialog.getByLabel('clear').check();
    await dialog.getByLabel('cobalt blue').check();
    await dialog.getByRole('button', { name: 'Prepare' }).click();
    await page.getByTestId('job-state').filter({ hasText: 'prepared' }).waitFor();
    await page.getByTestId('job-layout').getByText('Utilisation').waitFor();
    await shot('job-prepared');
  });

  it('lets the supervisor approve the prepared job', async () => {
    await openJob('supervisor');
    await takeAction('Approve the job', 'approved');
    await shot('job-approved');
  });

  it('lets the fabricator release the approved job and prepare its cut pack', async () => {
    await openJob('fabricator');
    await takeAction('Release to the machines', 'released');
    const pack = page.getByTestId('cut-pack');
    await pack.getByRole('button', { name: 'Prepare the cut pack' }).click();
    // The export queue works in the background; the panel follows it until the files are ready.
    await pack.getByText(/The cut pack is ready \(\d+ files\)/).waitFor({ timeout: 45_000 });
  });

  it('lets the operator acknowledge the safety notices and record the cut', async () => {
    await openJob('operator');
    await page.getByRole('button', { name: 'Safety notices' }).click();
    const safety = page.getByRole('dialog', { name: 'Safety before cutting' });
    await safety.getByTestId('safety-notices').waitFor();
    const acknowledge = safety.getByRole('button', { name: 'Acknowledge' });
    expect(await acknowledge.isDisabled()).toBe(true);
    await safety.getByLabel(/I have read these notices/).check();
    await shot('job-safety');
    await acknowledge.click();
    await safety.getByTestId('safety-acknowledged').waitFor();
    await safety.getByRole('button', { name: 'Close' }).click();

    // Acknowledged: the cut pack's files are offered, with their sizes, and download.
    const files = page.getByRole('table', { name: 'Cut pack files' });
    await files.waitFor();
    await shot('release-desk');
    const first = files.getByRole('button', { name: /^Download / }).first();
    const [download] = await Promise.all([page.waitForEvent('download'), first.click()]);
    const saved = await download.path();
    expect(fs.statSync(saved).size).toBeGreaterThan(0);

    await page.getByTestId('job-actions').getByRole('button', { name: 'Record the cut' }).click();
    const cut = page.getByRole('dialog', { name: 'Record the cut' });
    await cut.getByRole('button', { name: 'Record the cut' }).click();
    await cut.getByText('Enter the machine time in minutes').waitFor();
    await cut.getByLabel('Machine time (minutes)').fill('18.5');
    await cut.getByLabel('Measured kerf (mm, optional)').fill('0.16');
    await cut.getByRole('button', { name: 'Record the cut' }).click();
    await page.getByTestId('job-state').filter({ hasText: /^cut$/ }).waitFor();
    await page.getByText('18.5 min').waitFor();
    await shot('job-cut');
  });
});
