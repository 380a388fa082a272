import { LASER_ALLOWANCES, type LaserAllowance, type MaterialHazard } from '@kerfwright/contracts';
import Chip from '@mui/material/Chip';
import Stack from '@mui/material/Stack';
import Table from '@mui/material/Table';
import TableBody from '@mui/material/TableBody';
import TableCell from '@mui/material/TableCell';
import TableContainer from '@mui/material/TableContainer';
import TableHead from '@mui/material/TableHead';
import TablePagination from '@mui/material/TablePagination';
import TableRow from '@mui/material/TableRow';
import TableSortLabel from '@mui/material/TableSortLabel';
import TextField from '@mui/material/TextField';
import { useMemo, useState } from 'react';
import { NATIVE_SELECT } from '../../../components/ui/native-select-field';
import { familyLabel } from '../../../config/trade-labels';
import { useScrollFocus } from '../../../lib/use-scroll-focus';

type SortKey = 'family' | 'laser';
const LASER_LABEL: Record<LaserAllowance, string> = {
  yes: 'allowed',
  no: 'never',
  conditional: 'with conditions',
};
const LASER_COLOUR = { yes: 'success', no: 'error', conditional: 'warning' } as const;

/** The material hazard table: searchable, filterable by laser allowance, sortable and paged. */
export function HazardTable({ rows }: { rows: readonly MaterialHazard[] }) {
  const scrollFocus = useScrollFocus('Material hazards');
  const [q, setQ] = useState('');
  const [laser, setLaser] = useState<LaserAllowance | 'all'>('all');
  const [sort, setSort] = useState<{ key: SortKey; asc: boolean }>({ key: 'family', asc: true });
  const [page, setPage] = useState(0);
  const [pageSize, setPageSize] = useState(10);

  const shown = useMemo(() => {
    const needle = q.trim().toLowerCase();
    const filtered = rows.filter(
      (r) =>
        (laser === 'all' || r.laser === laser) &&
        (!needle ||
          [familyLabel(r.family), r.hazard, ...r.examples].some((t) => t.toLowerCase().includes(needle))),
    );
    // Families sort by the name shown, as the reader sees them.
    const key = (r: MaterialHazard) => (sort.key === 'family' ? familyLabel(r.family) : r.laser);
    const sorted = [...filtered].sort(
      (a, b) => key(a).localeCompare(key(b)) || familyLabel(a.family).localeCompare(familyLabel(b.family)),
    );
    return sort.asc ? sorted : sorted.reverse();
  }, [rows, q, laser, sort]);
  const pageIndex = Math.min(page, Math.max(0, Math.ceil(shown.length / pageSize) - 1));
  const header = (key: SortKey, label: string) => (
    <TableSortLabel
      active={sort.key === key}
      direction={sort.key === key && !sort.asc ? 'desc' : 'asc'}
      onClick={() => setSort((s) => ({ key, asc: s.key === key ? !s.asc : true }))}
    >
      {label}
    </TableSortLabel>
  );

  return (
    <>
      <Stack direction={{ xs: 'column', sm: 'row' }} spacing={2} sx={{ mb: 2 }}>
        <TextField
          size="small"
          label="Search materials"
          value={q}
          onChange={(e) => {
            setQ(e.target.value);
            setPage(0);
          }}
        />
        <TextField
          size="small"
          select
          label="On a laser"
          value={laser}
          onChange={(e) => {
            setLaser(e.target.value as LaserAllowance | 'all');
            setPage(0);
          }}
          slotProps={NATIVE_SELECT}
          sx={{ minWidth: 180 }}
        >
          <option value="all">any</option>
          {LASER_ALLOWANCES.map((a) => (
            <option key={a} value={a}>
              {LASER_LABEL[a]}
            </option>
          ))}
        </TextField>
      </Stack>
      {/* A phone-width page keeps its width: the table scrolls inside its own box. */}
      <TableContainer {...scrollFocus} sx={{ overflowX: 'auto' }}>
        <Table size="small" aria-label="Material hazards">
          <TableHead>
            <TableRow>
              <TableCell>{header('family', 'Family')}</TableCell>
              <TableCell>Examples</TableCell>
              <TableCell>{header('laser', 'On a laser')}</TableCell>
              <TableCell>Hazard</TableCell>
              <TableCell>Source</TableCell>
            </TableRow>
          </TableHead>
          <TableBody>
            {shown.slice(pageIndex * pageSize, (pageIndex + 1) * pageSize).map((r) => (
              <TableRow key={r.family} data-testid={`hazard-${r.family}`}>
                <TableCell>{familyLabel(r.family)}</TableCell>
                <TableCell>{r.examples.join(', ')}</TableCell>
                <TableCell>
                  <Chip size="small" color={LASER_COLOUR[r.laser]} label={LASER_LABEL[r.laser]} />
                </TableCell>
                <TableCell>{r.condition ? `${r.hazard} Condition: ${r.condition}` : r.hazard}</TableCell>
                <TableCell>{r.source}</TableCell>
              </TableRow>
            ))}
            {shown.length === 0 ? (
              <TableRow>
                <TableCell colSpan={5}>No material matches.</TableCell>
              </TableRow>
            ) : null}
          </TableBody>
        </Table>
      </TableContainer>
      <TablePagination
        component="div"
        count={shown.length}
        page={pageIndex}
        rowsPerPage={pageSize}
        rowsPerPageOptions={[10, 25, 50]}
        labelRowsPerPage="Rows per page"
        onPageChange={(_, p) => setPage(p)}
        onRowsPerPageChange={(e) => {
          setPageSize(Number(e.target.value));
          setPage(0);
        }}
      />
    </>
  );
}
