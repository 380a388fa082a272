import { type MachineProfileDetailView } from '@kerfwright/contracts';
import { screen, waitFor, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { json, stubFetch } from '../../../testing/fetch-stub';
import { userFixture, versionFixture } from '../../../testing/fixtures';
import { renderApp } from '../../../testing/render-app';
import { LENGTH_UNIT_STORAGE_KEY } from '../../../lib/use-length-unit';

const PROFILE_ID = '5e2f8a10-3c4b-4d6e-8f9a-0b1c2d3e4f50';

const approved = versionFixture({ profileId: PROFILE_ID });
const draft = versionFixture({
  profileId: PROFILE_ID,
  id: 'v-2',
  number: 2,
  state: 'draft',
  hourlyRate: 26.5,
});

const profile: MachineProfileDetailView = {
  id: PROFILE_ID,
  name: 'Bay 3 laser',
  kind: 'co2-laser',
  currentApproved: approved,
  latest: draft,
  versions: [draft, approved],
  createdAt: '2026-01-01T00:00:00.000Z',
};

describe('machine profile page', () => {
  it('gives each version its hourly rate per hour', async () => {
    stubFetch({
      'GET /api/auth/me': () => json(200, userFixture('fabricator')),
      [`GET /api/machine-profiles/${PROFILE_ID}`]: () => json(200, profile),
      [`GET /api/machine-profiles/${PROFILE_ID}/kerf-records`]: () =>
        json(200, { items: [], total: 0, page: 1, pageSize: 1000 }),
    });
    renderApp(`/machine-profiles/${PROFILE_ID}`, { token: 't' });
    const table = await screen.findByRole('table', { name: 'Versions side by side' });
    const rate = within(table).getByRole('rowheader', { name: 'Hourly rate' }).closest('tr')!;
    expect(
      within(rate)
        .getAllByRole('cell')
        .map((c) => c.textContent),
    ).toEqual(['24.00 EUR/h', '26.50 EUR/h (changed)']);
  });

  it('follows the unit chosen for this browser, and switching it here switches the whole page', async () => {
    window.localStorage.setItem(LENGTH_UNIT_STORAGE_KEY, 'in');
    stubFetch({
      'GET /api/auth/me': () => json(200, userFixture('fabricator')),
      [`GET /api/machine-profiles/${PROFILE_ID}`]: () => json(200, profile),
      [`GET /api/machine-profiles/${PROFILE_ID}/kerf-records`]: () =>
        json(200, { items: [], total: 0, page: 1, pageSize: 1000 }),
    });
    const { user } = renderApp(`/machine-profiles/${PROFILE_ID}`, { token: 't' });
    const table = await screen.findByRole('table', { name: 'Versions side by side' });
    const cells = (name: string) =>
      within(within(table).getByRole('rowheader', { name }).closest('tr')!)
        .getAllByRole('cell')
        .map((c) => c.textContent);
    // The fixture's 600 × 400 mm bed, 400 mm/s and 0.08 mm kerf (1 in = 25.4 mm exactly).
    expect(cells('Bed')).toEqual(['23.622 × 15.748 in', '23.622 × 15.748 in']);
    expect(cells('Rapid speed')).toEqual(['15.75 in/s', '15.75 in/s']);
    expect(cells('Kerf')).toEqual(['0.00315 in', '0.00315 in']);
    await user.click(screen.getByRole('button', { name: 'mm' }));
    expect(cells('Bed')).toEqual(['600 × 400 mm', '600 × 400 mm']);
    expect(cells('Kerf')).toEqual(['0.08 mm', '0.08 mm']);
    expect(window.localStorage.getItem(LENGTH_UNIT_STORAGE_KEY)).toBe('mm');
    await user.click(screen.getByRole('button', { name: 'Change the draft' }));
    expect(await screen.findByLabelText('Bed width (mm)')).toHaveValue(600);
  });

  it('says plainly that there is no such profile, with the way back and no retry, when the API knows none', async () => {
    stubFetch({
      'GET /api/auth/me': () => json(200, userFixture('fabricator')),
      [`GET /api/machine-profiles/${PROFILE_ID}`]: () =>
        json(404, {
          statusCode: 404,
          code: 'MACHINE_PROFILE.NOT_FOUND',
          message: 'No such machine profile',
          requestId: 'r-1',
        }),
    });
    renderApp(`/machine-profiles/${PROFILE_ID}`, { token: 't' });
    expect(await screen.findByRole('heading', { name: 'No such machine profile' })).toBeInTheDocument();
    expect(screen.getByRole('link', { name: 'Back to the machine profiles' })).toHaveAttribute(
      'href',
      '/machine-profiles',
    );
    expect(screen.queryByRole('button', { name: 'Try again' })).not.toBeInTheDocument();
    expect(screen.queryByText('The machine profile could not be loaded')).not.toBeInTheDocument();
    expect(screen.queryByText(/r-1/)).not.toBeInTheDocument();
  });

  it('does not ask the API about an address that is no profile id', async () => {
    const stub = stubFetch({ 'GET /api/auth/me': () => json(200, userFixture('supervisor')) });
    renderApp('/machine-profiles/not-a-profile', { token: 't' });
    expect(await screen.findByRole('heading', { name: 'No such machine profile' })).toBeInTheDocument();
    expect(stub.calls.some((c) => c.url.pathname.startsWith('/api/machine-profiles/'))).toBe(false);
  });

  it('lets a supervisor take the machine out of use only with a reason, then says so on the page', async () => {
    let current: MachineProfileDetailView = profile;
    const retired = {
      ...approved,
      state: 'retired' as const,
      approvedAt: '2026-11-02T08:00:00.000Z',
      retiredAt: '2026-12-05T09:30:00.000Z',
      retireReason: 'Laser tube cracked',
      lockVersion: approved.lockVersion + 1,
    };
    // A draft closed after the machine went out of use, with a reason of its own: it says nothing of the machine.
    const closedDraft = {
      ...draft,
      state: 'retired' as const,
      retiredAt: '2026-12-05T10:00:00.000Z',
      retireReason: 'Draft started by mistake',
    };
    const { calls } = stubFetch({
      'GET /api/auth/me': () => json(200, userFixture('supervisor')),
      [`GET /api/machine-profiles/${PROFILE_ID}`]: () => json(200, current),
      [`GET /api/machine-profiles/${PROFILE_ID}/kerf-records`]: () =>
        json(200, { items: [], total: 0, page: 1, pageSize: 1000 }),
      [`POST /api/machine-profiles/${PROFILE_ID}/versions/${approved.id}/retire`]: () => {
        current = {
          ...profile,
          currentApproved: null,
          latest: closedDraft,
          versions: [closedDraft, retired],
        };
        return json(200, retired);
      },
    });
    const { user } = renderApp(`/machine-profiles/${PROFILE_ID}`, { token: 't' });
    await user.click(await screen.findByRole('button', { name: 'Take out of use' }));
    const dialog = await screen.findByRole('dialog', { name: 'Take Bay 3 laser out of use?' });
    expect(dialog).toHaveTextContent(/Jobs already released stay on the release desk, marked/);
    await user.click(within(dialog).getByRole('button', { name: 'Take out of use' }));
    expect(await within(dialog).findByText(/Say why/)).toBeInTheDocument();
    expect(calls.some((c) => c.method === 'POST')).toBe(false);

    await user.type(within(dialog).getByLabelText('Reason'), '  Laser tube cracked ');
    await user.click(within(dialog).getByRole('button', { name: 'Take out of use' }));
    const out = await screen.findByTestId('out-of-use');
    // The button that opened the dialog is gone: the keyboard is on what the page now says.
    await waitFor(() => expect(out).toHaveFocus());
    expect(out).toHaveTextContent('Version 1 was taken out of use: “Laser tube cracked”.');
    const post = calls.find((c) => c.method === 'POST')!;
    expect(post.body).toEqual({ lockVersion: approved.lockVersion, reason: 'Laser tube cracked' });
    expect(screen.getByTestId('profile-status')).toHaveTextContent('No version is approved, so no job');
    expect(screen.queryByRole('button', { name: 'Take out of use' })).not.toBeInTheDocument();
  });

  it('offers taking the machine out of use to supervisors only', async () => {
    stubFetch({
      'GET /api/auth/me': () => json(200, userFixture('fabricator')),
      [`GET /api/machine-profiles/${PROFILE_ID}`]: () => json(200, profile),
      [`GET /api/machine-profiles/${PROFILE_ID}/kerf-records`]: () =>
        json(200, { items: [], total: 0, page: 1, pageSize: 1000 }),
    });
    renderApp(`/machine-profiles/${PROFILE_ID}`, { token: 't' });
    expect(await screen.findByTestId('profile-actions')).toBeInTheDocument();
    expect(screen.queryByRole('button', { name: 'Take out of use' })).not.toBeInTheDocument();
  });
});
