import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { jobsKeys } from './jobs-keys';

/** POST /api/jobs/:id/exports → { exportId }: queues the cut pack (layout files, setup sheet, guide). */
export function requestCutPack(id: string): Promise<{ exportId: string }> {
  return api.post<{ exportId: string }>(`/jobs/${encodeURIComponent(id)}/exports`, {});
}

export function useRequestCutPack(id: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => requestCutPack(id),
    onSuccess: () => void queryClient.invalidateQueries({ queryKey: jobsKeys.exports(id) }),
  });
}
