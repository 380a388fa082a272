import { type MachineProfileVersionView } from '@kerfwright/contracts';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { approvalsKeys, RELATED_KEYS } from './approvals-keys';

export interface ProfileDecision {
  profileId: string;
  versionId: string;
  lockVersion: number;
  /** Approve, or send back to draft with the reason. */
  decision: 'approve' | 'return';
  reason?: string;
  /** Approving: the laser conditions of the version's materials were checked (the API asks when there are any). */
  conditionsChecked?: boolean;
}

/**
 * POST /api/machine-profiles/:id/versions/:versionId/approve { lockVersion, conditionsChecked? } (the approved
 * one before is retired), or …/return { lockVersion, reason } (back to draft). Supervisors only.
 */
export function decideProfileVersion(d: ProfileDecision): Promise<MachineProfileVersionView> {
  const base = `/machine-profiles/${encodeURIComponent(d.profileId)}/versions/${encodeURIComponent(d.versionId)}`;
  return d.decision === 'approve'
    ? api.post<MachineProfileVersionView>(`${base}/approve`, {
        lockVersion: d.lockVersion,
        ...(d.conditionsChecked ? { conditionsChecked: true } : {}),
      })
    : api.post<MachineProfileVersionView>(`${base}/return`, { lockVersion: d.lockVersion, reason: d.reason });
}

export function useDecideProfileVersion() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: decideProfileVersion,
    onSuccess: () => {
      void queryClient.invalidateQueries({ queryKey: approvalsKeys.all });
      for (const key of RELATED_KEYS) void queryClient.invalidateQueries({ queryKey: key });
    },
  });
}
