import { type MachineProfileVersionView, type UpdateProfileVersionRequest } from '@kerfwright/contracts';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { profilesKeys } from './profiles-keys';

export interface UpdateProfileVersionVariables {
  versionId: string;
  body: UpdateProfileVersionRequest;
}

/** PATCH /api/machine-profiles/:id/versions/:versionId (drafts only, with the lockVersion read). */
export function updateProfileVersion(
  profileId: string,
  { versionId, body }: UpdateProfileVersionVariables,
): Promise<MachineProfileVersionView> {
  return api.patch<MachineProfileVersionView>(
    `/machine-profiles/${encodeURIComponent(profileId)}/versions/${encodeURIComponent(versionId)}`,
    body,
  );
}

export function useUpdateProfileVersion(profileId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (v: UpdateProfileVersionVariables) => updateProfileVersion(profileId, v),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: profilesKeys.all }),
  });
}
