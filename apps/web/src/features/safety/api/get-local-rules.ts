import { type LocalRulesView } from '@kerfwright/contracts';
import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { safetyKeys } from './safety-keys';

/** GET /api/safety/local-rules → the workshop's own rules (null before a supervisor writes any). */
export function getLocalRules(signal?: AbortSignal): Promise<LocalRulesView | null> {
  return api.get<LocalRulesView | null>('/safety/local-rules', undefined, signal);
}

export function localRulesQueryOptions() {
  return queryOptions({ queryKey: safetyKeys.localRules(), queryFn: ({ signal }) => getLocalRules(signal) });
}

export function useLocalRules() {
  return useQuery(localRulesQueryOptions());
}
