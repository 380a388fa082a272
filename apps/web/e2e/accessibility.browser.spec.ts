import fs from 'node:fs';
import {
  type AuthResponse,
  type MachineProfileSummaryView,
  type Page as ListPage,
  type Role,
} from '@kerfwright/contracts';
import { type Browser, type BrowserContext, type Locator, type Page } from 'playwright-core';
import type { AxeResults, Result, RunOptions } from 'axe-core';
import { BASE_URL, launchBrowser, newContext, signInToHome } from './browser';
import { DEMO_PASSWORD, demoUser } from './demo-users';

/*
 * Accessibility against W3C WCAG 2.1 level AA (https://www.w3.org/TR/WCAG21/), checked by axe-core in real
 * Chromium: every page each demo role reaches from the navigation, at a desktop width and a phone width, and
 * the dialogs of the main flow. axe checks what a machine can (names, labels, contrast, ARIA use, list and
 * table structure, scroll boxes the keyboard cannot reach); a failure names the axe-core rule id and the
 * elements. The keyboard checks below do by key presses what a person without a mouse does, and check that a
 * closed dialog hands the focus back. Each role signs in once; its pages are read in the same browser tab.
 * No rule is switched off and no element left out.
 */

/** The WCAG 2.0 and 2.1 success criteria of levels A and AA, as axe-core tags its rules. */
const WCAG_21_AA_TAGS = ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa'];
/** A common desktop width and a common phone width (CSS pixels). */
const WIDTHS = [
  { width: 1366, height: 768 },
  { width: 390, height: 844 },
] as const;

const AXE_SOURCE = fs.readFileSync(require.resolve('axe-core/axe.min.js'), 'utf8');

interface Finding {
  where: string;
  rule: string;
  impact: string;
  nodes: string[];
  help: string;
}

/** Every violation found, for the summary printed at the end (rule ids per page, role and width). */
const findings: Finding[] = [];
let checks = 0;
/** How long each axe run took (the test is to stay fast). */
const timings: { where: string; ms: number }[] = [];

async function axeOnce(page: Page, options: RunOptions): Promise<AxeResults> {
  if (!(await page.evaluate(() => 'axe' in window))) await page.evaluate(AXE_SOURCE);
  return page.evaluate(
    (o) => (window as unknown as { axe: typeof import('axe-core') }).axe.run(document, o),
    options,
  );
}

/** Runs axe with the WCAG 2.1 A/AA rules on the page as it stands; records and returns what it finds. */
async function audit(page: Page, where: string): Promise<Finding[]> {
  // Wait for what the page is loading (spinners, not a pack's progress) and for MUI's transitions to finish.
  await page
    .locator('[role="progressbar"]:not([aria-valuenow])')
    .first()
    .waitFor({ state: 'detached', timeout: 15_000 })
    .catch(() => undefined);
  await page
    .waitForFunction(
      () =>
        document
          .getAnimations()
          .every((a) => a.playState !== 'running' || a.effect?.getTiming().iterations === Infinity),
      undefined,
      { timeout: 5_000 },
    )
    .catch(() => undefined);
  const started = Date.now();
  const result = await axeOnce(page, {
    runOnly: { type: 'tag', values: WCAG_21_AA_TAGS },
    resultTypes: ['violations'],
  });
  checks += 1;
  timings.push({ where, ms: Date.now() - started });
  const found = result.violations.map((v: Result) => ({
    where,
    rule: v.id,
    impact: v.impact ?? '',
    help: v.help,
    nodes: v.nodes.map(
      (n) => `${n.target.join(' ')} — ${n.failureSummary?.split('\n').slice(1, 2).join('') ?? ''}`,
    ),
  }));
  findings.push(...found);
  return found;
}

function describeFindings(found: Finding[]): string {
  return found
    .map((f) => `${f.where}: ${f.rule} (${f.impact}) ${f.help}\n    ${f.nodes.slice(0, 6).join('\n    ')}`)
    .join('\n');
}

