import { type MachineProfileSummaryView, type Page } from '@kerfwright/contracts';
import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { jobsKeys } from './jobs-keys';

/** GET /api/machine-profiles (first 100), each with its current approved version if any. */
export function getMachineProfiles(signal?: AbortSignal): Promise<Page<MachineProfileSummaryView>> {
  return api.get<Page<MachineProfileSummaryView>>('/machine-profiles', { page: 1, pageSize: 100 }, signal);
}

export function useMachineProfiles(enabled: boolean) {
  return useQuery({
    ...queryOptions({ queryKey: jobsKeys.profiles(), queryFn: ({ signal }) => getMachineProfiles(signal) }),
    enabled,
  });
}
