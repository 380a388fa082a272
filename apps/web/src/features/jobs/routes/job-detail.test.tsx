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

  it('shows a measured kerf with the precision it was recorded to', async () => {
    stubFetch({
      'GET /api/auth/me': () => json(200, userFixture('operator')),
      [`GET /api/jobs/${job.id}`]: () =>
        json(200, {
          ...job,
          state: 'cut',
          actualMinutes: 12,
          sheetsUsed: 2,
          measuredKerfMm: 0.165,
          actions: [],
        }),
    });
    const { user } = renderApp(`/jobs/${job.id}`, { token: 't' });
    expect(await screen.findByText('0.165 mm')).toBeInTheDocument();
    await user.click(screen.getByRole('button', { name: 'inch' }));
    // 0.165 mm / 25.4 mm per inch = 0.0065 in.
    expect(screen.getByText('0.0065 in')).toBeInTheDocument();
  });

  it('says plainly that there is no such job, with the way back, for an address that is no job id', async () => {
    const stub = stubFetch({ 'GET /api/auth/me': () => json(200, userFixture('operator')) });
    renderApp('/jobs/not-a-uuid', { token: 't' });
    expect(await screen.findByRole('heading', { name: 'No such job' })).toBeInTheDocument();
    expect(screen.getByRole('link', { name: 'Back to the jobs' })).toHaveAttribute('href', '/jobs');
    expect(screen.queryByRole('button', { name: 'Try again' })).not.toBeInTheDocument();
    expect(screen.queryByText(/Validation failed/)).not.toBeInTheDocument();
    expect(stub.calls.some((c) => c.url.pathname.startsWith('/api/jobs/'))).toBe(false);
  });

  it('says the same when the API knows no job with that id', async () => {
    stubFetch({
      'GET /api/auth/me': () => json(200, userFixture('operator')),
      [`GET /api/jobs/${job.id}`]: () =>
        json(404, { statusCode: 404, code: 'JOB.NOT_FOUND', message: 'No such job', requestId: 'r-1' }),
    });
    renderApp(`/jobs/${job.id}`, { token: 't' });
    expect(await screen.findByRole('heading', { name: 'No such job' })).toBeInTheDocument();
    expect(screen.queryByRole('button', { name: 'Try again' })).not.toBeInTheDocument();
  });
});
