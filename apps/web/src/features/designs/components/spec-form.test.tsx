import { zodResolver } from '@hookform/resolvers/zod';
import { type DesignView } from '@kerfwright/contracts';
import { buildModel, validateSpec } from '@kerfwright/geometry';
import { screen, waitFor } from '@testing-library/react';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { describe, expect, it } from 'vitest';
import { type LengthUnit } from '../../../lib/units';
import { renderWithProviders } from '../../../testing/render-app';
import {
  DEFAULT_DESIGN_VALUES,
  type DesignFormValues,
  describeFormIssue,
  designFormSchema,
  fromDesign,
  toDesignSpec,
  toSavedSpec,
} from './design-form-schema';
import { SpecForm } from './spec-form';

function Harness({
  onValues,
  startUnit = 'mm',
}: {
  onValues?: (v: DesignFormValues) => void;
  startUnit?: LengthUnit;
}) {
  const form = useForm<DesignFormValues>({
    resolver: zodResolver(designFormSchema),
    mode: 'onChange',
    defaultValues: DEFAULT_DESIGN_VALUES,
  });
  const [unit, setUnit] = useState<LengthUnit>(startUnit);
  return (
    <form onSubmit={form.handleSubmit((v) => onValues?.(v))} noValidate>
      <button type="button" onClick={() => setUnit(unit === 'mm' ? 'in' : 'mm')}>
        Switch units
      </button>
      <SpecForm
        form={form}
        upload={null}
        onUpload={() => undefined}
        suggestedSizes={{ touch: 0.7071, overlap: 0.8 }}
        unit={unit}
      />
      <button type="submit">Check</button>
    </form>
  );
}

