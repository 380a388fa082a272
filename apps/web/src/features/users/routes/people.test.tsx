import { type UserView } from '@kerfwright/contracts';
import { screen, waitFor, within } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { json, type RecordedCall, stubFetch } from '../../../testing/fetch-stub';
import { userFixture } from '../../../testing/fixtures';
import { renderApp } from '../../../testing/render-app';
import { stubScreenWidth } from '../../../testing/screen-width';

const supervisor = userFixture('supervisor', { displayName: 'Sam Supervisor' });

/** A tiny stand-in for the API's users list: filters, sorts and pages, and applies PATCHes. */
function peopleApi(initial: UserView[]) {
  const people = initial.map((u) => ({ ...u }));
  return stubFetch({
    'GET /api/auth/me': () => json(200, supervisor),
    'GET /api/users': (call: RecordedCall) => {
      const p = call.url.searchParams;
      const page = Number(p.get('page') ?? 1);
      const pageSize = Number(p.get('pageSize') ?? 25);
      const sort = p.get('sort') ?? 'email';
      const field = sort.replace(/^-/, '') as keyof UserView;
      let rows = people.filter(
        (u) =>
          (!p.get('role') || u.role === p.get('role')) &&
          (!p.get('q') || `${u.displayName} ${u.email}`.toLowerCase().includes(p.get('q')!.toLowerCase())),
      );
      rows = rows.sort((a, b) => String(a[field]).localeCompare(String(b[field])));
      if (sort.startsWith('-')) rows.reverse();
      return json(200, {
        items: rows.slice((page - 1) * pageSize, page * pageSize),
        total: rows.length,
        page,
        pageSize,
      });
    },
    'PATCH /api/users/00000000-0000-4000-8000-000000000000': (call) => {
      const target = people.find((u) => u.role === 'hobbyist')!;
      Object.assign(target, call.body);
      return json(200, target);
    },
  });
}

const hobbyist = userFixture('hobbyist', { displayName: 'Alex Birch', email: 'alex@workshop.example' });
const operator = userFixture('operator', { displayName: 'Robin Slate', email: 'robin@workshop.example' });

