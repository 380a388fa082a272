import { type MaterialView } from '@kerfwright/contracts';
import { act, screen, waitFor, within } from '@testing-library/react';
import { type ComponentProps, useState } from 'react';
import { describe, expect, it, vi } from 'vitest';
import { renderWithProviders } from '../../../testing/render-app';
import { KerfRecordDialog } from './kerf-record-dialog';
import { ProfileFormDialog } from './profile-form-dialog';
import { EMPTY_PROFILE, EMPTY_SETTING, toVersionContent } from './profile-form-schema';

const material = (id: string, name: string, laserAllowed: boolean): MaterialView => ({
  id,
  name,
  family: laserAllowed ? 'plywood' : 'pvc',
  nominalThicknessMm: 3,
  measuredThicknessMm: null,
  flexible: false,
  colours: [],
  stockSheets: [],
  laserAllowed,
  hazardNote: laserAllowed ? '' : 'Chlorinated plastic.',
  notes: '',
  version: 1,
  createdAt: '2026-01-01T00:00:00.000Z',
  updatedAt: '2026-01-01T00:00:00.000Z',
});
const birch = material('m-birch', 'Birch plywood 3 mm', true);
const pvc = material('m-pvc', 'Expanded PVC 3 mm', false);
const acrylic = material('m-acrylic', 'Cast acrylic 3 mm', true);
const noop = () => undefined;
/** A material's row, whatever material it names ("Material setting 1: Birch plywood 3 mm"). */
const row = (n: number) => new RegExp(`^Material setting ${n}:`);

/** The form, by default a new profile in millimetres offering birch and PVC. */
function renderForm(
  onSubmit = vi.fn(),
  {
    mode = 'create',
    unit = 'mm',
    initial = EMPTY_PROFILE,
    materials = [birch, pvc],
  }: Partial<Pick<ComponentProps<typeof ProfileFormDialog>, 'mode' | 'unit' | 'initial' | 'materials'>> = {},
) {
  const utils = renderWithProviders(
    <ProfileFormDialog
      open
      mode={mode}
      unit={unit}
      initial={initial}
      materials={materials}
      busy={false}
      error={null}
      onSubmit={onSubmit}
      onClose={noop}
    />,
  );
  return { ...utils, onSubmit };
}

async function fillMachine(user: ReturnType<typeof renderForm>['user']) {
  await user.type(screen.getByLabelText('Profile name'), 'Bay 3 laser');
  await user.type(screen.getByLabelText('Bed width (mm)'), '600');
  await user.type(screen.getByLabelText('Bed height (mm)'), '400');
  await user.type(screen.getByLabelText('Rapid speed (mm/s)'), '300');
  await user.type(screen.getByLabelText('Hourly rate'), '20');
}

