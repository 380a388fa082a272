import { type JobView } from '@kerfwright/contracts';
import { useMutation } from '@tanstack/react-query';
import { api, ApiError, isApiError } from '../../../lib/api-client';

export interface RequestCutJobVariables {
  designId: string;
  quantity: number;
  notes: string;
  /**
   * The draft a refused request of this design left (DraftKeptError): requested again, with these copies and
   * notes, instead of a new draft each time (a refusal says there are too many open already).
   */
  draft?: JobView;
}

/**
 * The request was refused after its draft was made (too many jobs open with the workshop, say): the API's
 * refusal, saying the draft is kept, and the draft to request again.
 */
export class DraftKeptError extends ApiError {
  constructor(
    refusal: ApiError,
    readonly draft: JobView,
  ) {
    super(
      refusal.status,
      refusal.code,
      `${refusal.message} The job is kept as a draft: request it again here, or later from its page.`,
      refusal.details,
      refusal.requestId,
    );
  }
}

/**
 * POST /api/jobs (a draft for the design), then POST /api/jobs/:id/request with its version. A draft kept from
 * a refused request is read again and used instead (its copies and notes brought up to date) while it is one.
 */
export async function requestCutJob({ draft: kept, ...v }: RequestCutJobVariables): Promise<JobView> {
  let draft: JobView | null = null;
  if (kept && kept.designId === v.designId) {
    const current = await api.get<JobView>(`/jobs/${encodeURIComponent(kept.id)}`).catch(() => null);
    if (current?.state === 'draft') draft = current;
  }
  if (!draft) {
    draft = await api.post<JobView>('/jobs', v);
  } else if (draft.quantity !== v.quantity || draft.notes !== v.notes) {
    draft = await api.patch<JobView>(`/jobs/${encodeURIComponent(draft.id)}`, {
      version: draft.version,
      quantity: v.quantity,
      notes: v.notes,
    });
  }
  try {
    return await api.post<JobView>(`/jobs/${encodeURIComponent(draft.id)}/request`, {
      version: draft.version,
    });
  } catch (error) {
    throw isApiError(error) ? new DraftKeptError(error, draft) : error;
  }
}

export function useRequestCutJob() {
  return useMutation({ mutationFn: requestCutJob });
}
