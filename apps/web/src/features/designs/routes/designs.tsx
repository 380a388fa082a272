import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Chip from '@mui/material/Chip';
import LinearProgress from '@mui/material/LinearProgress';
import Paper from '@mui/material/Paper';
import Stack from '@mui/material/Stack';
import Table from '@mui/material/Table';
import TableBody from '@mui/material/TableBody';
import TableCell from '@mui/material/TableCell';
import TableHead from '@mui/material/TableHead';
import TablePagination from '@mui/material/TablePagination';
import TableRow from '@mui/material/TableRow';
import TableSortLabel from '@mui/material/TableSortLabel';
import TextField from '@mui/material/TextField';
import Typography from '@mui/material/Typography';
import { useMemo } from 'react';
import { Link, useSearchParams } from 'react-router-dom';
import { ErrorPanel } from '../../../components/errors/error-panel';
import {
  DESIGN_SORT_FIELDS,
  type DesignSort,
  type DesignSortField,
  type GetDesignsParams,
  useDesigns,
} from '../api/get-designs';

const PAGE_SIZES = [10, 25, 50];
const DEFAULT_SORT: DesignSort = '-updatedAt';

function parse(search: URLSearchParams): GetDesignsParams {
  const page = Number(search.get('page'));
  const size = Number(search.get('pageSize'));
  const sort = search.get('sort') ?? '';
  return {
    page: Number.isInteger(page) && page >= 1 ? page : 1,
    pageSize: PAGE_SIZES.includes(size) ? size : 25,
    sort: (DESIGN_SORT_FIELDS as readonly string[]).includes(sort.replace(/^-/, ''))
      ? (sort as DesignSort)
      : DEFAULT_SORT,
    q: search.get('q') ?? undefined,
  };
}

/** Saved designs (a hobbyist sees their own, staff everyone's): search, sort and page kept in the address. */
export function DesignsRoute() {
  const [search, setSearch] = useSearchParams();
  const params = useMemo(() => parse(search), [search]);
  const designs = useDesigns(params);
  const set = (change: Record<string, string | number | undefined>) =>
    setSearch(
      (prev) => {
        const next = new URLSearchParams(prev);
        for (const [k, v] of Object.entries(change)) {
          if (v === undefined || v === '') next.delete(k);
          else next.set(k, String(v));
        }
        if (!('page' in change)) next.delete('page');
        return next;
      },
      { replace: true },
    );
  const header = (field: DesignSortField, label: string) => (
    <TableSortLabel
      active={params.sort.replace(/^-/, '') === field}
      direction={params.sort === field ? 'asc' : 'desc'}
      onClick={() => set({ sort: params.sort === field ? `-${field}` : field })}
    >
      {label}
    </TableSortLabel>
  );
  const total = designs.data?.total ?? 0;

  return (
    <Box sx={{ maxWidth: 1200 }}>
      <title>Designs · Kerfwright</title>
      <Stack direction="row" sx={{ alignItems: 'center', mb: 1 }}>
        <Typography variant="h1" sx={{ flex: 1 }}>
          Designs
        </Typography>
        <Button variant="contained" component={Link} to="/designs/new">
          New design
        </Button>
      </Stack>
      <Typography color="text.secondary" sx={{ mb: 3 }}>
        Saved designs. Open one in the studio to change it, copy it or request a cut.
      </Typography>
      <TextField
        size="small"
        label="Search name or description"
        defaultValue={params.q ?? ''}
        onChange={(e) => set({ q: e.target.value })}
        sx={{ mb: 2 }}
      />
      {designs.isError ? (
        <ErrorPanel
          title="The designs could not be loaded"
          error={designs.error}
          onRetry={() => void designs.refetch()}
        />
      ) : (
        <Paper variant="outlined">
          <Box sx={{ height: 4 }}>
            {designs.isFetching ? <LinearProgress aria-label="Loading designs" /> : null}
          </Box>
          <Table size="small" aria-label="Designs">
            <TableHead>
              <TableRow>
                <TableCell>{header('name', 'Name')}</TableCell>
                <TableCell>Owner</TableCell>
                <TableCell>Solid</TableCell>
                <TableCell align="right">Pieces</TableCell>
                <TableCell>Check</TableCell>
                <TableCell>{header('updatedAt', 'Updated')}</TableCell>
              </TableRow>
            </TableHead>
            <TableBody>
              {(designs.data?.items ?? []).map((d) => (
                <TableRow key={d.id} hover>
                  <TableCell>
                    <Link to={`/designs/${d.id}`}>{d.name}</Link>
                  </TableCell>
                  <TableCell>{d.ownerName}</TableCell>
                  <TableCell>{d.solidFileName ?? d.solid}</TableCell>
                  <TableCell align="right">{d.preview.pieceCount}</TableCell>
                  <TableCell>
                    {d.preview.valid ? (
                      <Chip size="small" color="success" label="valid" />
                    ) : (
                      <Chip size="small" color="error" label={`${d.preview.errors.length} errors`} />
                    )}
                  </TableCell>
                  <TableCell>{new Date(d.updatedAt).toLocaleString()}</TableCell>
                </TableRow>
              ))}
              {designs.data && designs.data.items.length === 0 ? (
                <TableRow>
                  <TableCell colSpan={6}>No designs match.</TableCell>
                </TableRow>
              ) : null}
            </TableBody>
          </Table>
          <TablePagination
            component="div"
            count={total}
            page={Math.min(params.page - 1, Math.max(0, Math.ceil(total / params.pageSize) - 1))}
            rowsPerPage={params.pageSize}
            rowsPerPageOptions={PAGE_SIZES}
            labelRowsPerPage="Rows per page"
            onPageChange={(_, p) => set({ page: p + 1 })}
            onRowsPerPageChange={(e) => set({ pageSize: Number(e.target.value) })}
          />
        </Paper>
      )}
    </Box>
  );
}
