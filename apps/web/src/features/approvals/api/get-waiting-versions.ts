import { type MachineProfileSummaryView, type Page } from '@kerfwright/contracts';
import { useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
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

export function useWaitingVersions() {
  return useQuery({
    queryKey: approvalsKeys.versions(),
    queryFn: ({ signal }) => getWaitingVersions(signal),
  });
}
