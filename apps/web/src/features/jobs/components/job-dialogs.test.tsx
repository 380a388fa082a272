import { type MachineProfileSummaryView, type MaterialView } from '@kerfwright/contracts';
import { screen, waitFor, within } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { json, stubFetch } from '../../../testing/fetch-stub';
import { materialFixture } from '../../../testing/fixtures';
import { renderWithProviders } from '../../../testing/render-app';
import { ConfirmJobActionDialog } from './confirm-job-action-dialog';
import { PrepareJobDialog } from './prepare-job-dialog';
import { RecordCutDialog } from './record-cut-dialog';
import { ReturnJobDialog } from './return-job-dialog';
import { isBlankNumber } from '../../../lib/form-numbers';
import { FAILED_LIST_REFETCH_MS } from '../../../lib/query-client';

const noop = () => undefined;

/** The record-the-cut dialog, open, with the prepared sheets, machine kind and submit handler given. */
function renderRecordCut(props: {
  preparedSheets: number;
  machineKind: 'laser' | 'router';
  onSubmit: Parameters<typeof RecordCutDialog>[0]['onSubmit'];
  unit?: 'mm' | 'in';
}) {
  return renderWithProviders(
    <RecordCutDialog open busy={false} error={null} onClose={noop} unit="mm" {...props} />,
  );
}

describe('return job dialog', () => {
  it('needs a reason before sending a job back', async () => {
    const onSubmit = vi.fn();
    const { user } = renderWithProviders(
      <ReturnJobDialog open busy={false} error={null} onSubmit={onSubmit} onClose={noop} />,
    );
    await user.click(await screen.findByRole('button', { name: 'Return with this reason' }));
    expect(await screen.findByText('Say why the job goes back (at least 3 characters)')).toBeInTheDocument();
    expect(onSubmit).not.toHaveBeenCalled();
    await user.type(screen.getByLabelText('Reason'), 'Slots too tight for this acrylic');
    await user.click(screen.getByRole('button', { name: 'Return with this reason' }));
    await waitFor(() =>
      expect(onSubmit).toHaveBeenCalledWith({ reason: 'Slots too tight for this acrylic' }),
    );
  });
});

describe('return job dialog, what follows', () => {
  it('says a released job is taken back from the machines, its files withdrawn, before it is confirmed', () => {
    renderWithProviders(
      <ReturnJobDialog open from="released" busy={false} error={null} onSubmit={noop} onClose={noop} />,
    );
    expect(screen.getByRole('dialog', { name: 'Return the job' })).toHaveTextContent(
      /^Return the jobThe job is taken back from the machines: its files are no longer offered, and the operators are told not to cut it\. It goes back to its requester with your reason/,
    );
  });

  it('says where a job not yet released goes, and nothing about the machines', () => {
    renderWithProviders(
      <ReturnJobDialog open from="prepared" busy={false} error={null} onSubmit={noop} onClose={noop} />,
    );
    const dialog = screen.getByRole('dialog', { name: 'Return the job' });
    expect(dialog).toHaveTextContent(
      'It goes back to its requester with your reason; they can reopen it as a draft, change the copies and the notes, and request the cut again.',
    );
    expect(dialog).not.toHaveTextContent(/machines/);
  });
});

describe('confirming a job action', () => {
  it.each([
    // A release waits for its cut pack: the job stays approved until the files are ready.
    [
      'release',
      'approved',
      'Release to the machines?',
      'Its cut pack is built first; the job moves from approved to released once its files are ready.',
    ],
    // An action done at once says where it moves the job.
    ['approve', 'prepared', 'Approve the job?', 'The job moves from prepared to approved.'],
  ] as const)('says what follows %s from %s', (action, from, title, text) => {
    renderWithProviders(
      <ConfirmJobActionDialog
        action={action}
        from={from}
        busy={false}
        error={null}
        onConfirm={noop}
        onClose={noop}
      />,
    );
    expect(screen.getByRole('dialog', { name: title })).toHaveTextContent(text);
  });
});

describe('record the cut dialog', () => {
  it('opens with the keyboard in the machine time', async () => {
    const { user } = renderRecordCut({ preparedSheets: 2, machineKind: 'laser', onSubmit: noop });
    const minutes = await screen.findByLabelText('Machine time (minutes)');
    await waitFor(() => expect(minutes).toHaveFocus());
    await user.keyboard('12');
    expect(minutes).toHaveValue(12);
  });

  it('needs the machine time and whole sheets; the measured kerf may stay empty', async () => {
    const onSubmit = vi.fn();
    const { user } = renderRecordCut({ preparedSheets: 2, machineKind: 'laser', onSubmit: onSubmit });
    await user.click(await screen.findByRole('button', { name: 'Record the cut' }));
    expect(await screen.findByText('Enter the machine time in minutes')).toBeInTheDocument();
    await user.type(screen.getByLabelText('Machine time (minutes)'), '12');
    const sheets = screen.getByLabelText('Sheets used');
    await user.clear(sheets);
    await user.type(sheets, '1.5');
    await user.click(screen.getByRole('button', { name: 'Record the cut' }));
    expect(await screen.findByText('A whole number of sheets')).toBeInTheDocument();
    await user.clear(sheets);
    await user.type(sheets, '2');
    await user.type(screen.getByLabelText('Measured kerf (mm, optional)'), '3');
    await user.click(screen.getByRole('button', { name: 'Record the cut' }));
    expect(await screen.findByText('At most 2 mm')).toBeInTheDocument();
    await user.clear(screen.getByLabelText('Measured kerf (mm, optional)'));
    await user.click(screen.getByRole('button', { name: 'Record the cut' }));
    await waitFor(() => expect(onSubmit).toHaveBeenCalled());
    const values = onSubmit.mock.calls[0]?.[0] as {
      actualMinutes: number;
      sheetsUsed: number;
      measuredKerfMm: number;
    };
    expect(values.actualMinutes).toBe(12);
    expect(values.sheetsUsed).toBe(2);
    expect(Number.isNaN(values.measuredKerfMm)).toBe(true);
  });
});

