import { type AuditEventView } from '@kerfwright/contracts';
import { screen, waitFor, within } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { json, stubFetch } from '../../../testing/fetch-stub';
import { userFixture } from '../../../testing/fixtures';
import { renderApp } from '../../../testing/render-app';
import { stubScreenWidth } from '../../../testing/screen-width';

const supervisor = userFixture('supervisor');
const fabricatorId = '00000000-0000-4000-8000-000000000001';

const events: AuditEventView[] = [
  {
    id: '12',
    actorId: fabricatorId,
    actorName: 'Theo Lindqvist',
    action: 'machine-profile-version.submit',
    entityType: 'machine-profile-version',
    entityId: 'v-2',
    before: { number: 2, state: 'draft' },
    after: { number: 2, state: 'submitted' },
    requestId: 'r1',
    createdAt: '2026-02-01T10:00:00.000Z',
  },
  {
    id: '11',
    actorId: fabricatorId,
    actorName: 'Theo Lindqvist',
    action: 'material.create',
    entityType: 'material',
    entityId: 'm-1',
    before: null,
    after: { name: 'Poplar plywood 4 mm' },
    requestId: 'r0',
    createdAt: '2026-02-01T09:00:00.000Z',
  },
];

describe('Audit trail (supervisor)', () => {
  afterEach(() => vi.unstubAllGlobals());

  it('lists who did what, and asks the API for the chosen order and filters', async () => {
    const { calls } = stubFetch({
      'GET /api/auth/me': () => json(200, supervisor),
      'GET /api/audit': () => json(200, { items: events, total: 2, page: 1, pageSize: 25 }),
    });
    const { user } = renderApp('/audit', { token: 't' });
    const rows = await screen.findAllByTestId('audit-event');
    expect(rows[0]).toHaveTextContent('Theo Lindqvist');
    expect(rows[0]).toHaveTextContent('Profile version 2 submitted for approval (draft → submitted)');
    expect(rows[1]).toHaveTextContent('Material “Poplar plywood 4 mm” created');
    expect(calls.at(-1)?.url.searchParams.get('sort')).toBe('-createdAt');

    await user.click(screen.getByRole('button', { name: 'When' }));
    await waitFor(() => expect(calls.at(-1)?.url.searchParams.get('sort')).toBe('createdAt'));

    await user.click(screen.getByRole('combobox', { name: 'Record type' }));
    await user.click(await screen.findByRole('option', { name: 'Material' }));
    await waitFor(() => expect(calls.at(-1)?.url.searchParams.get('entityType')).toBe('material'));

    await user.type(screen.getByRole('searchbox', { name: 'Action starts with' }), 'material.');
    await waitFor(() => expect(calls.at(-1)?.url.searchParams.get('action')).toBe('material.'));

    await user.click(within(rows[1]!).getByRole('button', { name: 'Theo Lindqvist' }));
    await waitFor(() => expect(calls.at(-1)?.url.searchParams.get('actorId')).toBe(fabricatorId));
    expect(screen.getByText('Person: Theo Lindqvist')).toBeInTheDocument();
  });

  it('says each action in words, with the recorded action kept as its title for support', async () => {
    const more: AuditEventView[] = [
      {
        id: '14',
        actorId: fabricatorId,
        actorName: 'Theo Lindqvist',
        action: 'job.close',
        entityType: 'job',
        entityId: 'j-1',
        before: { state: 'cut', designName: 'Hexagon star' },
        after: { state: 'closed', designName: 'Hexagon star' },
        requestId: 'r3',
        createdAt: '2026-02-01T12:00:00.000Z',
      },
      {
        id: '13',
        actorId: fabricatorId,
        actorName: 'Theo Lindqvist',
        action: 'kerf-record.create',
        entityType: 'kerf-record',
        entityId: 'k-1',
        before: null,
        after: { kerfMm: 0.17 },
        requestId: 'r2',
        createdAt: '2026-02-01T11:00:00.000Z',
      },
      ...events,
    ];
    stubFetch({
      'GET /api/auth/me': () => json(200, supervisor),
      'GET /api/audit': () => json(200, { items: more, total: more.length, page: 1, pageSize: 25 }),
    });
    renderApp('/audit', { token: 't' });
    const rows = await screen.findAllByTestId('audit-event');
    const column = screen
      .getAllByRole('columnheader')
      .map((h) => h.textContent)
      .indexOf('Action');
    const actions = rows.map((r) => within(r).getAllByRole('cell')[column]!);
    expect(actions.map((a) => a.textContent)).toEqual([
      'Closed',
      'Created',
      'Submitted for approval',
      'Created',
    ]);
    expect(actions.map((a) => a.querySelector('[title]')?.getAttribute('title'))).toEqual([
      'job.close',
      'kerf-record.create',
      'machine-profile-version.submit',
      'material.create',
    ]);
  });

  it('fits a tablet (768 px) without scrolling sideways: the Record column goes, "What happened" stays', async () => {
    stubScreenWidth(768);
    stubFetch({
      'GET /api/auth/me': () => json(200, supervisor),
      'GET /api/audit': () => json(200, { items: events, total: 2, page: 1, pageSize: 25 }),
    });
    renderApp('/audit', { token: 't' });
    await screen.findAllByTestId('audit-event');
    const table = screen.getByRole('table', { name: 'Audit trail' });
    expect(
      within(table)
        .getAllByRole('columnheader')
        .map((h) => h.textContent),
    ).toEqual(['When', 'Who', 'Action', 'What happened']);
    expect(getComputedStyle(table).minWidth).not.toBe('900px');
  });

  it('is not part of a fabricator’s role', async () => {
    const { calls } = stubFetch({ 'GET /api/auth/me': () => json(200, userFixture('fabricator')) });
    renderApp('/audit', { token: 't' });
    expect(await screen.findByText('This page is not part of your role')).toBeInTheDocument();
    expect(calls.some((c) => c.url.pathname === '/api/audit')).toBe(false);
  });
});
