import { type HealthView } from '@kerfwright/contracts';
import { queryOptions, useQuery } from '@tanstack/react-query';
import { env } from '../../../config/env';
import { api, isApiError } from '../../../lib/api-client';

export const healthKeys = { all: ['health'] as const };

function isHealthView(value: unknown): value is HealthView {
  if (typeof value !== 'object' || value === null) return false;
  const v = value as Record<string, unknown>;
  return (
    (v.status === 'ok' || v.status === 'degraded') &&
    (v.database === 'up' || v.database === 'down') &&
    (v.redis === 'up' || v.redis === 'down') &&
    typeof v.version === 'string'
  );
}

/**
 * GET /api/health. A degraded service answers 503 with the same view in `details`; that is still an answer
 * about health, so it is returned rather than thrown.
 */
export async function getHealth(signal?: AbortSignal): Promise<HealthView> {
  try {
    return await api.get<HealthView>('/health', undefined, signal);
  } catch (error) {
    if (isApiError(error) && error.status === 503 && isHealthView(error.details)) return error.details;
    throw error;
  }
}

export function healthQueryOptions() {
  return queryOptions({
    queryKey: healthKeys.all,
    queryFn: ({ signal }) => getHealth(signal),
    staleTime: 10_000,
    refetchInterval: env.healthRefreshMs,
  });
}

export function useHealth() {
  return useQuery(healthQueryOptions());
}