describe('record the cut dialog, sheets used', () => {
  it('asks for a confirmation of a count far above the prepared sheets, which the API would take as it is', async () => {
    const onSubmit = vi.fn();
    const { user } = renderRecordCut({ preparedSheets: 3, machineKind: 'laser', onSubmit: onSubmit });
    await user.type(await screen.findByLabelText('Machine time (minutes)'), '25');
    const sheets = screen.getByLabelText('Sheets used');
    expect(sheets).toHaveValue(3);
    const record = screen.getByRole('button', { name: 'Record the cut' });
    // A spoilt sheet cut again is everyday: no question.
    await user.clear(sheets);
    await user.type(sheets, '5');
    expect(screen.queryByTestId('sheets-far-above')).not.toBeInTheDocument();
    expect(record).toBeEnabled();

    await user.clear(sheets);
    await user.type(sheets, '999');
    const warning = await screen.findByTestId('sheets-far-above');
    expect(warning).toHaveTextContent('999 sheets is far more than the 3 sheets the preparation laid out');
    expect(record).toBeDisabled();
    await user.type(sheets, '{Enter}');
    expect(onSubmit).not.toHaveBeenCalled();

    // Past the form's own limit there is nothing to confirm: the form refuses it.
    await user.clear(sheets);
    await user.type(sheets, '99999');
    expect(screen.queryByTestId('sheets-far-above')).not.toBeInTheDocument();
    await user.click(record);
    expect(await screen.findByText('At most 1000 sheets')).toBeInTheDocument();
    expect(onSubmit).not.toHaveBeenCalled();
    await user.clear(sheets);
    await user.type(sheets, '999');
    await user.click(
      within(await screen.findByTestId('sheets-far-above')).getByLabelText(
        'Yes, 999 sheets went into this cut',
      ),
    );
    expect(record).toBeEnabled();
    // Another count is a new question.
    await user.clear(sheets);
    await user.type(sheets, '99');
    expect(record).toBeDisabled();
    await user.click(within(screen.getByTestId('sheets-far-above')).getByRole('checkbox'));
    await user.click(record);
    await waitFor(() => expect(onSubmit).toHaveBeenCalledTimes(1));
    expect(onSubmit.mock.calls[0]?.[0]).toMatchObject({ actualMinutes: 25, sheetsUsed: 99 });
  });
});

describe('record the cut dialog, on a router', () => {
  it('asks for the width of the cut and takes what a router bit cuts (0.1–25 mm), as the API does', async () => {
    // The API's range for a router's measured kerf (MACHINE_PROFILE_LIMITS.toolDiameterMm): a 3.175 mm (1/8 in)
    // bit cuts a slot a little over 3.175 mm wide, far past a laser's 2 mm.
    const onSubmit = vi.fn();
    const { user } = renderRecordCut({ preparedSheets: 2, machineKind: 'router', onSubmit: onSubmit });
    await user.type(await screen.findByLabelText('Machine time (minutes)'), '40');
    const width = screen.getByLabelText('Measured cut width (mm, optional)');
    await user.type(width, '0.05');
    await user.click(screen.getByRole('button', { name: 'Record the cut' }));
    expect(
      await screen.findByText('At least 0.1 mm; leave it empty if it was not measured'),
    ).toBeInTheDocument();
    await user.clear(width);
    await user.type(width, '3.2');
    await user.click(screen.getByRole('button', { name: 'Record the cut' }));
    await waitFor(() => expect(onSubmit).toHaveBeenCalledTimes(1));
    expect(onSubmit.mock.calls[0]?.[0]).toMatchObject({ actualMinutes: 40, measuredKerfMm: 3.2 });
  });
});

describe('record the cut dialog, measured kerf', () => {
  it('takes a kerf of 0.01–2 mm as the API does, and never writes "NaN" into an empty field', async () => {
    // A browser warns 'The specified value "NaN" cannot be parsed' when a number input is given "NaN".
    const written: string[] = [];
    const value = Object.getOwnPropertyDescriptor(HTMLInputElement.prototype, 'value')!;
    const spy = vi.spyOn(HTMLInputElement.prototype, 'value', 'set').mockImplementation(function (
      this: HTMLInputElement,
      v: string,
    ) {
      written.push(String(v));
      value.set!.call(this, v);
    });
    try {
      const onSubmit = vi.fn();
      const { user } = renderRecordCut({ preparedSheets: 1, machineKind: 'laser', onSubmit: onSubmit });
      const kerf = await screen.findByLabelText('Measured kerf (mm, optional)');
      expect(kerf).toHaveValue(null);
      expect(screen.getByLabelText('Machine time (minutes)')).toHaveValue(null);
      await user.type(screen.getByLabelText('Machine time (minutes)'), '12');
      await user.type(kerf, '0.0000001');
      await user.click(screen.getByRole('button', { name: 'Record the cut' }));
      expect(
        await screen.findByText('At least 0.01 mm; leave it empty if it was not measured'),
      ).toBeInTheDocument();
      expect(onSubmit).not.toHaveBeenCalled();
      await user.clear(kerf);
      await user.type(kerf, '0.165');
      await user.click(screen.getByRole('button', { name: 'Record the cut' }));
      await waitFor(() => expect(onSubmit).toHaveBeenCalled());
      expect(onSubmit.mock.calls[0]?.[0]).toEqual({
        actualMinutes: 12,
        sheetsUsed: 1,
        measuredKerfMm: 0.165,
      });
      expect(written).not.toContain('NaN');
    } finally {
      spy.mockRestore();
    }
  });
});

