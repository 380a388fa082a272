import { describe, expect, it } from 'vitest';
import { ApiError } from './api-client';
import { FAILED_LIST_REFETCH_MS, createQueryClient, refetchWhileFailing } from './query-client';

const failedWith = (error: unknown) => ({ state: { status: 'error', error } });

describe('refetchWhileFailing', () => {
  it('asks again while the service is unreachable or failing, and not once the list has loaded', () => {
    const unreachable = new ApiError(0, 'NETWORK.UNREACHABLE', 'The Kerfwright service cannot be reached.');
    expect(refetchWhileFailing(failedWith(unreachable))).toBe(FAILED_LIST_REFETCH_MS);
    expect(refetchWhileFailing(failedWith(new ApiError(503, 'SERVICE.UNAVAILABLE', 'Down')))).toBe(
      FAILED_LIST_REFETCH_MS,
    );
    expect(refetchWhileFailing({ state: { status: 'success', error: null } })).toBe(false);
  });

  it('does not ask again after a refusal, which asking again would not change', () => {
    expect(refetchWhileFailing(failedWith(new ApiError(403, 'AUTH.FORBIDDEN', 'Not for your role')))).toBe(
      false,
    );
  });

  it('is what every query of the app does, so every page recovers once the service is back', () => {
    expect(createQueryClient().getDefaultOptions().queries?.refetchInterval).toBe(refetchWhileFailing);
  });
});
