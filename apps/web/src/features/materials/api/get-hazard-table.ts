import { type MaterialHazard } from '@kerfwright/contracts';
import { useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { materialsKeys } from './materials-keys';

/** GET /api/safety/hazards → the material hazard table: which families may go on a laser, and why. */
export function getHazardTable(signal?: AbortSignal): Promise<MaterialHazard[]> {
  return api.get<MaterialHazard[]>('/safety/hazards', undefined, signal);
}

export function useHazardTable() {
  return useQuery({ queryKey: materialsKeys.hazards(), queryFn: ({ signal }) => getHazardTable(signal) });
}
