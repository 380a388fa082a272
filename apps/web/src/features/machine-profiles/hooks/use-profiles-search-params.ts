import { isMachineProfileKind, PROFILE_SORT_FIELDS, PROFILE_VERSION_STATES } from '@kerfwright/contracts';
import { useMemo } from 'react';
import { useTableSearchParams } from '../../../components/data-table/use-table-search-params';
import { type GetMachineProfilesParams } from '../api/get-machine-profiles';

export const PAGE_SIZES = [10, 25, 50] as const;

const FILTERS = {
  kind: (raw: string | null) => (isMachineProfileKind(raw) ? raw : undefined),
  state: (raw: string | null) => PROFILE_VERSION_STATES.find((s) => s === raw),
};

/** The profiles list's page, sort and filters, kept in the address (they survive reload and Back). */
export function useProfilesSearchParams() {
  const search = useTableSearchParams({
    sortFields: PROFILE_SORT_FIELDS,
    defaultSort: 'name',
    pageSizes: PAGE_SIZES,
    defaultPageSize: 25,
    filters: FILTERS,
  });
  const { page, pageSize, sort, q, kind, state } = search.params;
  const query = useMemo(
    (): GetMachineProfilesParams => ({ page, pageSize, sort, kind, state, q }),
    [page, pageSize, sort, kind, state, q],
  );
  return { ...search, query };
}
