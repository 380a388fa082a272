import {
  type CreateMaterialRequest,
  laserRefusal,
  MATERIAL_FAMILIES,
  MATERIAL_LIMITS as L,
  type MaterialHazard,
  type MaterialView,
} from '@kerfwright/contracts';
import { z } from 'zod';
import { EMPTY_NUMBER, isBlankNumber } from '../../../lib/form-numbers';

const sheetSide = (label: string) =>
  z
    .number({ error: `Enter the ${label} in mm` })
    .min(L.sheetSideMm.min, `At least ${L.sheetSideMm.min} mm`)
    .max(L.sheetSideMm.max, `At most ${L.sheetSideMm.max} mm`);

const stockSheetSchema = z.object({
  widthMm: sheetSide('width'),
  heightMm: sheetSide('height'),
  pricePerSheet: z
    .number({ error: 'Enter the price per sheet' })
    .min(L.pricePerSheet.min, 'Not below 0')
    .max(L.pricePerSheet.max, `At most ${L.pricePerSheet.max}`),
  currency: z
    .string()
    .trim()
    // A code typed in lower case ("usd") is the same code; the API takes it in capitals (ISO 4217).
    .toUpperCase()
    .regex(/^[A-Z]{3}$/, 'A three-letter currency code such as EUR'),
});

/** The colours field holds one comma-separated line; the API takes a list. */
export function splitColours(text: string): string[] {
  return text
    .split(',')
    .map((c) => c.trim())
    .filter((c) => c.length > 0);
}

/**
 * The material form's rules: the same limits as the API (MATERIAL_LIMITS from the contracts) and the same
 * laser rule — a family the hazard table refuses may not be marked laser-allowed, and a material kept off
 * the laser for any other reason needs a note saying why.
 */
export function materialFormSchema(hazards: readonly MaterialHazard[] | undefined) {
  return z
    .object({
      name: z
        .string()
        .trim()
        .min(1, 'Give the material a name')
        .max(L.nameLength, `At most ${L.nameLength} characters`),
      family: z.enum(MATERIAL_FAMILIES, { error: 'Choose a family' }),
      nominalThicknessMm: z
        .number({ error: 'Enter the nominal thickness in mm' })
        .min(L.thicknessMm.min, `At least ${L.thicknessMm.min} mm`)
        .max(L.thicknessMm.max, `At most ${L.thicknessMm.max} mm`),
      /** Empty = not measured. */
      measuredThicknessMm: z.union([
        z.undefined(),
        z.nan(),
        z
          .number()
          .min(L.thicknessMm.min, `At least ${L.thicknessMm.min} mm`)
          .max(L.thicknessMm.max, `At most ${L.thicknessMm.max} mm`),
      ]),
      flexible: z.boolean(),
      colours: z.string(),
      stockSheets: z.array(stockSheetSchema).max(L.maxStockSheets, `At most ${L.maxStockSheets} sheet sizes`),
      laserAllowed: z.boolean(),
      hazardNote: z.string().max(L.hazardNoteLength, `At most ${L.hazardNoteLength} characters`),
      notes: z.string().max(L.notesLength, `At most ${L.notesLength} characters`),
    })
    .superRefine(
      (v, ctx) => {
        const colours = splitColours(v.colours);
        // A job is cut from one of the colours its material offers: a material offering none cannot be used.
        if (colours.length === 0) {
          ctx.addIssue({
            code: 'custom',
            path: ['colours'],
            message: 'Give at least one colour (for undyed stock, say “natural”)',
          });
        } else if (colours.length > L.maxColours) {
          ctx.addIssue({ code: 'custom', path: ['colours'], message: `At most ${L.maxColours} colours` });
        } else if (colours.some((c) => c.length > L.colourLength)) {
          ctx.addIssue({
            code: 'custom',
            path: ['colours'],
            message: `Each colour at most ${L.colourLength} characters`,
          });
        } else if (new Set(colours.map((c) => c.toLowerCase())).size !== colours.length) {
          ctx.addIssue({ code: 'custom', path: ['colours'], message: 'Name each colour once' });
        }
        const refusal = hazards ? laserRefusal(v.family, hazards) : null;
        if (refusal !== null && v.laserAllowed) {
          ctx.addIssue({
            code: 'custom',
            path: ['laserAllowed'],
            message: 'The hazard table refuses this family on a laser',
          });
        }
        if (refusal === null && !v.laserAllowed && v.hazardNote.trim() === '') {
          ctx.addIssue({
            code: 'custom',
            path: ['hazardNote'],
            message: 'Say why the material is kept off the laser',
          });
        }
        // Run even when other fields are wrong, so the laser rule shows at the first try.
      },
      { when: () => true },
    );
}

export type MaterialFormValues = z.infer<ReturnType<typeof materialFormSchema>>;

/** A new sheet size's row: nothing typed in yet. */
export const EMPTY_STOCK_SHEET = {
  widthMm: EMPTY_NUMBER,
  heightMm: EMPTY_NUMBER,
  pricePerSheet: EMPTY_NUMBER,
  currency: 'EUR',
};

export const EMPTY_MATERIAL: MaterialFormValues = {
  name: '',
  family: 'plywood',
  nominalThicknessMm: EMPTY_NUMBER,
  measuredThicknessMm: EMPTY_NUMBER,
  flexible: false,
  colours: '',
  stockSheets: [{ ...EMPTY_STOCK_SHEET }],
  laserAllowed: true,
  hazardNote: '',
  notes: '',
};

export function materialToFormValues(m: MaterialView): MaterialFormValues {
  return {
    name: m.name,
    family: m.family,
    nominalThicknessMm: m.nominalThicknessMm,
    measuredThicknessMm: m.measuredThicknessMm ?? EMPTY_NUMBER,
    flexible: m.flexible,
    colours: m.colours.join(', '),
    stockSheets: m.stockSheets.map((s) => ({ ...s })),
    laserAllowed: m.laserAllowed,
    hazardNote: m.hazardNote,
    notes: m.notes,
  };
}

/** The request body both POST and PATCH take (PATCH adds the version read). */
export function toMaterialRequest(v: MaterialFormValues): CreateMaterialRequest {
  return {
    name: v.name.trim(),
    family: v.family,
    nominalThicknessMm: v.nominalThicknessMm,
    measuredThicknessMm: isBlankNumber(v.measuredThicknessMm) ? null : v.measuredThicknessMm,
    flexible: v.flexible,
    colours: splitColours(v.colours),
    stockSheets: v.stockSheets.map((s) => ({ ...s, currency: s.currency.trim() })),
    laserAllowed: v.laserAllowed,
    hazardNote: v.hazardNote.trim(),
    notes: v.notes.trim(),
  };
}
