import { type MaterialView } from '@kerfwright/contracts';
import TextField from '@mui/material/TextField';
import { useEffect, useRef, useState } from 'react';
import { type UseFormReturn, useWatch } from 'react-hook-form';
import { NATIVE_SELECT } from '../../../components/ui/native-select-field';
import { formatSheetSize, formatStockThickness, type LengthUnit } from '../../../lib/units';
import { type DesignFormValues } from './design-form-schema';

/** One sheet size of one material the workshop keeps, as the studio offers it. */
export interface StockOption {
  key: string;
  materialId: string;
  materialName: string;
  widthMm: number;
  heightMm: number;
  /** The thickness slots are worked for: measured on the stock on hand, else nominal. */
  thicknessMm: number;
  flexible: boolean;
  /** Nominal and measured thickness, either of which counts as this stock's. */
  thicknessesMm: number[];
}

/** A material's nominal thickness and, when measured, its measured one: either counts as this stock's. */
function thicknessesOf(m: Pick<MaterialView, 'nominalThicknessMm' | 'measuredThicknessMm'>): number[] {
  return [m.nominalThicknessMm, ...(m.measuredThicknessMm != null ? [m.measuredThicknessMm] : [])];
}

/**
 * Every stock sheet the workshop lists, material by material; for a laser design, only materials a laser may
 * cut (the others are refused at preparation anyway).
 */
export function stockOptions(
  materials: readonly Pick<
    MaterialView,
    'id' | 'name' | 'stockSheets' | 'nominalThicknessMm' | 'measuredThicknessMm' | 'flexible' | 'laserAllowed'
  >[],
  machineKind: DesignFormValues['machineKind'],
): StockOption[] {
  return materials
    .filter((m) => machineKind !== 'laser' || m.laserAllowed)
    .flatMap((m) =>
      m.stockSheets.map((s, i) => ({
        key: `${m.id}:${i}`,
        materialId: m.id,
        materialName: m.name,
        widthMm: s.widthMm,
        heightMm: s.heightMm,
        thicknessMm: m.measuredThicknessMm ?? m.nominalThicknessMm,
        flexible: m.flexible,
        thicknessesMm: thicknessesOf(m),
      })),
    );
}

/**
 * Whether the form's sheet (either way round) and thickness are those of a stock option: the thickness its
 * slots are worked for, or the nominal one (as typed), not merely a near one, so the list never names stock
 * whose thickness the fields do not hold.
 */
export function isStockOf(
  o: StockOption,
  v: Pick<DesignFormValues, 'sheetWidthMm' | 'sheetHeightMm' | 'thicknessMm'>,
): boolean {
  return isSheetOf(o, v) && o.thicknessesMm.some((t) => sameLength(t, v.thicknessMm));
}

/**
 * Lengths the same as typed: within 0.003 mm, a little over the 0.00254 mm of the inch fields' fourth decimal,
 * so that the sizes shown in inches and typed back are still the stock's (23.622 in is 599.9988 mm); listed
 * sheets and thicknesses differ by far more.
 */
const sameLength = (a: number, b: number) => Math.abs(a - b) < 0.003;

function isSheetOf(
  s: { widthMm: number; heightMm: number },
  v: Pick<DesignFormValues, 'sheetWidthMm' | 'sheetHeightMm'>,
): boolean {
  return (
    (sameLength(s.widthMm, v.sheetWidthMm) && sameLength(s.heightMm, v.sheetHeightMm)) ||
    (sameLength(s.widthMm, v.sheetHeightMm) && sameLength(s.heightMm, v.sheetWidthMm))
  );
}

/**
 * The thickness said beside stock: the one its slots are worked for; or, when the form holds the stock's
 * nominal thickness while it measures otherwise, both, so the reader sees which one the slots follow.
 */
export function stockThicknessText(o: StockOption, formThicknessMm: number, unit: LengthUnit): string {
  const measured = o.thicknessesMm.length > 1;
  if (sameLength(o.thicknessMm, formThicknessMm))
    return `${formatStockThickness(o.thicknessMm, unit)} thick${measured ? ' as measured' : ''}`;
  return (
    `sold as ${formatStockThickness(formThicknessMm, unit)} and measured at ${formatStockThickness(o.thicknessMm, unit)}: ` +
    `the slots are worked for the ${formatStockThickness(formThicknessMm, unit)} in the fields`
  );
}

