import { type ExportView } from '@kerfwright/contracts';
import { useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { jobsKeys } from './jobs-keys';

/** GET /api/jobs/:id/exports → the job's cut-pack exports, newest first. */
export function getJobExports(id: string, signal?: AbortSignal): Promise<ExportView[]> {
  return api.get<ExportView[]>(`/jobs/${encodeURIComponent(id)}/exports`, undefined, signal);
}

/** Polls every second while the newest export is queued or running (the progress bar follows it). */
export function useJobExports(id: string, enabled: boolean) {
  return useQuery({
    queryKey: jobsKeys.exports(id),
    queryFn: ({ signal }) => getJobExports(id, signal),
    enabled,
    refetchInterval: (query) => {
      const newest = query.state.data?.[0];
      return newest && (newest.state === 'queued' || newest.state === 'running') ? 1000 : false;
    },
  });
}
