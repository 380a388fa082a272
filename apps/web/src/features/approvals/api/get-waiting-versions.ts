import { type MachineProfileSummaryView, type Page } from '@kerfwright/contracts';
import { useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { QUEUE_REFRESH_MS } from '../../../lib/query-client';
import { approvalsKeys } from './approvals-keys';

/**
 * GET /api/machine-profiles?state=submitted → profiles whose newest version waits for approval; each carries
 * that version (`latest`) and the one approved now (`currentApproved`), which is what the diff compares.
 */
export function getWaitingVersions(signal?: AbortSignal): Promise<Page<MachineProfileSummaryView>> {
  return api.get<Page<MachineProfileSummaryView>>(
    '/machine-profiles',
    { state: 'submitted', page: 1, pageSize: 100 },
    signal,
  );
}

/** The versions waiting for approval, read again every QUEUE_REFRESH_MS while the page is open. */
export function useWaitingVersions() {
  return useQuery({
    queryKey: approvalsKeys.versions(),
    queryFn: ({ signal }) => getWaitingVersions(signal),
    refetchInterval: QUEUE_REFRESH_MS,
  });
}
