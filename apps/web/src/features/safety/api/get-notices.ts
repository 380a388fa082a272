import { type SafetyNotice } from '@kerfwright/contracts';
import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { safetyKeys } from './safety-keys';

/** GET /api/safety/notices → the current version of every safety notice. */
export function getNotices(signal?: AbortSignal): Promise<SafetyNotice[]> {
  return api.get<SafetyNotice[]>('/safety/notices', undefined, signal);
}

export function noticesQueryOptions() {
  return queryOptions({ queryKey: safetyKeys.notices(), queryFn: ({ signal }) => getNotices(signal) });
}

export function useNotices() {
  return useQuery(noticesQueryOptions());
}
