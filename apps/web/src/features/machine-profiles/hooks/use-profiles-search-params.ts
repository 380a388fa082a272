import { isMachineProfileKind, PROFILE_VERSION_STATES } from '@kerfwright/contracts';
import { useMemo } from 'react';
import { useTableSearchParams } from '../../../components/data-table/use-table-search-params';
import { type GetMachineProfilesParams } from '../api/get-machine-profiles';

export const PAGE_SIZES = [10, 25, 50] as const;

const FILTERS = {
  kind: (raw: string | null) => (isMachineProfileKind(raw) ? raw : undefined),
  state: (raw: string | null) => PROFILE_VERSION_STATES.find((s) => s === raw),
};

/** The profiles list's page and filters, kept in the address (the API lists profiles by name). */
export function useProfilesSearchParams() {
  const search = useTableSearchParams({ pageSizes: PAGE_SIZES, defaultPageSize: 25, filters: FILTERS });
  const { page, pageSize, q, kind, state } = search.params;
  const query = useMemo(
    (): GetMachineProfilesParams => ({ page, pageSize, kind, state, q }),
    [page, pageSize, kind, state, q],
  );
  return { ...search, query };
}
