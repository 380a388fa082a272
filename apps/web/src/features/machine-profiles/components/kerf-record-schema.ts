import { type MachineProfileKind, measuredKerfRangeMm } from '@kerfwright/contracts';
import { z } from 'zod';

/**
 * A measured kerf, in the range the API accepts for the machine kind: a beam's or blade's kerf, or on a
 * router the measured width of the cut (which becomes the tool diameter when adopted).
 */
export function kerfRecordSchema(kind: MachineProfileKind) {
  const range = measuredKerfRangeMm(kind);
  return z.object({
    materialId: z.string().min(1, 'Choose the material'),
    kerfMm: z
      .number({ error: `Enter the measured ${kind === 'cnc-router' ? 'cut width' : 'kerf'}` })
      .min(range.min, `At least ${range.min} mm`)
      .max(range.max, `At most ${range.max} mm`),
    notes: z.string().trim().max(2000, 'At most 2000 characters'),
  });
}

export type KerfRecordValues = z.infer<ReturnType<typeof kerfRecordSchema>>;
