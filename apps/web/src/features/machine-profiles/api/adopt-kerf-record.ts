import { type MachineProfileVersionView } from '@kerfwright/contracts';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { profilesKeys } from './profiles-keys';

/** POST …/kerf-records/:recordId/adopt → the draft now holding the measured value (open draft or a new one). */
export function adoptKerfRecord(profileId: string, recordId: string): Promise<MachineProfileVersionView> {
  return api.post<MachineProfileVersionView>(
    `/machine-profiles/${encodeURIComponent(profileId)}/kerf-records/${encodeURIComponent(recordId)}/adopt`,
    {},
  );
}

export function useAdoptKerfRecord(profileId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (recordId: string) => adoptKerfRecord(profileId, recordId),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: profilesKeys.all }),
  });
}
