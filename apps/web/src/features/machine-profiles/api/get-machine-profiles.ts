import {
  type MachineProfileKind,
  type MachineProfileSummaryView,
  type Page,
  type ProfileVersionState,
} from '@kerfwright/contracts';
import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { profilesKeys } from './profiles-keys';

export interface GetMachineProfilesParams {
  page: number;
  pageSize: number;
  /** A field of PROFILE_SORT_FIELDS, '-' first for descending. */
  sort?: string;
  kind?: MachineProfileKind;
  /** State of the latest version. */
  state?: ProfileVersionState;
  q?: string;
}

/** GET /api/machine-profiles?page&pageSize&sort&kind&state&q → profiles with approved and latest versions. */
export function getMachineProfiles(
  params: GetMachineProfilesParams,
  signal?: AbortSignal,
): Promise<Page<MachineProfileSummaryView>> {
  return api.get<Page<MachineProfileSummaryView>>(
    '/machine-profiles',
    {
      page: params.page,
      pageSize: params.pageSize,
      sort: params.sort,
      kind: params.kind,
      state: params.state,
      q: params.q?.trim() || undefined,
    },
    signal,
  );
}

export function machineProfilesQueryOptions(params: GetMachineProfilesParams) {
  return queryOptions({
    queryKey: profilesKeys.list(params),
    queryFn: ({ signal }) => getMachineProfiles(params, signal),
    placeholderData: keepPreviousData,
  });
}

export function useMachineProfiles(params: GetMachineProfilesParams) {
  return useQuery(machineProfilesQueryOptions(params));
}
