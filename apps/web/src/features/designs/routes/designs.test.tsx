import { screen } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
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
  it('tells a new member there are no designs yet and how to start one', async () => {
    emptyDesigns();
    renderApp('/designs', { token: 't' });
    const table = await screen.findByRole('table', { name: 'Designs' });
    expect(await screen.findByText(/No designs yet\. Start one with New design/)).toBeInTheDocument();
    expect(table).not.toHaveTextContent('No designs match');
    expect(screen.getByRole('link', { name: 'New design' })).toHaveAttribute('href', '/designs/new');
  });

  it('says that nothing matches only when a search is set', async () => {
    emptyDesigns();
    renderApp('/designs?q=tetra', { token: 't' });
    expect(await screen.findByText('No designs match “tetra”.')).toBeInTheDocument();
    expect(screen.queryByText(/No designs yet/)).not.toBeInTheDocument();
  });
});
