import { type JobAction, type JobView } from '@kerfwright/contracts';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { jobsKeys } from './jobs-keys';

/** Body of a transition: always the job version read (409 when stale), plus what the action needs. */
export interface JobActionVariables {
  id: string;
  action: JobAction;
  body: { version: number } & Record<string, unknown>;
}

/** POST /api/jobs/:id/<action> → the job after the transition (the server checks role and state). */
export function takeJobAction({ id, action, body }: JobActionVariables): Promise<JobView> {
  return api.post<JobView>(`/jobs/${encodeURIComponent(id)}/${action}`, body);
}

export function useTakeJobAction() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: takeJobAction,
    onSuccess: (_job, v) => {
      void queryClient.invalidateQueries({ queryKey: jobsKeys.detail(v.id) });
      void queryClient.invalidateQueries({ queryKey: jobsKeys.lists() });
      void queryClient.invalidateQueries({ queryKey: jobsKeys.safety(v.id) });
    },
  });
}
