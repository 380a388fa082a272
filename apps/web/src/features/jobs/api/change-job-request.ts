import { type JobDetailView } from '@kerfwright/contracts';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api, isApiError } from '../../../lib/api-client';
import { jobsKeys } from './jobs-keys';

export interface ChangeJobRequestVariables {
  id: string;
  /** The job version read (409 JOB.STALE_VERSION when someone changed it since). */
  version: number;
  quantity: number;
  notes: string;
}

/** PATCH /api/jobs/:id: a draft's copies and notes (its requester or a supervisor). */
export function changeJobRequest({ id, ...body }: ChangeJobRequestVariables): Promise<JobDetailView> {
  return api.patch<JobDetailView>(`/jobs/${encodeURIComponent(id)}`, body);
}

export function useChangeJobRequest() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: changeJobRequest,
    onSuccess: (job, v) => {
      queryClient.setQueryData(jobsKeys.detail(v.id), job);
      void queryClient.invalidateQueries({ queryKey: jobsKeys.lists() });
    },
    // The job is not as the page read it (a newer version, or no longer a draft): show it as it is now.
    onError: (error, v) => {
      if (isApiError(error) && error.status === 409) {
        void queryClient.invalidateQueries({ queryKey: jobsKeys.detail(v.id) });
      }
    },
  });
}
