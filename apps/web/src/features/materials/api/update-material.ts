import { type MaterialView, type UpdateMaterialRequest } from '@kerfwright/contracts';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { materialsKeys } from './materials-keys';

export interface UpdateMaterialVariables {
  id: string;
  changes: UpdateMaterialRequest;
}

/** PATCH /api/materials/:id with the version read (409 MATERIAL.STALE_VERSION when someone changed it since). */
export function updateMaterial({ id, changes }: UpdateMaterialVariables): Promise<MaterialView> {
  return api.patch<MaterialView>(`/materials/${encodeURIComponent(id)}`, changes);
}

export function useUpdateMaterial() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updateMaterial,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: materialsKeys.lists() }),
  });
}
