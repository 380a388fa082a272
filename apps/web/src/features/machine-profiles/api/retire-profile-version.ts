import { type MachineProfileVersionView, type RetireProfileVersionRequest } from '@kerfwright/contracts';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { profilesKeys } from './profiles-keys';

/**
 * POST …/versions/:versionId/retire { lockVersion, reason } → the version, now retired. Supervisors only; when it
 * was the approved one, the machine is out of use until a newer version is approved, and fabricators, operators
 * and supervisors are mailed the reason and the jobs it touches.
 */
export function retireProfileVersion(
  profileId: string,
  version: Pick<MachineProfileVersionView, 'id' | 'lockVersion'>,
  reason: string,
): Promise<MachineProfileVersionView> {
  const body: RetireProfileVersionRequest = { lockVersion: version.lockVersion, reason };
  return api.post<MachineProfileVersionView>(
    `/machine-profiles/${encodeURIComponent(profileId)}/versions/${encodeURIComponent(version.id)}/retire`,
    body,
  );
}

export function useRetireProfileVersion(profileId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({
      version,
      reason,
    }: {
      version: Pick<MachineProfileVersionView, 'id' | 'lockVersion'>;
      reason: string;
    }) => retireProfileVersion(profileId, version, reason),
    // The profile pages, and the jobs and approvals that name the version, show its state; refused (another
    // supervisor retired it first), the page shows what happened meanwhile.
    onSettled: () =>
      Promise.all(
        [profilesKeys.all, ['jobs'], ['approvals']].map((queryKey) =>
          queryClient.invalidateQueries({ queryKey }),
        ),
      ),
  });
}
