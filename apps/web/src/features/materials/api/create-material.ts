import { type CreateMaterialRequest, type MaterialView } from '@kerfwright/contracts';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { materialsKeys } from './materials-keys';

/** POST /api/materials → the new material (fabricator, supervisor; laser use checked against the hazard table). */
export function createMaterial(body: CreateMaterialRequest): Promise<MaterialView> {
  return api.post<MaterialView>('/materials', body);
}

export function useCreateMaterial() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createMaterial,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: materialsKeys.lists() }),
  });
}
