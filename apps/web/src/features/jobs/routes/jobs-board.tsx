import { JOB_STATES, type JobState } from '@kerfwright/contracts';
import Box from '@mui/material/Box';
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
import ToggleButton from '@mui/material/ToggleButton';
import ToggleButtonGroup from '@mui/material/ToggleButtonGroup';
import Typography from '@mui/material/Typography';
import { useMemo } from 'react';
import { Link, useSearchParams } from 'react-router-dom';
import { ErrorPanel } from '../../../components/errors/error-panel';
import {
  type GetJobsParams,
  JOB_SORT_FIELDS,
  type JobSort,
  type JobSortField,
  useJobs,
} from '../api/get-jobs';
import { JobStateChip } from '../components/job-state-chip';

const PAGE_SIZES = [10, 25, 50];
const DEFAULT_SORT: JobSort = '-updatedAt';

function isJobState(value: string | null): value is JobState {
  return value !== null && (JOB_STATES as readonly string[]).includes(value);
}

function parse(search: URLSearchParams): GetJobsParams {
  const page = Number(search.get('page'));
  const size = Number(search.get('pageSize'));
  const sort = search.get('sort') ?? '';
  const state = search.get('state');
  const field = sort.replace(/^-/, '');
  return {
    page: Number.isInteger(page) && page >= 1 ? page : 1,
    pageSize: PAGE_SIZES.includes(size) ? size : 25,
    sort: (JOB_SORT_FIELDS as readonly string[]).includes(field) ? (sort as JobSort) : DEFAULT_SORT,
    state: isJobState(state) ? state : undefined,
    q: search.get('q') ?? undefined,
  };
}

/** Jobs by state: hobbyists see their own, staff see the workshop's. Filters, sort and page live in the address. */
export function JobsBoardRoute() {
  const [search, setSearch] = useSearchParams();
  const params = useMemo(() => parse(search), [search]);
  const jobs = useJobs(params);
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
  const sortBy = (field: JobSortField) => set({ sort: params.sort === field ? `-${field}` : field });
  const total = jobs.data?.total ?? 0;
  const sortHeader = (field: JobSortField, label: string) => (
    <TableSortLabel
      active={params.sort.replace(/^-/, '') === field}
      direction={params.sort === field ? 'asc' : 'desc'}
      onClick={() => sortBy(field)}
    >
      {label}
    </TableSortLabel>
  );

  return (
    <Box sx={{ maxWidth: 1200 }}>
      <title>Jobs · Kerfwright</title>
      <Typography variant="h1" sx={{ mb: 1 }}>
        Jobs
      </Typography>
      <Typography color="text.secondary" sx={{ mb: 3 }}>
        Every cut job by state. Open a job to see its history and the steps you can take.
      </Typography>
      <Stack direction={{ xs: 'column', md: 'row' }} spacing={2} sx={{ mb: 2 }}>
        <TextField
          size="small"
          label="Search design or requester"
          defaultValue={params.q ?? ''}
          onChange={(e) => set({ q: e.target.value })}
        />
        <ToggleButtonGroup
          size="small"
          exclusive
          value={params.state ?? 'all'}
          onChange={(_, v: JobState | 'all' | null) => v && set({ state: v === 'all' ? undefined : v })}
          aria-label="State"
          sx={{ flexWrap: 'wrap' }}
        >
          <ToggleButton value="all">all</ToggleButton>
          {JOB_STATES.map((s) => (
            <ToggleButton key={s} value={s}>
              {s}
            </ToggleButton>
          ))}
        </ToggleButtonGroup>
      </Stack>
      {jobs.isError ? (
        <ErrorPanel
          title="The jobs could not be loaded"
          error={jobs.error}
          onRetry={() => void jobs.refetch()}
        />
      ) : (
        <Paper variant="outlined">
          <Box sx={{ height: 4 }}>
            {jobs.isFetching ? <LinearProgress aria-label="Loading jobs" /> : null}
          </Box>
          <Table size="small" aria-label="Jobs">
            <TableHead>
              <TableRow>
                <TableCell>Design</TableCell>
                <TableCell>Requester</TableCell>
                <TableCell>{sortHeader('state', 'State')}</TableCell>
                <TableCell>Material</TableCell>
                <TableCell>Machine profile</TableCell>
                <TableCell align="right">Copies</TableCell>
                <TableCell>{sortHeader('createdAt', 'Created')}</TableCell>
                <TableCell>{sortHeader('updatedAt', 'Updated')}</TableCell>
              </TableRow>
            </TableHead>
            <TableBody>
              {(jobs.data?.items ?? []).map((job) => (
                <TableRow key={job.id} hover data-testid={`job-row-${job.id}`}>
                  <TableCell>
                    <Link to={`/jobs/${job.id}`}>{job.designName}</Link>
                  </TableCell>
                  <TableCell>{job.requesterName}</TableCell>
                  <TableCell>
                    <JobStateChip state={job.state} />
                  </TableCell>
                  <TableCell>{job.materialName ?? '—'}</TableCell>
                  <TableCell>
                    {job.profileName ? `${job.profileName} v${job.profileVersionNumber ?? '?'}` : '—'}
                  </TableCell>
                  <TableCell align="right">{job.quantity}</TableCell>
                  <TableCell>{new Date(job.createdAt).toLocaleDateString()}</TableCell>
                  <TableCell>{new Date(job.updatedAt).toLocaleString()}</TableCell>
                </TableRow>
              ))}
              {jobs.data && jobs.data.items.length === 0 ? (
                <TableRow>
                  <TableCell colSpan={8}>No jobs match.</TableCell>
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
            onPageChange={(_, page) => set({ page: page + 1 })}
            onRowsPerPageChange={(e) => set({ pageSize: Number(e.target.value) })}
          />
        </Paper>
      )}
    </Box>
  );
}