/** Whether a material keeps the form's sheet (either way round) at the form's thickness (see isStockOf). */
export function keepsStock(
  m: Pick<MaterialView, 'stockSheets' | 'nominalThicknessMm' | 'measuredThicknessMm'>,
  v: Pick<DesignFormValues, 'sheetWidthMm' | 'sheetHeightMm' | 'thicknessMm'>,
): boolean {
  return (
    m.stockSheets.some((sheet) => isSheetOf(sheet, v)) &&
    thicknessesOf(m).some((t) => sameLength(t, v.thicknessMm))
  );
}

/**
 * The stock a new design starts from, once the materials are known, or null to leave the form as it is: none
 * when the reader has changed the sheet or thickness; the stock the form's numbers already are, when its
 * thickness is only the nominal one (the slots are then worked for the measured thickness, as a pick would
 * set, and the estimate takes that stock); else the first stock offered when the form's sheet is none kept.
 */
export function stockToAdopt(
  options: readonly StockOption[],
  v: Pick<DesignFormValues, 'sheetWidthMm' | 'sheetHeightMm' | 'thicknessMm'>,
  untouched: boolean,
): StockOption | null {
  if (!untouched) return null;
  const match = options.find((o) => isStockOf(o, v));
  if (match) return sameLength(match.thicknessMm, v.thicknessMm) ? null : match;
  return options[0] ?? null;
}

const SHEET_FIELDS = ['sheetWidthMm', 'sheetHeightMm', 'thicknessMm'] as const;

/**
 * Picks the stock sheet and thickness from the workshop's materials in one step. It shows the stock the
 * form's numbers are (the one picked, while they still are), or "typed in". A new design whose starting
 * sheet is not stock the workshop keeps starts from the first stock sheet offered instead (`adoptFirst`).
 */
export function StockSheetPicker({
  form,
  materials,
  unit,
  adoptFirst,
  onShown,
}: {
  form: UseFormReturn<DesignFormValues>;
  materials: readonly MaterialView[] | undefined;
  unit: LengthUnit;
  adoptFirst: boolean;
  /** The material of the stock shown (null for "typed in"), for the estimate to take the same stock. */
  onShown?: (materialId: string | null) => void;
}) {
  const [machineKind, sheetWidthMm, sheetHeightMm, thicknessMm] = useWatch({
    control: form.control,
    name: ['machineKind', ...SHEET_FIELDS],
  });
  const values = { sheetWidthMm, sheetHeightMm, thicknessMm };
  const options = materials ? stockOptions(materials, machineKind) : [];
  const [picked, setPicked] = useState<string | null>(null);
  const current =
    options.find((o) => o.key === picked && isStockOf(o, values)) ??
    options.find((o) => isStockOf(o, values));

  const shownId = current?.materialId ?? null;
  useEffect(() => onShown?.(shownId), [onShown, shownId]);

  const use = (o: StockOption, asEdit: boolean) => {
    setPicked(o.key);
    const opts = { shouldValidate: true, shouldDirty: asEdit };
    form.setValue('sheetWidthMm', o.widthMm, opts);
    form.setValue('sheetHeightMm', o.heightMm, opts);
    form.setValue('thicknessMm', o.thicknessMm, opts);
    form.setValue('flexible', o.flexible, opts);
    void form.trigger(['sheetWidthMm', 'sheetHeightMm', 'marginMm']);
  };

  const adopted = useRef(false);
  useEffect(() => {
    if (!adoptFirst || adopted.current || !materials) return;
    adopted.current = true;
    const untouched = SHEET_FIELDS.every((f) => !form.getFieldState(f).isDirty);
    const start = stockToAdopt(options, form.getValues(), untouched);
    if (start) use(start, false);
    // Once, when the materials first arrive.
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [adoptFirst, materials]);

  if (!materials || options.length === 0) return null;
  return (
    <TextField
      select
      size="small"
      label="Workshop stock"
      value={current?.key ?? ''}
      onChange={(e) => {
        const o = options.find((x) => x.key === e.target.value);
        if (o) use(o, true);
      }}
      slotProps={NATIVE_SELECT}
      helperText={
        current
          ? `Sheet ${formatSheetSize(current, unit)}, ${stockThicknessText(current, thicknessMm, unit)}${current.flexible ? ', flexible' : ''}. The fabricator confirms the stock when preparing.`
          : 'Picking one sets the sheet size, thickness and flexibility; the fabricator confirms the stock when preparing.'
      }
    >
      <option value="" disabled>
        Typed in (not a listed sheet)
      </option>
      {options.map((o) => (
        <option key={o.key} value={o.key}>
          {`${o.materialName}, ${formatSheetSize(o, unit)}`}
        </option>
      ))}
    </TextField>
  );
}