describe('People (supervisor)', () => {
  afterEach(() => vi.unstubAllGlobals());

  it('lists people with their role and status, and locks your own row', async () => {
    peopleApi([supervisor, hobbyist, operator]);
    renderApp('/people', { token: 't' });
    const row = await screen.findByTestId('person-alex@workshop.example');
    expect(row).toHaveTextContent('Alex Birch');
    expect(row).toHaveTextContent('Active');
    expect(within(row).getByRole('combobox', { name: 'Role of Alex Birch' })).toHaveTextContent('Hobbyist');

    const own = screen.getByTestId(`person-${supervisor.email}`);
    expect(own).toHaveTextContent('(you)');
    expect(within(own).getByRole('button', { name: /Deactivate Sam Supervisor/ })).toBeDisabled();
  });

  it('keeps name, role and access on a phone (390 px): the status is said under a deactivated name', async () => {
    stubScreenWidth(390);
    peopleApi([supervisor, { ...hobbyist, active: false }, operator]);
    renderApp('/people', { token: 't' });
    const row = await screen.findByTestId('person-alex@workshop.example');
    expect(screen.queryByRole('columnheader', { name: 'Status' })).not.toBeInTheDocument();
    expect(screen.queryByRole('columnheader', { name: 'E-mail' })).not.toBeInTheDocument();
    expect(within(row).getByText('Deactivated')).toBeInTheDocument();
    expect(within(row).getByRole('button', { name: 'Reactivate Alex Birch' })).toBeInTheDocument();
  });

  it('fits a tablet (768 px) without scrolling sideways: only "Member since" goes', async () => {
    stubScreenWidth(768);
    peopleApi([supervisor, hobbyist, operator]);
    renderApp('/people', { token: 't' });
    const row = await screen.findByTestId('person-alex@workshop.example');
    const table = screen.getByRole('table', { name: 'People' });
    expect(
      within(table)
        .getAllByRole('columnheader')
        .map((h) => h.textContent),
    ).toEqual(['Name', 'E-mail', 'Role', 'Status', 'Access']);
    expect(getComputedStyle(table).minWidth).not.toBe('760px');
    expect(within(row).getByRole('button', { name: 'Deactivate Alex Birch' })).toBeInTheDocument();
  });

  it('asks the API for the chosen sort, role filter and search', async () => {
    const { calls } = peopleApi([supervisor, hobbyist, operator]);
    const { user } = renderApp('/people', { token: 't' });
    await screen.findByTestId('person-alex@workshop.example');

    await user.click(screen.getByRole('button', { name: 'E-mail' }));
    await waitFor(() => expect(calls.at(-1)?.url.searchParams.get('sort')).toBe('email'));
    await user.click(screen.getByRole('button', { name: 'E-mail' }));
    await waitFor(() => expect(calls.at(-1)?.url.searchParams.get('sort')).toBe('-email'));

    await user.click(screen.getByRole('combobox', { name: 'Role' }));
    await user.click(await screen.findByRole('option', { name: 'Operator' }));
    await waitFor(() => expect(calls.at(-1)?.url.searchParams.get('role')).toBe('operator'));
    await waitFor(() => expect(screen.queryByTestId('person-alex@workshop.example')).not.toBeInTheDocument());
    expect(screen.getByTestId('person-robin@workshop.example')).toBeInTheDocument();

    await user.type(screen.getByRole('searchbox', { name: 'Search name or e-mail' }), 'robin');
    await waitFor(() => expect(calls.at(-1)?.url.searchParams.get('q')).toBe('robin'));
    expect(calls.at(-1)?.url.searchParams.get('page')).toBe('1');
  });

  it('deactivates after confirmation and shows the refreshed list', async () => {
    const { calls } = peopleApi([supervisor, hobbyist, operator]);
    const { user } = renderApp('/people', { token: 't' });
    const row = await screen.findByTestId('person-alex@workshop.example');

    await user.click(within(row).getByRole('button', { name: 'Deactivate Alex Birch' }));
    const dialog = await screen.findByRole('dialog', { name: 'Deactivate Alex Birch?' });
    const listCallsBefore = calls.filter((c) => c.url.pathname === '/api/users').length;
    await user.click(within(dialog).getByRole('button', { name: 'Deactivate' }));

    await waitFor(() =>
      expect(screen.getByTestId('person-alex@workshop.example')).toHaveTextContent('Deactivated'),
    );
    const patch = calls.find((c) => c.method === 'PATCH');
    expect(patch?.body).toEqual({ active: false });
    // The list was fetched again (query invalidation), not patched locally.
    expect(calls.filter((c) => c.url.pathname === '/api/users').length).toBeGreaterThan(listCallsBefore);
    expect(await screen.findByText('Alex Birch is deactivated.')).toBeInTheDocument();
  });

  it('changes a role after confirmation', async () => {
    const { calls } = peopleApi([supervisor, hobbyist]);
    const { user } = renderApp('/people', { token: 't' });
    const row = await screen.findByTestId('person-alex@workshop.example');

    await user.click(within(row).getByRole('combobox', { name: 'Role of Alex Birch' }));
    await user.click(await screen.findByRole('option', { name: 'Fabricator' }));
    const dialog = await screen.findByRole('dialog', { name: 'Make Alex Birch a fabricator?' });
    await waitFor(() => expect(within(dialog).getByRole('button', { name: 'Change role' })).toHaveFocus());
    await user.click(within(dialog).getByRole('button', { name: 'Change role' }));

    await waitFor(() =>
      expect(
        within(screen.getByTestId('person-alex@workshop.example')).getByRole('combobox', {
          name: 'Role of Alex Birch',
        }),
      ).toHaveTextContent('Fabricator'),
    );
    expect(calls.find((c) => c.method === 'PATCH')?.body).toEqual({ role: 'fabricator' });
  });

  it("starts on Cancel when a change hands someone a supervisor's rights, so Enter twice does not", async () => {
    const { calls } = peopleApi([supervisor, hobbyist]);
    const { user } = renderApp('/people', { token: 't' });
    const row = await screen.findByTestId('person-alex@workshop.example');
    await user.click(within(row).getByRole('combobox', { name: 'Role of Alex Birch' }));
    await user.click(await screen.findByRole('option', { name: 'Supervisor' }));
    const dialog = await screen.findByRole('dialog', { name: 'Make Alex Birch a supervisor?' });
    await waitFor(() => expect(within(dialog).getByRole('button', { name: 'Cancel' })).toHaveFocus());
    await user.keyboard('{Enter}');
    await waitFor(() => expect(screen.queryByRole('dialog')).not.toBeInTheDocument());
    expect(calls.some((c) => c.method === 'PATCH')).toBe(false);
  });
});
