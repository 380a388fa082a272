import { type Page, type Role, type UserView } from '@kerfwright/contracts';
import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { usersKeys } from './users-keys';

/** Fields the API sorts by; a leading '-' means descending. */
export const USER_SORT_FIELDS = ['displayName', 'email', 'role', 'createdAt'] as const;
export type UserSortField = (typeof USER_SORT_FIELDS)[number];
export type UserSort = UserSortField | `-${UserSortField}`;

export interface GetUsersParams {
  /** 1-based. */
  page: number;
  pageSize: number;
  sort: UserSort;
  q?: string;
  role?: Role;
  active?: boolean;
}

/** GET /api/users?page&pageSize&sort&q&role&active → Page<UserView> (supervisor only). */
export function getUsers(params: GetUsersParams, signal?: AbortSignal): Promise<Page<UserView>> {
  return api.get<Page<UserView>>(
    '/users',
    {
      page: params.page,
      pageSize: params.pageSize,
      sort: params.sort,
      q: params.q?.trim() || undefined,
      role: params.role,
      active: params.active,
    },
    signal,
  );
}

export function usersQueryOptions(params: GetUsersParams) {
  return queryOptions({
    queryKey: usersKeys.list(params),
    queryFn: ({ signal }) => getUsers(params, signal),
    placeholderData: keepPreviousData,
  });
}

export function useUsers(params: GetUsersParams) {
  return useQuery(usersQueryOptions(params));
}
