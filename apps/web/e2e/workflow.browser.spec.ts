import fs from 'node:fs';
import path from 'node:path';
import { type Page } from 'playwright-core';
import { BASE_URL, canvasColourCount, SCREENSHOT_DIR, signInToHome, openPagePerTest } from './browser';
import { DEMO_PASSWORD, demoUser } from './demo-users';

/*
 * One job's way through the workshop, each step by the role that takes it, in real Chromium against the real
 * API and database: the hobbyist designs and requests, the fabricator prepares, the supervisor approves, the
 * fabricator releases, the operator acknowledges the safety notices and records the cut. The steps share the
 * job, so they run in order.
 */

let page: Page;
let jobPath = '';
const designName = `Octahedron hexagons ${Date.now().toString(36)}`;

openPagePerTest((p) => {
  page = p;
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
  // The dialog's confirm button says what it does, as the action's own button does.
  await page.getByRole('dialog').getByRole('button', { name: label }).click();
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
    // Without a mouse (WCAG 2.1.1, 2.5.1): the focused preview turns with the arrow keys and a button, the
    // page does not scroll, and Home brings back the starting view.
    const view = page.getByRole('application', { name: '3D preview of the assembled model' });
    const home = await view.getAttribute('data-turn-deg');
    const scrollY = await page.evaluate(() => window.scrollY);
    await view.focus();
    await page.keyboard.press('ArrowLeft');
    expect(await view.getAttribute('data-turn-deg')).not.toBe(home);
    expect(await page.evaluate(() => window.scrollY)).toBe(scrollY);
    await page.keyboard.press('Home');
    expect(await view.getAttribute('data-turn-deg')).toBe(home);
    await page.getByRole('button', { name: 'Turn model right' }).click();
    expect(await view.getAttribute('data-turn-deg')).not.toBe(home);
    await page.getByRole('button', { name: 'Reset view' }).click();
    expect(await view.getAttribute('data-turn-deg')).toBe(home);
    // In inches the lengths are shown and typed in inches; the design keeps millimetres.
    await page.getByRole('group', { name: 'Units' }).getByRole('button', { name: 'inch' }).click();
    expect(await page.getByLabel('Sheet width (in)').inputValue()).toBe('23.622');
    await page.getByRole('group', { name: 'Units' }).getByRole('button', { name: 'mm' }).click();
    expect(await page.getByLabel('Sheet width (mm)').inputValue()).toBe('600');

    // A field error blocks the preview's input, not the page: 2 sides is no polygon.
    await page.getByLabel('Sides (n)').fill('2');
    await page.getByText('At least 3 sides', { exact: true }).waitFor();
    await page.getByLabel('Sides (n)').fill('6');
    await page
      .getByTestId('report-valid')
      .or(page.getByText(/^Report \(0 errors/))
      .first()
      .waitFor();

    // The engine finds the smallest size that builds soundly (the size where pieces first cross builds with
    // errors: its crossings have no length); the report then has no errors. The default size is put back.
    await page
      .getByTestId('suggested-sizes')
      .getByText(/^Pieces cross from size 0\.7071\./)
      .waitFor();
    await page.getByRole('button', { name: 'Smallest sound size' }).click();
    await page
      .getByTestId('sound-size')
      .getByText(/is the smallest size that builds without errors/)
      .waitFor();
    const sound = Number(await page.getByLabel('Size').inputValue());
    expect(sound).toBeGreaterThan(0.7071);
    await page
      .getByTestId('report-valid')
      .or(page.getByText(/^Report \(0 errors/))
      .first()
      .waitFor();
    await page.getByLabel('Size').fill('1.3');

    // A colour rule the count cannot meet: four faces meet at each vertex of the octahedron, so two colours
    // cannot keep them apart; the studio says how many it needs and sets them on request.
    await page.getByLabel('Rule').selectOption('vertex-distinct');
    const notice = page.getByTestId('colour-plan-notice');
    await notice.getByText(/it needs at least 4/).waitFor();
    await notice.getByRole('button', { name: 'Use 4 colours' }).click();
    await notice.waitFor({ state: 'detached' });
    expect(await page.getByLabel('Colours', { exact: true }).inputValue()).toBe('4');
    await page.getByLabel('Colours', { exact: true }).fill('2');
    await page.getByLabel('Rule').selectOption('neighbour-distinct');

    // The same model laid out on the stock sheet, in the browser's layout worker (off the page's main thread):
    // each sheet drawn with its pieces.
    const workers: string[] = [];
    page.on('worker', (w) => workers.push(w.url()));
    const sheets = page.getByTestId('studio-sheets');
    await sheets.getByRole('button', { name: 'Lay out on sheets' }).click();
    await sheets.getByTestId('sheets-summary').waitFor();
    const drawn = await sheets.getByTestId('layout-sheet').count();
    expect(drawn).toBeGreaterThan(0);
    expect(await sheets.getByTestId('sheets-summary').textContent()).toMatch(
      new RegExp(`need ${drawn} sheets?\\.`),
    );
    // With an approved machine profile for stock of the design's thickness, the layout is estimated for time
    // and cost at once; "no machine" leaves cut length and pierces only.
    const machineTime = /Machine time(\d+\.\d min|[\d,]+ h \d+ min)/;
    await sheets.getByTestId('layout-facts').filter({ hasText: machineTime }).waitFor();
    const estimateWith = sheets.getByLabel('Estimate time and cost with');
    expect(await estimateWith.inputValue()).not.toBe('');
    await estimateWith.selectOption({ index: 0 });
    expect(await sheets.getByTestId('layout-facts').textContent()).not.toMatch(machineTime);
    await estimateWith.selectOption({ index: 1 });
    expect(await sheets.getByTestId('layout-facts').textContent()).toMatch(machineTime);
    await sheets.screenshot({ path: path.join(SCREENSHOT_DIR, 'studio-sheet-layout.png') });
    expect(workers.some((url) => /layout\.worker/.test(url))).toBe(true);

    // Fit to sheets: the largest model on two sheets, searched in the worker; the form stays usable meanwhile.
    await page.getByLabel('Scale by').selectOption('fitSheets');
    await page.getByLabel('Sheets', { exact: true }).fill('2');
    await sheets
      .getByTestId('sheets-summary')
      .filter({ hasText: /^Largest size on 2 sheets: diameter/ })
      .waitFor();
    expect(await sheets.getByTestId('layout-sheet').count()).toBeLessThanOrEqual(2);
    await page.getByLabel('Scale by').selectOption('diameter');
    await sheets
      .getByTestId('sheets-summary')
      .filter({ hasText: /^At diameter 240/ })
      .waitFor();

    // The assembly order: every piece once (8 hexagons), the first held upright.
    await page.getByRole('tab', { name: 'Assembly' }).click();
    const order = page.getByRole('table', { name: 'Assembly order' });
    await order.waitFor();
    expect(await order.getByRole('row').count()).toBe(1 + 8);
    expect(await order.getByRole('row').nth(1).textContent()).toContain('first piece');
    await page.getByRole('tab', { name: /^Report/ }).click();

    await page.getByLabel('Name').fill(designName);
    await page.getByRole('button', { name: 'Save design' }).click();
    await page.waitForURL(/\/designs\/[0-9a-f-]{36}$/);
    // Saving disabled the button for a moment: the keyboard is back on it, and the page says it saved.
    await page.getByText(`Saved “${designName}”.`).waitFor();
    await page.waitForFunction(() => document.activeElement?.textContent === 'Save');
    await shot('design-studio');

    await page.getByRole('button', { name: 'Request a cut job' }).click();
    const dialog = page.getByRole('dialog', { name: 'Request a cut job' });
    // The keyboard is in Copies at once, its 1 selected: a digit typed straight away replaces it (it once
    // made "12" of a "2", and later went to the dialog box until its opening had run).
    const copies = dialog.getByLabel('Copies');
    await page.keyboard.type('2');
    expect(await copies.inputValue()).toBe('2');
    await dialog.getByLabel('Copies').fill('0');
    await dialog.getByRole('button', { name: 'Request the cut' }).click();
    await dialog.getByText('At least 1 copy').waitFor();
    await dialog.getByLabel('Copies').fill('1');
    await dialog.getByLabel('Notes for the workshop').fill('Two colours if there are any.');
    await dialog.getByRole('button', { name: 'Request the cut' }).click();
    await page.waitForURL(/\/jobs\/[0-9a-f-]{36}$/);
    jobPath = new URL(page.url()).pathname;
    await page.getByTestId('job-state').filter({ hasText: 'requested' }).waitFor();
    // Second thoughts before anyone prepared it: withdraw the request, change the notes, request it again.
    const actions = page.getByTestId('job-actions');
    await actions.getByRole('button', { name: 'Withdraw the request' }).click();
    await page
      .getByRole('dialog', { name: 'Withdraw the request?' })
      .getByRole('button', { name: 'Withdraw the request' })
      .click();
    await page.getByTestId('job-state').filter({ hasText: 'draft' }).waitFor();
    await actions.getByRole('button', { name: 'Change copies and notes' }).click();
    const change = page.getByRole('dialog', { name: 'Change copies and notes' });
    expect(await change.getByLabel('Copies').inputValue()).toBe('1');
    expect(await change.getByLabel('Notes for the workshop').inputValue()).toBe(
      'Two colours if there are any.',
    );
    await change.getByLabel('Notes for the workshop').fill('Two colours if there are any; clear will do.');
    await change.getByRole('button', { name: 'Save the changes' }).click();
    await change.waitFor({ state: 'detached' });
    await page.getByText('Two colours if there are any; clear will do.').waitFor();
    await actions.getByRole('button', { name: 'Request the cut' }).click();
    await page
      .getByRole('dialog', { name: 'Request the cut?' })
      .getByRole('button', { name: 'Request the cut' })
      .click();
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

  it('builds a design near the cost limit off the main thread, and refuses one over it', async () => {
    const workers: string[] = [];
    page.on('worker', (w) => workers.push(w.url()));
    await signInToHome(page, demoUser('hobbyist').email, DEMO_PASSWORD);
    await page.goto('/designs/new');
    await page.locator('[data-testid="preview-3d"] canvas[data-rendered-key]').waitFor();
    // 120 pieces × 119 others × 14 sides = 199,920: just under the limit of 200,000 (spec/workload.ts).
    await page.getByLabel('Solid').selectOption('disdyakis-triacontahedron');
    await page.getByLabel('Sides (n)').fill('14');
    await page.getByLabel('Step (k)').fill('1');
    await page.getByLabel('Size').fill('1.2');
    await page.getByTestId('model-facts').getByText('120', { exact: true }).waitFor({ timeout: 60_000 });
    await page.locator('canvas[data-rendered-key*="disdyakis-triacontahedron"]').waitFor({ timeout: 60_000 });

    // The longest main-thread task (PerformanceObserver "longtask") from an edit of the size until the 3D view
    // shows the model built for it. Logged, not asserted: a figure of this machine, for the record.
    const runs: { longestMs: number; updateMs: number }[] = [];
    for (const size of ['1.21', '1.22', '1.23', '1.24', '1.25']) {
      runs.push(
        await page.evaluate(async (value) => {
          const input = document.querySelector<HTMLInputElement>('input[name="size"]');
          const canvas = document.querySelector<HTMLCanvasElement>('[data-testid="preview-3d"] canvas');
          if (!input || !canvas) throw new Error('studio not on screen');
          const tasks: number[] = [];
          const observer = new PerformanceObserver((list) => {
            for (const entry of list.getEntries()) tasks.push(entry.duration);
          });
          observer.observe({ type: 'longtask' });
          const before = canvas.getAttribute('data-rendered-key');
          const setter = Object.getOwnPropertyDescriptor(HTMLInputElement.prototype, 'value')?.set;
          const started = performance.now();
          setter?.call(input, value);
          input.dispatchEvent(new Event('input', { bubbles: true }));
          const updateMs = await new Promise<number>((resolve, reject) => {
            const timeout = setTimeout(() => reject(new Error('the preview did not update')), 60_000);
            const poll = () => {
              if (canvas.getAttribute('data-rendered-key') !== before) {
                clearTimeout(timeout);
                resolve(performance.now() - started);
              } else requestAnimationFrame(poll);
            };
            requestAnimationFrame(poll);
          });
          // Long tasks are reported after they end: give the last one time to arrive.
          await new Promise((resolve) => setTimeout(resolve, 300));
          observer.disconnect();
          return { longestMs: Math.max(0, ...tasks), updateMs };
        }, size),
      );
    }
    const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)] ?? NaN;
    const longest = runs.map((r) => r.longestMs);
    const update = runs.map((r) => r.updateMs);
    console.log(
      `120-piece design of 14 sides (199,920 of 200,000): longest main-thread task after an edit, median ` +
        `${median(longest).toFixed(0)} ms (runs: ${longest.map((t) => t.toFixed(0)).join(', ')} ms); ` +
        `model on screen after a median ${median(update).toFixed(0)} ms (runs: ${update.map((t) => t.toFixed(0)).join(', ')} ms)`,
    );
    // A size typed key by key (120 ms apart, as a quick typist): how long the keys took to go in (the page
    // froze under each build when it built on the main thread), and how soon the model followed the last key.
    const sizeField = page.getByLabel('Size');
    await sizeField.selectText();
    const typingStarted = Date.now();
    await sizeField.pressSequentially('1.234', { delay: 120 });
    const typedMs = Date.now() - typingStarted;
    await page.locator('canvas[data-rendered-key*="1.234"]').waitFor({ timeout: 60_000 });
    console.log(
      `the same design, 5 keys typed into Size: the keys took ${typedMs} ms (about 600 ms of it the typist's ` +
        `own pauses); the model followed ${Date.now() - typingStarted - typedMs} ms after the last key`,
    );

    // The model came from the preview worker, and the studio shows it whole: its facts, its report.
    expect(workers.some((url) => /preview\.worker/.test(url))).toBe(true);
    expect(await page.getByTestId('model-facts').textContent()).toMatch(
      /Pieces120Crossings[\d,]+Diameter240/,
    );
    const reportTab = page.getByRole('tab', { name: /^Report \(/ });
    await reportTab.click();
    expect(await reportTab.textContent()).toMatch(/^Report \([\d,]+ errors?/);
    await page
      .getByRole('table', { name: 'Crossings' })
      .or(page.getByTestId('report-issues'))
      .first()
      .waitFor();

    // One side more is over the limit: refused before it is built, with the engine's reason as a sentence.
    await page.getByLabel('Sides (n)').fill('15');
    const refused = page.getByTestId('preview-unavailable');
    await refused.getByText(/^This design is too heavy to compute in time: 120 pieces of 15 sides/).waitFor();
    expect(await refused.textContent()).toMatch(/at most 14 sides on this solid/);
  }, 240_000);

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
    // A first preparation starts from the design's stock: the studio drew it for one material's sheet at that
    // material's measured thickness, so that material comes chosen, and said so.
    const fromDesign = dialog.getByTestId('prepare-from-design');
    await fromDesign.waitFor();
    expect(await fromDesign.textContent()).toMatch(
      /^Chosen from the design’s stock: .+ 3 mm, 600 × 400 mm sheets/,
    );
    expect(await dialog.getByLabel('Material').inputValue()).not.toBe('');
    // Nothing chosen: the form says what is missing.
    await dialog.getByRole('progressbar').waitFor({ state: 'detached' });
    await dialog.getByLabel('Material').selectOption({ label: 'Choose…' });
    await dialog.getByRole('button', { name: 'Prepare' }).click();
    await dialog.getByText('Choose a material').waitFor();
    await dialog.getByLabel('Material').selectOption({ label: 'Cast acrylic 3 mm' });
    await dialog.getByLabel('Machine profile (approved version)').selectOption({ index: 1 });
    await dialog.getByLabel('clear').check();
    await dialog.getByLabel('cobalt blue').check();
    await dialog.getByRole('button', { name: 'Prepare' }).click();
    await page.getByTestId('job-state').filter({ hasText: 'prepared' }).waitFor();
    await page.getByTestId('job-layout').getByText('Utilisation').waitFor();
    // The time and cost the preparation kept (the cut pack's own figures), which the supervisor approves on.
    const kept = (await page.getByTestId('job-layout').textContent()) ?? '';
    expect(kept).toMatch(/Machine time \(estimated\)(\d+\.\d min|[\d,]+ h \d+ min)/);
    expect(kept).toMatch(/Cost\d[\d,]*\.\d\d \w+ \(machine /);
    // The sheet layout: as many sheets drawn as the preparation counted, every length in the chosen unit.
    const layout = page.getByTestId('job-sheets');
    await layout.getByTestId('sheet-layout').waitFor({ timeout: 30_000 });
    const facts = layout.getByTestId('layout-facts');
    const sheetCount = Number(
      (
        await facts
          .locator('div', { hasText: /^Sheets\d+$/ })
          .last()
          .textContent()
      )?.replace('Sheets', ''),
    );
    expect(sheetCount).toBeGreaterThan(0);
    expect(await layout.getByTestId('layout-sheet').count()).toBe(sheetCount);
    expect(await facts.textContent()).toMatch(/Sheet size\d+(\.\d+)? × \d+(\.\d+)? mm/);
    // Time and cost from the profile version's speeds and rate and the stock sheet's price.
    expect(await facts.textContent()).toMatch(/Machine time(\d+\.\d min|[\d,]+ h \d+ min)/);
    await page.getByRole('group', { name: 'Units' }).getByRole('button', { name: 'inch' }).click();
    expect(await facts.textContent()).toMatch(/Sheet size\d+\.\d{3} × \d+\.\d{3} in/);
    await layout.screenshot({ path: path.join(SCREENSHOT_DIR, 'sheet-layout.png') });
    // The choice of inches stays with the browser: a reload (or the studio) shows inches until mm is chosen.
    await page.reload();
    await page
      .getByTestId('layout-facts')
      .filter({ hasText: /Sheet size\d+\.\d{3} × \d+\.\d{3} in/ })
      .waitFor();
    await page.getByRole('group', { name: 'Units' }).getByRole('button', { name: 'mm' }).click();
    await shot('job-prepared');
  });

  it('lets the supervisor approve the prepared job', async () => {
    await openJob('supervisor');
    await takeAction('Approve the job', 'approved');
    await shot('job-approved');
  });

  it('lets the fabricator release the approved job, which prepares its cut pack', async () => {
    await openJob('fabricator');
    await page.getByTestId('job-actions').getByRole('button', { name: 'Release to the machines' }).click();
    await page.getByRole('dialog').getByRole('button', { name: 'Release to the machines' }).click();
    // Releasing queues the cut pack (202 with the export); the panel follows the export (its events) and
    // the job is released once the files are stored. An API that still releases at once (200) leaves the
    // pack to be asked for here.
    const pack = page.getByTestId('cut-pack');
    const ready = pack.getByText(/The cut pack is ready \(\d+ files\)/);
    await page.getByRole('dialog').waitFor({ state: 'detached' });
    const state = page.getByTestId('job-detail').getByTestId('job-state');
    await pack
      .getByText(/Preparing the files/)
      .or(ready)
      .or(state.filter({ hasText: 'released' }))
      .first()
      .waitFor({ timeout: 20_000 });
    if (await state.filter({ hasText: 'released' }).isVisible()) {
      const prepare = pack.getByRole('button', { name: 'Prepare the cut pack' });
      if (await prepare.isVisible()) await prepare.click();
    }
    await ready.waitFor({ timeout: 45_000 });
    await page
      .getByTestId('job-detail')
      .getByTestId('job-state')
      .filter({ hasText: 'released' })
      .waitFor({ timeout: 20_000 });
  });

  it('lets the operator acknowledge the safety notices at the release desk, download and record the cut', async () => {
    await signInToHome(page, demoUser('operator').email, DEMO_PASSWORD);
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Release desk' }).click();
    const desk = page.getByTestId('release-desk');
    await desk.getByRole('table', { name: 'Jobs at the release desk' }).waitFor();
    await desk.getByRole('button', { name: `Open ${designName}` }).click();
    const job = page.getByTestId('desk-job');
    await job.getByTestId('desk-needs-acknowledgement').waitFor();
    // No acknowledgement yet: no download links, and the cut cannot be recorded.
    expect(await job.getByRole('button', { name: /^Download / }).count()).toBe(0);
    expect(await job.getByRole('button', { name: 'Record the cut' }).isDisabled()).toBe(true);

    await job.getByRole('button', { name: 'Safety notices' }).click();
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
    const files = job.getByRole('table', { name: 'Cut pack files' });
    await files.waitFor();
    const sizes = await files.locator('tr td:nth-child(3)').allTextContents();
    expect(sizes.length).toBeGreaterThan(0);
    for (const size of sizes) expect(size).toMatch(/^\d+(\.\d+)? (B|KB|MB)$/);
    await shot('release-desk');
    const first = files.getByRole('button', { name: /^Download / }).first();
    const [download] = await Promise.all([page.waitForEvent('download'), first.click()]);
    const saved = await download.path();
    expect(fs.statSync(saved).size).toBeGreaterThan(0);

    await job.getByRole('button', { name: 'Record the cut' }).click();
    const cut = page.getByRole('dialog', { name: 'Record the cut' });
    await cut.getByRole('button', { name: 'Record the cut' }).click();
    await cut.getByText('Enter the machine time in minutes').waitFor();
    await cut.getByLabel('Machine time (minutes)').fill('18.5');
    await cut.getByLabel('Measured kerf (mm, optional)').fill('0.16');
    await cut.getByRole('button', { name: 'Record the cut' }).click();
    await job.getByTestId('job-state').filter({ hasText: /^cut$/ }).waitFor();
    await cut.waitFor({ state: 'detached' });

    // From the desk to the job's page within the app: leaving the desk's job must not break the page
    // (Chromium's scrollIntoView returns a promise, which an effect once handed React as its clean-up).
    await job.getByRole('link', { name: 'Job details' }).click();
    await page.waitForURL((url) => url.pathname === jobPath);
    await page.getByTestId('job-detail').getByTestId('job-state').filter({ hasText: /^cut$/ }).waitFor();
    expect(await page.getByText('Something went wrong').count()).toBe(0);
    await page.getByText('18.5 min').waitFor();
    await shot('job-cut');
  });

  it("gives the hobbyist their cut job's assembly guide, and only that", async () => {
    await signInToHome(page, demoUser('hobbyist').email, DEMO_PASSWORD);
    await page.goto(jobPath);
    const guide = page.getByTestId('assembly-guide');
    const button = guide.getByRole('button', { name: /^Download .*\.pdf$/ });
    await button.waitFor();
    const [download] = await Promise.all([page.waitForEvent('download'), button.click()]);
    const saved = await download.path();
    expect(fs.readFileSync(saved).subarray(0, 5).toString('latin1')).toBe('%PDF-');
    expect(await page.getByTestId('cut-pack').count()).toBe(0);
  });
});
