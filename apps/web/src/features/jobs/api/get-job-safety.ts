import { type JobSafetyView } from '@kerfwright/contracts';
import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { jobsKeys } from './jobs-keys';

/** GET /api/jobs/:id/safety → the notices and local rules that apply, and whether the caller acknowledged them. */
export function getJobSafety(id: string, signal?: AbortSignal): Promise<JobSafetyView> {
  return api.get<JobSafetyView>(`/jobs/${encodeURIComponent(id)}/safety`, undefined, signal);
}

export function useJobSafety(id: string, enabled: boolean) {
  return useQuery({
    ...queryOptions({ queryKey: jobsKeys.safety(id), queryFn: ({ signal }) => getJobSafety(id, signal) }),
    enabled,
  });
}
