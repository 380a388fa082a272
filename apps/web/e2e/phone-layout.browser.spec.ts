import { type Page } from 'playwright-core';
import { BASE_URL, openPagePerTest, signInToHome } from './browser';
import { DEMO_PASSWORD, demoUser } from './demo-users';

/*
 * Pages read on a phone (390 × 844 CSS pixels, a common phone) in real Chromium against the seeded demo: what
 * a person came for must be readable there, not squeezed into a sliver beside a column that will not wrap.
 */

let page: Page;

openPagePerTest((p) => {
  page = p;
});

const PHONE = { width: 390, height: 844 };

/** Each header cell's text and rendered width, in pixels, of the table with this accessible name. */
async function columnWidths(name: string): Promise<Record<string, number>> {
  const table = page.getByRole('table', { name });
  await table.locator('tbody tr').first().waitFor();
  return table
    .locator('thead th')
    .evaluateAll((cells) =>
      Object.fromEntries(
        cells.map((c) => [c.textContent?.trim() ?? '', Math.round(c.getBoundingClientRect().width)]),
      ),
    );
}

describe(`Pages at phone width, in Chromium at ${BASE_URL}`, () => {
  it('gives "What happened" in the audit trail room to be read, the time wrapping instead', async () => {
    await page.setViewportSize(PHONE);
    await signInToHome(page, demoUser('supervisor').email, DEMO_PASSWORD);
    await page.goto('/audit');
    const widths = await columnWidths('Audit trail');
    const what = widths['What happened'] ?? 0;
    const when = widths['When'] ?? 0;
    // Both columns are on screen (the phone hides Action and Record), and the summary is the wider one.
    expect(when).toBeGreaterThan(0);
    expect(what).toBeGreaterThan(when);
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(PHONE.width);
  });
});

describe(`Kerf history at phone width, in Chromium at ${BASE_URL}`, () => {
  it('draws the chart at the width it has, so its figures and labels are as large as the page text', async () => {
    await page.setViewportSize(PHONE);
    await signInToHome(page, demoUser('fabricator').email, DEMO_PASSWORD);
    await page.goto('/machine-profiles');
    await page
      .getByRole('link', { name: /CO2 laser/ })
      .first()
      .click();
    const chart = page.getByTestId('kerf-chart');
    await chart.waitFor();
    const box = await chart.boundingBox();
    expect(box).not.toBeNull();
    // A tick figure at 12 px type is about 12 px high on screen (it was about 5 px, drawn 720 wide and shrunk).
    const tickHeights = await chart
      .getByTestId('kerf-tick')
      .evaluateAll((ticks) => ticks.map((t) => t.getBoundingClientRect().height));
    expect(tickHeights.length).toBeGreaterThan(1);
    for (const h of tickHeights) expect(h).toBeGreaterThanOrEqual(10);
    // The approved value's label is whole on screen, inside the drawing.
    const labels = await chart
      .getByTestId('kerf-reference-label')
      .evaluateAll((ls) => ls.map((l) => l.getBoundingClientRect().toJSON() as DOMRect));
    expect(labels.length).toBeGreaterThan(0);
    for (const l of labels) {
      expect(l.left).toBeGreaterThanOrEqual(box!.x - 1);
      expect(l.right).toBeLessThanOrEqual(box!.x + box!.width + 1);
      expect(l.height).toBeGreaterThanOrEqual(10);
    }
  });

  it("keeps a measurement's Adopt button on screen, the table fitting the phone without scrolling sideways", async () => {
    await page.setViewportSize(PHONE);
    await signInToHome(page, demoUser('fabricator').email, DEMO_PASSWORD);
    await page.goto('/machine-profiles');
    await page
      .getByRole('link', { name: /CO2 laser/ })
      .first()
      .click();
    await page.getByTestId('kerf-chart').waitFor();
    const note = `phone layout check ${Date.now().toString(36)}`;
    await page.getByRole('button', { name: 'Record a measured kerf' }).click();
    const dialog = page.getByRole('dialog', { name: 'Record a measured kerf' });
    await dialog.getByLabel('Measured kerf (mm)').fill('0.081');
    await dialog.getByLabel('Notes (optional)').fill(note);
    await dialog.getByRole('button', { name: 'Record' }).click();
    await dialog.waitFor({ state: 'detached' });
    const row = page.getByTestId('kerf-record').filter({ hasText: note });
    const adopt = row.getByRole('button', { name: 'Adopt 0.081 mm' });
    await adopt.waitFor();
    const fits = await page.getByRole('table', { name: 'Measured kerfs' }).evaluate((table) => {
      const box = table.parentElement!;
      return {
        scrollWidth: box.scrollWidth,
        clientWidth: box.clientWidth,
        right: box.getBoundingClientRect().right,
      };
    });
    expect(fits.scrollWidth).toBeLessThanOrEqual(fits.clientWidth + 1);
    const button = await adopt.boundingBox();
    expect(button!.x + button!.width).toBeLessThanOrEqual(fits.right + 1);
  });
});

describe(`The studio's actions, in Chromium at ${BASE_URL}`, () => {
  it.each([
    ['a phone', { width: 390, height: 844 }],
    ['a desktop', { width: 1366, height: 768 }],
  ])('says why a cut job cannot be requested right under its button, on %s', async (_, size) => {
    await page.setViewportSize(size);
    await signInToHome(page, demoUser('hobbyist').email, DEMO_PASSWORD);
    await page.goto('/designs');
    await page.getByRole('table', { name: 'Designs' }).locator('tbody a').first().click();
    await page.getByTestId('design-studio').waitFor();
    const name = page.getByLabel('Name', { exact: true });
    await name.fill(`${await name.inputValue()} (edited)`);
    const reason = page.getByTestId('request-blocked').filter({ hasText: 'cannot be requested yet' });
    await reason.waitFor();
    const button = await page.getByRole('button', { name: 'Request a cut job' }).boundingBox();
    const line = await reason.boundingBox();
    if (!button || !line) throw new Error('the button or its reason is not on screen');
    // Just below the button (on a phone it sat under the title, a screen's height above the stacked actions)…
    const gap = line.y - (button.y + button.height);
    expect(gap).toBeGreaterThanOrEqual(0);
    expect(gap).toBeLessThan(40);
    // …and beside it, not across the page.
    expect(line.x).toBeLessThan(button.x + button.width);
    expect(line.x + line.width).toBeGreaterThan(button.x);
  });
});