describe('machine profile form', () => {
  it('names every missing value at the first try, kerf and power included for a laser', async () => {
    const { user, onSubmit } = renderForm();
    await user.click(await screen.findByRole('button', { name: 'Create as draft' }));
    expect(await screen.findByText('Give the profile a name')).toBeInTheDocument();
    expect(screen.getByText('Enter the bed width')).toBeInTheDocument();
    expect(screen.getByText('Choose a material')).toBeInTheDocument();
    expect(screen.getByText('Enter the kerf')).toBeInTheDocument();
    expect(screen.getByText('Enter the power')).toBeInTheDocument();
    expect(screen.getByText('Enter the cut speed')).toBeInTheDocument();
    expect(onSubmit).not.toHaveBeenCalled();
  });

  it('keeps a laser kerf within what a beam removes and refuses materials kept off the laser', async () => {
    const { user, onSubmit } = renderForm();
    await fillMachine(user);
    const setting = screen.getByRole('group', { name: row(1) });
    // The PVC option is disabled for a laser; choosing it anyway (as a stale form could) is refused too.
    expect(
      within(setting).getByRole('option', { name: 'Expanded PVC 3 mm (not for lasers)' }),
    ).toBeDisabled();
    await user.selectOptions(within(setting).getByLabelText('Material'), 'm-birch');
    // 0.2 mm is a usual CO2-laser kerf in 3 mm plywood (common practice); 3 mm is out of the API's 0.01–2 mm.
    await user.type(within(setting).getByLabelText('Kerf (mm)'), '3');
    await user.type(within(setting).getByLabelText('Cut speed (mm/s)'), '15');
    await user.type(within(setting).getByLabelText('Mark speed (mm/s)'), '250');
    await user.type(within(setting).getByLabelText('Power (%)'), '140');
    await user.click(screen.getByRole('button', { name: 'Create as draft' }));
    expect(await screen.findByText('Between 0.01 and 2 mm')).toBeInTheDocument();
    expect(screen.getByText('Between 1 and 100 %')).toBeInTheDocument();

    await user.clear(within(setting).getByLabelText('Kerf (mm)'));
    await user.type(within(setting).getByLabelText('Kerf (mm)'), '0.2');
    await user.clear(within(setting).getByLabelText('Power (%)'));
    await user.type(within(setting).getByLabelText('Power (%)'), '70');
    await user.click(screen.getByRole('button', { name: 'Create as draft' }));
    await waitFor(() => expect(onSubmit).toHaveBeenCalled());
    expect(toVersionContent(onSubmit.mock.calls[0]![0])).toEqual({
      bedWidthMm: 600,
      bedHeightMm: 400,
      rapidSpeedMmS: 300,
      hourlyRate: 20,
      currency: 'EUR',
      notes: '',
      settings: [
        {
          materialId: 'm-birch',
          kerfMm: 0.2,
          cutSpeedMmS: 15,
          markSpeedMmS: 250,
          powerPct: 70,
          passes: 1,
          pierceTimeS: 0,
        },
      ],
    });
  });

  it('takes a currency code typed in lower case, in capitals', async () => {
    const { user, onSubmit } = renderForm();
    await fillMachine(user);
    const currency = screen.getByLabelText<HTMLInputElement>('Currency');
    await user.clear(currency);
    await user.type(currency, 'usd');
    expect(currency.value).toBe('USD');
    const setting = screen.getByRole('group', { name: row(1) });
    await user.selectOptions(within(setting).getByLabelText('Material'), 'm-birch');
    await user.type(within(setting).getByLabelText('Kerf (mm)'), '0.2');
    await user.type(within(setting).getByLabelText('Cut speed (mm/s)'), '15');
    await user.type(within(setting).getByLabelText('Mark speed (mm/s)'), '250');
    await user.type(within(setting).getByLabelText('Power (%)'), '70');
    await user.click(screen.getByRole('button', { name: 'Create as draft' }));
    await waitFor(() => expect(onSubmit).toHaveBeenCalled());
    expect(toVersionContent(onSubmit.mock.calls[0]![0]).currency).toBe('USD');
  });

  it('asks a router for a tool diameter instead of a kerf, and a material only once', async () => {
    const { user, onSubmit } = renderForm();
    await fillMachine(user);
    await user.selectOptions(screen.getByLabelText('Kind of machine'), 'cnc-router');
    await user.click(screen.getByRole('button', { name: 'Add a material' }));
    for (const n of [1, 2]) {
      const setting = screen.getByRole('group', { name: row(n) });
      expect(within(setting).queryByLabelText('Kerf (mm)')).not.toBeInTheDocument();
      await user.selectOptions(within(setting).getByLabelText('Material'), 'm-birch');
      await user.type(within(setting).getByLabelText('Cut speed (mm/s)'), '20');
      await user.type(within(setting).getByLabelText('Mark speed (mm/s)'), '20');
    }
    await user.click(screen.getByRole('button', { name: 'Create as draft' }));
    expect(await screen.findAllByText('Enter the tool diameter')).toHaveLength(2);
    expect(screen.getByText('This material already has settings')).toBeInTheDocument();

    await user.click(screen.getByRole('button', { name: /^Remove material setting 2\b/ }));
    const setting = screen.getByRole('group', { name: row(1) });
    // A 3.175 mm (1/8 in) end mill is a common router bit for 3 mm sheet (common practice).
    await user.type(within(setting).getByLabelText('Tool diameter (mm)'), '3.175');
    await user.type(within(setting).getByLabelText('Spindle (rpm, optional)'), '18000');
    await user.click(screen.getByRole('button', { name: 'Create as draft' }));
    await waitFor(() => expect(onSubmit).toHaveBeenCalled());
    const content = toVersionContent(onSubmit.mock.calls[0]![0]);
    expect(content.settings[0]).toEqual({
      materialId: 'm-birch',
      toolDiameterMm: 3.175,
      spindleRpm: 18000,
      cutSpeedMmS: 20,
      markSpeedMmS: 20,
      passes: 1,
      pierceTimeS: 0,
    });
  });
});

