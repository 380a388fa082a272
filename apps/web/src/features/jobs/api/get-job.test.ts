import { describe, expect, it } from 'vitest';
import { QUEUE_REFRESH_MS } from '../../../lib/query-client';
import { jobQueryOptions } from './get-job';

/** The interval the job's query asks for, given what it holds. */
function intervalFor(state: { status: string; data?: { state: string }; error?: unknown }) {
  const interval = jobQueryOptions('5e2f8a10-3c4b-4d6e-8f9a-0b1c2d3e4f50').refetchInterval;
  if (typeof interval !== 'function') throw new Error('the job query sets no refetch rule');
  return (interval as (q: unknown) => number | false)({ state: { error: null, ...state } });
}

describe('the job query', () => {
  it('reads a job others may still act on again while it is open (its machine may be taken out of use)', () => {
    for (const state of ['requested', 'prepared', 'approved', 'released']) {
      expect(intervalFor({ status: 'success', data: { state } })).toBe(QUEUE_REFRESH_MS);
    }
  });

  it('leaves a closed job alone', () => {
    for (const state of ['draft', 'cut', 'closed', 'returned']) {
      expect(intervalFor({ status: 'success', data: { state } })).toBe(false);
    }
  });
});
