import { type CreateMachineProfileRequest, type MachineProfileDetailView } from '@kerfwright/contracts';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { profilesKeys } from './profiles-keys';

/** POST /api/machine-profiles → the new profile with version 1 as a draft (fabricator, supervisor). */
export function createMachineProfile(body: CreateMachineProfileRequest): Promise<MachineProfileDetailView> {
  return api.post<MachineProfileDetailView>('/machine-profiles', body);
}

export function useCreateMachineProfile() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createMachineProfile,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: profilesKeys.lists() }),
  });
}
