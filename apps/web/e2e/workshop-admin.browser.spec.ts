import path from 'node:path';
import { type ConsoleMessage, type Locator, type Page } from 'playwright-core';
import { BASE_URL, SCREENSHOT_DIR, signInToHome, openPagePerTest } from './browser';
import { DEMO_PASSWORD, demoUser } from './demo-users';

/*
 * The workshop's own records, each step by the role that owns it, in real Chromium against the real API and
 * database: a fabricator adds a material and a machine profile for it, a supervisor approves the profile's
 * first version, the fabricator drafts version 2 (with a measured kerf adopted into it) and submits it, the
 * supervisor reads the changes and sends it back with a reason, the fabricator submits it again, the
 * supervisor approves it, and the audit trail shows all of it. Names carry a run stamp, so the test needs
 * nothing but a seeded database and can run again on the same one. The steps share state and run in order.
 */

let page: Page;
const stamp = Date.now().toString(36);
const materialName = `Poplar plywood 4 mm ${stamp}`;
const profileName = `Bay 3 CO2 laser ${stamp}`;
const sendBackReason = `Measure the kerf on two more coupons first (${stamp})`;
const outOfUseReason = `Lens cracked; do not run until it is replaced (${stamp})`;
let profilePath = '';

const session = openPagePerTest((p) => {
  page = p;
});

async function shot(name: string) {
  // From the top, so the fixed app bar sits where it belongs in the full-page picture.
  await page.evaluate(() => window.scrollTo(0, 0));
  await page.screenshot({ path: path.join(SCREENSHOT_DIR, `${name}.png`), fullPage: true });
}

const nav = (label: string) =>
  page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: label });

async function openProfile(role: 'fabricator' | 'supervisor') {
  await signInToHome(page, demoUser(role).email, DEMO_PASSWORD);
  await page.goto(profilePath);
  await page.getByTestId('machine-profile-page').waitFor();
}

async function submitLatestVersion(number: number) {
  await page.getByRole('button', { name: `Submit version ${number} for approval` }).click();
  const dialog = page.getByRole('dialog', { name: `Submit version ${number} for approval?` });
  await dialog.getByRole('button', { name: 'Submit' }).click();
  await page.getByTestId('profile-status').filter({ hasText: 'waiting for approval' }).waitFor();
}

async function waitingCard(): Promise<Locator> {
  await signInToHome(page, demoUser('supervisor').email, DEMO_PASSWORD);
  await nav('Approvals').click();
  await page.getByTestId('approvals-page').waitFor();
  const card = page.getByTestId(`waiting-version-${profileName}`);
  await card.waitFor();
  return card;
}

/**
 * Collects what Chromium says about number inputs given text it cannot parse (a form that writes NaN into an
 * empty field shows the text "NaN" and gets "The specified value "NaN" cannot be parsed").
 */
function numberInputWarnings(): string[] {
  const seen: string[] = [];
  page.on('console', (m: ConsoleMessage) => {
    if (/cannot be parsed/i.test(m.text())) seen.push(m.text());
  });
  return seen;
}

