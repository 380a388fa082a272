import { type MaterialHazard, type MaterialView } from '@kerfwright/contracts';
import { screen, waitFor, within } from '@testing-library/react';
import { describe, expect, it, vi } from 'vitest';
import { json, stubFetch } from '../../../testing/fetch-stub';
import { userFixture } from '../../../testing/fixtures';
import { renderApp, renderWithProviders } from '../../../testing/render-app';
import { stubScreenWidth } from '../../../testing/screen-width';
import { MaterialFormDialog } from './material-form-dialog';
import { toMaterialRequest } from './material-form-schema';
import { type LengthUnit } from '../../../lib/units';
import { materialFixture } from '../../../testing/fixtures';

// Rows in the spirit of published laser-safety material lists: PVC gives off hydrogen chloride and never goes
// on a laser; plywood may (common practice).
const hazards: MaterialHazard[] = [
  {
    family: 'pvc',
    examples: ['PVC'],
    laser: 'no',
    hazard: 'Gives off hydrogen chloride.',
    source: 'common practice',
  },
  { family: 'plywood', examples: ['plywood'], laser: 'yes', hazard: 'Soot.', source: 'common practice' },
];

const noop = () => undefined;

function renderDialog(
  onSubmit = vi.fn(),
  material: MaterialView | null = null,
  canLiftLaserRestriction = false,
  unit: LengthUnit = 'mm',
) {
  const utils = renderWithProviders(
    <MaterialFormDialog
      open
      unit={unit}
      material={material}
      canLiftLaserRestriction={canLiftLaserRestriction}
      hazards={hazards}
      busy={false}
      error={null}
      onSubmit={onSubmit}
      onClose={noop}
    />,
  );
  return { ...utils, onSubmit };
}

describe('material form', () => {
  it('names every missing value, with the limits the API checks (MATERIAL_LIMITS)', async () => {
    const { user, onSubmit } = renderDialog();
    await user.click(await screen.findByRole('button', { name: 'Add the material' }));
    expect(await screen.findByText('Give the material a name')).toBeInTheDocument();
    expect(screen.getByText('Enter the nominal thickness in mm')).toBeInTheDocument();
    expect(screen.getByText('Enter the width in mm')).toBeInTheDocument();
    expect(screen.getByText('Enter the price per sheet')).toBeInTheDocument();
    // Commas and spaces alone name no colour, and a job must be cut from one of the material's colours.
    await user.type(screen.getByLabelText('Colours offered'), ' , ,');
    await user.click(screen.getByRole('button', { name: 'Add the material' }));
    expect(
      await screen.findByText('Give at least one colour (for undyed stock, say “natural”)'),
    ).toBeInTheDocument();
    await user.clear(screen.getByLabelText('Colours offered'));

    await user.type(screen.getByLabelText('Nominal thickness (mm)'), '60');
    await user.clear(screen.getByLabelText('Currency'));
    await user.type(screen.getByLabelText('Currency'), 'eu');
    await user.type(screen.getByLabelText('Colours offered'), 'black, Black');
    await user.click(screen.getByRole('button', { name: 'Add the material' }));
    expect(await screen.findByText('At most 50 mm')).toBeInTheDocument();
    expect(screen.getByText('A three-letter currency code such as EUR')).toBeInTheDocument();
    expect(screen.getByText('Name each colour once')).toBeInTheDocument();
    expect(onSubmit).not.toHaveBeenCalled();
  });

  it('refuses a family the hazard table keeps off the laser, and unticks laser use', async () => {
    const { user } = renderDialog();
    const laser = await screen.findByLabelText('May be cut on a laser');
    expect(laser).toBeChecked();
    await user.selectOptions(screen.getByLabelText('Family'), 'pvc');
    expect(await screen.findByTestId('family-refused')).toHaveTextContent('must not be cut on a laser');
    await waitFor(() => expect(laser).not.toBeChecked());
    expect(laser).toBeDisabled();
  });

  it('needs a reason when a permitted material is kept off the laser', async () => {
    const { user, onSubmit } = renderDialog();
    await user.type(await screen.findByLabelText('Name'), 'Birch plywood 6 mm');
    await user.type(screen.getByLabelText('Nominal thickness (mm)'), '6');
    await user.type(screen.getByLabelText('Colours offered'), 'natural');
    await user.click(screen.getByRole('button', { name: 'Remove sheet size 1' }));
    await user.click(screen.getByLabelText('May be cut on a laser'));
    await user.click(screen.getByRole('button', { name: 'Add the material' }));
    expect(await screen.findByText('Say why the material is kept off the laser')).toBeInTheDocument();
    await user.type(screen.getByLabelText('Why it is kept off the laser'), 'Too thick for our tube');
    await user.click(screen.getByRole('button', { name: 'Add the material' }));
    await waitFor(() => expect(onSubmit).toHaveBeenCalled());
    expect(toMaterialRequest(onSubmit.mock.calls[0]![0])).toEqual({
      name: 'Birch plywood 6 mm',
      family: 'plywood',
      nominalThicknessMm: 6,
      measuredThicknessMm: null,
      flexible: false,
      colours: ['natural'],
      stockSheets: [],
      laserAllowed: false,
      hazardNote: 'Too thick for our tube',
      notes: '',
    });
  });
});

