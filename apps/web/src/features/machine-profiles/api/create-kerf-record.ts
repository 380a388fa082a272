import { type CreateKerfRecordRequest, type KerfRecordView } from '@kerfwright/contracts';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { profilesKeys } from './profiles-keys';

/** POST /api/machine-profiles/:id/kerf-records → the recorded measurement (operator, fabricator, supervisor). */
export function createKerfRecord(profileId: string, body: CreateKerfRecordRequest): Promise<KerfRecordView> {
  return api.post<KerfRecordView>(`/machine-profiles/${encodeURIComponent(profileId)}/kerf-records`, body);
}

export function useCreateKerfRecord(profileId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: CreateKerfRecordRequest) => createKerfRecord(profileId, body),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: profilesKeys.kerfRecords(profileId) }),
  });
}
