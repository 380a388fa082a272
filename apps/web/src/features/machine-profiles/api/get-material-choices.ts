import { type MaterialView, type Page } from '@kerfwright/contracts';
import { useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { profilesKeys } from './profiles-keys';

/** GET /api/materials (first 200, by name): the materials a profile version can hold settings for. */
export function getMaterialChoices(signal?: AbortSignal): Promise<Page<MaterialView>> {
  return api.get<Page<MaterialView>>('/materials', { page: 1, pageSize: 200, sort: 'name' }, signal);
}

export function useMaterialChoices(enabled: boolean) {
  return useQuery({
    queryKey: profilesKeys.materials(),
    queryFn: ({ signal }) => getMaterialChoices(signal),
    enabled,
  });
}