describe('material form, currency', () => {
  it('takes a currency code typed in lower case, in capitals', async () => {
    const { user, onSubmit } = renderDialog();
    await user.type(await screen.findByLabelText('Name'), 'Birch plywood 6 mm');
    await user.type(screen.getByLabelText('Nominal thickness (mm)'), '6');
    await user.type(screen.getByLabelText('Colours offered'), 'natural');
    await user.type(screen.getByLabelText('Width (mm)'), '600');
    await user.type(screen.getByLabelText('Height (mm)'), '400');
    await user.type(screen.getByLabelText('Price per sheet'), '9.5');
    const currency = screen.getByLabelText<HTMLInputElement>('Currency');
    await user.clear(currency);
    await user.type(currency, 'usd');
    expect(currency.value).toBe('USD');
    await user.click(screen.getByRole('button', { name: 'Add the material' }));
    await waitFor(() => expect(onSubmit).toHaveBeenCalled());
    expect(screen.queryByText('A three-letter currency code such as EUR')).not.toBeInTheDocument();
    expect(toMaterialRequest(onSubmit.mock.calls[0]![0]).stockSheets).toEqual([
      { widthMm: 600, heightMm: 400, pricePerSheet: 9.5, currency: 'USD' },
    ]);
  });
});

// 1 in = 25.4 mm exactly (international yard and pound agreement, 1959).
describe('the material form in inches', () => {
  it('shows a material in inches and saves what is typed in millimetres', async () => {
    const { user, onSubmit } = renderDialog(
      vi.fn(),
      materialFixture({
        nominalThicknessMm: 3.175,
        stockSheets: [{ widthMm: 609.6, heightMm: 406.4, pricePerSheet: 14.5, currency: 'EUR' }],
      }),
      false,
      'in',
    );
    expect(await screen.findByLabelText('Nominal thickness (in)')).toHaveValue(0.125);
    expect(screen.getByLabelText('Width (in)')).toHaveValue(24);
    expect(screen.getByLabelText('Height (in)')).toHaveValue(16);
    expect(screen.queryByLabelText(/\(mm/)).not.toBeInTheDocument();
    await user.type(screen.getByLabelText('Measured thickness (in, optional)'), '0.12');
    await user.clear(screen.getByLabelText('Height (in)'));
    await user.type(screen.getByLabelText('Height (in)'), '12');
    await user.click(screen.getByRole('button', { name: 'Save changes' }));
    await waitFor(() => expect(onSubmit).toHaveBeenCalled());
    const sent = toMaterialRequest(onSubmit.mock.calls[0]![0]);
    expect(sent).toMatchObject({ nominalThicknessMm: 3.175, measuredThicknessMm: 3.048 });
    expect(sent.stockSheets).toEqual([
      { widthMm: 609.6, heightMm: 304.8, pricePerSheet: 14.5, currency: 'EUR' },
    ]);
  });
});

describe('a material kept off the laser', () => {
  const keptOff: MaterialView = {
    id: 'm-mdf',
    name: 'Brown board 3 mm',
    family: 'plywood',
    nominalThicknessMm: 3,
    measuredThicknessMm: null,
    flexible: false,
    colours: ['brown'],
    stockSheets: [{ widthMm: 600, heightMm: 400, pricePerSheet: 3, currency: 'EUR' }],
    laserAllowed: false,
    hazardNote: 'Binder unknown',
    notes: '',
    version: 2,
    createdAt: '2026-01-01T00:00:00.000Z',
    updatedAt: '2026-01-01T00:00:00.000Z',
  };

  it('keeps a fabricator from moving PVC out of its refused family; a supervisor may', async () => {
    const pvc: MaterialView = { ...keptOff, id: 'm-pvc', name: 'Grey board', family: 'pvc' };
    const onSubmit = vi.fn();
    const locked = renderDialog(onSubmit, pvc, false);
    expect(await screen.findByLabelText('Family')).toBeDisabled();
    expect(
      screen.getByText('Only a supervisor moves a material out of a refused family'),
    ).toBeInTheDocument();
    // Other changes are still saved, with the family as it was.
    await locked.user.type(screen.getByLabelText('Notes'), 'Second batch');
    await locked.user.click(screen.getByRole('button', { name: 'Save changes' }));
    await waitFor(() => expect(onSubmit).toHaveBeenCalled());
    expect(onSubmit.mock.calls[0]![0]).toMatchObject({ family: 'pvc', notes: 'Second batch' });
    locked.unmount();
    renderDialog(vi.fn(), pvc, true);
    expect(await screen.findByLabelText('Family')).toBeEnabled();
  });

  it('stays off for a fabricator, who is told a supervisor decides; a supervisor may tick it', async () => {
    const locked = renderDialog(vi.fn(), keptOff, false);
    const box = await screen.findByRole('checkbox', { name: 'May be cut on a laser' });
    expect(box).toBeDisabled();
    expect(screen.getByTestId('laser-locked')).toHaveTextContent('only a supervisor');
    locked.unmount();
    const { user } = renderDialog(vi.fn(), keptOff, true);
    const allowed = await screen.findByRole('checkbox', { name: 'May be cut on a laser' });
    expect(allowed).toBeEnabled();
    expect(screen.queryByTestId('laser-locked')).toBeNull();
    // Ticked: the reason it was kept off is cleared from the note.
    expect(screen.getByLabelText('Why it is kept off the laser')).toHaveValue('Binder unknown');
    await user.click(allowed);
    expect(screen.getByLabelText('Hazard note')).toHaveValue('');
  });
});

describe('Materials page (fabricator)', () => {
  const fabricator = userFixture('fabricator');
  const pvc: MaterialView = {
    id: 'm-pvc',
    name: 'Expanded PVC 3 mm',
    family: 'pvc',
    nominalThicknessMm: 3,
    measuredThicknessMm: null,
    flexible: false,
    colours: ['white'],
    stockSheets: [{ widthMm: 600, heightMm: 400, pricePerSheet: 4.9, currency: 'EUR' }],
    laserAllowed: false,
    hazardNote: 'Chlorinated plastic: never on a laser.',
    notes: '',
    version: 1,
    createdAt: '2026-01-01T00:00:00.000Z',
    updatedAt: '2026-01-01T00:00:00.000Z',
  };

  it('shows the condition a laser cuts a material on beside "Allowed"', async () => {
    // The hazard table's condition on felt (safety/material-hazards.json), kept as the material's note.
    const felt: MaterialView = {
      ...pvc,
      id: 'm-felt',
      name: 'Wool felt 2 mm',
      family: 'felt',
      flexible: true,
      laserAllowed: true,
      hazardNote:
        "Laser only when: The fibre content is known from the supplier's data sheet and the felt has no adhesive backing.",
    };
    stubFetch({
      'GET /api/auth/me': () => json(200, fabricator),
      'GET /api/safety/hazards': () => json(200, hazards),
      'GET /api/materials': () => json(200, { items: [felt], total: 1, page: 1, pageSize: 25 }),
    });
    renderApp('/materials', { token: 't' });
    const row = await screen.findByTestId('material-Wool felt 2 mm');
    expect(within(row).getByText('Allowed')).toBeInTheDocument();
    expect(within(row).getByTestId('laser-note')).toHaveTextContent(
      /^Laser only when: The fibre content is known/,
    );
  });

  it('keeps the list inside a phone (390 px): thickness under the name, no Family, Colours or Thickness column', async () => {
    stubScreenWidth(390);
    try {
      stubFetch({
        'GET /api/auth/me': () => json(200, fabricator),
        'GET /api/safety/hazards': () => json(200, hazards),
        'GET /api/materials': () => json(200, { items: [pvc], total: 1, page: 1, pageSize: 25 }),
      });
      renderApp('/materials', { token: 't' });
      const row = await screen.findByTestId('material-Expanded PVC 3 mm');
      for (const name of ['Family', 'Colours', 'Thickness', 'Stock sheets'])
        expect(screen.queryByRole('columnheader', { name })).not.toBeInTheDocument();
      expect(within(row).getAllByRole('cell')[0]).toHaveTextContent(`${pvc.nominalThicknessMm} mm`);
      expect(within(row).getByTestId('laser-refusal-reason')).toHaveTextContent('never on a laser');
    } finally {
      vi.unstubAllGlobals();
    }
  });

  it('lists prohibited materials with their reason, sorts through the API and sends a new material', async () => {
    const { calls } = stubFetch({
      'GET /api/auth/me': () => json(200, fabricator),
      'GET /api/safety/hazards': () => json(200, hazards),
      'GET /api/materials': () => json(200, { items: [pvc], total: 1, page: 1, pageSize: 25 }),
      'POST /api/materials': (call) => json(201, { ...pvc, ...(call.body as object), id: 'm-new' }),
    });
    const { user } = renderApp('/materials', { token: 't' });
    const row = await screen.findByTestId('material-Expanded PVC 3 mm');
    expect(within(row).getByText('Not for lasers')).toBeInTheDocument();
    expect(within(row).getByTestId('laser-refusal-reason')).toHaveTextContent('never on a laser');

    await user.click(screen.getByRole('button', { name: 'Thickness' }));
    await waitFor(() => expect(calls.at(-1)?.url.searchParams.get('sort')).toBe('nominalThicknessMm'));

    await user.click(screen.getByRole('button', { name: 'Add a material' }));
    const dialog = await screen.findByRole('dialog', { name: 'Add a material' });
    await user.type(within(dialog).getByLabelText('Name'), 'Poplar plywood 4 mm');
    await user.type(within(dialog).getByLabelText('Nominal thickness (mm)'), '4');
    await user.type(within(dialog).getByLabelText('Colours offered'), 'natural, white');
    await user.type(within(dialog).getByLabelText('Width (mm)'), '600');
    await user.type(within(dialog).getByLabelText('Height (mm)'), '400');
    await user.type(within(dialog).getByLabelText('Price per sheet'), '7.4');
    await user.click(within(dialog).getByRole('button', { name: 'Add the material' }));
    await waitFor(() => expect(calls.some((c) => c.method === 'POST')).toBe(true));
    expect(calls.find((c) => c.method === 'POST')?.body).toMatchObject({
      name: 'Poplar plywood 4 mm',
      family: 'plywood',
      nominalThicknessMm: 4,
      colours: ['natural', 'white'],
      stockSheets: [{ widthMm: 600, heightMm: 400, pricePerSheet: 7.4, currency: 'EUR' }],
      laserAllowed: true,
    });
  });

  it('says a name already taken at the Name field', async () => {
    stubFetch({
      'GET /api/auth/me': () => json(200, fabricator),
      'GET /api/safety/hazards': () => json(200, hazards),
      'GET /api/materials': () => json(200, { items: [pvc], total: 1, page: 1, pageSize: 25 }),
      // The API's answer to a duplicate name (apps/api/src/materials/materials.service.ts, mapDbErrors).
      'POST /api/materials': () =>
        json(409, {
          statusCode: 409,
          code: 'MATERIAL.NAME_TAKEN',
          message: 'A material with this name already exists',
          details: { field: 'name' },
          requestId: 'req-409',
        }),
    });
    const { user } = renderApp('/materials', { token: 't' });
    await user.click(await screen.findByRole('button', { name: 'Add a material' }));
    const dialog = await screen.findByRole('dialog', { name: 'Add a material' });
    await user.type(within(dialog).getByLabelText('Name'), pvc.name);
    await user.type(within(dialog).getByLabelText('Nominal thickness (mm)'), '3');
    await user.type(within(dialog).getByLabelText('Colours offered'), 'white');
    await user.type(within(dialog).getByLabelText('Width (mm)'), '600');
    await user.type(within(dialog).getByLabelText('Height (mm)'), '400');
    await user.type(within(dialog).getByLabelText('Price per sheet'), '4.9');
    await user.click(within(dialog).getByRole('button', { name: 'Add the material' }));
    const name = within(dialog).getByLabelText('Name');
    await waitFor(() => expect(name).toHaveAttribute('aria-invalid', 'true'));
    expect(name).toHaveAccessibleDescription('A material with this name already exists');
  });

  it('tells an operator that Materials is not part of their role', async () => {
    const { calls } = stubFetch({ 'GET /api/auth/me': () => json(200, userFixture('operator')) });
    renderApp('/materials', { token: 't' });
    expect(await screen.findByText('This page is not part of your role')).toBeInTheDocument();
    expect(calls.some((c) => c.url.pathname === '/api/materials')).toBe(false);
  });
});
