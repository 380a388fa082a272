import { useCallback, useMemo } from 'react';
import { useSearchParams } from 'react-router-dom';

/** Reads one filter from its value in the address; `undefined` means the list is not narrowed by it. */
export type FilterParser<V> = (raw: string | null) => V | undefined;

type FilterParsers = Record<string, FilterParser<unknown>>;

/** The filters' values, read from the address (an absent or malformed one is undefined). */
export type FilterValues<P extends FilterParsers> = { [K in keyof P]: ReturnType<P[K]> | undefined };

export type TableParams<S extends string | undefined, P extends FilterParsers = Record<never, never>> = {
  page: number;
  pageSize: number;
  /** `field` ascending, `-field` descending; undefined for a list the API does not sort. */
  sort: S;
  q?: string;
} & FilterValues<P>;

/** A change to the address: a value of undefined or '' removes the key. */
export type TableSearchChange<P extends FilterParsers> = Partial<
  Record<'page' | 'pageSize' | 'sort' | 'q' | Extract<keyof P, string>, string | number | undefined>
>;

interface TableSearchOptions<F extends string, P extends FilterParsers> {
  /** The API's sort fields; leave out (with defaultSort) for a list that is not sorted. */
  sortFields?: readonly F[];
  defaultSort?: F | `-${F}`;
  pageSizes: readonly number[];
  defaultPageSize: number;
  /** The list's own filters, each kept in the address under its key. */
  filters?: P;
}

const NO_FILTERS: FilterParsers = {};

/**
 * The longest search text the API takes: its list queries refuse a longer `q` (`@MaxLength(100)` in the
 * apps/api list DTOs) and the whole list would give way to that error.
 */
export const SEARCH_MAX_LENGTH = 100;

/**
 * Page, page size, sort, search and the list's own filters, kept in the address (so a list can be
 * bookmarked and the back button works). Unknown or malformed values fall back to the defaults, and default
 * values stay out of the address; the search text is cut to SEARCH_MAX_LENGTH. `set` changes some values;
 * any change other than the page itself goes back to page 1.
 */
export function useTableSearchParams<
  F extends string = never,
  P extends FilterParsers = Record<never, never>,
>(options: TableSearchOptions<F, P>) {
  type S = [F] extends [never] ? undefined : F | `-${F}`;
  const [search, setSearch] = useSearchParams();
  const { sortFields, defaultSort, pageSizes, defaultPageSize } = options;
  const filters = options.filters ?? (NO_FILTERS as P);
  const params = useMemo((): TableParams<S, P> => {
    const page = Number(search.get('page'));
    const size = Number(search.get('pageSize'));
    const sort = search.get('sort') ?? '';
    const values = Object.fromEntries(
      Object.entries(filters).map(([key, parse]) => [key, parse(search.get(key))]),
    ) as FilterValues<P>;
    return {
      ...values,
      page: Number.isInteger(page) && page >= 1 ? page : 1,
      pageSize: pageSizes.includes(size) ? size : defaultPageSize,
      sort: (sortFields && (sortFields as readonly string[]).includes(sort.replace(/^-/, ''))
        ? sort
        : defaultSort) as S,
      // An address typed or kept from elsewhere may hold more; the list searches for what the API takes.
      q: search.get('q')?.slice(0, SEARCH_MAX_LENGTH) ?? undefined,
    };
  }, [search, sortFields, defaultSort, pageSizes, defaultPageSize, filters]);
  const set = useCallback(
    (change: TableSearchChange<P>) =>
      setSearch(
        (prev) => {
          const next = new URLSearchParams(prev);
          const defaults: Record<string, string | undefined> = {
            page: '1',
            pageSize: String(defaultPageSize),
            sort: defaultSort,
          };
          for (const [k, v] of Object.entries(change)) {
            if (v === undefined || v === '' || String(v) === defaults[k]) next.delete(k);
            else next.set(k, String(v));
          }
          if (!('page' in change)) next.delete('page');
          return next;
        },
        { replace: true },
      ),
    [setSearch, defaultPageSize, defaultSort],
  );
  /** What a DataTable needs to page and sort through the address. */
  const tableProps = useMemo(
    () => ({
      page: params.page,
      pageSize: params.pageSize,
      pageSizes,
      sort: params.sort,
      onSort: (sort: string) => set({ sort } as TableSearchChange<P>),
      onPage: (page: number) => set({ page } as TableSearchChange<P>),
      onPageSize: (pageSize: number) => set({ pageSize } as TableSearchChange<P>),
    }),
    [params.page, params.pageSize, params.sort, pageSizes, set],
  );
  return { params, search, set, tableProps };
}
