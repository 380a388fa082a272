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

/** PUT /api/safety/local-rules (supervisor) → the new version of the rules. */
export function updateLocalRules(body: LocalRulesInput): Promise<LocalRulesView> {
  return api.put<LocalRulesView>('/safety/local-rules', body);
}

export function useUpdateLocalRules() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updateLocalRules,
    onSuccess: (rules) => queryClient.setQueryData(safetyKeys.localRules(), rules),
  });
}
