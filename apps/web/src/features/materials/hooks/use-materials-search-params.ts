import { isMaterialFamily, MATERIAL_SORT_FIELDS } from '@kerfwright/contracts';
import { useMemo } from 'react';
import { useTableSearchParams } from '../../../components/data-table/use-table-search-params';
import { type GetMaterialsParams } from '../api/get-materials';

export const PAGE_SIZES = [10, 25, 50] as const;

export type LaserFilter = 'allowed' | 'refused';

const FILTERS = {
  family: (raw: string | null) => (isMaterialFamily(raw) ? raw : undefined),
  laser: (raw: string | null): LaserFilter | undefined =>
    raw === 'allowed' || raw === 'refused' ? raw : undefined,
};

/** The materials list's page, sort and filters, kept in the address (they survive reload and Back). */
export function useMaterialsSearchParams() {
  const search = useTableSearchParams({
    sortFields: MATERIAL_SORT_FIELDS,
    defaultSort: 'name',
    pageSizes: PAGE_SIZES,
    defaultPageSize: 25,
    filters: FILTERS,
  });
  const { page, pageSize, sort, q, family, laser } = search.params;
  const query = useMemo(
    (): GetMaterialsParams => ({
      page,
      pageSize,
      sort,
      q,
      family,
      laserAllowed: laser === undefined ? undefined : laser === 'allowed',
    }),
    [page, pageSize, sort, q, family, laser],
  );
  return { ...search, query };
}
