import { screen } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { renderWithProviders } from '../../testing/render-app';
import { SEARCH_MAX_LENGTH, useTableSearchParams } from './use-table-search-params';

const SORT_FIELDS = ['name', 'updatedAt'] as const;
const PAGE_SIZES = [10, 25] as const;
const FILTERS = {
  colour: (raw: string | null) => (raw === 'red' || raw === 'blue' ? raw : undefined),
};

function Probe() {
  const { params, set } = useTableSearchParams({
    sortFields: SORT_FIELDS,
    defaultSort: '-updatedAt',
    pageSizes: PAGE_SIZES,
    defaultPageSize: 25,
    filters: FILTERS,
  });
  return (
    <>
      <output>{JSON.stringify(params)}</output>
      <button onClick={() => set({ colour: 'blue' })}>blue</button>
      <button onClick={() => set({ sort: '-updatedAt', pageSize: 10 })}>defaults</button>
    </>
  );
}

const shown = () => JSON.parse(screen.getByRole('status').textContent ?? '{}') as Record<string, unknown>;

describe('a list’s search parameters in the address', () => {
  it('reads typed filters and falls back to the defaults for unknown values', async () => {
    const malformed = renderWithProviders(<Probe />, {
      path: '/?page=0&pageSize=7&sort=owner&colour=green&q=box',
    });
    await screen.findByRole('status');
    expect(shown()).toEqual({ page: 1, pageSize: 25, sort: '-updatedAt', q: 'box' });
    malformed.unmount();

    renderWithProviders(<Probe />, { path: '/?page=3&pageSize=10&sort=name&colour=red' });
    await screen.findByRole('status');
    expect(shown()).toMatchObject({ page: 3, pageSize: 10, sort: 'name', colour: 'red' });
  });

  it('searches for no more text than the API takes, however long the address’s', async () => {
    // The API refuses a q over 100 characters (@MaxLength(100) on its list queries, e.g. apps/api/src/jobs/dto).
    const long = 'birch '.repeat(30);
    renderWithProviders(<Probe />, { path: `/?q=${encodeURIComponent(long)}` });
    await screen.findByRole('status');
    expect(SEARCH_MAX_LENGTH).toBe(100);
    expect(shown().q).toBe(long.slice(0, 100));
  });

  it('starts again from page 1 on a filter change and keeps default values out of the address', async () => {
    const { user, router } = renderWithProviders(<Probe />, { path: '/?page=3&sort=name&colour=red' });
    await user.click(await screen.findByRole('button', { name: 'blue' }));
    expect(router.state.location.search).toBe('?sort=name&colour=blue');
    await user.click(screen.getByRole('button', { name: 'defaults' }));
    expect(router.state.location.search).toBe('?colour=blue&pageSize=10');
  });
});
