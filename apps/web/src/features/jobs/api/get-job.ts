import { type JobDetailView } from '@kerfwright/contracts';
import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { isRecordId } from '../../../lib/record-id';
import { jobsKeys } from './jobs-keys';

/** GET /api/jobs/:id → the job with its history of transitions and the caller's actions. */
export function getJob(id: string, signal?: AbortSignal): Promise<JobDetailView> {
  return api.get<JobDetailView>(`/jobs/${encodeURIComponent(id)}`, undefined, signal);
}

export function jobQueryOptions(id: string) {
  return queryOptions({ queryKey: jobsKeys.detail(id), queryFn: ({ signal }) => getJob(id, signal) });
}

/** Job ids are UUIDs; anything else names no job, so it is not asked for. */
export function isJobId(id: string): boolean {
  return isRecordId(id);
}

export function useJob(id: string) {
  return useQuery({ ...jobQueryOptions(id), enabled: isJobId(id) });
}
