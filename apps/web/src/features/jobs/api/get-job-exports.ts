import { type ExportView } from '@kerfwright/contracts';
import { useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { jobsKeys } from './jobs-keys';

/** GET /api/jobs/:id/exports → the job's cut-pack exports, newest first. */
export function getJobExports(id: string, signal?: AbortSignal): Promise<ExportView[]> {
  return api.get<ExportView[]>(`/jobs/${encodeURIComponent(id)}/exports`, undefined, signal);
}

/**
 * The job's exports. A running one is followed by useFollowExport (its events, or polling), which keeps this
 * list current and refreshes it when the export ends.
 */
export function useJobExports(id: string, enabled: boolean) {
  return useQuery({
    queryKey: jobsKeys.exports(id),
    queryFn: ({ signal }) => getJobExports(id, signal),
    enabled,
  });
}
