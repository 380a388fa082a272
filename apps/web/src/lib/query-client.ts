import { QueryClient } from '@tanstack/react-query';
import { isApiError } from './api-client';

/** A client error (4xx) will not change on a retry; network trouble and a 5xx may. */
const isClientError = (error: unknown) => isApiError(error) && error.status >= 400 && error.status < 500;

/** Client errors (4xx) will not change on a retry; network trouble and 5xx get two more tries. */
function shouldRetry(failureCount: number, error: unknown): boolean {
  if (isClientError(error)) return false;
  return failureCount < 2;
}

/** How long a list that could not be loaded (the service unreachable, or failing) waits to be asked again. */
export const FAILED_LIST_REFETCH_MS = 15_000;

/**
 * The queries' refetchInterval: after its retries have failed on network trouble or a 5xx, a query is asked
 * again every FAILED_LIST_REFETCH_MS until it loads, so a page (or a form's list) recovers once the service
 * is back. A loaded query, or a refusal (4xx), is not asked again.
 */
export function refetchWhileFailing(query: { state: { status: string; error: unknown } }): number | false {
  return query.state.status === 'error' && !isClientError(query.state.error) ? FAILED_LIST_REFETCH_MS : false;
}

/**
 * How often a list of work that others change (the jobs board, the release desk, approvals) is read again while
 * its page is open, so that a screen left open shows jobs released, approved or sent meanwhile.
 */
export const QUEUE_REFRESH_MS = 30_000;

export function createQueryClient(): QueryClient {
  return new QueryClient({
    defaultOptions: {
      // Every page recovers by itself once the service is back (refetchWhileFailing): a list or a record
      // that could not be loaded is asked again while it is on screen; queries that poll set their own.
      queries: {
        staleTime: 30_000,
        retry: shouldRetry,
        refetchOnWindowFocus: true,
        refetchInterval: refetchWhileFailing,
      },
      mutations: { retry: false },
    },
  });
}