/** Checks one page at both widths, after `ready` says it is on screen. */
async function auditAtBothWidths(
  page: Page,
  where: string,
  ready: () => Promise<unknown>,
): Promise<Finding[]> {
  const found: Finding[] = [];
  for (const w of WIDTHS) {
    await page.setViewportSize({ width: w.width, height: w.height });
    await ready();
    found.push(...(await audit(page, `${where} @${w.width}`)));
  }
  return found;
}

/** Waits (up to 2 s) until the element has the keyboard focus; false if it never gets it. */
async function receivesFocus(target: Locator): Promise<boolean> {
  return target
    .evaluate(
      (el) =>
        new Promise<boolean>((resolve) => {
          const started = performance.now();
          const poll = () => {
            if (el === document.activeElement) resolve(true);
            else if (performance.now() - started > 2000) resolve(false);
            else requestAnimationFrame(poll);
          };
          poll();
        }),
    )
    .catch(() => false);
}

/**
 * Presses Tab until the element has the focus (no press if it has it), as a keyboard user moves through a
 * page; fails if it is not reached within `most` presses.
 */
async function tabTo(page: Page, target: Locator, most = 60): Promise<number> {
  const focused = () => target.evaluate((el) => el === document.activeElement).catch(() => false);
  if (await focused()) return 0;
  for (let presses = 1; presses <= most; presses++) {
    await page.keyboard.press('Tab');
    if (await focused()) return presses;
  }
  const now = await page.evaluate(() => document.activeElement?.outerHTML.slice(0, 160));
  throw new Error(`not reached with ${most} presses of Tab; the focus is on ${now}`);
}

const mainHeading = (page: Page) => page.locator('main h1').first().waitFor();

let browser: Browser;
const contexts: BrowserContext[] = [];

async function signedInPage(role: Role): Promise<Page> {
  const context = await newContext(browser);
  contexts.push(context);
  const page = await context.newPage();
  await page.setViewportSize({ width: WIDTHS[0].width, height: WIDTHS[0].height });
  await signInToHome(page, demoUser(role).email, DEMO_PASSWORD);
  return page;
}

/** Opens each of the role's navigation links in turn (as listed in the Main navigation) and audits it. */
async function auditNavigation(page: Page, role: Role): Promise<Finding[]> {
  const found: Finding[] = [];
  const nav = page.getByRole('navigation', { name: 'Main' });
  const links = await nav
    .getByRole('link')
    .evaluateAll((as) =>
      as.map((a) => ({ name: a.textContent?.trim() ?? '', href: a.getAttribute('href') ?? '' })),
    );
  expect(links.length).toBeGreaterThan(2);
  for (const link of links) {
    // Followed as a person does (the app stays loaded, and axe with it); the desktop's navigation is on screen.
    await page.setViewportSize({ width: WIDTHS[0].width, height: WIDTHS[0].height });
    await nav.getByRole('link', { name: link.name, exact: true }).click();
    await page.waitForURL((url) => url.pathname === link.href);
    found.push(...(await auditAtBothWidths(page, `${role} ${link.name}`, () => mainHeading(page))));
  }
  return found;
}

/** The first job in the jobs list (optionally of one state), opened. */
async function openFirstJob(page: Page, state?: string): Promise<void> {
  await page.goto(state ? `/jobs?state=${state}` : '/jobs');
  const link = page.getByRole('table', { name: 'Jobs' }).getByRole('link').first();
  await link.click();
  await page.getByTestId('job-detail').waitFor();
}

beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  for (const c of contexts) await c.close();
  await browser?.close();
  const byRule = new Map<string, number>();
  for (const f of findings) byRule.set(f.rule, (byRule.get(f.rule) ?? 0) + f.nodes.length);
  const slowest = [...timings].sort((a, b) => b.ms - a.ms).slice(0, 3);
  console.log(
    `axe-core (WCAG 2.1 A/AA): ${checks} checks in ${timings.reduce((t, x) => t + x.ms, 0)} ms ` +
      `(slowest: ${slowest.map((x) => `${x.where} ${x.ms} ms`).join(', ')}), ${findings.length} violations` +
      (findings.length
        ? `\n${[...byRule].map(([r, n]) => `  ${r}: ${n} elements`).join('\n')}\n${describeFindings(findings)}`
        : ''),
  );
});

