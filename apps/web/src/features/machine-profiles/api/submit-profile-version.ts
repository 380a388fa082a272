import { type MachineProfileVersionView } from '@kerfwright/contracts';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { profilesKeys } from './profiles-keys';

/** POST …/versions/:versionId/submit { lockVersion } → the version, now submitted (supervisors are mailed). */
export function submitProfileVersion(
  profileId: string,
  version: Pick<MachineProfileVersionView, 'id' | 'lockVersion'>,
): Promise<MachineProfileVersionView> {
  return api.post<MachineProfileVersionView>(
    `/machine-profiles/${encodeURIComponent(profileId)}/versions/${encodeURIComponent(version.id)}/submit`,
    { lockVersion: version.lockVersion },
  );
}

export function useSubmitProfileVersion(profileId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (version: Pick<MachineProfileVersionView, 'id' | 'lockVersion'>) =>
      submitProfileVersion(profileId, version),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: profilesKeys.all }),
  });
}
