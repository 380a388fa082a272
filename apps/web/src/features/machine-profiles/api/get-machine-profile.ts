import { type MachineProfileDetailView } from '@kerfwright/contracts';
import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { isRecordId } from '../../../lib/record-id';
import { profilesKeys } from './profiles-keys';

/** GET /api/machine-profiles/:id → the profile with every version, newest first. */
export function getMachineProfile(id: string, signal?: AbortSignal): Promise<MachineProfileDetailView> {
  return api.get<MachineProfileDetailView>(`/machine-profiles/${encodeURIComponent(id)}`, undefined, signal);
}

export function machineProfileQueryOptions(id: string) {
  return queryOptions({
    queryKey: profilesKeys.detail(id),
    queryFn: ({ signal }) => getMachineProfile(id, signal),
  });
}

/** An id that is no record id names no profile: it is not asked for (the API would refuse it). */
export function useMachineProfile(id: string) {
  return useQuery({ ...machineProfileQueryOptions(id), enabled: isRecordId(id) });
}
