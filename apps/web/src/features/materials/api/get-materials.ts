import {
  type MaterialFamily,
  type MaterialSortField,
  type MaterialView,
  type Page,
} from '@kerfwright/contracts';
import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { materialsKeys } from './materials-keys';

export type MaterialSort = MaterialSortField | `-${MaterialSortField}`;

export interface GetMaterialsParams {
  /** 1-based. */
  page: number;
  pageSize: number;
  sort: MaterialSort;
  q?: string;
  family?: MaterialFamily;
  laserAllowed?: boolean;
}

/** GET /api/materials?page&pageSize&sort&q&family&laserAllowed → Page<MaterialView>. */
export function getMaterials(params: GetMaterialsParams, signal?: AbortSignal): Promise<Page<MaterialView>> {
  return api.get<Page<MaterialView>>(
    '/materials',
    {
      page: params.page,
      pageSize: params.pageSize,
      sort: params.sort,
      q: params.q?.trim() || undefined,
      family: params.family,
      laserAllowed: params.laserAllowed,
    },
    signal,
  );
}

export function materialsQueryOptions(params: GetMaterialsParams) {
  return queryOptions({
    queryKey: materialsKeys.list(params),
    queryFn: ({ signal }) => getMaterials(params, signal),
    placeholderData: keepPreviousData,
  });
}

export function useMaterials(params: GetMaterialsParams) {
  return useQuery(materialsQueryOptions(params));
}
