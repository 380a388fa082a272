import { type JobView, type MachineProfileSummaryView } from '@kerfwright/contracts';
import { screen, waitFor, within } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { json, stubFetch } from '../../../testing/fetch-stub';
import { preparationFixture, userFixture, versionFixture } from '../../../testing/fixtures';
import { QUEUE_REFRESH_MS } from '../../../lib/query-client';
import { renderApp } from '../../../testing/render-app';
import { setLengthUnit } from '../../../lib/use-length-unit';

const supervisor = userFixture('supervisor');

// 3 mm cast acrylic on a CO2 laser: kerf about 0.15–0.23 mm (laser-cutting services' artwork guides, common practice).
const setting = { ...versionFixture().settings[0]!, kerfMm: 0.18 };

const approved = versionFixture({
  profileId: 'p-laser',
  settings: [setting],
  lockVersion: 3,
  submittedAt: '2026-01-02T10:00:00.000Z',
});

const waiting = versionFixture({
  ...approved,
  id: 'v-2',
  number: 2,
  state: 'submitted',
  lockVersion: 2,
  settings: [{ ...setting, kerfMm: 0.16 }],
});

const profile: MachineProfileSummaryView = {
  id: 'p-laser',
  name: 'CO2 laser, 60 W',
  kind: 'co2-laser',
  currentApproved: approved,
  latest: waiting,
  createdAt: '2026-01-01T00:00:00.000Z',
};

const job = {
  id: 'j-1',
  state: 'prepared',
  designName: 'Hexagon star',
  requesterName: 'Jun Park',
  quantity: 3,
  materialName: 'Card stock 300 g/m²',
  colours: ['saffron', 'teal'],
  profileName: 'CO2 laser, 60 W',
  profileVersionNumber: 1,
  preparation: null,
  version: 4,
  actions: ['approve', 'return'],
} as unknown as JobView;

function approvalsApi(waitingJob: JobView = job, waitingProfile: MachineProfileSummaryView = profile) {
  return stubFetch({
    'GET /api/auth/me': () => json(200, supervisor),
    'GET /api/machine-profiles': () =>
      json(200, { items: [waitingProfile], total: 1, page: 1, pageSize: 100 }),
    'GET /api/jobs': () => json(200, { items: [waitingJob], total: 1, page: 1, pageSize: 100 }),
    'POST /api/machine-profiles/p-laser/versions/v-2/return': (call) =>
      json(200, { ...waiting, state: 'draft', returnReason: (call.body as { reason: string }).reason }),
    'POST /api/machine-profiles/p-laser/versions/v-2/approve': () =>
      json(200, { ...waiting, state: 'approved' }),
    'POST /api/jobs/j-1/approve': () => json(200, { ...job, state: 'approved' }),
  });
}

