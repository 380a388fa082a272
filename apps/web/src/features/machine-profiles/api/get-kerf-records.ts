import { type KerfRecordView, type Page } from '@kerfwright/contracts';
import { useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { profilesKeys } from './profiles-keys';

/** GET /api/machine-profiles/:id/kerf-records → measured kerfs of the machine, oldest first (up to 1000). */
export function getKerfRecords(profileId: string, signal?: AbortSignal): Promise<Page<KerfRecordView>> {
  return api.get<Page<KerfRecordView>>(
    `/machine-profiles/${encodeURIComponent(profileId)}/kerf-records`,
    { page: 1, pageSize: 1000 },
    signal,
  );
}

export function useKerfRecords(profileId: string) {
  return useQuery({
    queryKey: profilesKeys.kerfRecords(profileId),
    queryFn: ({ signal }) => getKerfRecords(profileId, signal),
  });
}