describe('record the cut dialog, in inches', () => {
  it('takes the measured kerf in inches where the page shows inches, and records millimetres', async () => {
    // 0.0065 in × 25.4 mm/in = 0.1651 mm (the inch is 25.4 mm exactly, NIST SP 811 B.8).
    const onSubmit = vi.fn();
    const { user } = renderRecordCut({ preparedSheets: 1, machineKind: 'laser', onSubmit, unit: 'in' });
    await user.type(await screen.findByLabelText('Machine time (minutes)'), '12');
    expect(screen.queryByLabelText('Measured kerf (mm, optional)')).not.toBeInTheDocument();
    const kerf = screen.getByLabelText('Measured kerf (in, optional)');
    await user.type(kerf, '0.1');
    await user.click(screen.getByRole('button', { name: 'Record the cut' }));
    // 0.1 in is 2.54 mm, past a laser's 2 mm: the limit is said in inches too (2 mm ≈ 0.0787 in).
    expect(await screen.findByText('At most 0.0787 in')).toBeInTheDocument();
    await user.clear(kerf);
    await user.type(kerf, '0.0065');
    await user.click(screen.getByRole('button', { name: 'Record the cut' }));
    await waitFor(() => expect(onSubmit).toHaveBeenCalledTimes(1));
    expect(onSubmit.mock.calls[0]?.[0]).toMatchObject({ actualMinutes: 12, measuredKerfMm: 0.1651 });
  });

  it('may stay empty in inches too', async () => {
    const onSubmit = vi.fn();
    const { user } = renderRecordCut({ preparedSheets: 1, machineKind: 'router', onSubmit, unit: 'in' });
    await user.type(await screen.findByLabelText('Machine time (minutes)'), '30');
    expect(screen.getByLabelText('Measured cut width (in, optional)')).toHaveValue(null);
    await user.click(screen.getByRole('button', { name: 'Record the cut' }));
    await waitFor(() => expect(onSubmit).toHaveBeenCalledTimes(1));
    expect(isBlankNumber(onSubmit.mock.calls[0]?.[0].measuredKerfMm)).toBe(true);
  });
});

const acrylic = materialFixture({
  colours: ['clear', 'amber'],
  stockSheets: [
    { widthMm: 600, heightMm: 400, pricePerSheet: 14.5, currency: 'EUR' },
    { widthMm: 1000, heightMm: 600, pricePerSheet: 30, currency: 'EUR' },
  ],
});

const laser = {
  id: 'p-laser',
  name: 'CO2 laser',
  kind: 'co2-laser',
  currentApproved: {
    id: 'v-approved',
    number: 3,
    settings: [
      {
        materialId: 'm-acrylic',
        kerfMm: 0.18,
        cutSpeedMmS: 12,
        markSpeedMmS: 200,
        passes: 1,
        pierceTimeS: 0.2,
      },
    ],
  },
  latest: { id: 'v-approved', number: 3 },
  createdAt: '2026-01-01T00:00:00.000Z',
} as unknown as MachineProfileSummaryView;

const draftOnly = {
  id: 'p-router',
  name: 'Router without approval',
  kind: 'cnc-router',
  currentApproved: null,
  latest: { id: 'v-draft', number: 1 },
  createdAt: '2026-01-01T00:00:00.000Z',
} as unknown as MachineProfileSummaryView;

/** The material and profile lists the Prepare dialog reads. */
function stubLists(materials: readonly MaterialView[], profiles: readonly MachineProfileSummaryView[]) {
  return stubFetch({
    'GET /api/materials': () =>
      json(200, { items: materials, total: materials.length, page: 1, pageSize: 100 }),
    'GET /api/machine-profiles': () =>
      json(200, { items: profiles, total: profiles.length, page: 1, pageSize: 100 }),
  });
}

/**
 * The lists the Prepare dialog reads, unreachable (fetch rejects, as a browser's does when the service is down)
 * until `back()` is called.
 */
function stubListsUnreachable() {
  let up = false;
  const down = () => Promise.reject(new TypeError('Failed to fetch'));
  const stub = stubFetch({
    'GET /api/materials': () =>
      up ? json(200, { items: [acrylic], total: 1, page: 1, pageSize: 100 }) : down(),
    'GET /api/machine-profiles': () =>
      up ? json(200, { items: [laser], total: 1, page: 1, pageSize: 100 }) : down(),
  });
  return { ...stub, back: () => (up = true) };
}

describe('prepare job dialog, service unreachable', () => {
  afterEach(() => vi.useRealTimers());

  it('says so once, and Try again loads the lists once the service is back', async () => {
    const service = stubListsUnreachable();
    const { user } = renderWithProviders(
      <PrepareJobDialog open busy={false} error={null} onSubmit={vi.fn()} onClose={noop} />,
    );
    const alert = await screen.findByTestId('prepare-lists-error');
    await waitFor(() =>
      expect(alert).toHaveTextContent('The materials and machine profiles could not be loaded.'),
    );
    expect(screen.getAllByRole('alert')).toHaveLength(1);
    expect(screen.getAllByText(/cannot be reached/)).toHaveLength(1);
    service.back();
    await user.click(within(alert).getByRole('button', { name: 'Try again' }));
    expect(await screen.findByRole('option', { name: 'CO2 laser · CO2 laser · v3' })).toBeInTheDocument();
    expect(screen.getByRole('option', { name: /Cast acrylic/ })).toBeInTheDocument();
    expect(screen.queryByTestId('prepare-lists-error')).not.toBeInTheDocument();
  });

  it('asks again by itself while the lists cannot be loaded', async () => {
    vi.useFakeTimers({ shouldAdvanceTime: true });
    const service = stubListsUnreachable();
    renderWithProviders(
      <PrepareJobDialog open busy={false} error={null} onSubmit={vi.fn()} onClose={noop} />,
    );
    await screen.findByTestId('prepare-lists-error');
    service.back();
    await vi.advanceTimersByTimeAsync(FAILED_LIST_REFETCH_MS + 100);
    expect(await screen.findByRole('option', { name: 'CO2 laser · CO2 laser · v3' })).toBeInTheDocument();
    expect(screen.queryByTestId('prepare-lists-error')).not.toBeInTheDocument();
  });
});