describe('Approvals (supervisor)', () => {
  afterEach(() => vi.useRealTimers());

  it('shows what was submitted meanwhile without reloading the page', async () => {
    vi.useFakeTimers({ shouldAdvanceTime: true });
    let submitted = false;
    const page = (items: unknown[]) => json(200, { items, total: items.length, page: 1, pageSize: 100 });
    stubFetch({
      'GET /api/auth/me': () => json(200, supervisor),
      'GET /api/machine-profiles': () => page(submitted ? [profile] : []),
      'GET /api/jobs': () => page(submitted ? [job] : []),
    });
    renderApp('/approvals', { token: 't' });
    expect(await screen.findByText('No prepared job is waiting.')).toBeInTheDocument();
    expect(screen.getByText('No machine profile version is waiting.')).toBeInTheDocument();
    // A fabricator submits a version and prepares a job elsewhere; within QUEUE_REFRESH_MS both are here.
    submitted = true;
    await vi.advanceTimersByTimeAsync(QUEUE_REFRESH_MS + 100);
    expect(await screen.findByTestId('waiting-version-CO2 laser, 60 W')).toBeInTheDocument();
    expect(await screen.findByTestId('waiting-job')).toHaveTextContent('Hexagon star × 3');
  });

  it('shows only what the waiting version changes against the approved one', async () => {
    const { calls } = approvalsApi();
    renderApp('/approvals', { token: 't' });
    const card = await screen.findByTestId('waiting-version-CO2 laser, 60 W');
    const changes = within(card).getAllByTestId('version-change');
    expect(changes).toHaveLength(1);
    expect(changes[0]).toHaveTextContent('Cast acrylic 3 mm');
    expect(changes[0]).toHaveTextContent('Kerf');
    expect(changes[0]).toHaveTextContent('0.18 mm');
    expect(changes[0]).toHaveTextContent('0.16 mm');
    expect(calls.find((c) => c.url.pathname === '/api/machine-profiles')?.url.searchParams.get('state')).toBe(
      'submitted',
    );
    expect(calls.find((c) => c.url.pathname === '/api/jobs')?.url.searchParams.get('state')).toBe('prepared');
  });

  it("shows a waiting version's notes once: among the changes when they changed, else on a line of their own", async () => {
    const notes = 'Kerf measured on three coupons from the new acrylic batch.';
    const times = (text: string | null, part: string) => (text ?? '').split(part).length - 1;
    for (const approvedNotes of ['Kerf from the maker’s table.', notes]) {
      approvalsApi(job, {
        ...profile,
        currentApproved: { ...approved, notes: approvedNotes },
        latest: { ...waiting, notes },
      });
      const { unmount } = renderApp('/approvals', { token: 't' });
      const card = await screen.findByTestId('waiting-version-CO2 laser, 60 W');
      expect(times(card.textContent, notes)).toBe(1);
      const listed = within(card)
        .getAllByTestId('version-change')
        .some((c) => c.textContent?.includes(notes));
      if (approvedNotes === notes) {
        // Unchanged: not a change, so said below the list, and said to be unchanged.
        expect(listed).toBe(false);
        expect(within(card).getByTestId('version-notes')).toHaveTextContent(`Notes (unchanged): ${notes}`);
      } else {
        expect(listed).toBe(true);
        expect(within(card).queryByTestId('version-notes')).not.toBeInTheDocument();
      }
      unmount();
    }
  });

  it('sends a version back only with a reason, and the lockVersion it read', async () => {
    const { calls } = approvalsApi();
    const { user } = renderApp('/approvals', { token: 't' });
    const card = await screen.findByTestId('waiting-version-CO2 laser, 60 W');
    await user.click(within(card).getByRole('button', { name: 'Send back: CO2 laser, 60 W' }));
    const dialog = await screen.findByRole('dialog', { name: /Send back version 2/ });
    await user.click(within(dialog).getByRole('button', { name: 'Send back with this reason' }));
    expect(
      await within(dialog).findByText('Say what must change (at least 3 characters)'),
    ).toBeInTheDocument();
    expect(calls.some((c) => c.method === 'POST')).toBe(false);
    await user.type(within(dialog).getByLabelText('Reason'), 'Test the kerf on a second batch');
    await user.click(within(dialog).getByRole('button', { name: 'Send back with this reason' }));
    await waitFor(() => expect(calls.some((c) => c.method === 'POST')).toBe(true));
    expect(calls.find((c) => c.method === 'POST')?.body).toEqual({
      lockVersion: 2,
      reason: 'Test the kerf on a second batch',
    });
  });

  it('approves a prepared job with the job version it read, once confirmed as on the job page', async () => {
    const { calls } = approvalsApi();
    const { user } = renderApp('/approvals', { token: 't' });
    const card = await screen.findByTestId('waiting-job');
    expect(card).toHaveTextContent('Hexagon star × 3');
    // Named with the job's design, as every card has these buttons (WCAG 2.4.6); the visible text is kept.
    const approve = within(card).getByRole('button', { name: 'Approve the job: Hexagon star' });
    expect(approve).toHaveTextContent(/^Approve the job$/);
    expect(
      within(card).getByRole('button', { name: 'Return with a reason: Hexagon star' }),
    ).toHaveTextContent(/^Return with a reason$/);

    // Cancelled: nothing is sent.
    await user.click(approve);
    let dialog = await screen.findByRole('dialog', { name: 'Approve the job?' });
    expect(dialog).toHaveTextContent('The job moves from prepared to approved.');
    await user.click(within(dialog).getByRole('button', { name: 'Cancel' }));
    await waitFor(() => expect(screen.queryByRole('dialog')).not.toBeInTheDocument());
    expect(calls.some((c) => c.method === 'POST')).toBe(false);

    await user.click(approve);
    dialog = await screen.findByRole('dialog', { name: 'Approve the job?' });
    await user.click(within(dialog).getByRole('button', { name: 'Approve the job' }));
    await waitFor(() => expect(calls.some((c) => c.url.pathname === '/api/jobs/j-1/approve')).toBe(true));
    expect(calls.find((c) => c.url.pathname === '/api/jobs/j-1/approve')?.body).toEqual({ version: 4 });
    expect(await screen.findByText('Hexagon star is approved for release.')).toBeInTheDocument();
  });

  it('approves a version only once confirmed, with the lockVersion it read', async () => {
    const { calls } = approvalsApi();
    const { user } = renderApp('/approvals', { token: 't' });
    const card = await screen.findByTestId('waiting-version-CO2 laser, 60 W');
    // Named with the profile, as every waiting version has these buttons (WCAG 2.4.6); the visible text is kept.
    const approve = within(card).getByRole('button', { name: 'Approve version 2: CO2 laser, 60 W' });
    expect(approve).toHaveTextContent(/^Approve version 2$/);
    await user.click(approve);
    const dialog = await screen.findByRole('dialog', { name: 'Approve version 2 of CO2 laser, 60 W?' });
    expect(dialog).toHaveTextContent(
      'Jobs use it from now on; version 1 is retired. Jobs already released on version 1 stay released, marked ' +
        'as on a retired version: return any that must not be cut on it.',
    );
    expect(calls.some((c) => c.method === 'POST')).toBe(false);
    await user.click(within(dialog).getByRole('button', { name: 'Approve version 2' }));
    await waitFor(() => expect(calls.some((c) => c.method === 'POST')).toBe(true));
    expect(calls.find((c) => c.method === 'POST')?.url.pathname).toBe(
      '/api/machine-profiles/p-laser/versions/v-2/approve',
    );
    expect(calls.find((c) => c.method === 'POST')?.body).toEqual({ lockVersion: 2 });
    expect(
      await screen.findByText('Version 2 of CO2 laser, 60 W is approved; jobs use it from now on.'),
    ).toBeInTheDocument();
  });

  it('gives the keyboard focus to the section heading when a decided card leaves its list', async () => {
    // The lists answer as the server does: a decided version or job is no longer waiting.
    let versionWaits = true;
    let jobWaits = true;
    const page = <T,>(items: T[]) => json(200, { items, total: items.length, page: 1, pageSize: 100 });
    stubFetch({
      'GET /api/auth/me': () => json(200, supervisor),
      'GET /api/machine-profiles': () => page(versionWaits ? [profile] : []),
      'GET /api/jobs': () => page(jobWaits ? [job] : []),
      'POST /api/machine-profiles/p-laser/versions/v-2/approve': () => {
        versionWaits = false;
        return json(200, { ...waiting, state: 'approved' });
      },
      'POST /api/jobs/j-1/return': () => {
        jobWaits = false;
        return json(200, { ...job, state: 'returned' });
      },
    });
    const { user } = renderApp('/approvals', { token: 't' });
    const card = await screen.findByTestId('waiting-version-CO2 laser, 60 W');
    await user.click(within(card).getByRole('button', { name: 'Approve version 2: CO2 laser, 60 W' }));
    const dialog = await screen.findByRole('dialog', { name: 'Approve version 2 of CO2 laser, 60 W?' });
    await user.click(within(dialog).getByRole('button', { name: 'Approve version 2' }));
    await waitFor(() =>
      expect(screen.getByRole('heading', { name: /^Machine profile versions/ })).toHaveFocus(),
    );
    expect(screen.getByText('No machine profile version is waiting.')).toBeInTheDocument();

    const jobCard = await screen.findByTestId('waiting-job');
    await user.click(within(jobCard).getByRole('button', { name: 'Return with a reason: Hexagon star' }));
    const back = await screen.findByRole('dialog', { name: /Return the job Hexagon star/ });
    await user.type(within(back).getByLabelText('Reason'), 'Use the thinner card');
    await user.click(within(back).getByRole('button', { name: /^Return with this reason/ }));
    await waitFor(() => expect(screen.getByRole('heading', { name: /^Jobs/ })).toHaveFocus());
  });

  it('asks the approver to confirm the laser conditions of felt and unlisted materials, and says so to the API', async () => {
    // The hazard table's conditions (safety/material-hazards.json), as the API puts them on the settings.
    const felt = {
      ...setting,
      materialId: 'm-felt',
      materialName: 'Wool felt 3 mm',
      laserCondition:
        "The fibre content is known from the supplier's data sheet and the felt has no adhesive backing.",
    };
    const withFelt = { ...profile, latest: { ...waiting, settings: [setting, felt] } };
    const { calls } = approvalsApi(job, withFelt);
    const { user } = renderApp('/approvals', { token: 't' });
    const card = await screen.findByTestId('waiting-version-CO2 laser, 60 W');
    expect(within(card).getByTestId('laser-conditions')).toHaveTextContent(
      "Wool felt 3 mm: The fibre content is known from the supplier's data sheet",
    );
    await user.click(within(card).getByRole('button', { name: 'Approve version 2: CO2 laser, 60 W' }));
    const dialog = await screen.findByRole('dialog', { name: 'Approve version 2 of CO2 laser, 60 W?' });
    const approve = within(dialog).getByRole('button', { name: 'Approve version 2' });
    expect(approve).toBeDisabled();
    await user.click(
      within(dialog).getByRole('checkbox', { name: /I have checked the laser condition of Wool felt 3 mm/ }),
    );
    expect(approve).toBeEnabled();
    await user.click(approve);
    await waitFor(() => expect(calls.some((c) => c.method === 'POST')).toBe(true));
    expect(calls.find((c) => c.method === 'POST')?.body).toEqual({ lockVersion: 2, conditionsChecked: true });
  });

  it('gives a changed hourly rate per hour', async () => {
    approvalsApi(job, { ...profile, latest: { ...waiting, hourlyRate: 26 } });
    renderApp('/approvals', { token: 't' });
    const card = await screen.findByTestId('waiting-version-CO2 laser, 60 W');
    const rate = within(card)
      .getAllByTestId('version-change')
      .find((c) => c.textContent?.includes('Hourly rate'));
    expect(rate).toHaveTextContent('24.00 EUR/h');
    expect(rate).toHaveTextContent('26.00 EUR/h');
  });

  it('gives a large job its time in hours and its cost with thousands grouped', async () => {
    const preparation = preparationFixture({
      pieceCount: 600,
      diameterMm: 300,
      sheetCount: 600,
      utilisation: 0.41,
      estimate: {
        cutLengthMm: 1_238_848,
        markLengthMm: 0,
        pierces: 7200,
        minutes: 1723.8,
        machineCost: 574.6,
        materialCost: 8814.92,
      },
    });
    approvalsApi({ ...job, preparation } as unknown as JobView);
    renderApp('/approvals', { token: 't' });
    const card = await screen.findByTestId('waiting-job');
    expect(card).toHaveTextContent(
      '600 pieces on 600 sheets of 600 × 400 mm, 41.0 % used; about 28 h 44 min, 9,389.52 EUR.',
    );
  });

  it('counts machine time only when the sheet size has no price, and says so', async () => {
    const preparation = preparationFixture({
      sheet: { widthMm: 600, heightMm: 1000 },
      estimate: { minutes: 2.4, machineCost: 0.96, materialCost: null },
    });
    approvalsApi({ ...job, preparation } as unknown as JobView);
    renderApp('/approvals', { token: 't' });
    const card = await screen.findByTestId('waiting-job');
    expect(card).toHaveTextContent(
      '8 pieces on 1 sheet of 600 × 1000 mm, 30.0 % used; about 2.4 min, 0.96 EUR of machine time (no sheet price in EUR).',
    );
  });

  it("gives the job's sheet in the unit this browser shows lengths in", async () => {
    setLengthUnit('in');
    try {
      approvalsApi({
        ...job,
        preparation: preparationFixture({ sheet: { widthMm: 609.6, heightMm: 304.8 } }),
      });
      renderApp('/approvals', { token: 't' });
      // 24 × 12 in (1 in = 25.4 mm exactly, NIST SP 811).
      expect(await screen.findByTestId('waiting-job')).toHaveTextContent('1 sheet of 24.000 × 12.000 in');
    } finally {
      setLengthUnit('mm');
    }
  });

  it('says why a job cannot be approved instead of offering a button the server refuses', async () => {
    for (const [blocked, reason] of [
      [{ preparedByCaller: true }, /You prepared this job: another supervisor approves it/],
      [{ profileVersionRetired: true }, /CO2 laser, 60 W version 1 is no longer the approved one/],
    ] as const) {
      const { calls } = approvalsApi({ ...job, ...blocked, actions: ['return'] });
      const { unmount } = renderApp('/approvals', { token: 't' });
      const card = await screen.findByTestId('waiting-job');
      expect(within(card).getByTestId('approve-blocked')).toHaveTextContent(reason);
      expect(within(card).queryByRole('button', { name: /^Approve the job/ })).toBeNull();
      // Sending back stays possible.
      expect(within(card).getByRole('button', { name: 'Return with a reason: Hexagon star' })).toBeEnabled();
      expect(calls.some((c) => c.method === 'POST')).toBe(false);
      unmount();
    }
  });

  it('tells a fabricator that Approvals is not part of their role', async () => {
    stubFetch({ 'GET /api/auth/me': () => json(200, userFixture('fabricator')) });
    renderApp('/approvals', { token: 't' });
    expect(await screen.findByText('This page is not part of your role')).toBeInTheDocument();
  });
});