describe(`WCAG 2.1 AA (axe-core rules) in Chromium at ${BASE_URL}`, () => {
  it('finds no violation on sign-in and registration', async () => {
    const context = await newContext(browser);
    contexts.push(context);
    const page = await context.newPage();
    await page.goto('/sign-in');
    const found = await auditAtBothWidths(page, 'sign-in', () =>
      page.getByRole('button', { name: 'Sign in' }).waitFor(),
    );
    // A refused sign-in: the error and the fields marked invalid.
    await page.getByRole('textbox', { name: /E-mail/ }).fill('nobody@millbrook-makerspace.example');
    await page.getByLabel(/^Password/).fill('not-the-password');
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.getByTestId('form-error').waitFor();
    found.push(...(await audit(page, 'sign-in refused @390')));
    await page.goto('/register');
    found.push(
      ...(await auditAtBothWidths(page, 'register', () =>
        page.getByRole('button', { name: 'Create account' }).first().waitFor(),
      )),
    );
    // Submitted empty: every field says what it needs.
    await page.getByRole('button', { name: 'Create account' }).first().click();
    found.push(...(await audit(page, 'register with errors @390')));
    expect(describeFindings(found)).toBe('');
  });

  it('finds no violation on the hobbyist pages, the studio and the request dialog', async () => {
    const page = await signedInPage('hobbyist');
    const found = await auditNavigation(page, 'hobbyist');
    // The studio with the default model built and drawn in 3D.
    await page.goto('/designs/new');
    found.push(
      ...(await auditAtBothWidths(page, 'hobbyist studio (new)', () =>
        page.locator('[data-testid="preview-3d"] canvas[data-rendered-key]').waitFor(),
      )),
    );
    // Its sheets laid out (drawn pieces, facts), and the assembly order.
    const sheets = page.getByTestId('studio-sheets');
    await sheets.getByRole('button', { name: 'Lay out on sheets' }).click();
    await sheets.getByTestId('sheets-summary').waitFor();
    await page.getByRole('tab', { name: 'Assembly' }).click();
    await page.getByRole('table', { name: 'Assembly order' }).waitFor();
    found.push(...(await audit(page, 'hobbyist studio, sheets and assembly @390')));
    // On a phone the navigation opens over the page.
    await page.getByRole('button', { name: 'Open navigation' }).click();
    await page.getByRole('navigation', { name: 'Main' }).waitFor();
    found.push(...(await audit(page, 'hobbyist navigation drawer @390')));
    await page.keyboard.press('Escape');
    expect(await receivesFocus(page.getByRole('button', { name: 'Open navigation' }))).toBe(true);
    // A saved design, and its request for a cut.
    await page.goto('/designs');
    await page.getByRole('table', { name: 'Designs' }).getByRole('link').first().click();
    await page.getByTestId('design-studio').waitFor();
    found.push(
      // Ready when the model is built: until then the request button is disabled ("The preview is not ready
      // yet"), and once enabled its colours fade in, which axe must not catch half-way.
      ...(await auditAtBothWidths(page, 'hobbyist studio (saved)', () =>
        page.getByRole('button', { name: 'Request a cut job', disabled: false }).waitFor(),
      )),
    );
    for (const w of WIDTHS) {
      await page.setViewportSize({ width: w.width, height: w.height });
      await page.getByRole('button', { name: 'Request a cut job' }).click();
      const dialog = page.getByRole('dialog', { name: 'Request a cut job' });
      await dialog.waitFor();
      found.push(...(await audit(page, `hobbyist request-a-cut dialog @${w.width}`)));
      await dialog.getByLabel('Copies').fill('0');
      await dialog.getByRole('button', { name: 'Request the cut' }).click();
      await dialog.getByText('At least 1 copy').waitFor();
      found.push(...(await audit(page, `hobbyist request-a-cut dialog with an error @${w.width}`)));
      await page.keyboard.press('Escape');
      await dialog.waitFor({ state: 'detached' });
      // Closed, the keyboard is back on the button that opened it (WCAG 2.1, 2.4.3).
      expect(await receivesFocus(page.getByRole('button', { name: 'Request a cut job' }))).toBe(true);
    }
    await openFirstJob(page);
    found.push(
      ...(await auditAtBothWidths(page, 'hobbyist job page', () => page.getByTestId('job-detail').waitFor())),
    );
    expect(describeFindings(found)).toBe('');
  });

  it('finds no violation on the fabricator pages and the prepare dialog', async () => {
    const page = await signedInPage('fabricator');
    const found = await auditNavigation(page, 'fabricator');
    // A profile with versions side by side (the seed gives each profile one version): the approved laser
    // profile with a draft of its next version, started once through the API as the fabricator would.
    const fabricator = await api<AuthResponse>('POST', '/api/auth/login', {
      email: demoUser('fabricator').email,
      password: DEMO_PASSWORD,
    });
    const profiles = await api<ListPage<MachineProfileSummaryView>>(
      'GET',
      '/api/machine-profiles',
      undefined,
      fabricator.accessToken,
    );
    const profile = profiles.items.find((p) => p.currentApproved !== null);
    if (!profile) throw new Error('the demo data has no approved machine profile');
    if (profile.latest.number === 1)
      await api('POST', `/api/machine-profiles/${profile.id}/versions`, {}, fabricator.accessToken);
    await page.goto('/machine-profiles');
    await page.getByRole('table').getByRole('link', { name: profile.name, exact: true }).click();
    await page.getByTestId('version-comparison').waitFor();
    found.push(
      ...(await auditAtBothWidths(page, 'fabricator machine profile', () =>
        page.getByTestId('machine-profile-page').waitFor(),
      )),
    );
    await openFirstJob(page, 'requested');
    found.push(
      ...(await auditAtBothWidths(page, 'fabricator job page', () =>
        page.getByTestId('job-detail').waitFor(),
      )),
    );
    for (const w of WIDTHS) {
      await page.setViewportSize({ width: w.width, height: w.height });
      await page
        .getByTestId('job-actions')
        .getByRole('button', { name: /^Prepare/ })
        .click();
      const dialog = page.getByRole('dialog', { name: 'Prepare the job' });
      await dialog.waitFor();
      // Once the lists and the design are in: a first preparation may start from the design's stock, so the
      // material is emptied to show the form's errors.
      await dialog.getByRole('progressbar').waitFor({ state: 'detached' });
      found.push(...(await audit(page, `fabricator prepare dialog @${w.width}`)));
      await dialog.getByLabel('Material').selectOption({ label: 'Choose…' });
      await dialog.getByRole('button', { name: 'Prepare' }).click();
      await dialog.getByText('Choose a material').waitFor();
      found.push(...(await audit(page, `fabricator prepare dialog with errors @${w.width}`)));
      await page.keyboard.press('Escape');
      await dialog.waitFor({ state: 'detached' });
      expect(
        await receivesFocus(page.getByTestId('job-actions').getByRole('button', { name: /^Prepare/ })),
      ).toBe(true);
    }
    expect(describeFindings(found)).toBe('');
  });

  it('finds no violation on the operator pages and the safety notices at the release desk', async () => {
    const page = await signedInPage('operator');
    const found = await auditNavigation(page, 'operator');
    await openFirstJob(page, 'released');
    found.push(
      ...(await auditAtBothWidths(page, 'operator job page', () => page.getByTestId('job-detail').waitFor())),
    );
    for (const w of WIDTHS) {
      await page.setViewportSize({ width: w.width, height: w.height });
      await page.goto('/release-desk');
      // A table of jobs on a desktop, a card each on a phone (the app bar's "Open navigation" is not one).
      const list = page
        .getByTestId('release-desk')
        .getByRole(w.width < 600 ? 'list' : 'table', { name: 'Jobs at the release desk' });
      await list
        .getByRole('button', { name: /^Open / })
        .first()
        .click();
      const job = page.getByTestId('desk-job');
      await job.waitFor();
      found.push(...(await audit(page, `operator desk job @${w.width}`)));
      await job.getByRole('button', { name: 'Safety notices' }).click();
      const dialog = page.getByRole('dialog', { name: 'Safety before cutting' });
      await dialog.getByTestId('safety-notices').waitFor();
      found.push(...(await audit(page, `operator safety dialog @${w.width}`)));
      await page.keyboard.press('Escape');
      await dialog.waitFor({ state: 'detached' });
      expect(await receivesFocus(job.getByRole('button', { name: 'Safety notices' }))).toBe(true);
    }
    expect(describeFindings(found)).toBe('');
  });

  it('finds no violation on the supervisor pages', async () => {
    const page = await signedInPage('supervisor');
    const found = await auditNavigation(page, 'supervisor');
    await openFirstJob(page, 'prepared');
    found.push(
      ...(await auditAtBothWidths(page, 'supervisor job page', () =>
        page.getByTestId('job-detail').waitFor(),
      )),
    );
    expect(describeFindings(found)).toBe('');
  });
});

