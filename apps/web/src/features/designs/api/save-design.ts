import { type CreateDesignRequest, type DesignView, type UpdateDesignRequest } from '@kerfwright/contracts';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { designsKeys } from './designs-keys';

/** POST /api/designs → the new design. */
export function createDesign(body: CreateDesignRequest): Promise<DesignView> {
  return api.post<DesignView>('/designs', body);
}

/** PATCH /api/designs/:id with the version read (409 when stale) → the saved design. */
export function updateDesign(id: string, body: UpdateDesignRequest): Promise<DesignView> {
  return api.patch<DesignView>(`/designs/${encodeURIComponent(id)}`, body);
}

export type SaveDesignVariables =
  { id?: undefined; body: CreateDesignRequest } | { id: string; body: UpdateDesignRequest };

/** Creates a design, or saves an existing one; either way the cache holds the answer. */
export function useSaveDesign() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (v: SaveDesignVariables) =>
      v.id === undefined ? createDesign(v.body) : updateDesign(v.id, v.body),
    onSuccess: (design) => {
      queryClient.setQueryData(designsKeys.detail(design.id), design);
      void queryClient.invalidateQueries({ queryKey: designsKeys.lists() });
    },
  });
}
