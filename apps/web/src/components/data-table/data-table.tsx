import Box from '@mui/material/Box';
import LinearProgress from '@mui/material/LinearProgress';
import Paper from '@mui/material/Paper';
import Skeleton from '@mui/material/Skeleton';
import { type SxProps, type Theme } from '@mui/material/styles';
import useMediaQuery from '@mui/material/useMediaQuery';
import Table from '@mui/material/Table';
import TableBody from '@mui/material/TableBody';
import TableCell from '@mui/material/TableCell';
import TableContainer from '@mui/material/TableContainer';
import TableHead from '@mui/material/TableHead';
import TablePagination from '@mui/material/TablePagination';
import TableRow from '@mui/material/TableRow';
import TableSortLabel from '@mui/material/TableSortLabel';
import { type ReactNode } from 'react';
import { useScrollFocus } from '../../lib/use-scroll-focus';

/** One column: its header, how a row shows in it, and (when sortable) the API's sort field. */
export interface DataTableColumn<T, F extends string = string> {
  id: string;
  header: string;
  render: (row: T) => ReactNode;
  sortField?: F;
  align?: 'left' | 'right';
  /** Style of the column's body cells. */
  cellSx?: SxProps<Theme>;
  /**
   * Left out on a phone-wide screen (below the theme's sm), so the columns that matter there (the record's name
   * and the actions on it) stay in reach without scrolling sideways.
   */
  hideOnPhone?: boolean;
  /**
   * Left out below the theme's md too (a tablet, and a phone), so that the table fits a tablet-wide screen
   * without scrolling sideways.
   */
  hideOnTablet?: boolean;
}

interface DataTableProps<T, F extends string> {
  /** The table's accessible name. */
  label: string;
  columns: readonly DataTableColumn<T, F>[];
  rows: readonly T[] | undefined;
  rowKey: (row: T) => string;
  /** Extra attributes for a row (e.g. a test id). */
  rowProps?: (row: T) => Record<string, string>;
  /** Style of a row (e.g. a warning tint). */
  rowSx?: (row: T) => SxProps<Theme> | undefined;
  /** Placeholder rows while the first page loads (none unless given). */
  loadingRows?: number;
  /**
   * From the theme's md up, below this width the table scrolls sideways instead of squeezing its columns. A
   * narrower screen has no such floor: its columns (fewer, see hideOnTablet) share the screen's width.
   */
  minWidth?: number;
  /** Shown in one row when a loaded page has no rows. */
  emptyText: string;
  /** A refetch is under way (a thin bar above the table). */
  fetching: boolean;
  fetchingLabel: string;
  total: number;
  /** 1-based page, as the API counts. */
  page: number;
  pageSize: number;
  pageSizes: readonly number[];
  /** `field` ascending, `-field` descending; leave out for a list the API does not sort. */
  sort?: string;
  onSort?: (sort: string) => void;
  onPage: (page: number) => void;
  onPageSize: (pageSize: number) => void;
}

/**
 * A server-paged, server-sorted table: sortable headers (a second click reverses), a refetch bar, an empty
 * row, placeholder rows while loading, and pagination. A page past the end (a stale link, or the last row
 * filtered away) shows the last page. The lists keep page, size and sort in the address (see
 * useTableSearchParams).
 */
export function DataTable<T, F extends string = string>({
  label,
  columns: allColumns,
  rows,
  rowKey,
  rowProps,
  rowSx,
  loadingRows = 0,
  minWidth,
  emptyText,
  fetching,
  fetchingLabel,
  total,
  page,
  pageSize,
  pageSizes,
  sort = '',
  onSort,
  onPage,
  onPageSize,
}: DataTableProps<T, F>) {
  const scrollFocus = useScrollFocus(label);
  const phone = useMediaQuery((theme: Theme) => theme.breakpoints.down('sm'));
  const tablet = useMediaQuery((theme: Theme) => theme.breakpoints.down('md'));
  // On a phone or a tablet the secondary columns go, and with them the width the whole table needed.
  const columns = allColumns.filter((c) => !(tablet && c.hideOnTablet) && !(phone && c.hideOnPhone));
  const lastPage = Math.max(0, Math.ceil(total / pageSize) - 1);
  const sorted = (c: DataTableColumn<T, F>) =>
    c.sortField !== undefined && sort.replace(/^-/, '') === c.sortField;
  return (
    <Paper variant="outlined">
      <Box sx={{ height: 4 }}>{fetching ? <LinearProgress aria-label={fetchingLabel} /> : null}</Box>
      <TableContainer {...scrollFocus} sx={{ overflowX: 'auto' }}>
        <Table size="small" aria-label={label} sx={{ minWidth: tablet ? undefined : minWidth }}>
          <TableHead>
            <TableRow>
              {columns.map((c) => (
                <TableCell
                  key={c.id}
                  align={c.align}
                  sortDirection={sorted(c) ? (sort.startsWith('-') ? 'desc' : 'asc') : false}
                >
                  {c.sortField ? (
                    <TableSortLabel
                      active={sorted(c)}
                      direction={sort === c.sortField ? 'asc' : 'desc'}
                      onClick={() => onSort?.(sort === c.sortField ? `-${c.sortField}` : (c.sortField ?? ''))}
                    >
                      {c.header}
                    </TableSortLabel>
                  ) : (
                    c.header
                  )}
                </TableCell>
              ))}
            </TableRow>
          </TableHead>
          <TableBody>
            {rows === undefined
              ? Array.from({ length: loadingRows }, (_, i) => (
                  <TableRow key={`loading-${i}`} aria-hidden="true">
                    {columns.map((c) => (
                      <TableCell key={c.id}>
                        <Skeleton />
                      </TableCell>
                    ))}
                  </TableRow>
                ))
              : null}
            {(rows ?? []).map((row) => (
              <TableRow key={rowKey(row)} hover sx={rowSx?.(row)} {...rowProps?.(row)}>
                {columns.map((c) => (
                  <TableCell key={c.id} align={c.align} sx={c.cellSx}>
                    {c.render(row)}
                  </TableCell>
                ))}
              </TableRow>
            ))}
            {rows && rows.length === 0 ? (
              <TableRow>
                <TableCell colSpan={columns.length}>{emptyText}</TableCell>
              </TableRow>
            ) : null}
          </TableBody>
        </Table>
      </TableContainer>
      <TablePagination
        component="div"
        count={total}
        page={Math.min(page - 1, lastPage)}
        rowsPerPage={pageSize}
        rowsPerPageOptions={[...pageSizes]}
        labelRowsPerPage="Rows per page"
        onPageChange={(_, p) => onPage(p + 1)}
        onRowsPerPageChange={(e) => onPageSize(Number(e.target.value))}
      />
    </Paper>
  );
}
