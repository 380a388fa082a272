import { type DesignSummary } from '@kerfwright/contracts';
import { screen, within } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { FAILED_LIST_REFETCH_MS } from '../../../lib/query-client';
import { json, stubFetch } from '../../../testing/fetch-stub';
import { userFixture } from '../../../testing/fixtures';
import { renderApp } from '../../../testing/render-app';

function emptyDesigns() {
  return stubFetch({
    'GET /api/auth/me': () => json(200, userFixture('hobbyist')),
    'GET /api/designs': (call) =>
      json(200, {
        items: [],
        total: 0,
        page: Number(call.url.searchParams.get('page') ?? 1),
        pageSize: Number(call.url.searchParams.get('pageSize') ?? 25),
      }),
  });
}

describe('designs list', () => {
  afterEach(() => vi.useRealTimers());

  it('tells a new member there are no designs yet and how to start one', async () => {
    emptyDesigns();
    renderApp('/designs', { token: 't' });
    const table = await screen.findByRole('table', { name: 'Designs' });
    expect(await screen.findByText(/No designs yet\. Start one with New design/)).toBeInTheDocument();
    expect(table).not.toHaveTextContent('No designs match');
    expect(screen.getByRole('link', { name: 'New design' })).toHaveAttribute('href', '/designs/new');
  });

  it('comes back by itself once the service is reachable again, without a reload or Try again', async () => {
    vi.useFakeTimers({ shouldAdvanceTime: true });
    let up = false;
    stubFetch({
      'GET /api/auth/me': () => json(200, userFixture('hobbyist')),
      // As a browser's fetch fails while the service is down.
      'GET /api/designs': () =>
        up
          ? json(200, { items: [], total: 0, page: 1, pageSize: 25 })
          : Promise.reject(new TypeError('Failed to fetch')),
    });
    renderApp('/designs', { token: 't' });
    expect(await screen.findByText('The designs could not be loaded')).toBeInTheDocument();
    up = true;
    await vi.advanceTimersByTimeAsync(FAILED_LIST_REFETCH_MS + 100);
    expect(await screen.findByText(/No designs yet/)).toBeInTheDocument();
    expect(screen.queryByText('The designs could not be loaded')).not.toBeInTheDocument();
  });

  it('says that nothing matches only when a search is set', async () => {
    emptyDesigns();
    renderApp('/designs?q=tetra', { token: 't' });
    expect(await screen.findByText('No designs match “tetra”.')).toBeInTheDocument();
    expect(screen.queryByText(/No designs yet/)).not.toBeInTheDocument();
    // The search box shows the address's search and, as every list's, takes no more than the API does.
    const box = screen.getByRole('searchbox', { name: 'Search name or description' });
    expect(box).toHaveValue('tetra');
    expect(box).toHaveAttribute('maxlength', '100');
  });

  it('names each solid as the studio does, and an uploaded solid by its file', async () => {
    const row = (id: string, solid: string, solidFileName: string | null): DesignSummary => ({
      id,
      ownerId: userFixture('hobbyist').id,
      ownerName: 'Hobbyist Person',
      name: `Design ${id}`,
      description: '',
      solid,
      solidFileName,
      preview: {
        valid: true,
        pieceCount: 12,
        crossingCount: 24,
        diameterMm: 240,
        planeDistanceMm: 80,
        errors: [],
        warnings: [],
      },
      version: 1,
      createdAt: '2026-01-15T09:30:00.000Z',
      updatedAt: '2026-01-15T09:30:00.000Z',
    });
    const items = [
      row('d-1', 'rhombic-dodecahedron', null),
      row('d-2', 'octahedron', null),
      row('d-3', 'Lamp cube', 'Lamp cube.off'),
    ];
    stubFetch({
      'GET /api/auth/me': () => json(200, userFixture('hobbyist')),
      'GET /api/designs': () => json(200, { items, total: items.length, page: 1, pageSize: 25 }),
    });
    renderApp('/designs', { token: 't' });
    const table = await screen.findByRole('table', { name: 'Designs' });
    await within(table).findByRole('link', { name: 'Design d-1' });
    const column = within(table)
      .getAllByRole('columnheader')
      .map((h) => h.textContent)
      .indexOf('Solid');
    const solids = within(table)
      .getAllByRole('row')
      .slice(1)
      .map((r) => within(r).getAllByRole('cell')[column]?.textContent);
    expect(solids).toEqual(['Rhombic dodecahedron', 'Octahedron', 'Lamp cube.off']);
  });
});
