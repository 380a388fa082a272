import { useMemo } from 'react';
import { useTableSearchParams } from '../../../components/data-table/use-table-search-params';
import { type GetAuditParams } from '../api/get-audit-events';
import { isRecordId } from '../../../lib/record-id';

export const PAGE_SIZES = [25, 50, 100] as const;
const SORT_FIELDS = ['createdAt'] as const;

const FILTERS = {
  entityType: (raw: string | null) => raw?.slice(0, 40) || undefined,
  entityId: (raw: string | null) => raw?.slice(0, 64) || undefined,
  actor: (raw: string | null) => (raw && isRecordId(raw) ? raw : undefined),
  action: (raw: string | null) => raw?.slice(0, 80) || undefined,
};

/** The audit trail's page, order and filters, kept in the address. */
export function useAuditSearchParams() {
  const search = useTableSearchParams({
    sortFields: SORT_FIELDS,
    defaultSort: '-createdAt',
    pageSizes: PAGE_SIZES,
    defaultPageSize: 25,
    filters: FILTERS,
  });
  const { page, pageSize, sort, entityType, entityId, actor, action } = search.params;
  const query = useMemo(
    (): GetAuditParams => ({ page, pageSize, sort, entityType, entityId, actorId: actor, action }),
    [page, pageSize, sort, entityType, entityId, actor, action],
  );
  return { ...search, query };
}
