import { type ExportView } from '@kerfwright/contracts';
import { useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { jobsKeys } from './jobs-keys';

/** GET /api/jobs/:id/exports → the job's cut-pack exports, newest first. */
export function getJobExports(id: string, signal?: AbortSignal): Promise<ExportView[]> {
  return api.get<ExportView[]>(`/jobs/${encodeURIComponent(id)}/exports`, undefined, signal);
}

/** How often a pack whose setup sheet is out of date is looked at again (someone may be rebuilding it). */
export const STALE_PACK_REFRESH_MS = 15_000;

/**
 * How often a current pack is looked at again: the notices or rules may change elsewhere, and the server then
 * builds the pack again by itself.
 */
export const DONE_PACK_REFRESH_MS = 60_000;

/**
 * The job's exports. A running one is followed by useFollowExport (its events, or polling), which keeps this
 * list current and refreshes it when the export ends. A done pack whose setup sheet is out of date is read again
 * every STALE_PACK_REFRESH_MS: a fabricator elsewhere may be rebuilding it, and the operator at the machine
 * should see the new pack without reloading; a current one every DONE_PACK_REFRESH_MS, in case the notices
 * change meanwhile.
 */
export function useJobExports(id: string, enabled: boolean) {
  return useQuery({
    queryKey: jobsKeys.exports(id),
    queryFn: ({ signal }) => getJobExports(id, signal),
    enabled,
    refetchInterval: (query) => {
      const newest = query.state.data?.[0];
      if (newest?.safetyChanged) return STALE_PACK_REFRESH_MS;
      return newest?.state === 'done' ? DONE_PACK_REFRESH_MS : false;
    },
  });
}
