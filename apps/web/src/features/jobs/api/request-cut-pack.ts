import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { jobsKeys } from './jobs-keys';

/**
 * POST /api/jobs/:id/exports → { exportId }: queues the cut pack (layout files, setup sheet, guide) of the job
 * as read at `version` (409 JOB.STALE_VERSION if it changed since: an approved job is released by it).
 */
export function requestCutPack(id: string, version: number): Promise<{ exportId: string }> {
  return api.post<{ exportId: string }>(`/jobs/${encodeURIComponent(id)}/exports`, { version });
}

export function useRequestCutPack(id: string, version: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => requestCutPack(id, version),
    onSuccess: () => void queryClient.invalidateQueries({ queryKey: jobsKeys.exports(id) }),
  });
}