describe('rows of settings per material', () => {
  it('names each row by its material, so a screen reader tells the rows apart', async () => {
    const { user } = renderForm();
    await user.click(screen.getByRole('button', { name: 'Add a material' }));
    const first = screen.getByRole('group', { name: 'Material setting 1: no material chosen yet' });
    const second = screen.getByRole('group', { name: 'Material setting 2: no material chosen yet' });
    await user.selectOptions(within(first).getByLabelText('Material'), 'm-birch');
    expect(first).toHaveAccessibleName('Material setting 1: Birch plywood 3 mm');
    expect(second).toHaveAccessibleName('Material setting 2: no material chosen yet');
    expect(
      within(first).getByRole('button', { name: 'Remove material setting 1: Birch plywood 3 mm' }),
    ).toBeInTheDocument();
  });

  it('gives every value a column wide enough for its whole label, at most three to a row', () => {
    renderForm();
    const values = within(screen.getByRole('group', { name: row(1) })).getByTestId('setting-values');
    // 12.5rem (200 px) holds "Spindle (rpm, optional)", the longest label, and the input's padding; eight
    // columns in the dialog's width gave "Mark speed (mm/s)" some 127 px, and cut it short.
    expect(getComputedStyle(values).gridTemplateColumns).toBe(
      'repeat(auto-fill, minmax(min(100%, max(12.5rem, calc((100% - 16px) / 3))), 1fr))',
    );
    expect(within(values).getByLabelText('Mark speed (mm/s)')).toBeInTheDocument();
  });
});

describe('changing a draft', () => {
  /** The page's materials come from their own request, which answers after the dialog has opened. */
  // One object for the life of the dialog, as the page keeps it (a new one would reset the form).
  const draft = {
    ...EMPTY_PROFILE,
    name: 'Bay 3 laser',
    settings: [
      { ...EMPTY_SETTING, materialId: 'm-birch', kerfMm: 0.2, cutSpeedMmS: 15, powerPct: 70 },
      { ...EMPTY_SETTING, materialId: 'm-acrylic', kerfMm: 0.16, cutSpeedMmS: 12, powerPct: 65 },
    ],
  };
  let deliver: (materials: MaterialView[]) => void = noop;
  function LateMaterials() {
    const [materials, setMaterials] = useState<MaterialView[]>();
    deliver = setMaterials;
    return (
      <ProfileFormDialog
        open
        mode="edit-draft"
        unit="mm"
        initial={draft}
        materials={materials}
        busy={false}
        error={null}
        onSubmit={noop}
        onClose={noop}
      />
    );
  }

  it('shows each row with its material when the materials arrive after the form opened', async () => {
    renderWithProviders(<LateMaterials />);
    expect(await screen.findByText('Loading the materials…')).toBeInTheDocument();
    act(() => deliver([acrylic, birch, pvc]));
    const first = await screen.findByRole('group', { name: row(1) });
    expect(within(first).getByLabelText('Material')).toHaveDisplayValue('Birch plywood 3 mm');
    expect(within(first).getByLabelText('Kerf (mm)')).toHaveValue(0.2);
    const second = screen.getByRole('group', { name: row(2) });
    expect(within(second).getByLabelText('Material')).toHaveDisplayValue('Cast acrylic 3 mm');
    expect(screen.queryByText('Loading the materials…')).not.toBeInTheDocument();
  });
});

