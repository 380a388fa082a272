import { type JobDetailView } from '@kerfwright/contracts';
import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { QUEUE_REFRESH_MS, refetchWhileFailing } from '../../../lib/query-client';
import { isRecordId } from '../../../lib/record-id';
import { jobsKeys } from './jobs-keys';

/** GET /api/jobs/:id → the job with its history of transitions and the caller's actions. */
export function getJob(id: string, signal?: AbortSignal): Promise<JobDetailView> {
  return api.get<JobDetailView>(`/jobs/${encodeURIComponent(id)}`, undefined, signal);
}

/** A job others may still act on: its page, or the desk's open job, reads it again while it is on screen. */
const OPEN_STATES: readonly string[] = ['requested', 'prepared', 'approved', 'released'];

/**
 * The job, read again every QUEUE_REFRESH_MS while it is on screen and others may change it (a supervisor
 * approving it, or taking its machine out of use while an operator has it open on the desk); a closed one, or
 * one that could not be loaded, as every query is (refetchWhileFailing).
 */
export function jobQueryOptions(id: string) {
  return queryOptions({
    queryKey: jobsKeys.detail(id),
    queryFn: ({ signal }) => getJob(id, signal),
    refetchInterval: (query) =>
      query.state.status === 'success' && query.state.data && OPEN_STATES.includes(query.state.data.state)
        ? QUEUE_REFRESH_MS
        : refetchWhileFailing(query),
  });
}

/** Job ids are UUIDs; anything else names no job, so it is not asked for. */
export function isJobId(id: string): boolean {
  return isRecordId(id);
}

export function useJob(id: string) {
  return useQuery({ ...jobQueryOptions(id), enabled: isJobId(id) });
}
