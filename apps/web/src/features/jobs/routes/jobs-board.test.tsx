import { type JobView } from '@kerfwright/contracts';
import { screen, waitFor, within } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { json, stubFetch } from '../../../testing/fetch-stub';
import { jobFixture, userFixture } from '../../../testing/fixtures';
import { QUEUE_REFRESH_MS } from '../../../lib/query-client';
import { renderApp } from '../../../testing/render-app';
import { stubScreenWidth } from '../../../testing/screen-width';
import { formatDate } from '../../../lib/dates';

function boardJob(id: string, state: JobView['state'], requesterName: string): JobView {
  return jobFixture({
    id,
    state,
    designId: `d-${id}`,
    designName: `Design ${id}`,
    requesterId: `u-${id}`,
    requesterName,
    updatedAt: '2026-01-02T00:00:00.000Z',
  });
}

describe('jobs board', () => {
  afterEach(() => {
    vi.useRealTimers();
    vi.unstubAllGlobals();
  });

  it('shows jobs sent meanwhile without reloading the page', async () => {
    vi.useFakeTimers({ shouldAdvanceTime: true });
    const first = boardJob('j-1', 'requested', 'Jun Park');
    const later = boardJob('j-2', 'requested', 'Ana Ruiz');
    let sent = false;
    stubFetch({
      'GET /api/auth/me': () => json(200, userFixture('fabricator')),
      'GET /api/jobs': () => {
        const items = sent ? [later, first] : [first];
        return json(200, { items, total: items.length, page: 1, pageSize: 25 });
      },
    });
    renderApp('/jobs', { token: 't' });
    await screen.findByTestId('job-row-j-1');
    expect(screen.queryByTestId('job-row-j-2')).not.toBeInTheDocument();
    // A hobbyist sends a job elsewhere; within QUEUE_REFRESH_MS the board lists it.
    sent = true;
    await vi.advanceTimersByTimeAsync(QUEUE_REFRESH_MS + 100);
    expect(await screen.findByTestId('job-row-j-2')).toHaveTextContent('Ana Ruiz');
  });

  it("links each job by its design's name in the app's own link style, as every other list does", async () => {
    stubFetch({
      'GET /api/auth/me': () => json(200, userFixture('hobbyist')),
      'GET /api/jobs': () =>
        json(200, { items: [boardJob('j-1', 'requested', 'Jun Park')], total: 1, page: 1, pageSize: 25 }),
    });
    renderApp('/jobs', { token: 't' });
    const link = await screen.findByRole('link', { name: 'Design j-1' });
    expect(link).toHaveAttribute('href', '/jobs/j-1');
    // The browser's own blue and visited purple stood out beside the themed links of the other lists.
    expect(link).toHaveClass('MuiLink-root');
  });

  it('heads the column of names "Owner", true of a draft too, which nobody has requested', async () => {
    // A draft whose request was withdrawn, beside a job that is requested.
    const withdrawn = boardJob('j-1', 'draft', 'Jun Park');
    const requested = boardJob('j-2', 'requested', 'Ana Ruiz');
    stubFetch({
      'GET /api/auth/me': () => json(200, userFixture('fabricator')),
      'GET /api/jobs': () => json(200, { items: [withdrawn, requested], total: 2, page: 1, pageSize: 25 }),
    });
    renderApp('/jobs', { token: 't' });
    const table = await screen.findByRole('table', { name: 'Jobs' });
    await within(table).findByTestId('job-row-j-1');
    const headers = within(table)
      .getAllByRole('columnheader')
      .map((h) => h.textContent);
    expect(headers).toContain('Owner');
    expect(headers).not.toContain('Requester');
    const column = headers.indexOf('Owner');
    for (const [row, name] of [
      ['job-row-j-1', 'Jun Park'],
      ['job-row-j-2', 'Ana Ruiz'],
    ] as const) {
      expect(within(within(table).getByTestId(row)).getAllByRole('cell')[column]).toHaveTextContent(name);
    }
    expect(screen.getByLabelText('Search design or owner')).toBeInTheDocument();
  });

  it('keeps what a job is and where it stands on a tablet (768 px) and a phone (390 px)', async () => {
    stubFetch({
      'GET /api/auth/me': () => json(200, userFixture('fabricator')),
      'GET /api/jobs': () =>
        json(200, {
          items: [
            {
              ...boardJob('j-1', 'requested', 'Ana Ruiz'),
              quantity: 3,
              createdAt: '2025-12-30T09:00:00.000Z',
            },
          ],
          total: 1,
          page: 1,
          pageSize: 25,
        }),
    });
    for (const [px, expected] of [
      [768, ['Design', 'Owner', 'State', 'Material', 'Machine profile', 'Updated']],
      [390, ['Design', 'Owner', 'State']],
    ] as const) {
      stubScreenWidth(px);
      const { unmount } = renderApp('/jobs', { token: 't' });
      const table = await screen.findByRole('table', { name: 'Jobs' });
      await within(table).findByTestId('job-row-j-1');
      expect(
        within(table)
          .getAllByRole('columnheader')
          .map((h) => h.textContent),
      ).toEqual(expected);
      // Copies and the day it was created, gone with their columns, are said under the design's name.
      expect(within(table).getByTestId('job-row-facts')).toHaveTextContent(
        `3 copies · created ${formatDate('2025-12-30T09:00:00.000Z')}`,
      );
      unmount();
    }
  });

  it("says whose jobs the board lists: a hobbyist's own, the workshop's for staff", async () => {
    for (const [role, listed] of [
      ['hobbyist', 'Your cut jobs by state.'],
      ['operator', 'Every cut job sent to the workshop, and your own drafts, by state.'],
      ['supervisor', 'Every cut job in the workshop, drafts included, by state.'],
    ] as const) {
      stubFetch({
        'GET /api/auth/me': () => json(200, userFixture(role)),
        'GET /api/jobs': () => json(200, { items: [], total: 0, page: 1, pageSize: 25 }),
      });
      const { unmount } = renderApp('/jobs', { token: 't' });
      expect(await screen.findByText(new RegExp(`^${listed}`))).toBeInTheDocument();
      if (role === 'hobbyist') expect(screen.queryByText(/Every cut job/)).not.toBeInTheDocument();
      unmount();
    }
  });

  it('takes no more search text than the API accepts', async () => {
    const { calls } = stubFetch({
      'GET /api/auth/me': () => json(200, userFixture('fabricator')),
      'GET /api/jobs': () => json(200, { items: [], total: 0, page: 1, pageSize: 25 }),
    });
    const { user } = renderApp('/jobs', { token: 't' });
    const box = await screen.findByLabelText<HTMLInputElement>('Search design or owner');
    // The API answers 400 to a q over 100 characters (@MaxLength(100) in apps/api/src/jobs/dto/job.dto.ts).
    await user.click(box);
    await user.paste('plywood '.repeat(20));
    expect(box.value).toBe('plywood '.repeat(20).slice(0, 100));
    await waitFor(() => expect(calls.some((c) => c.url.searchParams.has('q'))).toBe(true));
    for (const call of calls.filter((c) => c.url.pathname === '/api/jobs')) {
      expect(call.url.searchParams.get('q')?.length ?? 0).toBeLessThanOrEqual(100);
    }
  });
});
