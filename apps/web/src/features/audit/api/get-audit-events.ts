import { type AuditEventView, type Page } from '@kerfwright/contracts';
import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';

export interface GetAuditParams {
  page: number;
  pageSize: number;
  /** Newest first unless 'createdAt'. */
  sort: 'createdAt' | '-createdAt';
  entityType?: string;
  entityId?: string;
  actorId?: string;
  /** Prefix of the action, e.g. "material." */
  action?: string;
}

export const auditKeys = {
  all: ['audit'] as const,
  list: (params: GetAuditParams) => [...auditKeys.all, 'list', params] as const,
};

/** GET /api/audit?page&pageSize&sort&entityType&entityId&actorId&action → Page<AuditEventView> (supervisors). */
export function getAuditEvents(params: GetAuditParams, signal?: AbortSignal): Promise<Page<AuditEventView>> {
  return api.get<Page<AuditEventView>>(
    '/audit',
    {
      page: params.page,
      pageSize: params.pageSize,
      sort: params.sort,
      entityType: params.entityType,
      entityId: params.entityId,
      actorId: params.actorId,
      action: params.action?.trim() || undefined,
    },
    signal,
  );
}

export function auditQueryOptions(params: GetAuditParams) {
  return queryOptions({
    queryKey: auditKeys.list(params),
    queryFn: ({ signal }) => getAuditEvents(params, signal),
    placeholderData: keepPreviousData,
  });
}

export function useAuditEvents(params: GetAuditParams) {
  return useQuery(auditQueryOptions(params));
}