describe('measured kerf form', () => {
  it('keeps the laser values typed when the kind is switched to a router and back', async () => {
    const { user } = renderForm();
    const setting = screen.getByRole('group', { name: row(1) });
    await user.type(within(setting).getByLabelText('Kerf (mm)'), '0.2');
    await user.type(within(setting).getByLabelText('Power (%)'), '80');
    await user.selectOptions(screen.getByLabelText('Kind of machine'), 'cnc-router');
    await user.type(within(setting).getByLabelText('Tool diameter (mm)'), '6');
    await user.type(within(setting).getByLabelText('Spindle (rpm, optional)'), '18000');
    await user.selectOptions(screen.getByLabelText('Kind of machine'), 'co2-laser');
    expect(within(setting).getByLabelText('Kerf (mm)')).toHaveValue(0.2);
    expect(within(setting).getByLabelText('Power (%)')).toHaveValue(80);
    await user.selectOptions(screen.getByLabelText('Kind of machine'), 'cnc-router');
    expect(within(setting).getByLabelText('Tool diameter (mm)')).toHaveValue(6);
    expect(within(setting).getByLabelText('Spindle (rpm, optional)')).toHaveValue(18000);
  });

  it('needs a value in the range of the machine kind', async () => {
    const onSubmit = vi.fn();
    const { user } = renderWithProviders(
      <KerfRecordDialog
        open
        kind="co2-laser"
        unit="mm"
        materials={[birch]}
        defaultMaterialId="m-birch"
        busy={false}
        error={null}
        onSubmit={onSubmit}
        onClose={noop}
      />,
    );
    await user.click(await screen.findByRole('button', { name: 'Record' }));
    expect(await screen.findByText('Enter the measured kerf')).toBeInTheDocument();
    await user.type(screen.getByLabelText('Measured kerf (mm)'), '2.5');
    await user.click(screen.getByRole('button', { name: 'Record' }));
    expect(await screen.findByText('At most 2 mm')).toBeInTheDocument();
    await user.clear(screen.getByLabelText('Measured kerf (mm)'));
    await user.type(screen.getByLabelText('Measured kerf (mm)'), '0.17');
    await user.click(screen.getByRole('button', { name: 'Record' }));
    await waitFor(() =>
      expect(onSubmit).toHaveBeenCalledWith({ materialId: 'm-birch', kerfMm: 0.17, notes: '' }),
    );
  });
});

