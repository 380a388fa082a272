import { type DesignView } from '@kerfwright/contracts';
import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { designsKeys } from './designs-keys';

/** GET /api/designs/:id → DesignView (owner or staff). */
export function getDesign(id: string, signal?: AbortSignal): Promise<DesignView> {
  return api.get<DesignView>(`/designs/${encodeURIComponent(id)}`, undefined, signal);
}

export function designQueryOptions(id: string) {
  return queryOptions({ queryKey: designsKeys.detail(id), queryFn: ({ signal }) => getDesign(id, signal) });
}

export function useDesign(id: string | undefined) {
  return useQuery({ ...designQueryOptions(id ?? ''), enabled: Boolean(id) });
}
