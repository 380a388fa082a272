import { type JobView } from '@kerfwright/contracts';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { approvalsKeys, RELATED_KEYS } from './approvals-keys';

export interface JobDecision {
  jobId: string;
  /** The job version read (409 when someone acted on it since). */
  version: number;
  decision: 'approve' | 'return';
  reason?: string;
}

/** POST /api/jobs/:id/approve { version } or /api/jobs/:id/return { version, reason }. */
export function decideJob(d: JobDecision): Promise<JobView> {
  const base = `/jobs/${encodeURIComponent(d.jobId)}`;
  return d.decision === 'approve'
    ? api.post<JobView>(`${base}/approve`, { version: d.version })
    : api.post<JobView>(`${base}/return`, { version: d.version, reason: d.reason });
}

export function useDecideJob() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: decideJob,
    onSuccess: () => {
      void queryClient.invalidateQueries({ queryKey: approvalsKeys.all });
      for (const key of RELATED_KEYS) void queryClient.invalidateQueries({ queryKey: key });
    },
  });
}
