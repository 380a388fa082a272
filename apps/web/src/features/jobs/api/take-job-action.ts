import { type JobAction, type JobView } from '@kerfwright/contracts';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api, isApiError } from '../../../lib/api-client';
import { followExport } from './follow-export';
import { jobsKeys } from './jobs-keys';

/** Body of a transition: always the job version read (409 when stale), plus what the action needs. */
export interface JobActionVariables {
  id: string;
  action: JobAction;
  body: { version: number } & Record<string, unknown>;
}

/**
 * What a transition answers: the job after it (200), or, for a transition that waits on the cut-pack queue
 * (release: 202), the export to follow; the job moves on when that export is done.
 */
export type JobActionResult = JobView | { exportId: string };

export function isQueuedAction(result: JobActionResult): result is { exportId: string } {
  return typeof (result as { exportId?: unknown }).exportId === 'string';
}

/** POST /api/jobs/:id/<action> (the server checks role and state). */
export function takeJobAction({ id, action, body }: JobActionVariables): Promise<JobActionResult> {
  return api.post<JobActionResult>(`/jobs/${encodeURIComponent(id)}/${action}`, body);
}

/** The action was refused because someone acted on the job since the caller read it (a newer version or state). */
export function isJobChangedSince(error: unknown): boolean {
  return isApiError(error) && (error.code === 'JOB.STALE_VERSION' || error.code === 'JOB.ILLEGAL_TRANSITION');
}

export function useTakeJobAction() {
  const queryClient = useQueryClient();
  const readAgain = (id: string) => {
    void queryClient.invalidateQueries({ queryKey: jobsKeys.detail(id) });
    void queryClient.invalidateQueries({ queryKey: jobsKeys.lists() });
    void queryClient.invalidateQueries({ queryKey: jobsKeys.safety(id) });
    void queryClient.invalidateQueries({ queryKey: jobsKeys.exports(id) });
  };
  return useMutation({
    mutationFn: takeJobAction,
    // A 409 means the job is not as this page read it (a newer version, another state, or a rule of the
    // action): read it again, so the page shows the job as it is now beside the server's message.
    onError: (error, v) => {
      if (isApiError(error) && error.status === 409) readAgain(v.id);
    },
    onSuccess: (result, v) => {
      if (isQueuedAction(result)) {
        // The job moves on when its export is done: follow it (events, else polling), then read the job again.
        void followExport(result.exportId, () => undefined, new AbortController().signal)
          .catch(() => null)
          .then(() => {
            void queryClient.invalidateQueries({ queryKey: jobsKeys.detail(v.id) });
            void queryClient.invalidateQueries({ queryKey: jobsKeys.lists() });
            void queryClient.invalidateQueries({ queryKey: jobsKeys.exports(v.id) });
          });
      }
      readAgain(v.id);
    },
  });
}