describe('prepare job dialog', () => {
  it('needs a material, an approved profile version and a colour, and sends the chosen sheet', async () => {
    stubFetch({
      'GET /api/materials': () => json(200, { items: [acrylic], total: 1, page: 1, pageSize: 100 }),
      'GET /api/machine-profiles': () =>
        json(200, { items: [laser, draftOnly], total: 2, page: 1, pageSize: 100 }),
    });
    const onSubmit = vi.fn();
    const { user } = renderWithProviders(
      <PrepareJobDialog open busy={false} error={null} onSubmit={onSubmit} onClose={noop} />,
    );
    await user.click(await screen.findByRole('button', { name: 'Prepare' }));
    expect(await screen.findByText('Choose a material')).toBeInTheDocument();
    expect(screen.getByText('Choose an approved machine profile')).toBeInTheDocument();
    expect(screen.getByText('Choose at least one colour')).toBeInTheDocument();

    // Only profiles with an approved version are offered.
    const profile = screen.getByLabelText('Machine profile (approved version)');
    await screen.findByRole('option', { name: 'CO2 laser · CO2 laser · v3' });
    expect(screen.queryByRole('option', { name: /Router without approval/ })).not.toBeInTheDocument();

    await user.selectOptions(screen.getByLabelText('Material'), 'm-acrylic');
    await user.selectOptions(profile, 'v-approved');
    await user.click(await screen.findByLabelText('amber'));
    await user.selectOptions(screen.getByLabelText('Sheet'), '1');
    await user.click(screen.getByRole('button', { name: 'Prepare' }));
    await waitFor(() => expect(onSubmit).toHaveBeenCalled());
    expect(onSubmit.mock.calls[0]?.[0]).toEqual({
      materialId: 'm-acrylic',
      profileVersionId: 'v-approved',
      colours: ['amber'],
      colourRule: 'neighbour-distinct',
      sheet: { widthMm: 1000, heightMm: 600 },
    });
  });

  it('says it is loading until the lists and the design are in', async () => {
    stubLists([acrylic], [laser]);
    renderWithProviders(
      <PrepareJobDialog
        open
        designId="d-missing"
        busy={false}
        error={null}
        onSubmit={vi.fn()}
        onClose={noop}
      />,
    );
    expect(
      screen.getByRole('progressbar', { name: 'Loading the materials and machine profiles' }),
    ).toBeInTheDocument();
    await screen.findByRole('option', { name: acrylic.name });
    await waitFor(() => expect(screen.queryByRole('progressbar')).not.toBeInTheDocument());
  });

  it('lists the stock sheets in the unit the job page shows (the prices stay per sheet)', async () => {
    stubLists([acrylic], [laser, draftOnly]);
    const { user } = renderWithProviders(
      <PrepareJobDialog open unit="in" busy={false} error={null} onSubmit={vi.fn()} onClose={noop} />,
    );
    await screen.findByRole('option', { name: new RegExp(acrylic.name) });
    await user.selectOptions(screen.getByLabelText('Material'), 'm-acrylic');
    // 600 × 400 mm is 23.622 × 15.748 in (1 in = 25.4 mm exactly).
    expect(await screen.findByRole('option', { name: '23.622 × 15.748 in · 14.50 EUR' })).toBeInTheDocument();
  });

  it("opens with the job's last preparation: material, colours, sheet either way round, rule and profile", async () => {
    stubLists([acrylic], [laser, draftOnly]);
    const onSubmit = vi.fn();
    const { user } = renderWithProviders(
      <PrepareJobDialog
        open
        jobColours={['Amber']}
        // Prepared on version 2 of the laser, retired since: its approved version (3) is chosen now.
        prepared={{
          materialId: 'm-acrylic',
          profileVersionId: 'v-retired',
          profileName: 'CO2 laser',
          sheet: { widthMm: 600, heightMm: 1000 },
          colourRule: 'opposite-match',
        }}
        busy={false}
        error={null}
        onSubmit={onSubmit}
        onClose={noop}
      />,
    );
    await waitFor(() =>
      expect(screen.getByLabelText('Machine profile (approved version)')).toHaveValue('v-approved'),
    );
    expect(screen.getByLabelText('Material')).toHaveValue('m-acrylic');
    expect(screen.getByLabelText('amber')).toBeChecked();
    expect(screen.getByLabelText('clear')).not.toBeChecked();
    expect(screen.getByLabelText('Sheet')).toHaveValue('1');
    expect(screen.getByLabelText('Colour rule')).toHaveValue('opposite-match');
    // Everything is still offered (the retired version's profile has an approved one): nothing to say.
    expect(screen.queryByTestId('prepare-not-offered')).not.toBeInTheDocument();
    await user.click(screen.getByRole('button', { name: 'Prepare' }));
    await waitFor(() => expect(onSubmit).toHaveBeenCalled());
    expect(onSubmit.mock.calls[0]?.[0]).toEqual({
      materialId: 'm-acrylic',
      profileVersionId: 'v-approved',
      colours: ['amber'],
      colourRule: 'opposite-match',
      sheet: { widthMm: 1000, heightMm: 600 },
    });
  });

  it('opens with nothing chosen when the material prepared with is no longer listed', async () => {
    stubLists([acrylic], [laser]);
    renderWithProviders(
      <PrepareJobDialog
        open
        prepared={{ materialId: 'm-gone', profileVersionId: 'v-approved', profileName: 'CO2 laser' }}
        busy={false}
        error={null}
        onSubmit={vi.fn()}
        onClose={noop}
      />,
    );
    await screen.findByRole('option', { name: 'Cast acrylic 3 mm' });
    expect(screen.getByLabelText('Material')).toHaveValue('');
    expect(screen.getByLabelText('Machine profile (approved version)')).toHaveValue('');
    expect(await screen.findByTestId('prepare-not-offered')).toHaveTextContent(
      'Since the job was last prepared: The material the job was prepared with is no longer listed: choose one.',
    );
  });

  it('says what of the last preparation the material no longer stocks: a colour, the sheet size', async () => {
    stubLists([acrylic], [laser]);
    renderWithProviders(
      <PrepareJobDialog
        open
        jobColours={['amber', 'coral']}
        prepared={{
          materialId: 'm-acrylic',
          profileVersionId: 'v-approved',
          profileName: 'CO2 laser',
          sheet: { widthMm: 500, heightMm: 300 },
        }}
        busy={false}
        error={null}
        onSubmit={vi.fn()}
        onClose={noop}
      />,
    );
    const note = await screen.findByTestId('prepare-not-offered');
    expect(note).toHaveTextContent('Cast acrylic 3 mm no longer stocks coral.');
    expect(note).toHaveTextContent(
      'Cast acrylic 3 mm no longer lists 500 × 300 mm sheets, the size the job was laid out on: check the sheet below.',
    );
    expect(screen.getByLabelText('amber')).toBeChecked();
    expect(screen.getByLabelText('Sheet')).toHaveValue('0');
  });

  it('clears the chosen profile version when a material it has no settings for is chosen', async () => {
    const birch = { ...acrylic, id: 'm-birch', name: 'Birch plywood 3 mm', colours: ['natural'] };
    stubFetch({
      'GET /api/materials': () => json(200, { items: [acrylic, birch], total: 2, page: 1, pageSize: 100 }),
      'GET /api/machine-profiles': () => json(200, { items: [laser], total: 1, page: 1, pageSize: 100 }),
    });
    const onSubmit = vi.fn();
    const { user } = renderWithProviders(
      <PrepareJobDialog open busy={false} error={null} onSubmit={onSubmit} onClose={noop} />,
    );
    await screen.findByRole('option', { name: 'Birch plywood 3 mm' });
    await user.selectOptions(screen.getByLabelText('Material'), 'm-acrylic');
    const profile = screen.getByLabelText('Machine profile (approved version)');
    await user.selectOptions(profile, await screen.findByRole('option', { name: /CO2 laser/ }));
    expect(profile).toHaveValue('v-approved');
    // The laser's approved version holds settings for acrylic only.
    await user.selectOptions(screen.getByLabelText('Material'), 'm-birch');
    expect(profile).toHaveValue('');
    await user.click(await screen.findByLabelText('natural'));
    await user.click(screen.getByRole('button', { name: 'Prepare' }));
    expect(await screen.findByText('Choose an approved machine profile')).toBeInTheDocument();
    expect(screen.getByTestId('prepare-explanation')).toHaveTextContent(
      'CO2 laser has no settings for Birch plywood 3 mm in its approved version v3',
    );
    expect(onSubmit).not.toHaveBeenCalled();
    // The rules are offered by name.
    expect(screen.getByRole('option', { name: 'Neighbours differ' })).toBeInTheDocument();
  });

  it('says why a material kept off lasers empties the laser, with its hazard and what would work', async () => {
    // PVC on a laser gives off hydrogen chloride (safety/material-hazards.json, from EHS never-cut lists).
    const pvc = {
      ...acrylic,
      id: 'm-pvc',
      name: 'Expanded PVC board 3 mm',
      family: 'pvc',
      colours: ['white'],
      laserAllowed: false,
      hazardNote: 'Gives off hydrogen chloride, which harms lungs and corrodes the machine.',
    } as MaterialView;
    const router = {
      ...laser,
      id: 'p-router',
      name: 'Bay router',
      kind: 'cnc-router',
      currentApproved: {
        ...laser.currentApproved!,
        id: 'v-router',
        number: 1,
        settings: [{ ...laser.currentApproved!.settings[0]!, materialId: 'm-pvc' }],
      },
    } as MachineProfileSummaryView;
    stubFetch({
      'GET /api/materials': () => json(200, { items: [acrylic, pvc], total: 2, page: 1, pageSize: 100 }),
      'GET /api/machine-profiles': () =>
        json(200, { items: [laser, router], total: 2, page: 1, pageSize: 100 }),
    });
    const { user } = renderWithProviders(
      <PrepareJobDialog open busy={false} error={null} onSubmit={vi.fn()} onClose={noop} />,
    );
    await screen.findByRole('option', { name: /Expanded PVC/ });
    const materialSelect = screen.getByLabelText('Material');
    const profile = screen.getByLabelText('Machine profile (approved version)');
    await user.selectOptions(materialSelect, 'm-acrylic');
    await user.selectOptions(profile, 'v-approved');
    expect(screen.queryByTestId('prepare-explanation')).not.toBeInTheDocument();

    await user.selectOptions(materialSelect, 'm-pvc');
    expect(profile).toHaveValue('');
    const why = screen.getByTestId('prepare-explanation');
    expect(why).toHaveTextContent(
      'Expanded PVC board 3 mm is never cut on a laser, and CO2 laser is a laser (co2-laser): Gives off hydrogen chloride',
    );
    expect(why).toHaveTextContent('Profiles that can cut Expanded PVC board 3 mm: Bay router.');
    expect(why).toHaveTextContent('Materials CO2 laser can cut: Cast acrylic 3 mm.');
    expect(
      within(profile)
        .getAllByRole('option')
        .map((o) => o.textContent),
    ).toEqual(['Choose…', 'Bay router · CNC router · v1']);

    // Back to a material the laser cuts: the laser is chosen again, and there is nothing to explain.
    await user.selectOptions(materialSelect, 'm-acrylic');
    expect(profile).toHaveValue('v-approved');
    expect(screen.queryByTestId('prepare-explanation')).not.toBeInTheDocument();
  });

  it('says when no approved profile may cut a material kept off lasers', async () => {
    const pvc = {
      ...acrylic,
      id: 'm-pvc',
      name: 'Expanded PVC board 3 mm',
      laserAllowed: false,
      hazardNote: '',
    };
    stubFetch({
      'GET /api/materials': () => json(200, { items: [acrylic, pvc], total: 2, page: 1, pageSize: 100 }),
      'GET /api/machine-profiles': () => json(200, { items: [laser], total: 1, page: 1, pageSize: 100 }),
    });
    const { user } = renderWithProviders(
      <PrepareJobDialog open busy={false} error={null} onSubmit={vi.fn()} onClose={noop} />,
    );
    await screen.findByRole('option', { name: /Expanded PVC/ });
    await user.selectOptions(screen.getByLabelText('Material'), 'm-pvc');
    const why = screen.getByTestId('prepare-explanation');
    expect(why).toHaveTextContent(
      'Expanded PVC board 3 mm is never cut on a laser: The material hazard table keeps it off every laser.',
    );
    expect(why).toHaveTextContent('No approved machine profile that may cut it has settings for it');
  });

  it('puts the keyboard on the first colour when none is ticked, described by the error', async () => {
    stubFetch({
      'GET /api/materials': () => json(200, { items: [acrylic], total: 1, page: 1, pageSize: 100 }),
      'GET /api/machine-profiles': () => json(200, { items: [laser], total: 1, page: 1, pageSize: 100 }),
    });
    const { user } = renderWithProviders(
      <PrepareJobDialog open busy={false} error={null} onSubmit={vi.fn()} onClose={noop} />,
    );
    await screen.findByRole('option', { name: 'Cast acrylic 3 mm' });
    await user.selectOptions(screen.getByLabelText('Material'), 'm-acrylic');
    await user.selectOptions(screen.getByLabelText('Machine profile (approved version)'), 'v-approved');
    await user.click(screen.getByRole('button', { name: 'Prepare' }));
    // As on a field left empty (WCAG 2.1, 3.3.1 error identification): focus and description.
    await waitFor(() => expect(screen.getByLabelText('clear')).toHaveFocus());
    expect(screen.getByLabelText('clear')).toHaveAccessibleDescription('Choose at least one colour');
  });

  it('forgets the colour error of the last material when another material is chosen', async () => {
    const birch = { ...acrylic, id: 'm-birch', name: 'Birch plywood 3 mm', colours: ['natural'] };
    stubFetch({
      'GET /api/materials': () => json(200, { items: [acrylic, birch], total: 2, page: 1, pageSize: 100 }),
      'GET /api/machine-profiles': () => json(200, { items: [laser], total: 1, page: 1, pageSize: 100 }),
    });
    const { user } = renderWithProviders(
      <PrepareJobDialog open busy={false} error={null} onSubmit={vi.fn()} onClose={noop} />,
    );
    await screen.findByRole('option', { name: 'Birch plywood 3 mm' });
    await user.selectOptions(screen.getByLabelText('Material'), 'm-acrylic');
    await user.click(screen.getByRole('button', { name: 'Prepare' }));
    expect(await screen.findByText('Choose at least one colour')).toBeInTheDocument();
    await user.selectOptions(screen.getByLabelText('Material'), 'm-birch');
    expect(screen.queryByText('Choose at least one colour')).not.toBeInTheDocument();
  });

  it('ticks the colours the job lists already, where the chosen material stocks them', async () => {
    const birch = { ...acrylic, id: 'm-birch', name: 'Birch plywood 3 mm', colours: ['natural'] };
    stubFetch({
      'GET /api/materials': () => json(200, { items: [acrylic, birch], total: 2, page: 1, pageSize: 100 }),
      'GET /api/machine-profiles': () => json(200, { items: [laser], total: 1, page: 1, pageSize: 100 }),
    });
    const onSubmit = vi.fn();
    const { user } = renderWithProviders(
      <PrepareJobDialog
        open
        jobColours={['Amber', 'teal']}
        busy={false}
        error={null}
        onSubmit={onSubmit}
        onClose={noop}
      />,
    );
    await screen.findByRole('option', { name: 'Birch plywood 3 mm' });
    await user.selectOptions(screen.getByLabelText('Material'), 'm-acrylic');
    expect(screen.getByLabelText('amber')).toBeChecked();
    expect(screen.getByLabelText('clear')).not.toBeChecked();
    // A material without them ticks none; coming back ticks them again.
    await user.selectOptions(screen.getByLabelText('Material'), 'm-birch');
    expect(screen.getByLabelText('natural')).not.toBeChecked();
    await user.selectOptions(screen.getByLabelText('Material'), 'm-acrylic');
    expect(screen.getByLabelText('amber')).toBeChecked();

    await user.selectOptions(screen.getByLabelText('Machine profile (approved version)'), 'v-approved');
    await user.click(screen.getByRole('button', { name: 'Prepare' }));
    await waitFor(() => expect(onSubmit).toHaveBeenCalled());
    expect(onSubmit.mock.calls[0]?.[0]).toMatchObject({ materialId: 'm-acrylic', colours: ['amber'] });
  });

  it('offers the colours of stock as one labelled group', async () => {
    stubFetch({
      'GET /api/materials': () => json(200, { items: [acrylic], total: 1, page: 1, pageSize: 100 }),
      'GET /api/machine-profiles': () => json(200, { items: [laser], total: 1, page: 1, pageSize: 100 }),
    });
    const { user } = renderWithProviders(
      <PrepareJobDialog open busy={false} error={null} onSubmit={vi.fn()} onClose={noop} />,
    );
    await screen.findByRole('option', { name: 'Cast acrylic 3 mm' });
    await user.selectOptions(screen.getByLabelText('Material'), 'm-acrylic');
    const group = screen.getByRole('group', { name: 'Colours of stock' });
    expect(
      within(group)
        .getAllByRole('checkbox')
        .map((c) => c.closest('label')?.textContent),
    ).toEqual(['clear', 'amber']);
  });

  it('warns before preparing with fewer colours than the design was drawn in', async () => {
    const lamp = { ...acrylic, colours: ['clear', 'amber', 'teal'] };
    stubFetch({
      'GET /api/materials': () => json(200, { items: [lamp], total: 1, page: 1, pageSize: 100 }),
      'GET /api/machine-profiles': () => json(200, { items: [laser], total: 1, page: 1, pageSize: 100 }),
      'GET /api/designs/d-1': () =>
        json(200, {
          id: 'd-1',
          name: 'Cube lamp',
          // Drawn for 6 mm stock, which no material here keeps: the dialog starts with nothing chosen.
          spec: {
            stock: { thicknessMm: 6, sheet: { widthMm: 600, heightMm: 400 } },
            machine: { kind: 'laser', kerfMm: 0.2 },
            colours: { count: 3, rule: 'neighbour-distinct' },
          },
        }),
    });
    const onSubmit = vi.fn();
    const { user } = renderWithProviders(
      <PrepareJobDialog open designId="d-1" busy={false} error={null} onSubmit={onSubmit} onClose={noop} />,
    );
    await screen.findByRole('option', { name: 'Cast acrylic 3 mm' });
    await user.selectOptions(screen.getByLabelText('Material'), 'm-acrylic');
    await user.selectOptions(screen.getByLabelText('Machine profile (approved version)'), 'v-approved');
    // The job names no colours and the material stocks exactly three: all three come ticked.
    for (const c of ['clear', 'amber', 'teal']) expect(screen.getByLabelText(c)).toBeChecked();
    expect(screen.queryByTestId('prepare-colour-warning')).not.toBeInTheDocument();
    await user.click(screen.getByLabelText('teal'));
    expect(await screen.findByTestId('prepare-colour-warning')).toHaveTextContent(
      'The design uses 3 colours (Neighbours differ); with 2 colours its pieces are shared among fewer colours, and the rule may not be met.',
    );
    await user.click(screen.getByLabelText('clear'));
    expect(screen.getByTestId('prepare-colour-warning')).toHaveTextContent(
      'The design uses 3 colours (Neighbours differ); with 1 colour every piece is cut from the same stock.',
    );
    await user.click(screen.getByLabelText('teal'));
    await user.click(screen.getByLabelText('clear'));
    expect(screen.queryByTestId('prepare-colour-warning')).not.toBeInTheDocument();
  });

  describe("a first preparation starts from the design's stock", () => {
    const plywood6 = materialFixture({
      id: 'm-ply6',
      name: 'Birch plywood 6 mm',
      family: 'plywood',
      nominalThicknessMm: 6,
      colours: ['natural'],
    });
    const router = {
      ...laser,
      id: 'p-router',
      name: 'Bay router',
      kind: 'cnc-router',
      currentApproved: { ...laser.currentApproved, id: 'v-router', number: 1 },
    } as unknown as MachineProfileSummaryView;
    function stubDesign(spec: object, materials: MaterialView[], profiles: MachineProfileSummaryView[]) {
      stubFetch({
        'GET /api/materials': () =>
          json(200, { items: materials, total: materials.length, page: 1, pageSize: 100 }),
        'GET /api/machine-profiles': () =>
          json(200, { items: profiles, total: profiles.length, page: 1, pageSize: 100 }),
        'GET /api/designs/d-1': () => json(200, { id: 'd-1', name: 'Star lamp', spec }),
      });
    }

    it('chooses the one material that keeps its sheet (either way round) and thickness, its machine and rule', async () => {
      stubDesign(
        {
          stock: { thicknessMm: 3, sheet: { widthMm: 600, heightMm: 1000 } },
          machine: { kind: 'laser', kerfMm: 0.18 },
          colours: { count: 2, rule: 'vertex-distinct' },
        },
        [plywood6, acrylic],
        [laser, router, draftOnly],
      );
      const onSubmit = vi.fn();
      const { user } = renderWithProviders(
        <PrepareJobDialog
          open
          designId="d-1"
          jobColours={['amber', 'Clear']}
          busy={false}
          error={null}
          onSubmit={onSubmit}
          onClose={noop}
        />,
      );
      await waitFor(() =>
        expect(screen.getByLabelText('Machine profile (approved version)')).toHaveValue('v-approved'),
      );
      expect(screen.getByLabelText('Material')).toHaveValue('m-acrylic');
      expect(screen.getByLabelText('Sheet')).toHaveValue('1');
      expect(screen.getByLabelText('Colour rule')).toHaveValue('vertex-distinct');
      expect(screen.getByTestId('prepare-from-design')).toHaveTextContent(
        'Chosen from the design’s stock: Cast acrylic 3 mm, 1000 × 600 mm sheets, on CO2 laser. Check them before preparing.',
      );
      await user.click(screen.getByRole('button', { name: 'Prepare' }));
      await waitFor(() => expect(onSubmit).toHaveBeenCalled());
      expect(onSubmit.mock.calls[0]?.[0]).toEqual({
        materialId: 'm-acrylic',
        profileVersionId: 'v-approved',
        colours: ['clear', 'amber'],
        colourRule: 'vertex-distinct',
        sheet: { widthMm: 1000, heightMm: 600 },
      });
    });

    it('leaves the machine to choose when none of the design’s kind is approved for the material', async () => {
      stubDesign(
        {
          stock: { thicknessMm: 6, sheet: { widthMm: 400, heightMm: 600 } },
          machine: { kind: 'router', toolDiameterMm: 3.175 },
        },
        [plywood6, acrylic],
        // The laser holds settings for the plywood too, but the design was drawn for a router bit.
        [
          {
            ...laser,
            currentApproved: {
              ...laser.currentApproved,
              settings: [
                ...laser.currentApproved!.settings,
                { ...laser.currentApproved!.settings[0], materialId: 'm-ply6' },
              ],
            },
          } as MachineProfileSummaryView,
        ],
      );
      const { user } = renderWithProviders(
        <PrepareJobDialog open designId="d-1" busy={false} error={null} onSubmit={vi.fn()} onClose={noop} />,
      );
      expect(await screen.findByTestId('prepare-from-design')).toHaveTextContent(
        'Chosen from the design’s stock: Birch plywood 6 mm, 600 × 400 mm sheets. Check them before preparing.',
      );
      expect(screen.getByLabelText('Material')).toHaveValue('m-ply6');
      expect(screen.getByLabelText('Machine profile (approved version)')).toHaveValue('');
      // Another material chosen: the line no longer says what is chosen.
      await user.selectOptions(screen.getByLabelText('Material'), 'm-acrylic');
      expect(screen.queryByTestId('prepare-from-design')).not.toBeInTheDocument();
    });

    it('chooses nothing when two materials keep the stock and the colours asked do not tell them apart', async () => {
      const clearOnly = materialFixture({
        id: 'm-acrylic-b',
        name: 'Extruded acrylic 3 mm',
        colours: ['clear'],
      });
      stubDesign(
        {
          stock: { thicknessMm: 3, sheet: { widthMm: 600, heightMm: 400 } },
          machine: { kind: 'laser', kerfMm: 0.18 },
          colours: { count: 1, rule: 'opposite-match' },
        },
        [acrylic, clearOnly],
        [laser],
      );
      const { unmount } = renderWithProviders(
        <PrepareJobDialog
          open
          designId="d-1"
          jobColours={['clear']}
          busy={false}
          error={null}
          onSubmit={vi.fn()}
          onClose={noop}
        />,
      );
      await waitFor(() => expect(screen.getByLabelText('Colour rule')).toHaveValue('opposite-match'));
      expect(screen.getByLabelText('Material')).toHaveValue('');
      // It says why nothing is chosen.
      expect(screen.getByTestId('prepare-from-design')).toHaveTextContent(
        'Cast acrylic 3 mm, Extruded acrylic 3 mm all keep the design’s stock and stock the colours asked: choose one.',
      );
      unmount();

      // Amber is stocked by one of them only: that one.
      renderWithProviders(
        <PrepareJobDialog
          open
          designId="d-1"
          jobColours={['amber']}
          busy={false}
          error={null}
          onSubmit={vi.fn()}
          onClose={noop}
        />,
      );
      await waitFor(() => expect(screen.getByLabelText('Material')).toHaveValue('m-acrylic'));
    });

    it('ticks every colour of a material stocking as many as the design is drawn in, when the job names none', async () => {
      // A job requested from the studio names no colours; its design is drawn in 2 (a count, no names).
      const twoTone = materialFixture({ id: 'm-two', name: 'Felt 3 mm', colours: ['grey', 'mustard'] });
      const threeTone = materialFixture({
        id: 'm-three',
        name: 'Card 3 mm',
        colours: ['white', 'black', 'red'],
        stockSheets: [{ widthMm: 500, heightMm: 500, pricePerSheet: 2, currency: 'EUR' }],
      });
      stubDesign(
        {
          stock: { thicknessMm: 3, sheet: { widthMm: 600, heightMm: 400 } },
          machine: { kind: 'laser', kerfMm: 0.18 },
          colours: { count: 2, rule: 'opposite-match' },
        },
        [twoTone, threeTone],
        [laser],
      );
      const { user } = renderWithProviders(
        <PrepareJobDialog open designId="d-1" busy={false} error={null} onSubmit={vi.fn()} onClose={noop} />,
      );
      await waitFor(() => expect(screen.getByLabelText('Material')).toHaveValue('m-two'));
      expect(screen.getByLabelText('grey')).toBeChecked();
      expect(screen.getByLabelText('mustard')).toBeChecked();
      // Three colours for a two-colour design: which two is the fabricator's choice.
      await user.selectOptions(screen.getByLabelText('Material'), 'm-three');
      for (const c of ['white', 'black', 'red']) expect(screen.getByLabelText(c)).not.toBeChecked();
    });

    it('ticks the colours the design names when the job names none', async () => {
      const threeTone = materialFixture({
        id: 'm-three',
        name: 'Card 3 mm',
        colours: ['White', 'black', 'red'],
      });
      stubDesign(
        {
          stock: { thicknessMm: 3, sheet: { widthMm: 600, heightMm: 400 } },
          machine: { kind: 'laser', kerfMm: 0.18 },
          colours: { names: ['white', 'red'], rule: 'opposite-match' },
        },
        [threeTone],
        [laser],
      );
      renderWithProviders(
        <PrepareJobDialog open designId="d-1" busy={false} error={null} onSubmit={vi.fn()} onClose={noop} />,
      );
      await waitFor(() => expect(screen.getByLabelText('Material')).toHaveValue('m-three'));
      expect(screen.getByLabelText('White')).toBeChecked();
      expect(screen.getByLabelText('red')).toBeChecked();
      expect(screen.getByLabelText('black')).not.toBeChecked();
    });

    it('says so when no material keeps the stock the design was drawn for, in the unit asked', async () => {
      // 1/4 in (6.35 mm) stock in 24 × 12 in sheets; only 3 and 6 mm materials are listed.
      stubDesign(
        {
          stock: { thicknessMm: 6.35, sheet: { widthMm: 609.6, heightMm: 304.8 } },
          machine: { kind: 'laser', kerfMm: 0.18 },
        },
        [acrylic, plywood6],
        [laser],
      );
      renderWithProviders(
        <PrepareJobDialog
          open
          designId="d-1"
          unit="in"
          busy={false}
          error={null}
          onSubmit={vi.fn()}
          onClose={noop}
        />,
      );
      expect(await screen.findByTestId('prepare-from-design')).toHaveTextContent(
        'No material on the list is 0.250 in stock in 24.000 × 12.000 in sheets that may be cut on a laser, as ' +
          'the design was drawn for: choose a material. Its slots keep the widths drawn for that thickness.',
      );
      expect(screen.getByLabelText('Material')).toHaveValue('');
    });
  });
});