describe(`Materials, machine profiles, approvals and the audit trail, in Chromium at ${BASE_URL}`, () => {
  it('keeps the supervisor pages from a fabricator and the workshop pages from an operator', async () => {
    await signInToHome(page, demoUser('fabricator').email, DEMO_PASSWORD);
    await nav('Materials').waitFor();
    expect(await nav('Approvals').count()).toBe(0);
    await page.goto('/approvals');
    await page.getByText('This page is not part of your role').waitFor();

    await session.restart();
    await signInToHome(page, demoUser('operator').email, DEMO_PASSWORD);
    expect(await nav('Materials').count()).toBe(0);
    await page.goto('/materials');
    await page.getByText('This page is not part of your role').waitFor();
  });

  it('lets a fabricator add a material, with the laser rules checked in the form', async () => {
    await signInToHome(page, demoUser('fabricator').email, DEMO_PASSWORD);
    await nav('Materials').click();
    await page.getByRole('table', { name: 'Materials' }).waitFor();
    await page.getByTestId('material-Cast acrylic 3 mm').waitFor();
    await shot('materials');

    const warnings = numberInputWarnings();
    await page.getByRole('button', { name: 'Add a material' }).click();
    const dialog = page.getByRole('dialog', { name: 'Add a material' });
    // Empty number fields are empty, not "NaN", also in a sheet-size row added later.
    expect(await dialog.getByLabel('Nominal thickness (mm)').inputValue()).toBe('');
    await dialog.getByRole('button', { name: 'Add a sheet size' }).click();
    expect(await dialog.getByLabel('Width (mm)').nth(1).inputValue()).toBe('');
    await dialog.getByRole('button', { name: 'Remove sheet size 2' }).click();
    await dialog.getByRole('button', { name: 'Add the material' }).click();
    await dialog.getByText('Give the material a name').waitFor();
    await dialog.getByText('Enter the nominal thickness in mm').waitFor();

    // A family the hazard table refuses cannot be laser-allowed: the form says why and unticks it.
    await dialog.getByLabel('Family').selectOption('pvc');
    await dialog.getByTestId('family-refused').waitFor();
    // Unticked by the form once the refusal shows (an effect after that render): waited for, not read at once.
    await dialog.getByLabel('May be cut on a laser').and(page.locator('input:not(:checked)')).waitFor();
    expect(await dialog.getByLabel('May be cut on a laser').isChecked()).toBe(false);
    await shot('material-form-prohibited');

    await dialog.getByLabel('Family').selectOption('plywood');
    await dialog.getByLabel('Name').fill(materialName);
    await dialog.getByLabel('Nominal thickness (mm)').fill('4');
    await dialog.getByLabel('Measured thickness (mm, optional)').fill('3.9');
    await dialog.getByLabel('Colours offered').fill('natural, whitewashed');
    await dialog.getByLabel('Width (mm)').fill('600');
    await dialog.getByLabel('Height (mm)').fill('400');
    await dialog.getByLabel('Price per sheet').fill('7.40');
    // Kept off the laser without a reason: refused until the note says why.
    await dialog.getByLabel('May be cut on a laser').uncheck();
    await dialog.getByRole('button', { name: 'Add the material' }).click();
    await dialog.getByText('Say why the material is kept off the laser').waitFor();
    await dialog.getByLabel('May be cut on a laser').check();
    await dialog.getByLabel('Hazard note').fill('Glue fumes and soot: extraction on.');
    await shot('material-form');
    await dialog.getByRole('button', { name: 'Add the material' }).click();
    await dialog.waitFor({ state: 'detached' });
    expect(warnings).toEqual([]);

    await page.getByRole('searchbox', { name: 'Search name or notes' }).fill(stamp);
    const row = page.getByTestId(`material-${materialName}`);
    await row.waitFor();
    expect(await row.textContent()).toContain('4 mm (measured 3.9 mm)');
    expect(await row.textContent()).toContain('600 × 400 mm · 7.40 EUR');

    // Prohibited materials are listed in red with their reason.
    await page.getByRole('searchbox', { name: 'Search name or notes' }).fill('');
    await page.getByTestId('material-Cast acrylic 3 mm').waitFor();
    await page.getByRole('combobox', { name: 'Laser' }).click();
    await page.getByRole('option', { name: 'Kept off the laser' }).click();
    await page.getByTestId('laser-refusal-reason').first().waitFor();
    await shot('materials-kept-off-laser');
  });

  it('lets the fabricator create a machine profile for it and submit version 1', async () => {
    await signInToHome(page, demoUser('fabricator').email, DEMO_PASSWORD);
    await nav('Machine profiles').click();
    await page.getByRole('table', { name: 'Machine profiles' }).waitFor();
    await page.getByTestId('profile-CO2 laser, 60 W (laser room)').waitFor();
    await shot('machine-profiles');

    const warnings = numberInputWarnings();
    await page.getByRole('button', { name: 'New machine profile' }).click();
    const dialog = page.getByRole('dialog', { name: 'New machine profile' });
    expect(await dialog.getByLabel('Bed width (mm)').inputValue()).toBe('');
    expect(warnings).toEqual([]);
    await dialog.getByRole('button', { name: 'Create as draft' }).click();
    await dialog.getByText('Give the profile a name').waitFor();
    await dialog.getByText('Enter the kerf').waitFor();

    await dialog.getByLabel('Profile name').fill(profileName);
    await dialog.getByLabel('Kind of machine').selectOption('co2-laser');
    await dialog.getByLabel('Bed width (mm)').fill('600');
    await dialog.getByLabel('Bed height (mm)').fill('400');
    await dialog.getByLabel('Rapid speed (mm/s)').fill('300');
    await dialog.getByLabel('Hourly rate').fill('20');
    await dialog.getByLabel('Material', { exact: true }).selectOption({ label: materialName });
    await dialog.getByLabel('Kerf (mm)').fill('3');
    await dialog.getByLabel('Cut speed (mm/s)').fill('10');
    await dialog.getByLabel('Mark speed (mm/s)').fill('200');
    await dialog.getByLabel('Power (%)').fill('60');
    await dialog.getByLabel('Pierce time (s)').fill('0.2');
    await dialog.getByRole('button', { name: 'Create as draft' }).click();
    // A 3 mm kerf is outside what a laser's beam removes (the API's range, 0.01–2 mm).
    await dialog.getByText('Between 0.01 and 2 mm').waitFor();
    await dialog.getByLabel('Kerf (mm)').fill('0.2');
    await shot('machine-profile-form');
    await dialog.getByRole('button', { name: 'Create as draft' }).click();

    await page.waitForURL(/\/machine-profiles\/[0-9a-f-]{36}$/);
    profilePath = new URL(page.url()).pathname;
    await page.getByTestId('profile-status').filter({ hasText: 'No version is approved yet' }).waitFor();
    await submitLatestVersion(1);
  });

  it('lets a supervisor approve version 1 from Approvals', async () => {
    const card = await waitingCard();
    await card.getByText('No version is approved yet: every value is new.').waitFor();
    await card.getByRole('button', { name: 'Approve version 1' }).click();
    // Asked once more, as every approval is.
    await page.getByRole('dialog').getByRole('button', { name: 'Approve version 1' }).click();
    await card.waitFor({ state: 'detached' });
  });

  it('lets the fabricator draft version 2, adopt a measured kerf into it and submit it', async () => {
    await openProfile('fabricator');
    await page.getByTestId('profile-status').filter({ hasText: 'Jobs use version 1 (approved).' }).waitFor();

    await page.getByRole('button', { name: 'Draft a new version' }).click();
    const dialog = page.getByRole('dialog', { name: 'Draft a new version' });
    await dialog.getByLabel('Cut speed (mm/s)').fill('12');
    await dialog.getByLabel('Rapid speed (mm/s)').fill('350');
    await dialog.getByRole('button', { name: 'Save the draft' }).click();
    await dialog.waitFor({ state: 'detached' });
    await page.getByTestId('profile-status').filter({ hasText: 'Newest: version 2, draft.' }).waitFor();

    // A kerf measured on a test coupon goes into the open draft.
    const history = page.getByTestId('kerf-history');
    await history.getByRole('button', { name: 'Record a measured kerf' }).click();
    const record = page.getByRole('dialog', { name: 'Record a measured kerf' });
    await record.getByRole('button', { name: 'Record' }).click();
    await record.getByText('Enter the measured kerf').waitFor();
    await record.getByLabel('Measured kerf (mm)').fill('0.17');
    await record.getByLabel('Notes (optional)').fill('Coupon of 10 slots, callipers');
    await record.getByRole('button', { name: 'Record' }).click();
    await record.waitFor({ state: 'detached' });
    await history.getByTestId('kerf-point').first().waitFor();
    await history.getByRole('button', { name: 'Record a measured kerf' }).click();
    await record.getByLabel('Measured kerf (mm)').fill('0.16');
    await record.getByRole('button', { name: 'Record' }).click();
    await record.waitFor({ state: 'detached' });
    await history.getByTestId('kerf-point').nth(1).waitFor();
    await history.getByRole('button', { name: 'Adopt 0.17 mm' }).click();
    await history.getByText('Adopted into version 2').waitFor();

    const comparison = page.getByTestId('version-comparison');
    const changed = comparison.locator('td[data-changed="true"]');
    await changed.filter({ hasText: '0.17 mm' }).waitFor();
    await changed.filter({ hasText: '12 mm/s' }).waitFor();
    expect(await page.getByTestId('kerf-reference').count()).toBe(2);
    await shot('machine-profile');

    await submitLatestVersion(2);
  });

  it('lets the supervisor read the changes of version 2 and send it back with a reason', async () => {
    const card = await waitingCard();
    const changes = card.getByTestId('version-change');
    // Only the changed values, old → new.
    expect(await changes.count()).toBe(3);
    await changes
      .filter({ hasText: 'Kerf' })
      .filter({ hasText: '0.20 mm' })
      .filter({ hasText: '0.17 mm' })
      .waitFor();
    await changes.filter({ hasText: 'Cut speed' }).filter({ hasText: '12 mm/s' }).waitFor();
    await changes.filter({ hasText: 'Rapid speed' }).filter({ hasText: '350 mm/s' }).waitFor();
    await shot('approvals');

    await card.getByRole('button', { name: 'Send back' }).click();
    const dialog = page.getByRole('dialog', { name: /^Send back version 2/ });
    await dialog.getByRole('button', { name: 'Send back with this reason' }).click();
    await dialog.getByText('Say what must change (at least 3 characters)').waitFor();
    await dialog.getByLabel('Reason').fill(sendBackReason);
    await shot('approvals-send-back');
    await dialog.getByRole('button', { name: 'Send back with this reason' }).click();
    await card.waitFor({ state: 'detached' });
  });

  it('shows the fabricator the reason, and lets them submit version 2 again', async () => {
    await openProfile('fabricator');
    await page.getByTestId('return-reason').filter({ hasText: sendBackReason }).waitFor();
    await submitLatestVersion(2);
  });

  it('lets the supervisor approve version 2, which jobs then use', async () => {
    const card = await waitingCard();
    await card.getByRole('button', { name: 'Approve version 2' }).click();
    await page.getByRole('dialog').getByRole('button', { name: 'Approve version 2' }).click();
    await card.waitFor({ state: 'detached' });

    await page.goto(profilePath);
    await page.getByTestId('profile-status').filter({ hasText: 'Jobs use version 2 (approved).' }).waitFor();
    const header = page.getByTestId('version-comparison').locator('thead');
    await header.getByText('Retired').waitFor();
    await header.getByText('Approved').waitFor();
    await shot('machine-profile-approved');
  });

  it('lets the supervisor take the machine out of use, only with a reason, which the profile then shows', async () => {
    await openProfile('supervisor');
    await page.getByTestId('profile-actions').getByRole('button', { name: 'Take out of use' }).click();
    const dialog = page.getByRole('dialog', { name: `Take ${profileName} out of use?` });
    await dialog.getByRole('button', { name: 'Take out of use' }).click();
    await dialog.getByText(/^Say why/).waitFor();
    await dialog.getByLabel('Reason').fill(outOfUseReason);
    await dialog.getByRole('button', { name: 'Take out of use' }).click();
    await dialog.waitFor({ state: 'detached' });
    await page.getByTestId('out-of-use').filter({ hasText: outOfUseReason }).waitFor();
    await page
      .getByTestId('profile-status')
      .filter({ hasText: 'No version is approved, so no job can use this machine.' })
      .waitFor();
    expect(await page.getByRole('button', { name: 'Take out of use' }).count()).toBe(0);
    await shot('machine-profile-out-of-use');
  });

  it('shows the supervisor all of it in the audit trail', async () => {
    await signInToHome(page, demoUser('supervisor').email, DEMO_PASSWORD);
    await nav('Audit trail').click();
    const table = page.getByRole('table', { name: 'Audit trail' });
    await table.waitFor();
    const rows = table.getByTestId('audit-event');

    await page.getByRole('searchbox', { name: 'Action starts with' }).fill('machine-profile-version.');
    await rows.filter({ hasText: sendBackReason }).first().waitFor();
    await rows.filter({ hasText: outOfUseReason }).first().waitFor();
    for (const action of ['approve', 'return', 'submit', 'update', 'create', 'retire']) {
      await table.locator(`[data-action="machine-profile-version.${action}"]`).first().waitFor();
    }
    expect(await rows.filter({ hasText: 'Theo Lindqvist' }).count()).toBeGreaterThan(0);
    expect(await rows.filter({ hasText: 'Rosa Quintero' }).count()).toBeGreaterThan(0);
    await shot('audit-trail');

    await page.getByRole('searchbox', { name: 'Action starts with' }).fill('material.create');
    await rows.filter({ hasText: `Material “${materialName}” created` }).waitFor();
  });
});
