import { COLOUR_RULES } from '@kerfwright/contracts';
import { z } from 'zod';

export const returnJobSchema = z.object({
  reason: z
    .string()
    .trim()
    .min(3, 'Say why the job goes back (at least 3 characters)')
    .max(2000, 'At most 2000 characters'),
});
export type ReturnJobValues = z.infer<typeof returnJobSchema>;

export const recordCutSchema = z.object({
  actualMinutes: z
    .number({ error: 'Enter the machine time in minutes' })
    .gt(0, 'More than 0 minutes')
    .max(10000, 'At most 10000 minutes'),
  sheetsUsed: z
    .number({ error: 'Enter the sheets used' })
    .int('A whole number of sheets')
    .min(1, 'At least 1 sheet')
    .max(1000, 'At most 1000 sheets'),
  /** Empty = not measured. */
  measuredKerfMm: z.union([z.nan(), z.number().gt(0, 'More than 0 mm').max(2, 'At most 2 mm')]),
});
export type RecordCutValues = z.infer<typeof recordCutSchema>;

export const prepareJobSchema = z.object({
  materialId: z.string().min(1, 'Choose a material'),
  profileVersionId: z.string().min(1, 'Choose an approved machine profile'),
  colours: z.array(z.string()).min(1, 'Choose at least one colour'),
  /** Index into the material's stock sheets. */
  sheetIndex: z.string(),
  colourRule: z.enum(COLOUR_RULES),
});
export type PrepareJobValues = z.infer<typeof prepareJobSchema>;
