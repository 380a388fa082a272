import { type JobDetailView } from '@kerfwright/contracts';
import { screen, waitFor, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { json, stubFetch } from '../../../testing/fetch-stub';
import { userFixture } from '../../../testing/fixtures';
import { renderApp } from '../../../testing/render-app';

const job: JobDetailView = {
  id: '11111111-2222-3333-4444-555555555555',
  state: 'requested',
  designId: 'd-1',
  designName: 'Cube planes with squares turned 45 degrees',
  requesterId: 'u-h',
  requesterName: 'Jun Park',
  quantity: 1,
  notes: '',
  materialId: null,
  materialName: null,
  colours: [],
  profileVersionId: null,
  profileName: null,
  profileVersionNumber: null,
  returnReason: null,
  preparation: null,
  actualMinutes: null,
  sheetsUsed: null,
  measuredKerfMm: null,
  version: 4,
  createdAt: '2026-01-01T00:00:00.000Z',
  updatedAt: '2026-01-01T00:00:00.000Z',
  actions: ['prepare', 'return'],
  transitions: [
    {
      from: null,
      to: 'draft',
      action: 'create',
      actorId: 'u-h',
      actorName: 'Jun Park',
      reason: null,
      at: '2026-01-01T00:00:00.000Z',
    },
    {
      from: 'draft',
      to: 'requested',
      action: 'request',
      actorId: 'u-h',
      actorName: 'Jun Park',
      reason: null,
      at: '2026-01-01T00:01:00.000Z',
    },
  ],
};

describe('job detail', () => {
  it('offers exactly the actions the API lists for the caller and returns the job with a reason and its version', async () => {
    const stub = stubFetch({
      'GET /api/auth/me': () => json(200, userFixture('fabricator')),
      [`GET /api/jobs/${job.id}`]: () => json(200, job),
      [`POST /api/jobs/${job.id}/return`]: () =>
        json(200, { ...job, state: 'returned', version: 5, actions: [] }),
    });
    const { user } = renderApp(`/jobs/${job.id}`, { token: 't' });
    const actions = await screen.findByTestId('job-actions');
    expect(
      within(actions)
        .getAllByRole('button')
        .map((b) => b.textContent),
    ).toEqual(['Prepare: material, machine, layout', 'Return with a reason']);
    const history = screen.getByRole('table', { name: 'History' });
    expect(history).toHaveTextContent('draft → requested');
    // At phone width (375 px) the table scrolls inside its own box instead of widening the page.
    expect(getComputedStyle(history.parentElement!).overflowX).toBe('auto');

    await user.click(within(actions).getByRole('button', { name: 'Return with a reason' }));
    await user.type(await screen.findByLabelText('Reason'), 'Please pick a thinner stock');
    await user.click(screen.getByRole('button', { name: 'Return with this reason' }));
    await waitFor(() => expect(stub.calls.some((c) => c.method === 'POST')).toBe(true));
    const post = stub.calls.find((c) => c.method === 'POST');
    expect(post?.body).toEqual({ version: 4, reason: 'Please pick a thinner stock' });
  });

  it('shows nothing to do when the API lists no actions', async () => {
    stubFetch({
      'GET /api/auth/me': () => json(200, userFixture('hobbyist')),
      [`GET /api/jobs/${job.id}`]: () => json(200, { ...job, actions: [] }),
    });
    renderApp(`/jobs/${job.id}`, { token: 't' });
    expect(await screen.findByText('Nothing for you to do on this job now.')).toBeInTheDocument();
  });
});
