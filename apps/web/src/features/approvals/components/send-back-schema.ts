import { MACHINE_PROFILE_LIMITS } from '@kerfwright/contracts';
import { z } from 'zod';

/** The reason a supervisor gives when sending work back; the API needs 3–2000 characters for jobs. */
export const sendBackSchema = z.object({
  reason: z
    .string()
    .trim()
    .min(3, 'Say what must change (at least 3 characters)')
    .max(MACHINE_PROFILE_LIMITS.reasonLength, `At most ${MACHINE_PROFILE_LIMITS.reasonLength} characters`),
});
export type SendBackValues = z.infer<typeof sendBackSchema>;
