import { type JobView } from '@kerfwright/contracts';
import { useMutation } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';

export interface RequestCutJobVariables {
  designId: string;
  quantity: number;
  notes: string;
}

/** POST /api/jobs (a draft for the design), then POST /api/jobs/:id/request with its version. */
export async function requestCutJob(v: RequestCutJobVariables): Promise<JobView> {
  const draft = await api.post<JobView>('/jobs', v);
  return api.post<JobView>(`/jobs/${encodeURIComponent(draft.id)}/request`, { version: draft.version });
}

export function useRequestCutJob() {
  return useMutation({ mutationFn: requestCutJob });
}
