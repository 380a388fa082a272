import { QueryClient } from '@tanstack/react-query';
import { isApiError } from './api-client';

/** Client errors (4xx) will not change on a retry; network trouble and 5xx get two more tries. */
function shouldRetry(failureCount: number, error: unknown): boolean {
  if (isApiError(error) && error.status >= 400 && error.status < 500) return false;
  return failureCount < 2;
}

/**
 * How often a list of work that others change (the jobs board, the release desk, approvals) is read again while
 * its page is open, so that a screen left open shows jobs released, approved or sent meanwhile.
 */
export const QUEUE_REFRESH_MS = 30_000;

export function createQueryClient(): QueryClient {
  return new QueryClient({
    defaultOptions: {
      queries: { staleTime: 30_000, retry: shouldRetry, refetchOnWindowFocus: true },
      mutations: { retry: false },
    },
  });
}
