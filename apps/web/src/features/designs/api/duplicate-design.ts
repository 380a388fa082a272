import { type DesignView } from '@kerfwright/contracts';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { designsKeys } from './designs-keys';

/** POST /api/designs/:id/duplicate → a copy owned by the caller. */
export function duplicateDesign(id: string): Promise<DesignView> {
  return api.post<DesignView>(`/designs/${encodeURIComponent(id)}/duplicate`, {});
}

export function useDuplicateDesign() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: duplicateDesign,
    onSuccess: (design) => {
      queryClient.setQueryData(designsKeys.detail(design.id), design);
      void queryClient.invalidateQueries({ queryKey: designsKeys.lists() });
    },
  });
}
