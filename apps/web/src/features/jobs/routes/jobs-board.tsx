import { JOB_STATES, type JobState, type JobView, type Role } from '@kerfwright/contracts';
import Stack from '@mui/material/Stack';
import ToggleButton from '@mui/material/ToggleButton';
import ToggleButtonGroup from '@mui/material/ToggleButtonGroup';
import Typography from '@mui/material/Typography';
import { RouterLink } from '../../../components/ui/router-link';
import { paths } from '../../../config/paths';
import { DataTable, type DataTableColumn } from '../../../components/data-table/data-table';
import { SearchFilter } from '../../../components/data-table/filter-bar';
import { useTableSearchParams } from '../../../components/data-table/use-table-search-params';
import { ListPage } from '../../../components/layouts/list-page';
import { useUser } from '../../../lib/auth';
import { JOB_SORT_FIELDS, type JobSortField, useJobs } from '../api/get-jobs';
import { JobStateChip } from '../components/job-state-chip';
import { formatDate, formatDateTime } from '../../../lib/dates';
import { countOf } from '../../../lib/plural';

const PAGE_SIZES = [10, 25, 50] as const;

const FILTERS = {
  state: (raw: string | null) => JOB_STATES.find((s) => s === raw),
};

/** Which jobs the board holds for each role, as the server lists them. */
const JOBS_LISTED: Record<Role, string> = {
  hobbyist: 'Your cut jobs',
  fabricator: 'Every cut job sent to the workshop, and your own drafts,',
  operator: 'Every cut job sent to the workshop, and your own drafts,',
  supervisor: 'Every cut job in the workshop, drafts included,',
};

const COLUMNS: readonly DataTableColumn<JobView, JobSortField>[] = [
  {
    id: 'design',
    header: 'Design',
    render: (job) => (
      <>
        <RouterLink to={paths.job.getHref(job.id)}>{job.designName}</RouterLink>
        {/* Below md the copies and created columns go: said under the name instead, so two jobs of one
            design still read apart. */}
        <Typography
          variant="body2"
          color="text.secondary"
          sx={{ display: { xs: 'block', md: 'none' } }}
          data-testid="job-row-facts"
        >
          {`${countOf(job.quantity, 'copy', 'copies')} · created ${formatDate(job.createdAt)}`}
        </Typography>
      </>
    ),
  },
  // "Owner", not "Requester": a draft (not sent yet, or its request withdrawn) is requested by nobody.
  { id: 'requester', header: 'Owner', render: (job) => job.requesterName },
  { id: 'state', header: 'State', sortField: 'state', render: (job) => <JobStateChip state={job.state} /> },
  { id: 'material', hideOnPhone: true, header: 'Material', render: (job) => job.materialName ?? '—' },
  {
    id: 'profile',
    hideOnPhone: true,
    header: 'Machine profile',
    render: (job) => (job.profileName ? `${job.profileName} v${job.profileVersionNumber ?? '?'}` : '—'),
  },
  // A tablet keeps what a job is and where it stands; a phone (below) its design, owner and state.
  { id: 'copies', hideOnTablet: true, header: 'Copies', align: 'right', render: (job) => job.quantity },
  {
    id: 'created',
    hideOnTablet: true,
    header: 'Created',
    sortField: 'createdAt',
    render: (job) => formatDate(job.createdAt),
  },
  {
    id: 'updated',
    hideOnPhone: true,
    header: 'Updated',
    sortField: 'updatedAt',
    render: (job) => formatDateTime(job.updatedAt),
  },
];

/** Jobs by state: hobbyists see their own, staff see the workshop's. Filters, sort and page live in the address. */
export function JobsBoardRoute() {
  const { params, set, tableProps } = useTableSearchParams({
    sortFields: JOB_SORT_FIELDS,
    defaultSort: '-updatedAt',
    pageSizes: PAGE_SIZES,
    defaultPageSize: 25,
    filters: FILTERS,
  });
  const { state } = params;
  const jobs = useJobs(params);
  const user = useUser();

  return (
    <ListPage
      title="Jobs"
      intro={`${JOBS_LISTED[user.role]} by state. Open a job to see its history and the steps you can take.`}
      query={jobs}
      errorTitle="The jobs could not be loaded"
      filters={
        <Stack direction={{ xs: 'column', md: 'row' }} spacing={2} sx={{ mb: 2 }}>
          <SearchFilter
            id="jobs-search"
            label="Search design or owner"
            value={params.q ?? ''}
            onSearch={(q) => set({ q })}
          />
          <ToggleButtonGroup
            size="small"
            exclusive
            value={state ?? 'all'}
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
      }
      table={
        <DataTable
          label="Jobs"
          columns={COLUMNS}
          rows={jobs.data?.items}
          rowKey={(job) => job.id}
          rowProps={(job) => ({ 'data-testid': `job-row-${job.id}` })}
          emptyText="No jobs match."
          fetching={jobs.isFetching}
          fetchingLabel="Loading jobs"
          total={jobs.data?.total ?? 0}
          {...tableProps}
        />
      }
    />
  );
}
