import { type ExportView, type JobView } from '@kerfwright/contracts';
import { useQueries, useQuery } from '@tanstack/react-query';
import { getJobExports } from '../../jobs/api/get-job-exports';
import { getJobs } from '../../jobs/api/get-jobs';
import { jobsKeys } from '../../jobs/api/jobs-keys';
import { QUEUE_REFRESH_MS } from '../../../lib/query-client';

/** Most jobs one desk lists per state (the workshop's queue, not an archive). */
const DESK_PAGE_SIZE = 100;

export interface DeskRow {
  job: JobView;
  /** The job's newest export, once loaded (null: none yet). */
  newest: ExportView | null | undefined;
  /** Files of the last pack built, still offered while a newer one is prepared or after it failed. */
  lastBuiltFiles: number | null;
}

/**
 * The release desk's queue: released jobs, and approved jobs whose cut pack is being prepared (a release in
 * progress), each with its newest export. GET /api/jobs?state=released|approved, then the exports per job.
 * Both lists, and the exports of the approved jobs (a pack started elsewhere brings one to the desk), are read
 * again every QUEUE_REFRESH_MS while the desk is open.
 */
export function useReleaseDeskJobs() {
  const released = useQuery({
    queryKey: jobsKeys.list({ desk: 'released' }),
    queryFn: ({ signal }) =>
      getJobs({ page: 1, pageSize: DESK_PAGE_SIZE, sort: '-updatedAt', state: 'released' }, signal),
    refetchInterval: QUEUE_REFRESH_MS,
  });
  const approved = useQuery({
    queryKey: jobsKeys.list({ desk: 'approved' }),
    queryFn: ({ signal }) =>
      getJobs({ page: 1, pageSize: DESK_PAGE_SIZE, sort: '-updatedAt', state: 'approved' }, signal),
    refetchInterval: QUEUE_REFRESH_MS,
  });
  const jobs = [...(released.data?.items ?? []), ...(approved.data?.items ?? [])];
  const exports = useQueries({
    queries: jobs.map((job) => ({
      queryKey: jobsKeys.exports(job.id),
      queryFn: ({ signal }: { signal: AbortSignal }) => getJobExports(job.id, signal),
      refetchInterval: job.state === 'approved' ? QUEUE_REFRESH_MS : false,
    })),
  });
  const rows: DeskRow[] = jobs
    .map((job, i) => ({
      job,
      newest: exports[i]?.data ? (exports[i]?.data?.[0] ?? null) : undefined,
      lastBuiltFiles: exports[i]?.data?.find((e) => e.state === 'done')?.files.length ?? null,
    }))
    .filter(
      ({ job, newest }) =>
        job.state === 'released' || (newest && (newest.state === 'queued' || newest.state === 'running')),
    );
  return {
    rows,
    isPending: released.isPending || approved.isPending,
    error: released.error ?? approved.error,
    refetch: () => Promise.all([released.refetch(), approved.refetch()]),
  };
}
