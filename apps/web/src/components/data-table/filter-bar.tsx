import Box from '@mui/material/Box';
import MenuItem from '@mui/material/MenuItem';
import TextField from '@mui/material/TextField';
import { type ReactNode, useEffect, useRef, useState } from 'react';
import { SEARCH_MAX_LENGTH } from './use-table-search-params';

const SEARCH_DELAY_MS = 300;
/** The value of a select filter's first entry, which narrows nothing. */
const ALL = 'all';

/** A list's filters in one row (one column each on a phone); `columns` is the grid's template above that. */
export function FilterBar({
  label,
  columns,
  children,
}: {
  /** The search region's accessible name. */
  label: string;
  columns: string;
  children: ReactNode;
}) {
  return (
    <Box
      role="search"
      aria-label={label}
      sx={{ display: 'grid', gap: 2, gridTemplateColumns: { xs: '1fr', sm: columns }, mb: 2 }}
    >
      {children}
    </Box>
  );
}

/**
 * A search box that asks once typing pauses, not on every key, and follows `value` when it changes from
 * outside (Back, a cleared filter).
 */
export function SearchFilter({
  id,
  label,
  value,
  onSearch,
  maxLength = SEARCH_MAX_LENGTH,
  placeholder,
}: {
  id: string;
  label: string;
  value: string;
  onSearch: (text: string) => void;
  maxLength?: number;
  placeholder?: string;
}) {
  const [text, setText] = useState(value);
  // The newest callback, so that a parent's new arrow function does not restart the pause.
  const search = useRef(onSearch);
  useEffect(() => {
    search.current = onSearch;
  });

  // The text last asked for. The address reports it back later (a navigation may be deferred), and that
  // echo must not overwrite what was typed in the meantime.
  const asked = useRef<string | null>(null);
  useEffect(() => {
    const echo = value === asked.current;
    asked.current = null;
    if (!echo) setText(value);
  }, [value]);

  useEffect(() => {
    if (text === value) return;
    const timer = window.setTimeout(() => {
      asked.current = text;
      search.current(text);
    }, SEARCH_DELAY_MS);
    return () => window.clearTimeout(timer);
  }, [text, value]);

  return (
    <TextField
      id={id}
      label={label}
      type="search"
      size="small"
      placeholder={placeholder}
      value={text}
      onChange={(event) => setText(event.target.value)}
      slotProps={{ htmlInput: { maxLength } }}
    />
  );
}

/** One choice narrows the list; the first entry (`allLabel`) does not, and reaches `onChange` as undefined. */
export function SelectFilter<V extends string>({
  id,
  label,
  value,
  allLabel,
  options,
  onChange,
}: {
  id: string;
  label: string;
  value: V | undefined;
  allLabel: string;
  options: readonly { value: V; label: string }[];
  onChange: (value: V | undefined) => void;
}) {
  return (
    <TextField
      id={id}
      select
      size="small"
      label={label}
      value={value ?? ALL}
      onChange={(event) => onChange(event.target.value === ALL ? undefined : (event.target.value as V))}
    >
      <MenuItem value={ALL}>{allLabel}</MenuItem>
      {options.map((o) => (
        <MenuItem key={o.value} value={o.value}>
          {o.label}
        </MenuItem>
      ))}
    </TextField>
  );
}

/** Options for a SelectFilter from a list of values and their labels. */
export function labelled<V extends string>(
  values: readonly V[],
  labels: Readonly<Record<V, string>>,
): { value: V; label: string }[] {
  return values.map((value) => ({ value, label: labels[value] }));
}

/** One select of a SearchSelectFilterBar: the narrowing choices for one key of the list's filters. */
export interface SelectFilterSpec<V extends string> {
  id: string;
  label: string;
  allLabel: string;
  options: readonly { value: V; label: string }[];
}

/** A change to a SearchSelectFilterBar's values: the search text or one select. */
type FilterChange<S extends Record<string, string>> = { q?: string } & { [K in keyof S]?: S[K] };

/**
 * A list's usual filters: a wide search box (`q`) then one select per key of `selects`, in that order. Every
 * change reaches `onChange` as the one key it changes (a cleared select as undefined).
 */
export function SearchSelectFilterBar<S extends Record<string, string>>({
  label,
  search,
  selects,
  values,
  onChange,
}: {
  /** The search region's accessible name. */
  label: string;
  search: { id: string; label: string };
  selects: { [K in keyof S]: SelectFilterSpec<S[K]> };
  values: NoInfer<{ q: string } & { [K in keyof S]?: S[K] }>;
  onChange: (change: NoInfer<FilterChange<S>>) => void;
}) {
  const keys = Object.keys(selects) as (keyof S & string)[];
  return (
    <FilterBar label={label} columns={['2fr', ...keys.map(() => '1fr')].join(' ')}>
      <SearchFilter
        id={search.id}
        label={search.label}
        value={values.q}
        onSearch={(text) => onChange({ q: text } as FilterChange<S>)}
      />
      {keys.map((key) => (
        <SelectFilter
          key={key}
          {...selects[key]}
          value={values[key]}
          onChange={(value) => onChange({ [key]: value } as FilterChange<S>)}
        />
      ))}
    </FilterBar>
  );
}