/** Calls the API as the web app does (JSON, bearer token); fails on an error answer. */
async function api<T>(method: string, route: string, body: unknown, token?: string): Promise<T> {
  const res = await fetch(`${BASE_URL}${route}`, {
    method,
    headers: { 'content-type': 'application/json', ...(token ? { authorization: `Bearer ${token}` } : {}) },
    body: body === undefined ? undefined : JSON.stringify(body),
  });
  if (!res.ok) throw new Error(`${method} ${route}: ${res.status} ${await res.text()}`);
  return (await res.json()) as T;
}

/** A member who registers and whom the supervisor makes an operator (through the API); their e-mail. */
async function newOperator(): Promise<string> {
  const email = `keyboard-operator-${Date.now().toString(36)}@millbrook-makerspace.example`;
  const member = await api<AuthResponse>('POST', '/api/auth/register', {
    email,
    displayName: 'Keyboard Operator',
    password: DEMO_PASSWORD,
  });
  const supervisor = await api<AuthResponse>('POST', '/api/auth/login', {
    email: demoUser('supervisor').email,
    password: DEMO_PASSWORD,
  });
  await api('PATCH', `/api/users/${member.user.id}`, { role: 'operator' }, supervisor.accessToken);
  return email;
}

describe(`The main flow with the keyboard alone (WCAG 2.1, 2.1.1 and 2.4.3) in Chromium at ${BASE_URL}`, () => {
  let page: Page;

  /** Signs in with Tab, typing and Enter only. */
  async function signInByKeyboard(role: Role, email = demoUser(role).email): Promise<void> {
    const context = await newContext(browser);
    contexts.push(context);
    page = await context.newPage();
    await page.setViewportSize({ width: WIDTHS[0].width, height: WIDTHS[0].height });
    await page.goto('/sign-in');
    // The form opens with the keyboard in E-mail.
    expect(await receivesFocus(page.getByRole('textbox', { name: /E-mail/ }))).toBe(true);
    await page.keyboard.type(email);
    await tabTo(page, page.getByLabel(/^Password/), 3);
    await page.keyboard.type(DEMO_PASSWORD);
    await page.keyboard.press('Enter');
    await page.getByTestId(`home-${role}`).waitFor();
  }

  /** Tabs through the page to the Main navigation's link and follows it. */
  async function navigateByKeyboard(name: string): Promise<void> {
    await tabTo(page, page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name }), 30);
    await page.keyboard.press('Enter');
  }

  it('lets a hobbyist sign in, open a design and request a cut', async () => {
    await signInByKeyboard('hobbyist');
    await navigateByKeyboard('Designs');
    const designs = page.getByRole('table', { name: 'Designs' });
    await designs.getByRole('link').first().waitFor();
    await tabTo(page, designs.getByRole('link').first());
    await page.keyboard.press('Enter');
    await page.getByTestId('design-studio').waitFor();
    const request = page.getByRole('button', { name: 'Request a cut job' });
    await request.waitFor();
    await tabTo(page, request, 80);
    await page.keyboard.press('Enter');
    const dialog = page.getByRole('dialog', { name: 'Request a cut job' });
    await dialog.waitFor();
    // The keyboard starts in Copies (the dialog's first field).
    expect(await receivesFocus(dialog.getByLabel('Copies'))).toBe(true);
    await page.keyboard.type('1');
    await tabTo(page, dialog.getByLabel('Notes for the workshop'), 3);
    await page.keyboard.type('Requested with the keyboard alone.');
    await tabTo(page, dialog.getByRole('button', { name: 'Request the cut' }), 5);
    await page.keyboard.press('Enter');
    await page.waitForURL(/\/jobs\/[0-9a-f-]{36}$/);
    await page.getByTestId('job-state').filter({ hasText: 'requested' }).waitFor();
    // The dialog and its button have gone with the studio: the keyboard is on the new job's heading, as after
    // any other move to a page, not back at the start of the document.
    expect(await receivesFocus(page.getByTestId('job-detail').getByRole('heading', { level: 1 }))).toBe(true);
  });

  it('lets an operator open a released job at the desk, acknowledge its notices and reach the downloads', async () => {
    // A new operator, so that nothing is acknowledged yet however often the test runs on the same data.
    await signInByKeyboard('operator', await newOperator());
    await navigateByKeyboard('Release desk');
    // Followed from the navigation, the keyboard goes on from the page's heading (the desk's own: the page left
    // behind may still show its heading for a moment).
    const desk = page.getByTestId('release-desk');
    expect(await receivesFocus(desk.getByRole('heading', { level: 1 }))).toBe(true);
    await desk.getByRole('table', { name: 'Jobs at the release desk' }).waitFor();
    // A released job whose cut pack is ready (the seed releases some; their packs are built at start).
    const row = desk
      .getByRole('row')
      .filter({ hasText: 'released' })
      .filter({ hasText: /ready|files/i })
      .first();
    await row.waitFor({ timeout: 30_000 });
    await tabTo(page, row.getByRole('button', { name: /^Open / }), 40);
    await page.keyboard.press('Enter');
    const job = page.getByTestId('desk-job');
    await job.waitFor();
    const notices = job.getByRole('button', { name: 'Safety notices' });
    await tabTo(page, notices, 40);
    await page.keyboard.press('Enter');
    const dialog = page.getByRole('dialog', { name: 'Safety before cutting' });
    await dialog.getByTestId('safety-notices').waitFor();
    await tabTo(page, dialog.getByLabel(/I have read these notices/), 40);
    await page.keyboard.press('Space');
    expect(await dialog.getByLabel(/I have read these notices/).isChecked()).toBe(true);
    await tabTo(page, dialog.getByRole('button', { name: 'Acknowledge' }), 5);
    await page.keyboard.press('Enter');
    await dialog.getByTestId('safety-acknowledged').waitFor();
    // The Acknowledge button goes: the keyboard is on Close, not lost.
    expect(await receivesFocus(dialog.getByRole('button', { name: 'Close' }))).toBe(true);
    await page.keyboard.press('Enter');
    await dialog.waitFor({ state: 'detached' });
    expect(await receivesFocus(notices)).toBe(true);
    // Acknowledged: the files are offered, and the first downloads from the keyboard.
    const download = job
      .getByRole('table', { name: 'Cut pack files' })
      .getByRole('button', { name: /^Download / })
      .first();
    await download.waitFor();
    await tabTo(page, download, 40);
    const [file] = await Promise.all([page.waitForEvent('download'), page.keyboard.press('Enter')]);
    expect(file.suggestedFilename()).not.toBe('');
  });
});
