import { type AcknowledgeSafetyRequest, type JobSafetyView } from '@kerfwright/contracts';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { jobsKeys } from './jobs-keys';

/** POST /api/jobs/:id/safety/acknowledge with exactly the notice versions and local rules shown. */
export function acknowledgeJobSafety(id: string, body: AcknowledgeSafetyRequest): Promise<JobSafetyView> {
  return api.post<JobSafetyView>(`/jobs/${encodeURIComponent(id)}/safety/acknowledge`, body);
}

export function useAcknowledgeJobSafety(id: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: AcknowledgeSafetyRequest) => acknowledgeJobSafety(id, body),
    onSuccess: () => void queryClient.invalidateQueries({ queryKey: jobsKeys.safety(id) }),
  });
}
