import { type DesignSummary, type Page } from '@kerfwright/contracts';
import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { designsKeys } from './designs-keys';

export const DESIGN_SORT_FIELDS = ['name', 'createdAt', 'updatedAt'] as const;
export type DesignSortField = (typeof DESIGN_SORT_FIELDS)[number];
export type DesignSort = DesignSortField | `-${DesignSortField}`;

export interface GetDesignsParams {
  page: number;
  pageSize: number;
  sort: DesignSort;
  q?: string;
}

/** GET /api/designs?page&pageSize&sort&q → Page<DesignSummary> (hobbyists see their own). */
export function getDesigns(params: GetDesignsParams, signal?: AbortSignal): Promise<Page<DesignSummary>> {
  return api.get<Page<DesignSummary>>(
    '/designs',
    { page: params.page, pageSize: params.pageSize, sort: params.sort, q: params.q?.trim() || undefined },
    signal,
  );
}

export function designsQueryOptions(params: GetDesignsParams) {
  return queryOptions({
    queryKey: designsKeys.list(params),
    queryFn: ({ signal }) => getDesigns(params, signal),
    placeholderData: keepPreviousData,
  });
}

export function useDesigns(params: GetDesignsParams) {
  return useQuery(designsQueryOptions(params));
}