describe('design studio spec form', () => {
  it('refuses fewer than 3 sides, a step of half the sides or more, and an empty name', async () => {
    const { user } = renderWithProviders(<Harness />);
    const sides = await screen.findByLabelText('Sides (n)');
    await user.clear(sides);
    await user.type(sides, '2');
    expect(await screen.findByText('At least 3 sides')).toBeInTheDocument();

    await user.clear(sides);
    await user.type(sides, '6');
    const step = screen.getByLabelText('Step (k)');
    await user.clear(step);
    await user.type(step, '3');
    // {6/3} is no star polygon: k must stay below n/2 (regular star polygons, common practice in geometry texts).
    expect(await screen.findByText('Step must be less than half the sides (below 3)')).toBeInTheDocument();

    await user.clear(screen.getByLabelText('Name'));
    expect(await screen.findByText('Give the design a name')).toBeInTheDocument();
  });

  it('heads each group of fields, so a screen reader can move through the form by its headings', async () => {
    renderWithProviders(<Harness />);
    const headings = await screen.findAllByRole('heading', { level: 2 });
    expect(headings.map((h) => h.textContent)).toEqual(expect.arrayContaining(['Piece shape']));
    expect(headings.length).toBeGreaterThanOrEqual(4);
  });

  it('clears the message of the step when the sides put it right, as of the sides when the step does', async () => {
    const { user } = renderWithProviders(<Harness />);
    const sides = await screen.findByLabelText('Sides (n)');
    const step = screen.getByLabelText('Step (k)');
    await user.clear(step);
    await user.type(step, '2');
    await user.clear(sides);
    await user.type(sides, '4');
    expect(await screen.findByText('Step must be less than half the sides (below 2)')).toBeInTheDocument();
    expect(step).toHaveAttribute('aria-invalid', 'true');
    await user.clear(sides);
    await user.type(sides, '5');
    await waitFor(() => expect(step).toHaveAttribute('aria-invalid', 'false'));
    expect(screen.queryByText(/Step must be less than half the sides/)).not.toBeInTheDocument();
  });

  it('asks for a number when a length is emptied, and for a positive thickness', async () => {
    const { user } = renderWithProviders(<Harness />);
    await user.clear(await screen.findByLabelText('Scale (mm)'));
    expect(await screen.findByText('Scale: enter a number')).toBeInTheDocument();
    const thickness = screen.getByLabelText('Thickness (mm)');
    await user.clear(thickness);
    await user.type(thickness, '0');
    expect(await screen.findByText('Thickness must be more than 0')).toBeInTheDocument();
  });

  it('shows and takes lengths in inches when the studio works in inches, and keeps millimetres in the spec', async () => {
    let submitted: DesignFormValues | undefined;
    const { user } = renderWithProviders(<Harness startUnit="in" onValues={(v) => (submitted = v)} />);
    // 600 mm = 23.622 in (1 in = 25.4 mm exactly, NIST SP 811), to four decimals.
    const width = (await screen.findByLabelText('Sheet width (in)')) as HTMLInputElement;
    expect(width.value).toBe('23.622');
    expect(screen.queryByLabelText('Sheet width (mm)')).not.toBeInTheDocument();
    // A quarter inch of margin and gap, typed as inches: 6.35 mm in the spec, not 6.3500000000000005.
    for (const label of ['Margin (in)', 'Gap (in)']) {
      await user.clear(screen.getByLabelText(label));
      await user.type(screen.getByLabelText(label), '0.25');
    }
    await user.clear(width);
    await user.type(width, '24');
    await user.click(screen.getByRole('button', { name: 'Check' }));
    await waitFor(() => expect(submitted).toBeDefined());
    expect(submitted).toMatchObject({ marginMm: 6.35, gapMm: 6.35, sheetWidthMm: 609.6 });
    // Back in millimetres, the fields show what the form keeps.
    await user.click(screen.getByRole('button', { name: 'Switch units' }));
    expect((await screen.findByLabelText('Margin (mm)')) as HTMLInputElement).toHaveValue(6.35);
    expect(screen.getByLabelText('Sheet width (mm)')).toHaveValue(609.6);
    // An emptied inch field asks for a number, as a millimetre field does.
    await user.click(screen.getByRole('button', { name: 'Switch units' }));
    await user.clear(await screen.findByLabelText('Thickness (in)'));
    expect(await screen.findByText('Thickness: enter a number')).toBeInTheDocument();
  });

  it('shows the kerf in inches to the decimals that, typed back as shown, keep the kerf', async () => {
    let submitted: DesignFormValues | undefined;
    const { user } = renderWithProviders(<Harness startUnit="in" onValues={(v) => (submitted = v)} />);
    const kerf = await screen.findByLabelText('Kerf (in)');
    // The studio's 0.15 mm = 0.0059055 in (1 in = 25.4 mm exactly); 0.0059 in is 0.14986 mm, less than half a
    // micrometre off, so a fifth decimal would be one too many.
    expect(kerf).toHaveValue(0.0059);
    await user.clear(kerf);
    await user.type(kerf, '0.0059');
    await user.click(screen.getByRole('button', { name: 'Check' }));
    await waitFor(() => expect(submitted).toBeDefined());
    expect(Math.abs(submitted!.kerfMm - 0.15)).toBeLessThanOrEqual(0.0005);
  });

  it('asks for a tool diameter instead of a kerf when the machine is a router', async () => {
    const { user } = renderWithProviders(<Harness />);
    expect(await screen.findByLabelText('Kerf (mm)')).toBeInTheDocument();
    await user.selectOptions(screen.getByLabelText('Machine kind'), 'router');
    expect(await screen.findByLabelText('Tool diameter (mm)')).toBeInTheDocument();
    expect(screen.queryByLabelText('Kerf (mm)')).not.toBeInTheDocument();
  });

  it('finds the smallest sound size with the engine and puts it into the size field', async () => {
    let submitted: DesignFormValues | undefined;
    const { user } = renderWithProviders(<Harness onValues={(v) => (submitted = v)} />);
    expect(await screen.findByTestId('suggested-sizes')).toHaveTextContent('Pieces cross from size 0.8000.');
    await user.click(screen.getByRole('button', { name: 'Smallest sound size' }));
    const said = await screen.findByTestId('sound-size');
    const size = Number((screen.getByLabelText('Size') as HTMLInputElement).value);
    expect(said).toHaveTextContent(`${size.toFixed(4)} is the smallest size that builds without errors`);
    // The size found builds a sound model of the form's spec (checked with the geometry library itself).
    const spec = toDesignSpec(designFormSchema.parse({ ...DEFAULT_DESIGN_VALUES, size }), null)!;
    expect(buildModel(spec).report.errors).toEqual([]);
    await user.click(screen.getByRole('button', { name: 'Check' }));
    await waitFor(() => expect(submitted?.size).toBe(size));
    // Another change makes the answer stale: it is withdrawn.
    await user.clear(screen.getByLabelText('Thickness (mm)'));
    await user.type(screen.getByLabelText('Thickness (mm)'), '6');
    await waitFor(() => expect(screen.queryByTestId('sound-size')).not.toBeInTheDocument());
  });

  it('turns valid form values into a spec that the geometry library accepts', () => {
    const parsed = designFormSchema.parse({ ...DEFAULT_DESIGN_VALUES, sides: 8, step: 3, solidId: 'cube' });
    const spec = toDesignSpec(parsed, null);
    expect(spec?.piece).toEqual({ sides: 8, step: 3, rotationDeg: 0, size: 1.3 });
    expect(validateSpec(spec).ok).toBe(true);
    const router = toDesignSpec({ ...parsed, machineKind: 'router', toolDiameterMm: 3.175 }, null);
    expect(router?.machine).toEqual({ kind: 'router', toolDiameterMm: 3.175 });
    // An uploaded solid is needed when the source is "upload".
    expect(toDesignSpec({ ...parsed, solidSource: 'upload' }, null)).toBeNull();
  });

  it('offers fit to sheets (a number of sheets of the stock sheet) and fit to the bed', async () => {
    let submitted: DesignFormValues | undefined;
    const { user } = renderWithProviders(<Harness onValues={(v) => (submitted = v)} />);
    const scaleBy = await screen.findByLabelText('Scale by');
    await user.selectOptions(scaleBy, 'fitSheets');
    const sheets = await screen.findByLabelText('Sheets');
    expect(screen.queryByLabelText('Scale (mm)')).not.toBeInTheDocument();
    await user.clear(sheets);
    await user.type(sheets, '0');
    expect(await screen.findByText('At least 1 sheet')).toBeInTheDocument();
    // Two colours (the default) need two sheets at least: each colour has sheets of its own.
    await user.clear(sheets);
    await user.type(sheets, '1');
    expect(await screen.findByText('2 colours need at least 2 sheets (one per colour)')).toBeInTheDocument();
    // The colours are the other half of the rule: marked too, whichever of the two was changed.
    expect(screen.getByLabelText('Colours')).toHaveAttribute('aria-invalid', 'true');
    expect(
      screen.getByText('Fit to 1 sheet takes at most 1 colour (one sheet per colour)'),
    ).toBeInTheDocument();
    await user.clear(sheets);
    await user.type(sheets, '3');
    await user.clear(screen.getByLabelText('Sheet width (mm)'));
    await user.type(screen.getByLabelText('Sheet width (mm)'), '450');
    await user.click(screen.getByRole('button', { name: 'Check' }));
    await waitFor(() => expect(submitted?.fitSheets).toBe(3));
    const spec = toDesignSpec(submitted as DesignFormValues, null);
    expect(spec?.scale).toEqual({ by: 'fitSheets', sheets: 3 });
    expect(spec?.stock.sheet).toEqual({ widthMm: 450, heightMm: 400 });
    expect(validateSpec(spec).ok).toBe(true);

    await user.selectOptions(scaleBy, 'fitBed');
    expect(await screen.findByLabelText('Bed width (mm)')).toBeInTheDocument();
    expect(screen.queryByLabelText('Sheets')).not.toBeInTheDocument();
  });

  it('keeps each value when a field is swapped for another and back (scale by, machine kind)', async () => {
    let submitted: DesignFormValues | undefined;
    const { user } = renderWithProviders(<Harness onValues={(v) => (submitted = v)} />);
    const scaleBy = await screen.findByLabelText('Scale by');
    await user.selectOptions(scaleBy, 'fitSheets');
    const sheets = await screen.findByLabelText('Sheets');
    await user.clear(sheets);
    await user.type(sheets, '3');
    await user.selectOptions(scaleBy, 'diameter');
    expect(await screen.findByLabelText('Scale (mm)')).toHaveValue(DEFAULT_DESIGN_VALUES.scaleMm);
    await user.selectOptions(screen.getByLabelText('Machine kind'), 'router');
    const tool = await screen.findByLabelText('Tool diameter (mm)');
    await user.clear(tool);
    await user.type(tool, '6');
    await user.selectOptions(screen.getByLabelText('Machine kind'), 'laser');
    expect(await screen.findByLabelText('Kerf (mm)')).toHaveValue(DEFAULT_DESIGN_VALUES.kerfMm);
    await user.click(screen.getByRole('button', { name: 'Check' }));
    await waitFor(() => expect(submitted).toBeDefined());
    expect(submitted).toMatchObject({
      scaleMm: DEFAULT_DESIGN_VALUES.scaleMm,
      fitSheets: 3,
      kerfMm: DEFAULT_DESIGN_VALUES.kerfMm,
      toolDiameterMm: 6,
    });
  });

  it('saves the colours with the design and reads a fit scale back from a saved spec', () => {
    const parsed = designFormSchema.parse({ ...DEFAULT_DESIGN_VALUES, scaleBy: 'fitBed', colourCount: 3 });
    const saved = toSavedSpec(parsed, null);
    expect(saved?.colours).toEqual({ count: 3, rule: 'neighbour-distinct' });
    expect(saved?.scale).toEqual({ by: 'fitBed' });
    expect(saved?.bed).toEqual({ widthMm: 600, heightMm: 400 });
    expect(validateSpec(saved).ok).toBe(true);
    const back = fromDesign({
      id: 'd1',
      name: 'Round trip',
      description: '',
      spec: saved,
    } as unknown as DesignView).values;
    expect(back.scaleBy).toBe('fitBed');
    expect(back.colourCount).toBe(3);
    expect(back.bedWidthMm).toBe(600);
  });

  it('names the field of a message said away from it, once', () => {
    const issue = (values: Partial<DesignFormValues>) => {
      const parsed = designFormSchema.safeParse({ ...DEFAULT_DESIGN_VALUES, ...values });
      if (parsed.success) throw new Error('expected a form error');
      return describeFormIssue(parsed.error.issues[0]!);
    };
    expect(issue({ sheetWidthMm: 0 })).toBe('Sheet width (mm): more than 0 mm');
    expect(issue({ scaleBy: 'fitSheets', fitSheets: 0, colourCount: 1 })).toBe('Sheets: at least 1 sheet');
    expect(issue({ gapMm: -1 })).toBe('Gap (mm): cannot be negative');
    // A message that names its field already is left as it is.
    expect(issue({ scaleMm: Number.NaN })).toBe('Scale: enter a number');
    expect(issue({ sides: 6, step: 3 })).toBe('Step must be less than half the sides (below 3)');
  });
});
