import { type AcknowledgeSafetyRequest, type JobSafetyView } from '@kerfwright/contracts';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api, isApiError } from '../../../lib/api-client';
import { jobsKeys } from './jobs-keys';

/**
 * POST /api/jobs/:id/safety/acknowledge with exactly the notice versions, local rules and preparation shown.
 */
export function acknowledgeJobSafety(id: string, body: AcknowledgeSafetyRequest): Promise<JobSafetyView> {
  return api.post<JobSafetyView>(`/jobs/${encodeURIComponent(id)}/safety/acknowledge`, body);
}

const STALE_CODES = new Set(['SAFETY.STALE_ACKNOWLEDGEMENT', 'SAFETY.PREPARATION_CHANGED']);

/** Whether an acknowledgement was refused because what was read is no longer current. */
export function isStaleAcknowledgement(error: unknown): boolean {
  return isApiError(error) && STALE_CODES.has(error.code);
}

export function useAcknowledgeJobSafety(id: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: AcknowledgeSafetyRequest) => acknowledgeJobSafety(id, body),
    onSuccess: () => void queryClient.invalidateQueries({ queryKey: jobsKeys.safety(id) }),
    // Refused because what was read is no longer current (new notice versions or rules, or the job prepared
    // again): read the view again, so the notices to acknowledge now are on screen beside the refusal.
    onError: (error) => {
      if (isStaleAcknowledgement(error)) {
        void queryClient.invalidateQueries({ queryKey: jobsKeys.safety(id) });
      }
    },
  });
}
