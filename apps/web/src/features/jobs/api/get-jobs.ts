import { type JobState, type JobView, type Page } from '@kerfwright/contracts';
import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { QUEUE_REFRESH_MS } from '../../../lib/query-client';
import { jobsKeys } from './jobs-keys';

export const JOB_SORT_FIELDS = ['createdAt', 'updatedAt', 'state'] as const;
export type JobSortField = (typeof JOB_SORT_FIELDS)[number];
export type JobSort = JobSortField | `-${JobSortField}`;

export interface GetJobsParams {
  page: number;
  pageSize: number;
  sort: JobSort;
  state?: JobState;
  q?: string;
}

/** GET /api/jobs?page&pageSize&sort&state&q → Page<JobView> (hobbyists see their own jobs). */
export function getJobs(params: GetJobsParams, signal?: AbortSignal): Promise<Page<JobView>> {
  return api.get<Page<JobView>>(
    '/jobs',
    {
      page: params.page,
      pageSize: params.pageSize,
      sort: params.sort,
      state: params.state,
      q: params.q?.trim() || undefined,
    },
    signal,
  );
}

/** One page of jobs, read again every QUEUE_REFRESH_MS while it is on screen (others move jobs meanwhile). */
export function jobsQueryOptions(params: GetJobsParams) {
  return queryOptions({
    queryKey: jobsKeys.list(params),
    queryFn: ({ signal }) => getJobs(params, signal),
    placeholderData: keepPreviousData,
    refetchInterval: QUEUE_REFRESH_MS,
  });
}

export function useJobs(params: GetJobsParams) {
  return useQuery(jobsQueryOptions(params));
}
