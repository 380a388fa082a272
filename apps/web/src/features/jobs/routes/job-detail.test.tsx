import {
  type ExportView,
  type JobAction,
  type JobDetailView,
  type JobState,
  type Role,
} from '@kerfwright/contracts';
import { screen, waitFor, within } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { json, stubFetch } from '../../../testing/fetch-stub';
import { jobFixture, jobSafetyFixture, preparationFixture, userFixture } from '../../../testing/fixtures';
import { renderApp } from '../../../testing/render-app';
import { stubScreenWidth } from '../../../testing/screen-width';

const job: JobDetailView = {
  ...jobFixture({ version: 4 }),
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
      to: 'draft',
      action: 'change',
      actorId: 'u-h',
      actorName: 'Jun Park',
      reason: 'copies 1 → 2',
      at: '2026-01-01T00:00:30.000Z',
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

/** A finished cut pack as the API lists it to a hobbyist: their assembly guide only (exports.service). */
const hobbyistExport: ExportView = {
  id: 'e-1',
  jobId: job.id,
  state: 'done',
  progress: 100,
  attempts: 1,
  errorCode: null,
  errorMessage: null,
  files: [
    {
      name: 'assembly-guide.pdf',
      role: 'assembly-guide',
      contentType: 'application/pdf',
      bytes: 20480,
      sha256: 'c',
    },
  ],
  createdAt: '2026-01-02T00:00:00.000Z',
  finishedAt: '2026-01-02T00:01:00.000Z',
  replaced: false,
};

describe('job detail', () => {
  afterEach(() => vi.unstubAllGlobals());

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
    // A change of copies or notes is a row of its own, saying what changed, not a step "draft → draft".
    expect(within(history).getAllByRole('row')[2]).toHaveTextContent(
      /draft: changed.*Jun Park.*copies 1 → 2/,
    );
    expect(history).not.toHaveTextContent('draft → draft');
    // Should it be wider than the page, the table scrolls inside its own box instead of widening the page.
    expect(getComputedStyle(history.parentElement!).overflowX).toBe('auto');

    await user.click(within(actions).getByRole('button', { name: 'Return with a reason' }));
    await user.type(await screen.findByLabelText('Reason'), 'Please pick a thinner stock');
    await user.click(screen.getByRole('button', { name: 'Return with this reason' }));
    await waitFor(() => expect(stub.calls.some((c) => c.method === 'POST')).toBe(true));
    const post = stub.calls.find((c) => c.method === 'POST');
    expect(post?.body).toEqual({ version: 4, reason: 'Please pick a thinner stock' });
  });

  it('says that a supervisor approved the job by hand, where the keyboard goes to its name (WCAG 2.1, 4.1.3)', async () => {
    const prepared = { ...job, state: 'prepared' as const, actions: ['approve', 'return'] as JobAction[] };
    const stub = stubFetch({
      'GET /api/auth/me': () => json(200, userFixture('supervisor')),
      [`GET /api/jobs/${job.id}`]: () => json(200, prepared),
      [`POST /api/jobs/${job.id}/approve`]: () =>
        json(200, { ...prepared, state: 'approved', version: 5, actions: ['return'] }),
    });
    const { user } = renderApp(`/jobs/${job.id}`, { token: 't' });
    await user.click(await screen.findByRole('button', { name: 'Approve the job' }));
    const dialog = await screen.findByRole('dialog', { name: 'Approve the job?' });
    await user.click(within(dialog).getByRole('button', { name: 'Approve the job' }));
    await waitFor(() => expect(stub.calls.some((c) => c.method === 'POST')).toBe(true));
    // The heading that gets the keyboard names the job only; the step taken is said where it is announced.
    await waitFor(() => expect(screen.getByRole('heading', { level: 1 })).toHaveFocus());
    expect(screen.getByRole('heading', { level: 1 })).toHaveAccessibleName(job.designName);
    expect(await screen.findByRole('alert')).toHaveTextContent(`${job.designName} is approved for release.`);
  });

  it('says that the job went back with the reason given, as the Approvals page does', async () => {
    stubFetch({
      'GET /api/auth/me': () => json(200, userFixture('supervisor')),
      [`GET /api/jobs/${job.id}`]: () => json(200, job),
      [`POST /api/jobs/${job.id}/return`]: () =>
        json(200, { ...job, state: 'returned', version: 5, actions: ['reopen'], returnReason: 'Too thick' }),
    });
    const { user } = renderApp(`/jobs/${job.id}`, { token: 't' });
    await user.click(await screen.findByRole('button', { name: 'Return with a reason' }));
    await user.type(await screen.findByLabelText('Reason'), 'Too thick');
    await user.click(screen.getByRole('button', { name: 'Return with this reason' }));
    expect(await screen.findByRole('alert')).toHaveTextContent(
      `${job.designName} is returned, with your reason.`,
    );
    await waitFor(() => expect(screen.getByRole('heading', { level: 1 })).toHaveFocus());
  });

  it('lists the history on a phone (390 px), each step on its own lines, with no table to scroll', async () => {
    stubScreenWidth(390);
    stubFetch({
      'GET /api/auth/me': () => json(200, userFixture('fabricator')),
      [`GET /api/jobs/${job.id}`]: () => json(200, job),
    });
    renderApp(`/jobs/${job.id}`, { token: 't' });
    const history = await screen.findByRole('list', { name: 'History' });
    expect(screen.queryByRole('table', { name: 'History' })).not.toBeInTheDocument();
    const steps = within(history).getAllByRole('listitem');
    expect(steps).toHaveLength(job.transitions.length);
    expect(steps[0]).toHaveTextContent('new → draft');
    expect(steps[1]).toHaveTextContent(/draft: changed.*Jun Park.*copies 1 → 2/);
    expect(steps[2]).toHaveTextContent('draft → requested');
  });

  it('lets the requester withdraw a request not yet prepared, after confirming', async () => {
    const stub = stubFetch({
      'GET /api/auth/me': () => json(200, userFixture('hobbyist')),
      [`GET /api/jobs/${job.id}`]: () => json(200, { ...job, state: 'requested', actions: ['withdraw'] }),
      [`POST /api/jobs/${job.id}/withdraw`]: () =>
        json(200, { ...job, state: 'draft', actions: ['request'] }),
    });
    const { user } = renderApp(`/jobs/${job.id}`, { token: 't' });
    await user.click(await screen.findByRole('button', { name: 'Withdraw the request' }));
    expect(screen.getByText(/^Requested by Jun Park · 1 copy/)).toBeInTheDocument();
    const dialog = await screen.findByRole('dialog', { name: 'Withdraw the request?' });
    expect(dialog).toHaveTextContent('The job moves from requested to draft.');
    // The confirmation says what it does, as the page's own button does; no bare "Confirm".
    expect(within(dialog).queryByRole('button', { name: 'Confirm' })).not.toBeInTheDocument();
    await user.click(within(dialog).getByRole('button', { name: 'Withdraw the request' }));
    await waitFor(() => expect(stub.calls.some((c) => c.method === 'POST')).toBe(true));
    expect(stub.calls.find((c) => c.method === 'POST')?.url.pathname).toBe(`/api/jobs/${job.id}/withdraw`);
    // The button is gone with the step: the keyboard focus goes to the job's name, not to the page.
    await waitFor(() => expect(screen.getByRole('heading', { level: 1 })).toHaveFocus());
  });

  it('names the owner of a draft, and confirms its request with a button that says it requests the cut', async () => {
    const stub = stubFetch({
      'GET /api/auth/me': () => json(200, userFixture('hobbyist')),
      [`GET /api/jobs/${job.id}`]: () => json(200, { ...job, state: 'draft', actions: ['request'] }),
      [`POST /api/jobs/${job.id}/request`]: () =>
        json(200, { ...job, state: 'requested', actions: ['withdraw'] }),
    });
    const { user } = renderApp(`/jobs/${job.id}`, { token: 't' });
    const actions = await screen.findByTestId('job-actions');
    // A draft (never sent, or its request withdrawn) is requested by nobody yet: it names its owner.
    expect(screen.getByText(/^Owner: Jun Park · 1 copy/)).toBeInTheDocument();
    expect(screen.queryByText(/Requested by/)).not.toBeInTheDocument();
    await user.click(within(actions).getByRole('button', { name: 'Request the cut' }));
    const dialog = await screen.findByRole('dialog', { name: 'Request the cut?' });
    expect(
      within(dialog)
        .getAllByRole('button')
        .map((b) => b.textContent),
    ).toEqual(['Cancel', 'Request the cut']);
    await user.click(within(dialog).getByRole('button', { name: 'Request the cut' }));
    await waitFor(() => expect(stub.calls.some((c) => c.method === 'POST')).toBe(true));
    expect(stub.calls.find((c) => c.method === 'POST')?.url.pathname).toBe(`/api/jobs/${job.id}/request`);
    expect(stub.calls.find((c) => c.method === 'POST')?.body).toEqual({ version: 4 });
  });

  it('says in the request dialog why the workshop refused the request: too many open, and who can raise the limit', async () => {
    const message =
      '5 jobs are already waiting for the workshop (requested, or prepared and not yet approved), and 5 are ' +
      'allowed at a time: request this one once the workshop has approved or returned one, or withdraw one not ' +
      'yet prepared. The workshop can raise the limit.';
    stubFetch({
      'GET /api/auth/me': () => json(200, userFixture('hobbyist')),
      [`GET /api/jobs/${job.id}`]: () => json(200, { ...job, state: 'draft', actions: ['request'] }),
      [`POST /api/jobs/${job.id}/request`]: () =>
        json(429, {
          statusCode: 429,
          code: 'JOB.TOO_MANY_OPEN_REQUESTS',
          message,
          details: { open: 5, limit: 5, openStates: ['requested', 'prepared'] },
          requestId: 'r-429',
        }),
    });
    const { user } = renderApp(`/jobs/${job.id}`, { token: 't' });
    await user.click(
      within(await screen.findByTestId('job-actions')).getByRole('button', { name: 'Request the cut' }),
    );
    const dialog = await screen.findByRole('dialog', { name: 'Request the cut?' });
    await user.click(within(dialog).getByRole('button', { name: 'Request the cut' }));
    // Said where the request was made, and the job is still a draft to request later.
    expect(await within(dialog).findByRole('alert')).toHaveTextContent(message);
    expect(screen.getByText(/^Owner: Jun Park/)).toBeInTheDocument();
  });

  it('keeps the reason a job was returned for in view once it is reopened as a draft, until it is requested again', async () => {
    // Typed without a full stop: the page ends the sentence before going on.
    const reason = 'Saffron card is out of stock until Friday; choose another colour';
    let current: JobDetailView = { ...job, state: 'returned', returnReason: reason, actions: ['reopen'] };
    stubFetch({
      'GET /api/auth/me': () => json(200, userFixture('hobbyist')),
      [`GET /api/jobs/${job.id}`]: () => json(200, current),
      [`POST /api/jobs/${job.id}/reopen`]: () => {
        // The API keeps the reason on the reopened draft (jobs.service clears it on the next request).
        current = { ...current, state: 'draft', version: 5, actions: ['request'] };
        return json(200, current);
      },
      [`POST /api/jobs/${job.id}/request`]: () => {
        current = { ...current, state: 'requested', version: 6, returnReason: null, actions: ['withdraw'] };
        return json(200, current);
      },
    });
    const { user } = renderApp(`/jobs/${job.id}`, { token: 't' });
    expect(await screen.findByTestId('return-reason')).toHaveTextContent(`Returned: ${reason}`);

    await user.click(
      within(screen.getByTestId('job-actions')).getByRole('button', { name: 'Reopen as a draft' }),
    );
    const reopen = await screen.findByRole('dialog', { name: 'Reopen as a draft?' });
    await user.click(within(reopen).getByRole('button', { name: 'Reopen as a draft' }));
    await screen.findByText(/^Owner: Jun Park/);
    expect(screen.getByTestId('return-reason')).toHaveTextContent(
      `Returned earlier: ${reason}. Put that right, then request the cut again.`,
    );

    await user.click(
      within(screen.getByTestId('job-actions')).getByRole('button', { name: 'Request the cut' }),
    );
    const request = await screen.findByRole('dialog', { name: 'Request the cut?' });
    await user.click(within(request).getByRole('button', { name: 'Request the cut' }));
    await screen.findByText(/^Requested by Jun Park/);
    expect(screen.queryByTestId('return-reason')).not.toBeInTheDocument();
  });

  it("lets a draft's requester change its copies and notes, starting from the job's own", async () => {
    const me = userFixture('hobbyist');
    let current: JobDetailView = {
      ...job,
      state: 'draft',
      requesterId: me.id,
      quantity: 2,
      notes: 'Teal if possible',
      actions: ['request'],
    };
    const stub = stubFetch({
      'GET /api/auth/me': () => json(200, me),
      [`GET /api/jobs/${job.id}`]: () => json(200, current),
      [`PATCH /api/jobs/${job.id}`]: (req) => {
        const body = req.body as { quantity: number; notes: string };
        current = { ...current, ...body, version: current.version + 1 };
        return json(200, current);
      },
    });
    const { user } = renderApp(`/jobs/${job.id}`, { token: 't' });
    const actions = await screen.findByTestId('job-actions');
    await user.click(within(actions).getByRole('button', { name: 'Change copies and notes' }));
    const dialog = await screen.findByRole('dialog', { name: 'Change copies and notes' });
    expect(within(dialog).getByLabelText('Copies')).toHaveValue(2);
    expect(within(dialog).getByLabelText('Notes for the workshop')).toHaveValue('Teal if possible');
    // A wrong count is refused in the form, and not kept for the next opening.
    await user.clear(within(dialog).getByLabelText('Copies'));
    await user.type(within(dialog).getByLabelText('Copies'), '0');
    await user.click(within(dialog).getByRole('button', { name: 'Save the changes' }));
    expect(await within(dialog).findByText('At least 1 copy')).toBeInTheDocument();
    await user.click(within(dialog).getByRole('button', { name: 'Cancel' }));
    await waitFor(() => expect(screen.queryByRole('dialog')).not.toBeInTheDocument());
    await user.click(within(actions).getByRole('button', { name: 'Change copies and notes' }));
    const again = await screen.findByRole('dialog', { name: 'Change copies and notes' });
    expect(within(again).getByLabelText('Copies')).toHaveValue(2);
    await user.clear(within(again).getByLabelText('Copies'));
    await user.type(within(again).getByLabelText('Copies'), '3');
    await user.click(within(again).getByRole('button', { name: 'Save the changes' }));
    await waitFor(() => expect(screen.queryByRole('dialog')).not.toBeInTheDocument());
    expect(stub.calls.find((c) => c.method === 'PATCH')?.body).toEqual({
      version: 4,
      quantity: 3,
      notes: 'Teal if possible',
    });
    expect(await screen.findByText(/^Owner: Jun Park · 3 copies/)).toBeInTheDocument();
  });

  it('offers no change of copies once the job is requested, nor to anyone but its requester', async () => {
    const me = userFixture('hobbyist');
    let current: JobDetailView = { ...job, state: 'requested', requesterId: me.id, actions: ['withdraw'] };
    stubFetch({
      'GET /api/auth/me': () => json(200, me),
      [`GET /api/jobs/${job.id}`]: () => json(200, current),
    });
    const first = renderApp(`/jobs/${job.id}`, { token: 't' });
    const actions = await screen.findByTestId('job-actions');
    expect(within(actions).queryByRole('button', { name: 'Change copies and notes' })).toBeNull();
    first.unmount();
    // A draft of someone else's (a supervisor may change it; a fabricator never sees it).
    current = { ...current, state: 'draft', requesterId: 'u-h', actions: [] };
    vi.unstubAllGlobals();
    stubFetch({
      'GET /api/auth/me': () => json(200, userFixture('fabricator')),
      [`GET /api/jobs/${job.id}`]: () => json(200, current),
    });
    renderApp(`/jobs/${job.id}`, { token: 't' });
    expect(await screen.findByText('Nothing for you to do on this job now.')).toBeInTheDocument();
    expect(screen.queryByRole('button', { name: 'Change copies and notes' })).toBeNull();
  });

  it('closes the change of copies when someone changed the job meanwhile, and says nothing was saved', async () => {
    const me = userFixture('hobbyist');
    let current: JobDetailView = { ...job, state: 'draft', requesterId: me.id, actions: ['request'] };
    stubFetch({
      'GET /api/auth/me': () => json(200, me),
      [`GET /api/jobs/${job.id}`]: () => json(200, current),
      [`PATCH /api/jobs/${job.id}`]: () => {
        current = { ...current, version: 5, notes: 'Changed in another tab' };
        return json(409, {
          statusCode: 409,
          code: 'JOB.STALE_VERSION',
          message: 'The job changed since you read it; reload it and try again',
          details: { current: 5 },
          requestId: 'r-9',
        });
      },
    });
    const { user } = renderApp(`/jobs/${job.id}`, { token: 't' });
    await user.click(await screen.findByRole('button', { name: 'Change copies and notes' }));
    const dialog = await screen.findByRole('dialog', { name: 'Change copies and notes' });
    await user.type(within(dialog).getByLabelText('Notes for the workshop'), 'Birch');
    await user.click(within(dialog).getByRole('button', { name: 'Save the changes' }));
    await waitFor(() => expect(screen.queryByRole('dialog')).not.toBeInTheDocument());
    expect(await screen.findByText('Changed in another tab')).toBeInTheDocument();
    expect(screen.getByTestId('job-read-again')).toHaveTextContent(
      'The job was changed elsewhere (by someone else, or in another tab) while you had it open, so your changes were not saved.',
    );
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
    // 0.165 mm / 25.4 mm per inch = 0.0064961 in; 0.0065 in is 0.1651 mm, less than half a micrometre off.
    expect(screen.getByText('0.0065 in')).toBeInTheDocument();
  });

  it('shows a kerf as the machine profiles do (0.09 mm, 0.20 mm), and a router job’s as the width of its cut', async () => {
    for (const [machineKind, label, kerf, shown] of [
      ['laser', 'Measured kerf', 0.09, '0.09 mm'],
      ['laser', 'Measured kerf', 0.2, '0.20 mm'],
      ['router', 'Measured cut width', 3.2, '3.20 mm'],
    ] as const) {
      stubFetch({
        'GET /api/auth/me': () => json(200, userFixture('operator')),
        [`GET /api/jobs/${job.id}`]: () =>
          json(200, {
            ...job,
            state: 'cut',
            preparation: preparationFixture({ machineKind }),
            actualMinutes: 12,
            sheetsUsed: 1,
            measuredKerfMm: kerf,
            actions: [],
          }),
        [`GET /api/jobs/${job.id}/exports`]: () => json(200, []),
      });
      const { unmount } = renderApp(`/jobs/${job.id}`, { token: 't' });
      const term = await screen.findByText(label, { selector: 'dt' });
      expect(term.nextElementSibling?.textContent).toBe(shown);
      unmount();
    }
  });

  /** The job in `state` on CO2 laser version 1, retired since, as `role` sees it. */
  function onRetiredVersion(role: Role, state: JobState, actions: JobAction[]) {
    stubFetch({
      'GET /api/auth/me': () => json(200, userFixture(role)),
      [`GET /api/jobs/${job.id}`]: () =>
        json(200, {
          ...job,
          state,
          preparation: preparationFixture(),
          profileName: 'CO2 laser, 60 W',
          profileVersionNumber: 1,
          profileVersionRetired: true,
          actions,
        }),
      [`GET /api/jobs/${job.id}/exports`]: () => json(200, []),
      [`GET /api/jobs/${job.id}/safety`]: () => json(200, jobSafetyFixture(job.id, false)),
    });
  }

  it('does not offer the cut pack of an approved job whose machine version was retired, but the way back', async () => {
    onRetiredVersion('fabricator', 'approved', ['release', 'return']);
    renderApp(`/jobs/${job.id}`, { token: 't' });
    const pack = await screen.findByTestId('cut-pack');
    expect(within(pack).getByTestId('cut-pack-blocked')).toHaveTextContent(
      /^CO2 laser, 60 W version 1, which this job was prepared on, has been retired since/,
    );
    expect(within(pack).queryByRole('button', { name: /^Prepare the cut pack/ })).not.toBeInTheDocument();
    const actions = screen.getByTestId('job-actions');
    expect(within(actions).getByRole('button', { name: 'Return with a reason' })).toBeInTheDocument();
    // Beside the actions, why there is no release.
    expect(within(actions).getByTestId('release-blocked')).toHaveTextContent(
      /version 1, which this job was prepared on, has been retired since, so it cannot be released to the machines/,
    );
  });

  it('says a released job’s machine version was retired since, and offers a supervisor its return', async () => {
    onRetiredVersion('supervisor', 'released', ['cut', 'return']);
    renderApp(`/jobs/${job.id}`, { token: 't' });
    const actions = await screen.findByTestId('job-actions');
    // A warning of its own, telling the supervisor what is theirs to do.
    expect(await screen.findByTestId('retired-since-release')).toHaveTextContent(
      /^CO2 laser, 60 W version 1, which this job was released on, has been retired since\. If it must not be cut on that version, return it with a reason/,
    );
    expect(within(actions).getByRole('button', { name: 'Return with a reason' })).toBeInTheDocument();
  });

  /** A job's history, one step per action, as the API lists it (only the actions matter to the cut pack). */
  const history = (...actions: string[]): JobDetailView['transitions'] =>
    actions.map((action, i) => ({
      from: null,
      to: 'draft',
      action,
      actorId: 'u-f',
      actorName: 'Ada Fabricator',
      reason: action === 'return' ? 'Use card for this one' : null,
      at: `2026-01-0${1 + Math.floor(i / 5)}T00:0${i % 5}:00.000Z`,
    }));
  const firstPreparation = history('create', 'request', 'prepare', 'approve');
  const preparedAgain = history(
    ...['create', 'request', 'prepare', 'approve', 'release'],
    ...['return', 'reopen', 'request', 'prepare', 'approve'],
  );
  const runningPack: ExportView = {
    ...hobbyistExport,
    id: 'e-2',
    state: 'running',
    progress: 40,
    files: [],
    finishedAt: null,
  };

  it.each([
    ['no pack yet', preparedAgain, [], true, 'none'],
    ['its new pack being built', preparedAgain, [runningPack], true, 'progress'],
    ['its new pack failed', preparedAgain, [{ ...runningPack, state: 'failed' as const }], true, 'failed'],
    ['its new pack built', preparedAgain, [hobbyistExport], false, 'files'],
    ['no pack yet, never returned', firstPreparation, [], false, 'none'],
  ])(
    'says plainly whether a job’s current preparation has a cut pack (%s)',
    async (_case, transitions, exports, saysPreparedAgain, shows) => {
      stubFetch({
        'GET /api/auth/me': () => json(200, userFixture('operator')),
        [`GET /api/jobs/${job.id}`]: () =>
          json(200, {
            ...job,
            state: 'approved',
            actions: [],
            preparation: preparationFixture(),
            transitions,
          }),
        [`GET /api/jobs/${job.id}/exports`]: () => json(200, exports),
        [`GET /api/jobs/${job.id}/safety`]: () => json(200, jobSafetyFixture(job.id, true)),
        'GET /api/exports/e-2/events': () =>
          new Response(`event: progress\ndata: ${JSON.stringify(runningPack)}\n\n`, { status: 200 }),
        'GET /api/exports/e-2': () => json(200, runningPack),
      });
      renderApp(`/jobs/${job.id}`, { token: 't' });
      const pack = await screen.findByTestId('cut-pack');
      if (shows === 'files') await within(pack).findByRole('table', { name: 'Cut pack files' });
      else if (shows === 'progress') await within(pack).findByRole('progressbar');
      else if (shows === 'failed') await within(pack).findByRole('alert');
      else await within(pack).findByText(/cut pack/);
      if (saysPreparedAgain) {
        expect(within(pack).getByTestId('cut-pack-none-for-preparation')).toHaveTextContent(
          'The job was returned and prepared again: no cut pack has been built for its current preparation yet.',
        );
      } else {
        expect(within(pack).queryByTestId('cut-pack-none-for-preparation')).not.toBeInTheDocument();
      }
      // Only the packs the API lists for the preparation in effect are offered: none but a built one's files.
      expect(within(pack).queryAllByRole('button', { name: /^Download / })).toHaveLength(
        shows === 'files' ? hobbyistExport.files.length : 0,
      );
      expect(within(pack).queryByText('No cut pack has been prepared for this job yet.') !== null).toBe(
        shows === 'none' && !saysPreparedAgain,
      );
    },
  );

  it('tells the recorded machine time from the estimated one', async () => {
    const preparation = preparationFixture();
    stubFetch({
      'GET /api/auth/me': () => json(200, userFixture('operator')),
      [`GET /api/jobs/${job.id}`]: () =>
        json(200, { ...job, state: 'cut', preparation, actualMinutes: 12, sheetsUsed: 1, actions: [] }),
      [`GET /api/jobs/${job.id}/exports`]: () => json(200, []),
    });
    renderApp(`/jobs/${job.id}`, { token: 't' });
    const value = async (label: string) =>
      (await screen.findByText(label, { selector: 'dt' })).nextElementSibling?.textContent;
    expect(await value('Machine time (recorded)')).toBe('12.0 min');
    expect(await value('Machine time (estimated)')).toBe('9.5 min');
    expect(screen.queryByText('Machine time', { selector: 'dt' })).not.toBeInTheDocument();
  });

  it('says which figures count every copy and which one model', async () => {
    const preparation = preparationFixture({ pieceCount: 24, sheetCount: 2 });
    stubFetch({
      'GET /api/auth/me': () => json(200, userFixture('operator')),
      [`GET /api/jobs/${job.id}`]: () =>
        json(200, { ...job, state: 'prepared', quantity: 2, preparation, actions: [] }),
      [`GET /api/jobs/${job.id}/exports`]: () => json(200, []),
    });
    renderApp(`/jobs/${job.id}`, { token: 't' });
    const value = async (label: string) =>
      (await screen.findByText(label, { selector: 'dt' })).nextElementSibling?.textContent;
    expect(await value('Pieces')).toBe('24 (2 copies of 12)');
    expect(await value('Crossings')).toBe('12 per copy');
    expect(await value('Sheets')).toBe('2 sheets of 600 × 400 mm');
  });

  it('writes the stock thickness as the materials list does (3 mm, not 3.00 mm)', async () => {
    const preparation = preparationFixture({ thicknessMm: 3 });
    stubFetch({
      'GET /api/auth/me': () => json(200, userFixture('operator')),
      [`GET /api/jobs/${job.id}`]: () => json(200, { ...job, state: 'prepared', preparation, actions: [] }),
      [`GET /api/jobs/${job.id}/exports`]: () => json(200, []),
    });
    renderApp(`/jobs/${job.id}`, { token: 't' });
    const stock = await screen.findByText('Stock', { selector: 'dt' });
    expect(stock.nextElementSibling?.textContent).toBe('3 mm thick, cut on a laser');
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

  it("offers a hobbyist their released job's assembly guide, and nothing the server keeps from them", async () => {
    const hobbyist = userFixture('hobbyist');
    const mine = { ...job, requesterId: hobbyist.id, state: 'released' as const, actions: [] };
    const stub = stubFetch({
      'GET /api/auth/me': () => json(200, hobbyist),
      [`GET /api/jobs/${job.id}`]: () => json(200, mine),
      [`GET /api/jobs/${job.id}/exports`]: () => json(200, [hobbyistExport]),
      'GET /api/exports/e-1/files/assembly-guide.pdf': () =>
        new Response('%PDF-1.7', { status: 200, headers: { 'Content-Type': 'application/pdf' } }),
    });
    // jsdom keeps no object URLs: the saved file is seen as the blob handed to the browser.
    const saved = vi.fn((_blob: Blob) => 'blob:guide');
    vi.stubGlobal(
      'URL',
      class extends URL {
        static override createObjectURL = saved;
        static override revokeObjectURL = () => undefined;
      },
    );
    const { user } = renderApp(`/jobs/${job.id}`, { token: 't' });
    const panel = await screen.findByTestId('assembly-guide');
    await user.click(await within(panel).findByRole('button', { name: 'Download assembly-guide.pdf' }));
    await waitFor(() =>
      expect(stub.calls.some((c) => c.url.pathname === '/api/exports/e-1/files/assembly-guide.pdf')).toBe(
        true,
      ),
    );
    await waitFor(() => expect(saved).toHaveBeenCalledTimes(1));
    expect(within(panel).queryByTestId('form-error')).not.toBeInTheDocument();
    expect(within(panel).getAllByRole('button')).toHaveLength(1);
    // The staff's cut pack (every file, safety acknowledgement) is not theirs, nor are the safety notices.
    expect(screen.queryByTestId('cut-pack')).not.toBeInTheDocument();
    expect(stub.calls.some((c) => c.url.pathname.endsWith('/safety'))).toBe(false);
  });

  it('offers no assembly guide before the job is released, as the server refuses it then', async () => {
    const hobbyist = userFixture('hobbyist');
    const stub = stubFetch({
      'GET /api/auth/me': () => json(200, hobbyist),
      [`GET /api/jobs/${job.id}`]: () =>
        json(200, { ...job, requesterId: hobbyist.id, state: 'approved', actions: [] }),
      [`GET /api/jobs/${job.id}/exports`]: () => json(200, [hobbyistExport]),
    });
    renderApp(`/jobs/${job.id}`, { token: 't' });
    await screen.findByText('Nothing for you to do on this job now.');
    expect(screen.queryByTestId('assembly-guide')).not.toBeInTheDocument();
    expect(stub.calls.some((c) => c.url.pathname.endsWith('/exports'))).toBe(false);
  });

  /** The stock and machine of a design no material in these tests keeps (a first preparation chooses nothing). */
  const sixMillimetreDesign = {
    stock: { thicknessMm: 6, sheet: { widthMm: 600, heightMm: 400 } },
    machine: { kind: 'laser', kerfMm: 0.2 },
  };

  it("holds the colours of stock chosen in the Prepare dialog against the job's design", async () => {
    const material = {
      id: 'm-acrylic',
      name: 'Cast acrylic 3 mm',
      colours: ['clear', 'amber', 'teal'],
      stockSheets: [{ widthMm: 600, heightMm: 400, pricePerSheet: 14.5, currency: 'EUR' }],
      laserAllowed: true,
    };
    const stub = stubFetch({
      'GET /api/auth/me': () => json(200, userFixture('fabricator')),
      [`GET /api/jobs/${job.id}`]: () => json(200, job),
      'GET /api/materials': () => json(200, { items: [material], total: 1, page: 1, pageSize: 100 }),
      'GET /api/machine-profiles': () => json(200, { items: [], total: 0, page: 1, pageSize: 100 }),
      'GET /api/designs/d-1': () =>
        json(200, {
          id: 'd-1',
          // Drawn for 6 mm stock, which the material here is not: the dialog starts with nothing chosen.
          spec: { ...sixMillimetreDesign, colours: { count: 3, rule: 'neighbour-distinct' } },
        }),
    });
    const { user } = renderApp(`/jobs/${job.id}`, { token: 't' });
    const actions = await screen.findByTestId('job-actions');
    await user.click(within(actions).getByRole('button', { name: 'Prepare: material, machine, layout' }));
    const dialog = await screen.findByRole('dialog', { name: 'Prepare the job' });
    await within(dialog).findByRole('option', { name: 'Cast acrylic 3 mm' });
    await user.selectOptions(within(dialog).getByLabelText('Material'), 'm-acrylic');
    // The job names no colours: the material's three, as many as the design's, come ticked; two taken off.
    await user.click(within(dialog).getByLabelText('teal'));
    await user.click(within(dialog).getByLabelText('amber'));
    expect(await within(dialog).findByTestId('prepare-colour-warning')).toHaveTextContent(
      'The design uses 3 colours (Neighbours differ); with 1 colour every piece is cut from the same stock.',
    );
    expect(stub.calls.some((c) => c.url.pathname === '/api/designs/d-1')).toBe(true);
  });

  it('opens the Prepare dialog with the colours the job lists ticked', async () => {
    const material = {
      id: 'm-acrylic',
      name: 'Cast acrylic 3 mm',
      colours: ['clear', 'amber', 'teal'],
      stockSheets: [{ widthMm: 600, heightMm: 400, pricePerSheet: 14.5, currency: 'EUR' }],
      laserAllowed: true,
    };
    stubFetch({
      'GET /api/auth/me': () => json(200, userFixture('fabricator')),
      [`GET /api/jobs/${job.id}`]: () => json(200, { ...job, colours: ['teal', 'amber'] }),
      'GET /api/materials': () => json(200, { items: [material], total: 1, page: 1, pageSize: 100 }),
      'GET /api/machine-profiles': () => json(200, { items: [], total: 0, page: 1, pageSize: 100 }),
      'GET /api/designs/d-1': () => json(200, { id: 'd-1', spec: sixMillimetreDesign }),
    });
    const { user } = renderApp(`/jobs/${job.id}`, { token: 't' });
    const actions = await screen.findByTestId('job-actions');
    await user.click(within(actions).getByRole('button', { name: 'Prepare: material, machine, layout' }));
    const dialog = await screen.findByRole('dialog', { name: 'Prepare the job' });
    await within(dialog).findByRole('option', { name: 'Cast acrylic 3 mm' });
    await user.selectOptions(within(dialog).getByLabelText('Material'), 'm-acrylic');
    const group = within(dialog).getByRole('group', { name: 'Colours of stock' });
    expect(
      within(group)
        .getAllByRole('checkbox')
        .map((c) => (c as HTMLInputElement).checked),
    ).toEqual([false, true, true]);
  });

  it('tells the supervisor who prepared a job why they are not offered its approval', async () => {
    stubFetch({
      'GET /api/auth/me': () => json(200, userFixture('supervisor')),
      [`GET /api/jobs/${job.id}`]: () =>
        json(200, { ...job, state: 'prepared', actions: ['prepare', 'return'], preparedByCaller: true }),
      [`GET /api/jobs/${job.id}/exports`]: () => json(200, []),
    });
    renderApp(`/jobs/${job.id}`, { token: 't' });
    const actions = await screen.findByTestId('job-actions');
    expect(await within(actions).findByTestId('approve-blocked')).toHaveTextContent(
      'You prepared this job: another supervisor approves it (four-eyes rule).',
    );
    expect(within(actions).queryByRole('button', { name: /approve/i })).toBeNull();
  });

  it('says why a job whose material was taken off the laser is not offered for approval, release or cut', async () => {
    // The server's refusal (MATERIAL.LASER_PROHIBITED), word for word, as the job view carries it.
    const refusal = 'PVC, vinyl must not be cut on a laser: releases hydrogen chloride';
    for (const [role, state, next] of [
      ['supervisor', 'prepared', 'Return it with a reason'],
      ['operator', 'released', 'A supervisor or fabricator returns it'],
    ] as const) {
      stubFetch({
        'GET /api/auth/me': () => json(200, userFixture(role)),
        [`GET /api/jobs/${job.id}`]: () =>
          json(200, {
            ...job,
            state,
            actions: role === 'supervisor' ? ['return'] : [],
            materialRefusal: refusal,
          }),
        [`GET /api/jobs/${job.id}/exports`]: () => json(200, []),
        [`GET /api/jobs/${job.id}/safety`]: () => json(200, jobSafetyFixture(job.id, false)),
      });
      const { unmount } = renderApp(`/jobs/${job.id}`, { token: 't' });
      const actions = await screen.findByTestId('job-actions');
      const note = await within(actions).findByTestId('material-stopped');
      expect(note).toHaveTextContent(`${refusal}. Since it was prepared`);
      expect(note).toHaveTextContent('it cannot be approved, released or cut');
      expect(note).toHaveTextContent(next);
      // Not the supervisor's generic "You cannot approve this job." beside it.
      expect(within(actions).queryByTestId('approve-blocked')).toBeNull();
      unmount();
    }
  });

  it('waits with the cut record until the operator has acknowledged the notices, as the server does', async () => {
    for (const acknowledged of [false, true]) {
      stubFetch({
        'GET /api/auth/me': () => json(200, userFixture('operator')),
        [`GET /api/jobs/${job.id}`]: () => json(200, { ...job, state: 'released', actions: ['cut'] }),
        [`GET /api/jobs/${job.id}/exports`]: () => json(200, []),
        [`GET /api/jobs/${job.id}/safety`]: () => json(200, jobSafetyFixture(job.id, acknowledged)),
      });
      const { unmount } = renderApp(`/jobs/${job.id}`, { token: 't' });
      const actions = await screen.findByTestId('job-actions');
      const record = within(actions).getByRole('button', { name: 'Record the cut' });
      if (acknowledged) {
        await waitFor(() => expect(record).toBeEnabled());
        expect(within(actions).queryByTestId('cut-waits')).toBeNull();
      } else {
        expect(await within(actions).findByTestId('cut-waits')).toHaveTextContent(
          'Acknowledge the safety notices',
        );
        expect(record).toBeDisabled();
      }
      unmount();
    }
  });

  it('reads the job again after a conflict and says in its own words why nothing was done', async () => {
    let current: JobDetailView = { ...job, state: 'prepared', actions: ['approve', 'prepare', 'return'] };
    const stub = stubFetch({
      'GET /api/auth/me': () => json(200, userFixture('supervisor')),
      [`GET /api/jobs/${job.id}`]: () => json(200, current),
      [`POST /api/jobs/${job.id}/approve`]: () => {
        // Meanwhile a fabricator returned the job: the server has a newer version in another state.
        current = { ...current, state: 'returned', version: 5, returnReason: 'Wrong stock', actions: [] };
        return json(409, {
          statusCode: 409,
          code: 'JOB.ILLEGAL_TRANSITION',
          message: 'A returned job cannot be given "approve"',
          details: { state: 'returned', action: 'approve', allowedFrom: ['prepared'] },
          requestId: 'r-2',
        });
      },
    });
    const { user } = renderApp(`/jobs/${job.id}`, { token: 't' });
    const actions = await screen.findByTestId('job-actions');
    await user.click(within(actions).getByRole('button', { name: /^Approve/ }));
    const dialog = await screen.findByRole('dialog');
    await user.click(within(dialog).getByRole('button', { name: 'Approve the job' }));

    expect(await screen.findByTestId('return-reason')).toHaveTextContent('Returned: Wrong stock');
    expect(screen.getByTestId('job-state')).toHaveTextContent('returned');
    expect(screen.getByTestId('job-read-again')).toHaveTextContent(
      'Someone else acted on this job while you had it open, so nothing was done',
    );
    // The refusal in the page's words: the API's action names ("approve") stay out of it.
    expect(screen.getByTestId('job-read-again')).toHaveTextContent(
      'The page now shows it as it is (a returned job cannot be approved): check it before you act again.',
    );
    expect(screen.getByTestId('job-read-again')).not.toHaveTextContent(/given|"approve"/);
    // The confirmation for an action the job no longer offers is gone.
    await waitFor(() => expect(screen.queryByRole('dialog')).not.toBeInTheDocument());
    expect(
      stub.calls.filter((c) => c.method === 'GET' && c.url.pathname === `/api/jobs/${job.id}`),
    ).toHaveLength(2);
  });

  it('after a stale version, closes the dialog and sends the next try with the version read again', async () => {
    let current: JobDetailView = { ...job, state: 'prepared', actions: ['approve', 'prepare', 'return'] };
    let answered = false;
    const stub = stubFetch({
      'GET /api/auth/me': () => json(200, userFixture('supervisor')),
      [`GET /api/jobs/${job.id}`]: () => json(200, current),
      [`POST /api/jobs/${job.id}/approve`]: () => {
        if (answered) return json(200, { ...current, state: 'approved', actions: [] });
        answered = true;
        // Meanwhile the notes were edited: same state, newer version.
        current = { ...current, version: 6, notes: 'Two colours after all' };
        return json(409, {
          statusCode: 409,
          code: 'JOB.STALE_VERSION',
          message: 'The job changed since you read it; reload it and try again',
          details: { current: 6 },
          requestId: 'r-3',
        });
      },
    });
    const { user } = renderApp(`/jobs/${job.id}`, { token: 't' });
    const actions = await screen.findByTestId('job-actions');
    await user.click(within(actions).getByRole('button', { name: /^Approve/ }));
    const dialog = await screen.findByRole('dialog');
    await user.click(within(dialog).getByRole('button', { name: 'Approve the job' }));
    // The dialog closes: the supervisor sees the job as it is now before approving it again.
    await waitFor(() => expect(screen.queryByRole('dialog')).not.toBeInTheDocument());
    expect(await screen.findByText('Two colours after all')).toBeInTheDocument();
    expect(screen.getByTestId('job-read-again')).not.toHaveTextContent('reload');
    await user.click(within(actions).getByRole('button', { name: /^Approve/ }));
    await user.click(
      within(await screen.findByRole('dialog')).getByRole('button', { name: 'Approve the job' }),
    );
    await waitFor(() => expect(stub.calls.filter((c) => c.method === 'POST')).toHaveLength(2));
    expect(stub.calls.filter((c) => c.method === 'POST').map((c) => c.body)).toEqual([
      { version: 4 },
      { version: 6 },
    ]);
  });
});
