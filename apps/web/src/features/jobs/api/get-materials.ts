import { type MaterialView, type Page } from '@kerfwright/contracts';
import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { jobsKeys } from './jobs-keys';

/** GET /api/materials (first 100): the materials a fabricator can prepare a job with. */
export function getMaterials(signal?: AbortSignal): Promise<Page<MaterialView>> {
  return api.get<Page<MaterialView>>('/materials', { page: 1, pageSize: 100 }, signal);
}

export function useMaterials(enabled: boolean) {
  return useQuery({
    ...queryOptions({ queryKey: jobsKeys.materials(), queryFn: ({ signal }) => getMaterials(signal) }),
    enabled,
  });
}
