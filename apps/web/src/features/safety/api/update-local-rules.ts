import { type LocalRulesView } from '@kerfwright/contracts';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { api } from '../../../lib/api-client';
import { safetyKeys } from './safety-keys';

export const LOCAL_RULES_MAX_LENGTH = 20_000;

export const localRulesSchema = z.object({
  body: z
    .string()
    .trim()
    .min(1, 'Write the rules, or keep the current ones')
    .max(LOCAL_RULES_MAX_LENGTH, `At most ${LOCAL_RULES_MAX_LENGTH} characters`),
});
export type LocalRulesInput = z.infer<typeof localRulesSchema>;

/**
 * PUT /api/safety/local-rules (supervisor) → the new version of the rules. `version`: the one the text was
 * written over (0: none yet); the API answers 409 SAFETY.STALE_RULES when another has been saved since.
 */
export function updateLocalRules(body: LocalRulesInput & { version: number }): Promise<LocalRulesView> {
  return api.put<LocalRulesView>('/safety/local-rules', body);
}

export function useUpdateLocalRules() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updateLocalRules,
    onSuccess: (rules) => queryClient.setQueryData(safetyKeys.localRules(), rules),
  });
}