// 1 in = 25.4 mm exactly (international yard and pound agreement, 1959).
describe('the profile forms in inches', () => {
  it('shows a version in inches and saves what is typed in millimetres', async () => {
    const onSubmit = vi.fn();
    const version = {
      ...EMPTY_PROFILE,
      name: 'Bay 3 laser',
      bedWidthMm: 609.6,
      bedHeightMm: 406.4,
      rapidSpeedMmS: 254,
      hourlyRate: 20,
      settings: [
        { ...EMPTY_SETTING, materialId: 'm-birch', kerfMm: 0.2032, cutSpeedMmS: 12.7, powerPct: 70 },
      ],
    };
    const { user } = renderForm(onSubmit, {
      mode: 'edit-draft',
      unit: 'in',
      initial: version,
      materials: [birch],
    });
    const setting = await screen.findByRole('group', { name: row(1) });
    expect(screen.getByLabelText('Bed width (in)')).toHaveValue(24);
    expect(screen.getByLabelText('Bed height (in)')).toHaveValue(16);
    expect(screen.getByLabelText('Rapid speed (in/s)')).toHaveValue(10);
    expect(within(setting).getByLabelText('Kerf (in)')).toHaveValue(0.008);
    expect(within(setting).getByLabelText('Cut speed (in/s)')).toHaveValue(0.5);
    expect(screen.queryByLabelText(/\(mm/)).not.toBeInTheDocument();

    await user.clear(screen.getByLabelText('Bed width (in)'));
    await user.type(screen.getByLabelText('Bed width (in)'), '48');
    await user.clear(within(setting).getByLabelText('Mark speed (in/s)'));
    await user.type(within(setting).getByLabelText('Mark speed (in/s)'), '4');
    await user.click(screen.getByRole('button', { name: 'Save the draft' }));
    await waitFor(() => expect(onSubmit).toHaveBeenCalledTimes(1));
    const saved = toVersionContent(onSubmit.mock.calls[0]![0]);
    expect(saved).toMatchObject({ bedWidthMm: 1219.2, bedHeightMm: 406.4, rapidSpeedMmS: 254 });
    expect(saved.settings[0]).toMatchObject({ kerfMm: 0.2032, cutSpeedMmS: 12.7, markSpeedMmS: 101.6 });
  });

  it('shows a kerf in inches to the decimals that, typed back as shown, keep the kerf', async () => {
    const onSubmit = vi.fn();
    const version = {
      ...EMPTY_PROFILE,
      name: 'Bay 3 laser',
      bedWidthMm: 600,
      bedHeightMm: 400,
      rapidSpeedMmS: 300,
      hourlyRate: 20,
      settings: [
        {
          ...EMPTY_SETTING,
          materialId: 'm-birch',
          kerfMm: 0.08,
          cutSpeedMmS: 12,
          markSpeedMmS: 100,
          powerPct: 70,
        },
      ],
    };
    const { user } = renderForm(onSubmit, {
      mode: 'edit-draft',
      unit: 'in',
      initial: version,
      materials: [birch],
    });
    const setting = await screen.findByRole('group', { name: row(1) });
    const kerf = within(setting).getByLabelText('Kerf (in)');
    // 0.08 mm = 0.0031496 in (1 in = 25.4 mm exactly).
    expect(kerf).toHaveValue(0.00315);
    await user.clear(kerf);
    await user.type(kerf, '0.00315');
    await user.click(screen.getByRole('button', { name: 'Save the draft' }));
    await waitFor(() => expect(onSubmit).toHaveBeenCalledTimes(1));
    const saved = toVersionContent(onSubmit.mock.calls[0]![0]);
    expect(Math.abs(saved.settings[0]!.kerfMm! - 0.08)).toBeLessThanOrEqual(0.0005);
  });

  it('gives the limits of a speed in inches per second', async () => {
    const { user } = renderForm(vi.fn(), { unit: 'in', materials: [birch] });
    await user.type(screen.getByLabelText('Rapid speed (in/s)'), '100000');
    await user.click(screen.getByRole('button', { name: 'Create as draft' }));
    expect(await screen.findByText(/^At most [\d.]+ in\/s$/)).toBeInTheDocument();
  });

  it('records a measured kerf typed in inches as millimetres', async () => {
    const onSubmit = vi.fn();
    const { user } = renderWithProviders(
      <KerfRecordDialog
        open
        kind="co2-laser"
        unit="in"
        materials={[birch]}
        defaultMaterialId="m-birch"
        busy={false}
        error={null}
        onSubmit={onSubmit}
        onClose={noop}
      />,
    );
    await user.type(await screen.findByLabelText('Measured kerf (in)'), '0.0065');
    await user.click(screen.getByRole('button', { name: 'Record' }));
    await waitFor(() =>
      expect(onSubmit).toHaveBeenCalledWith({ materialId: 'm-birch', kerfMm: 0.1651, notes: '' }),
    );
  });
});
