import path from 'node:path';
import { type Page } from 'playwright-core';
import { BASE_URL, SCREENSHOT_DIR, signInToHome, openPagePerTest } from './browser';
import { DEMO_PASSWORD, demoUser } from './demo-users';

let page: Page;

openPagePerTest((p) => {
  page = p;
});

describe(`Safety page in Chromium at ${BASE_URL}`, () => {
  it('shows a hobbyist the notices, the hazard table with PVC refused for lasers, and the local rules', async () => {
    await signInToHome(page, demoUser('hobbyist').email, DEMO_PASSWORD);
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Safety' }).click();
    await page.getByTestId('safety-page').waitFor();
    // Notices are standing content, notes rather than alerts (WAI-ARIA 1.2: alert is for urgent messages).
    await page.getByTestId('notices').getByRole('note').first().waitFor();
    expect(await page.getByTestId('notices').getByRole('alert').count()).toBe(0);
    // Chlorinated plastics must never go on a laser (DESIGN.md safety rules; common practice).
    await page.getByLabel('On a laser').selectOption('no');
    await page.getByTestId('hazard-pvc').waitFor();
    expect(await page.getByTestId('hazard-pvc').textContent()).toMatch(/never/);
    expect(await page.getByRole('button', { name: 'Edit the local rules' }).count()).toBe(0);
    await page.screenshot({ path: path.join(SCREENSHOT_DIR, 'safety.png'), fullPage: true });
  });

  it('lets the supervisor save the local rules as a new version', async () => {
    await signInToHome(page, demoUser('supervisor').email, DEMO_PASSWORD);
    await page.goto('/safety');
    const rules = page.getByTestId('local-rules');
    await rules.waitFor();
    const version = page.getByText(/^Version \d+/);
    const before = Number((await version.textContent())?.match(/Version (\d+)/)?.[1] ?? 0);
    await page.getByRole('button', { name: 'Edit the local rules' }).click();
    const body = page.getByLabel('Local rules');
    const text = await body.inputValue();
    await body.fill(`${text.trim()}\n\nChecked by the browser test.`);
    await page.getByRole('button', { name: 'Save as a new version' }).click();
    await page.getByText(`Version ${before + 1}`, { exact: false }).waitFor();
    expect(await rules.textContent()).toContain('Checked by the browser test.');
  });
});
