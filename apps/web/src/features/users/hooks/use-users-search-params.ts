import { isRole } from '@kerfwright/contracts';
import { useMemo } from 'react';
import { useTableSearchParams } from '../../../components/data-table/use-table-search-params';
import { type GetUsersParams, USER_SORT_FIELDS } from '../api/get-users';

export const PAGE_SIZES = [10, 25, 50] as const;

export type StatusFilter = 'active' | 'inactive';

const FILTERS = {
  role: (raw: string | null) => (isRole(raw) ? raw : undefined),
  status: (raw: string | null): StatusFilter | undefined =>
    raw === 'active' || raw === 'inactive' ? raw : undefined,
};

/** The people list's page, sort and filters, kept in the address (so they survive reload and Back). */
export function useUsersSearchParams() {
  const search = useTableSearchParams({
    sortFields: USER_SORT_FIELDS,
    defaultSort: 'displayName',
    pageSizes: PAGE_SIZES,
    defaultPageSize: 25,
    filters: FILTERS,
  });
  const { page, pageSize, sort, q, role, status } = search.params;
  const query = useMemo(
    (): GetUsersParams => ({
      page,
      pageSize,
      sort,
      q,
      role,
      active: status === undefined ? undefined : status === 'active',
    }),
    [page, pageSize, sort, q, role, status],
  );
  return { ...search, query };
}
