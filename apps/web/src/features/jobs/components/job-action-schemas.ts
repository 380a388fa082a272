import { COLOUR_RULES, measuredKerfRangeMm } from '@kerfwright/contracts';
import { z } from 'zod';

/** Most sheets one cut may record (the API's RecordCutDto takes up to 1000). */
const MAX_SHEETS_USED = 1000;

/**
 * A sheet count far above what the preparation laid out: more than twice the prepared sheets, and at least
 * three more (a spoilt sheet cut again or a test cut are everyday). The API takes up to 1000 sheets for
 * any job (RecordCutDto), so the form asks for a confirmation rather than refusing such a count.
 */
export function isFarAboveSheets(used: number, prepared: number | null): boolean {
  // A count past the form's own limit is refused by the form: nothing to confirm.
  if (prepared === null || !Number.isFinite(used) || used > MAX_SHEETS_USED) return false;
  return used > Math.max(2 * prepared, prepared + 2);
}

/**
 * The record-cut form for a job cut on a laser (or blade) or a router: the measured kerf takes the range the
 * API takes for that kind of machine (a router's is the width of its cut, a bit's diameter or more).
 */
export function recordCutSchemaFor(machineKind: 'laser' | 'router') {
  const kerf = measuredKerfRangeMm(machineKind);
  return z.object({
    /** Undefined until typed in (so the empty field never holds "NaN"). */
    actualMinutes: z
      .number({ error: 'Enter the machine time in minutes' })
      .gt(0, 'More than 0 minutes')
      .max(10000, 'At most 10000 minutes'),
    sheetsUsed: z
      .number({ error: 'Enter the sheets used' })
      .int('A whole number of sheets')
      .min(1, 'At least 1 sheet')
      .max(MAX_SHEETS_USED, `At most ${MAX_SHEETS_USED} sheets`),
    /** Empty = not measured (undefined until typed in, NaN once cleared). */
    measuredKerfMm: z.union([
      z.undefined(),
      z.nan(),
      z
        .number()
        .min(kerf.min, `At least ${kerf.min} mm; leave it empty if it was not measured`)
        .max(kerf.max, `At most ${kerf.max} mm`),
    ]),
  });
}
export type RecordCutValues = z.infer<ReturnType<typeof recordCutSchemaFor>>;

export const prepareJobSchema = z.object({
  materialId: z.string().min(1, 'Choose a material'),
  profileVersionId: z.string().min(1, 'Choose an approved machine profile'),
  colours: z.array(z.string()).min(1, 'Choose at least one colour'),
  /** Index into the material's stock sheets. */
  sheetIndex: z.string(),
  colourRule: z.enum(COLOUR_RULES),
});
export type PrepareJobValues = z.infer<typeof prepareJobSchema>;
