import { isRole } from '@kerfwright/contracts';
import { useCallback, useMemo } from 'react';
import { useSearchParams } from 'react-router-dom';
import { type GetUsersParams, USER_SORT_FIELDS, type UserSort } from '../api/get-users';

export const PAGE_SIZES = [10, 25, 50] as const;
const DEFAULT_PAGE_SIZE = 25;
const DEFAULT_SORT: UserSort = 'displayName';

export type StatusFilter = 'all' | 'active' | 'inactive';

function isUserSort(value: string | null): value is UserSort {
  if (!value) return false;
  const field = value.startsWith('-') ? value.slice(1) : value;
  return (USER_SORT_FIELDS as readonly string[]).includes(field);
}

function positiveInt(value: string | null, fallback: number): number {
  const n = Number(value);
  return Number.isInteger(n) && n >= 1 ? n : fallback;
}

/** Reads the people list's page, sort and filters from the address (so they survive reload and Back). */
export function parseUsersSearch(search: URLSearchParams): GetUsersParams {
  const size = positiveInt(search.get('pageSize'), DEFAULT_PAGE_SIZE);
  const status = search.get('status');
  const role = search.get('role');
  const sort = search.get('sort');
  return {
    page: positiveInt(search.get('page'), 1),
    pageSize: (PAGE_SIZES as readonly number[]).includes(size) ? size : DEFAULT_PAGE_SIZE,
    sort: isUserSort(sort) ? sort : DEFAULT_SORT,
    q: search.get('q') ?? undefined,
    role: isRole(role) ? role : undefined,
    active: status === 'active' ? true : status === 'inactive' ? false : undefined,
  };
}

export interface UsersSearchChange {
  page?: number;
  pageSize?: number;
  sort?: UserSort;
  q?: string;
  role?: string;
  status?: StatusFilter;
}

export function useUsersSearchParams() {
  const [search, setSearch] = useSearchParams();
  const params = useMemo(() => parseUsersSearch(search), [search]);
  const status: StatusFilter = params.active === undefined ? 'all' : params.active ? 'active' : 'inactive';

  const update = useCallback(
    (change: UsersSearchChange) => {
      setSearch(
        (prev) => {
          const next = new URLSearchParams(prev);
          const set = (key: string, value: string | number | undefined, fallback?: string) => {
            if (value === undefined || value === '' || String(value) === fallback) next.delete(key);
            else next.set(key, String(value));
          };
          if ('q' in change) set('q', change.q);
          if ('role' in change) set('role', change.role, 'all');
          if ('status' in change) set('status', change.status, 'all');
          if ('sort' in change) set('sort', change.sort, DEFAULT_SORT);
          if ('pageSize' in change) set('pageSize', change.pageSize, String(DEFAULT_PAGE_SIZE));
          // Any change but paging itself starts again from the first page.
          set('page', change.page ?? 1, '1');
          return next;
        },
        { replace: true },
      );
    },
    [setSearch],
  );

  return { params, status, update };
}
