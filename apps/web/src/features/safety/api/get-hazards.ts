import { type MaterialHazard } from '@kerfwright/contracts';
import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { safetyKeys } from './safety-keys';

/** GET /api/safety/hazards → the material hazard table (which families may go on a laser, and why). */
export function getHazards(signal?: AbortSignal): Promise<MaterialHazard[]> {
  return api.get<MaterialHazard[]>('/safety/hazards', undefined, signal);
}

export function hazardsQueryOptions() {
  return queryOptions({ queryKey: safetyKeys.hazards(), queryFn: ({ signal }) => getHazards(signal) });
}

export function useHazards() {
  return useQuery(hazardsQueryOptions());
}
