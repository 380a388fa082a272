import { type CreateProfileVersionRequest, type MachineProfileVersionView } from '@kerfwright/contracts';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { profilesKeys } from './profiles-keys';

/** POST /api/machine-profiles/:id/versions → a new draft copied from the latest version, with the changes. */
export function createProfileVersion(
  profileId: string,
  body: CreateProfileVersionRequest,
): Promise<MachineProfileVersionView> {
  return api.post<MachineProfileVersionView>(
    `/machine-profiles/${encodeURIComponent(profileId)}/versions`,
    body,
  );
}

export function useCreateProfileVersion(profileId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: CreateProfileVersionRequest) => createProfileVersion(profileId, body),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: profilesKeys.all }),
  });
}
