import { type JobView, type Page } from '@kerfwright/contracts';
import { useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { QUEUE_REFRESH_MS } from '../../../lib/query-client';
import { approvalsKeys } from './approvals-keys';

/** GET /api/jobs?state=prepared → jobs a fabricator has prepared, oldest first, waiting for approval. */
export function getWaitingJobs(signal?: AbortSignal): Promise<Page<JobView>> {
  return api.get<Page<JobView>>(
    '/jobs',
    { state: 'prepared', sort: 'updatedAt', page: 1, pageSize: 100 },
    signal,
  );
}

/** The jobs waiting for approval, read again every QUEUE_REFRESH_MS while the page is open. */
export function useWaitingJobs() {
  return useQuery({
    queryKey: approvalsKeys.jobs(),
    queryFn: ({ signal }) => getWaitingJobs(signal),
    refetchInterval: QUEUE_REFRESH_MS,
  });
}
