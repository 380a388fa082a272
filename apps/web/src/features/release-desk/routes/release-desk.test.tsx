import { type ExportView, type JobSafetyView, type JobView } from '@kerfwright/contracts';
import { act, screen, waitFor, within } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { json, stubFetch } from '../../../testing/fetch-stub';
import { jobSafetyFixture, userFixture } from '../../../testing/fixtures';
import { QUEUE_REFRESH_MS } from '../../../lib/query-client';
import { renderApp } from '../../../testing/render-app';
import { DONE_PACK_REFRESH_MS, STALE_PACK_REFRESH_MS } from '../../jobs/api/get-job-exports';
import { stubScreenWidth } from '../../../testing/screen-width';
import { formatDateTime } from '../../../lib/dates';

function jobFixture(id: string, state: JobView['state'], name: string): JobView {
  return {
    id,
    state,
    designId: `d-${id}`,
    designName: name,
    requesterId: 'u-h',
    requesterName: 'Jun Park',
    quantity: 1,
    notes: '',
    materialId: 'm-1',
    materialName: 'Cast acrylic 3 mm',
    colours: ['clear'],
    profileVersionId: 'v-1',
    profileName: 'CO2 laser',
    profileVersionNumber: 2,
    returnReason: null,
    preparation: null,
    actualMinutes: null,
    sheetsUsed: null,
    measuredKerfMm: null,
    version: 7,
    createdAt: '2026-01-01T00:00:00.000Z',
    updatedAt: '2026-01-02T00:00:00.000Z',
    actions: state === 'released' ? ['cut'] : [],
  };
}

function exportFixture(id: string, jobId: string, state: ExportView['state'], progress: number): ExportView {
  return {
    id,
    jobId,
    state,
    progress,
    attempts: 1,
    errorCode: null,
    errorMessage: null,
    files:
      state === 'done'
        ? [
            {
              name: 'sheet-01-clear.svg',
              role: 'sheet-svg',
              contentType: 'image/svg+xml',
              bytes: 4506,
              sha256: 'a',
            },
            {
              name: 'manifest.json',
              role: 'manifest',
              contentType: 'application/json',
              bytes: 812,
              sha256: 'b',
            },
          ]
        : [],
    createdAt: '2026-01-02T00:00:00.000Z',
    finishedAt: null,
    replaced: false,
  };
}

const released = jobFixture('j-released', 'released', 'Turned squares');
const packing = jobFixture('j-packing', 'approved', 'Star lamp');
const waiting = jobFixture('j-waiting', 'approved', 'Not released yet');

function stubDesk(
  acknowledged: boolean,
  pack: Partial<ExportView> | (() => Partial<ExportView>) = {},
  extra: Parameters<typeof stubFetch>[0] = {},
) {
  const safety: JobSafetyView = jobSafetyFixture(released.id, acknowledged);
  return stubFetch({
    'GET /api/auth/me': () => json(200, userFixture('operator')),
    'GET /api/jobs': (call) => {
      const state = call.url.searchParams.get('state');
      const items = state === 'released' ? [released] : state === 'approved' ? [packing, waiting] : [];
      return json(200, { items, total: items.length, page: 1, pageSize: 100 });
    },
    [`GET /api/jobs/${released.id}`]: () => json(200, { ...released, transitions: [] }),
    [`GET /api/jobs/${released.id}/exports`]: () =>
      json(200, [
        {
          ...exportFixture('e-r', released.id, 'done', 100),
          ...(typeof pack === 'function' ? pack() : pack),
        },
      ]),
    [`GET /api/jobs/${packing.id}/exports`]: () =>
      json(200, [exportFixture('e-p', packing.id, 'running', 40)]),
    [`GET /api/jobs/${waiting.id}/exports`]: () => json(200, []),
    // The pack being prepared: its event stream reports 65 % and ends; polling then finds it still running.
    'GET /api/exports/e-p/events': () =>
      new Response(
        `event: progress\ndata: ${JSON.stringify(exportFixture('e-p', packing.id, 'running', 65))}\n\n`,
        {
          status: 200,
        },
      ),
    'GET /api/exports/e-p': () => json(200, exportFixture('e-p', packing.id, 'running', 65)),
    [`GET /api/jobs/${released.id}/safety`]: () => json(200, safety),
    [`POST /api/jobs/${released.id}/cut`]: () => json(200, { ...released, state: 'cut', actions: [] }),
    ...extra,
  });
}

describe('release desk', () => {
  afterEach(() => {
    vi.unstubAllGlobals();
    vi.useRealTimers();
  });

  it('lists released jobs and approved jobs whose pack is being prepared, with live progress', async () => {
    stubDesk(false);
    renderApp('/release-desk', { token: 't' });
    const table = await screen.findByRole('table', { name: 'Jobs at the release desk' });
    await within(table).findByText('Star lamp');
    expect(within(table).getByText('Turned squares')).toBeInTheDocument();
    // Whose job each row is: two jobs of one design are told apart.
    expect(within(table).getAllByText('for Jun Park').length).toBeGreaterThanOrEqual(2);
    expect(within(table).queryByText('Not released yet')).not.toBeInTheDocument();
    // The stream's 65 % replaces the 40 % the list gave.
    expect(
      await within(table).findByRole('progressbar', { name: 'Preparing the cut pack, 65 %' }),
    ).toBeInTheDocument();
    expect(within(table).getByText('Ready, 2 files')).toBeInTheDocument();
    // Every column has a name, the buttons' too (a screen reader reads it with each cell).
    expect(
      within(table)
        .getAllByRole('columnheader')
        .map((h) => h.textContent),
    ).toEqual(['Design', 'State', 'Material', 'Machine', 'Sheets', 'Cut pack', 'Open']);
    // At phone width (375 px) the seven columns scroll inside the card instead of running out of it.
    expect(getComputedStyle(table.parentElement!).overflowX).toBe('auto');
  });

  it('leaves a job opened at the desk without breaking the page, though scrollIntoView returns a promise', async () => {
    // Chromium's scrollIntoView returns a promise; an effect that returned it had React call it as its
    // clean-up when the job was closed ("not a function"), replacing the page with the error screen.
    // jsdom has no scrollIntoView: define one for this test.
    const scroll = vi.fn(() => Promise.resolve());
    Object.defineProperty(Element.prototype, 'scrollIntoView', { value: scroll, configurable: true });
    try {
      stubDesk(false);
      const { user } = renderApp('/release-desk', { token: 't' });
      await user.click(await screen.findByRole('button', { name: 'Open Turned squares' }));
      await screen.findByTestId('desk-job');
      expect(scroll).toHaveBeenCalled();
      await user.click(screen.getByRole('link', { name: 'Jobs' }));
      await screen.findByRole('heading', { name: 'Jobs', level: 1 });
      expect(screen.queryByText('Something went wrong')).not.toBeInTheDocument();
    } finally {
      delete (Element.prototype as { scrollIntoView?: unknown }).scrollIntoView;
    }
  });

  it("keeps the opened job in the address: the browser's Back closes it, and a link to it opens it", async () => {
    stubDesk(false);
    const { user, router } = renderApp('/release-desk', { token: 't' });
    await user.click(await screen.findByRole('button', { name: 'Open Turned squares' }));
    await screen.findByTestId('desk-job');
    expect(router.state.location.search).toBe('?job=j-released');
    await act(() => router.navigate(-1));
    await waitFor(() => expect(screen.queryByTestId('desk-job')).not.toBeInTheDocument());
    expect(router.state.location.pathname).toBe('/release-desk');
    // The focus goes back to the button that opened the job, not to the page.
    await waitFor(() => expect(screen.getByRole('button', { name: 'Open Turned squares' })).toHaveFocus());
    // Forward (or a link someone sent) opens it again.
    await act(() => router.navigate(1));
    expect(await screen.findByTestId('desk-job')).toHaveTextContent('Turned squares');
  });

  it('opens one job after another as one step of history, and says so when a link names no job there', async () => {
    stubDesk(
      false,
      {},
      {
        'GET /api/jobs/j-gone': () =>
          json(404, { statusCode: 404, code: 'JOB.NOT_FOUND', message: 'No such job' }),
      },
    );
    const { user, router } = renderApp('/release-desk', { token: 't' });
    await user.click(await screen.findByRole('button', { name: 'Open Turned squares' }));
    await screen.findByTestId('desk-job');
    await user.click(screen.getByRole('button', { name: 'Open Star lamp' }));
    await waitFor(() => expect(router.state.location.search).toBe('?job=j-packing'));
    // Back closes the job instead of reopening the first one.
    await act(() => router.navigate(-1));
    await waitFor(() => expect(screen.queryByTestId('desk-job')).not.toBeInTheDocument());
    expect(router.state.location.search).toBe('');
    // A link to a job that is not at the desk is said, not silently dropped.
    await act(() => router.navigate('/release-desk?job=j-gone'));
    expect(await screen.findByTestId('desk-job-missing')).toHaveTextContent('could not be found at the desk');
  });

  it('once the cut is recorded, closes the job from the desk', async () => {
    const cut = { ...released, state: 'cut' as const, actions: ['close' as const], version: 8 };
    const stub = stubDesk(
      true,
      {},
      {
        [`GET /api/jobs/${released.id}`]: () => json(200, { ...cut, transitions: [] }),
        [`POST /api/jobs/${released.id}/close`]: () => json(200, { ...cut, state: 'closed', actions: [] }),
      },
    );
    const { user } = renderApp('/release-desk', { token: 't' });
    await user.click(await screen.findByRole('button', { name: 'Open Turned squares' }));
    const job = await screen.findByTestId('desk-job');
    await user.click(await within(job).findByRole('button', { name: 'Close the job' }));
    const dialog = await screen.findByRole('dialog', { name: 'Close the job?' });
    await user.click(within(dialog).getByRole('button', { name: 'Close the job' }));
    await waitFor(() => expect(stub.calls.some((c) => c.method === 'POST')).toBe(true));
    expect(stub.calls.find((c) => c.method === 'POST')?.body).toEqual({ version: 8 });
  });

  it('offers a supervisor a new cut pack only where the API builds one: not once the job is cut or closed', async () => {
    for (const state of ['released', 'cut', 'closed'] as const) {
      stubDesk(
        true,
        {},
        {
          'GET /api/auth/me': () => json(200, userFixture('supervisor')),
          // Opened while released, the job stays on screen after its cut and its closing.
          [`GET /api/jobs/${released.id}`]: () =>
            json(200, { ...released, state, actions: [], transitions: [] }),
        },
      );
      const { user, unmount } = renderApp('/release-desk', { token: 't' });
      await user.click(await screen.findByRole('button', { name: 'Open Turned squares' }));
      const job = await screen.findByTestId('desk-job');
      await waitFor(() => expect(within(job).getByTestId('job-state')).toHaveTextContent(state));
      // The pack is loaded (its files listed) before the button is looked for.
      await within(job).findByRole('table', { name: 'Cut pack files' });
      const rebuild = within(job).queryByRole('button', { name: /^Prepare the cut pack/ });
      if (state === 'released') {
        expect(rebuild).toHaveTextContent('Prepare the cut pack again');
      } else {
        expect(rebuild).not.toBeInTheDocument();
      }
      unmount();
    }
  });

  it('offers no cut pack for an approved job on a retired machine version, and says it must be returned', async () => {
    for (const state of ['approved', 'released'] as const) {
      const stub = stubDesk(
        true,
        {},
        {
          'GET /api/auth/me': () => json(200, userFixture('supervisor')),
          // The profile's version 2 retired after the job was approved (or released).
          [`GET /api/jobs/${released.id}`]: () =>
            json(200, { ...released, state, profileVersionRetired: true, actions: [], transitions: [] }),
        },
      );
      const { user, unmount } = renderApp('/release-desk', { token: 't' });
      await user.click(await screen.findByRole('button', { name: 'Open Turned squares' }));
      const job = await screen.findByTestId('desk-job');
      await waitFor(() => expect(within(job).getByTestId('job-state')).toHaveTextContent(state));
      await within(job).findByRole('table', { name: 'Cut pack files' });
      const rebuild = within(job).queryByRole('button', { name: /^Prepare the cut pack/ });
      if (state === 'approved') {
        // The API refuses it (409, the version is retired): not offered, and the way on is said instead.
        expect(rebuild).not.toBeInTheDocument();
        expect(within(job).getByTestId('cut-pack-blocked')).toHaveTextContent(
          'CO2 laser version 2, which this job was prepared on, has been retired since, so no cut pack can be ' +
            'prepared for it. Return the job with a reason: once it is requested again, it is prepared on the ' +
            'current version.',
        );
      } else {
        // A released job's pack is rebuilt on the version it was released on; the desk says to check first.
        expect(rebuild).toHaveTextContent('Prepare the cut pack again');
        expect(within(job).queryByTestId('cut-pack-blocked')).not.toBeInTheDocument();
        expect(within(job).getByTestId('desk-retired-since-release')).toHaveTextContent(
          'CO2 laser version 2, which this job was released on, has been retired since. If it must not be cut on ' +
            'that version, return it with a reason',
        );
      }
      if (state === 'approved') expect(within(job).queryByTestId('desk-retired-since-release')).toBeNull();
      expect(stub.calls.some((c) => c.method === 'POST')).toBe(false);
      unmount();
    }
  });

  it('tells the operator why a released job’s machine was taken out of use', async () => {
    stubDesk(
      true,
      {},
      {
        'GET /api/auth/me': () => json(200, userFixture('operator')),
        [`GET /api/jobs/${released.id}`]: () =>
          json(200, {
            ...released,
            profileVersionRetired: true,
            profileRetireReason: 'Lens cracked',
            actions: [],
            transitions: [],
          }),
      },
    );
    const { user } = renderApp('/release-desk', { token: 't' });
    await user.click(await screen.findByRole('button', { name: 'Open Turned squares' }));
    const job = await screen.findByTestId('desk-job');
    expect(await within(job).findByTestId('desk-retired-since-release')).toHaveTextContent(
      'CO2 laser version 2, which this job was released on, has been retired since, taken out of use: ' +
        '“Lens cracked”. Check with a supervisor before cutting it',
    );
  });

  it('tells the operator why a released job’s material may not be cut on its laser any more', async () => {
    stubDesk(
      true,
      {},
      {
        'GET /api/auth/me': () => json(200, userFixture('operator')),
        [`GET /api/jobs/${released.id}`]: () =>
          json(200, {
            ...released,
            materialRefusal: 'PVC, vinyl must not be cut on a laser: releases hydrogen chloride',
            actions: [],
            transitions: [],
          }),
      },
    );
    const { user } = renderApp('/release-desk', { token: 't' });
    await user.click(await screen.findByRole('button', { name: 'Open Turned squares' }));
    const job = await screen.findByTestId('desk-job');
    expect(await within(job).findByTestId('desk-material-stopped')).toHaveTextContent(
      'PVC, vinyl must not be cut on a laser: releases hydrogen chloride. Since it was prepared',
    );
    expect(within(job).queryByRole('button', { name: 'Record the cut' })).toBeNull();
  });

  it('shows a job returned while open as returned, with its reason, and offers none of its files', async () => {
    stubDesk(
      true,
      {},
      {
        [`GET /api/jobs/${released.id}`]: () =>
          json(200, {
            ...released,
            state: 'returned',
            returnReason: 'Wrong acrylic batch on the bed',
            actions: [],
            transitions: [],
          }),
      },
    );
    const { user } = renderApp('/release-desk', { token: 't' });
    await user.click(await screen.findByRole('button', { name: 'Open Turned squares' }));
    const job = await screen.findByTestId('desk-job');
    expect(await within(job).findByTestId('desk-job-gone')).toHaveTextContent(
      'This job was returned: “Wrong acrylic batch on the bed.” Its files are no longer offered, and it is not to be cut.',
    );
    expect(within(job).queryByRole('table', { name: 'Cut pack files' })).not.toBeInTheDocument();
    expect(within(job).queryByRole('button', { name: /^Download/ })).not.toBeInTheDocument();
    expect(within(job).queryByRole('button', { name: 'Record the cut' })).not.toBeInTheDocument();
  });

  it('queues a new cut pack for the job as read: the request carries its version', async () => {
    const stub = stubDesk(
      true,
      {},
      {
        'GET /api/auth/me': () => json(200, userFixture('supervisor')),
        [`GET /api/jobs/${released.id}`]: () => json(200, { ...released, actions: [], transitions: [] }),
        [`POST /api/jobs/${released.id}/exports`]: () => json(202, { exportId: 'e-again' }),
      },
    );
    const { user } = renderApp('/release-desk', { token: 't' });
    await user.click(await screen.findByRole('button', { name: 'Open Turned squares' }));
    const job = await screen.findByTestId('desk-job');
    await within(job).findByRole('table', { name: 'Cut pack files' });
    await user.click(within(job).getByRole('button', { name: 'Prepare the cut pack again' }));
    await waitFor(() => expect(stub.calls.some((c) => c.method === 'POST')).toBe(true));
    const post = stub.calls.find((c) => c.method === 'POST')!;
    expect(post.url.pathname).toBe(`/api/jobs/${released.id}/exports`);
    expect(released.version).toBe(7);
    expect(post.body).toStrictEqual({ version: 7 });
  });

  it('keeps offering the last built pack while a new one failed, and says which it is', async () => {
    const failed = {
      ...exportFixture('e-new', released.id, 'failed', 40),
      errorCode: 'EXPORT.ATTEMPT_FAILED',
      errorMessage:
        'The file storage could not be reached, so the cut pack could not be stored; every attempt failed, so it must be prepared again (by a fabricator or a supervisor)',
      attempts: 4,
    };
    const built = {
      ...exportFixture('e-r', released.id, 'done', 100),
      finishedAt: '2026-01-02T10:30:00.000Z',
    };
    stubDesk(true, {}, { [`GET /api/jobs/${released.id}/exports`]: () => json(200, [failed, built]) });
    const { user } = renderApp('/release-desk', { token: 't' });
    // The row says how things stand in a few words: the files still offered, and that a newer pack failed.
    const table = await screen.findByRole('table', { name: 'Jobs at the release desk' });
    expect(
      await within(table).findByText(`Ready, ${built.files.length} files; a newer pack failed`),
    ).toBeInTheDocument();
    await user.click(await screen.findByRole('button', { name: 'Open Turned squares' }));
    const job = await screen.findByTestId('desk-job');
    await within(job).findByText(
      /^Tried 4 times: the file storage could not be reached, .*\. If it fails again/,
    );
    const files = await within(job).findByRole('table', { name: 'Cut pack files' });
    expect(files).toHaveTextContent('sheet-01-clear.svg');
    expect(within(job).getByTestId('cut-pack-earlier')).toHaveTextContent(
      `The files below are from the cut pack built ${formatDateTime('2026-01-02T10:30:00.000Z')};`,
    );
  });

  it('offers no download and no cut record before the safety notices are acknowledged', async () => {
    stubDesk(false);
    const { user } = renderApp('/release-desk', { token: 't' });
    await user.click(await screen.findByRole('button', { name: 'Open Turned squares' }));
    const job = await screen.findByTestId('desk-job');
    // Why "Record the cut" is disabled is said on the page, not only in the button's title.
    expect(await within(job).findByTestId('desk-needs-acknowledgement')).toHaveTextContent(
      'before its files are offered and its cut can be recorded',
    );
    expect(within(job).queryByRole('button', { name: /^Download / })).not.toBeInTheDocument();
    expect(within(job).getByRole('button', { name: 'Record the cut' })).toBeDisabled();
  });

  it('once acknowledged, shows the files with their sizes and records the cut', async () => {
    const stub = stubDesk(true);
    const { user } = renderApp('/release-desk', { token: 't' });
    await user.click(await screen.findByRole('button', { name: 'Open Turned squares' }));
    const job = await screen.findByTestId('desk-job');
    const files = await within(job).findByRole('table', { name: 'Cut pack files' });
    expect(files).toHaveTextContent('sheet-01-clear.svg');
    expect(files).toHaveTextContent('4.4 KB');
    expect(files).toHaveTextContent('812 B');
    await user.click(within(job).getByRole('button', { name: 'Record the cut' }));
    await user.type(await screen.findByLabelText('Machine time (minutes)'), '21');
    await user.click(within(screen.getByRole('dialog')).getByRole('button', { name: 'Record the cut' }));
    await waitFor(() => expect(stub.calls.some((c) => c.method === 'POST')).toBe(true));
    expect(stub.calls.find((c) => c.method === 'POST')?.body).toEqual({
      version: 7,
      actualMinutes: 21,
      sheetsUsed: 1,
    });
  });

  it('records the measured kerf in inches once the desk is switched to inches, and keeps millimetres in the request', async () => {
    const stub = stubDesk(true);
    const { user } = renderApp('/release-desk', { token: 't' });
    await user.click(await screen.findByRole('button', { name: 'inch' }));
    await user.click(await screen.findByRole('button', { name: 'Open Turned squares' }));
    const job = await screen.findByTestId('desk-job');
    await user.click(await within(job).findByRole('button', { name: 'Record the cut' }));
    await user.type(await screen.findByLabelText('Machine time (minutes)'), '21');
    await user.type(screen.getByLabelText('Measured kerf (in, optional)'), '0.007');
    await user.click(within(screen.getByRole('dialog')).getByRole('button', { name: 'Record the cut' }));
    await waitFor(() => expect(stub.calls.some((c) => c.method === 'POST')).toBe(true));
    // 0.007 in × 25.4 mm per inch (the inch's definition, NIST SP 811) = 0.1778 mm.
    const body = stub.calls.find((c) => c.method === 'POST')?.body as { measuredKerfMm: number };
    expect(body.measuredKerfMm).toBeCloseTo(0.1778, 6);
    expect(window.localStorage.getItem('kerfwright.lengthUnit')).toBe('in');
  });

  it('gives the keyboard back to the job once its cut is recorded and its button gone', async () => {
    let cutDone = false;
    stubDesk(
      true,
      {},
      {
        [`GET /api/jobs/${released.id}`]: () =>
          json(200, {
            ...released,
            ...(cutDone ? { state: 'cut', actions: ['close'], version: 8 } : {}),
            transitions: [],
          }),
        [`POST /api/jobs/${released.id}/cut`]: () => {
          cutDone = true;
          return json(200, { ...released, state: 'cut', actions: ['close'], version: 8 });
        },
      },
    );
    const { user } = renderApp('/release-desk', { token: 't' });
    await user.click(await screen.findByRole('button', { name: 'Open Turned squares' }));
    const job = await screen.findByTestId('desk-job');
    await user.click(await within(job).findByRole('button', { name: 'Record the cut' }));
    await user.type(await screen.findByLabelText('Machine time (minutes)'), '21');
    await user.click(within(screen.getByRole('dialog')).getByRole('button', { name: 'Record the cut' }));
    await within(job).findByRole('button', { name: 'Close the job' });
    await waitFor(() => expect(within(job).getByRole('heading', { name: 'Turned squares' })).toHaveFocus());
  });

  it('says when the safety notices changed since the pack was built, and offers no stale setup sheet', async () => {
    const done = exportFixture('e-r', released.id, 'done', 100);
    stubDesk(true, {
      safetyChanged: true,
      files: [
        ...done.files,
        {
          name: 'setup-sheet.pdf',
          role: 'setup-sheet',
          contentType: 'application/pdf',
          bytes: 9000,
          sha256: 'c',
        },
      ],
    });
    const { user } = renderApp('/release-desk', { token: 't' });
    await user.click(await screen.findByRole('button', { name: 'Open Turned squares' }));
    const job = await screen.findByTestId('desk-job');
    expect(await within(job).findByTestId('cut-pack-safety-changed')).toHaveTextContent(
      'A new pack is prepared by itself shortly (a fabricator or supervisor can also prepare it now)',
    );
    expect(
      screen.getAllByText('Ready, 3 files; setup sheet out of date (safety notices changed)').length,
    ).toBeGreaterThan(0);
    expect(within(job).getByRole('button', { name: 'Download setup-sheet.pdf' })).toBeDisabled();
    expect(within(job).getByRole('button', { name: 'Download sheet-01-clear.svg' })).toBeEnabled();
  });

  it('does not promise a rebuild of an out-of-date pack once the job is cut', async () => {
    stubDesk(
      true,
      { safetyChanged: true },
      {
        [`GET /api/jobs/${released.id}`]: () =>
          json(200, { ...released, state: 'cut', actions: ['close'], transitions: [] }),
      },
    );
    const { user } = renderApp('/release-desk', { token: 't' });
    await user.click(await screen.findByRole('button', { name: 'Open Turned squares' }));
    const job = await screen.findByTestId('desk-job');
    await waitFor(() => expect(within(job).getByTestId('job-state')).toHaveTextContent('cut'));
    const alert = await within(job).findByTestId('cut-pack-safety-changed');
    expect(alert).toHaveTextContent('The job has been cut, so no new pack is built for it');
    expect(alert).not.toHaveTextContent(/prepared by itself|prepare it/);
  });

  it('shows jobs released, and packs started, elsewhere without reloading', async () => {
    vi.useFakeTimers({ shouldAdvanceTime: true });
    const later = jobFixture('j-later', 'released', 'Woven basket');
    let meanwhile = false;
    stubDesk(
      false,
      {},
      {
        'GET /api/jobs': (call) => {
          const state = call.url.searchParams.get('state');
          const items =
            state === 'released'
              ? [released, ...(meanwhile ? [later] : [])]
              : state === 'approved'
                ? [waiting]
                : [];
          return json(200, { items, total: items.length, page: 1, pageSize: 100 });
        },
        [`GET /api/jobs/${later.id}/exports`]: () => json(200, [exportFixture('e-l', later.id, 'done', 100)]),
        // A fabricator starts the pack of an approved job: it comes to the desk as being prepared.
        [`GET /api/jobs/${waiting.id}/exports`]: () =>
          json(200, meanwhile ? [exportFixture('e-w', waiting.id, 'queued', 0)] : []),
      },
    );
    renderApp('/release-desk', { token: 't' });
    const table = await screen.findByRole('table', { name: 'Jobs at the release desk' });
    await within(table).findByText('Turned squares');
    expect(within(table).queryByText('Woven basket')).not.toBeInTheDocument();
    expect(within(table).queryByText('Not released yet')).not.toBeInTheDocument();
    meanwhile = true;
    await vi.advanceTimersByTimeAsync(QUEUE_REFRESH_MS + 100);
    expect(await within(table).findByText('Woven basket')).toBeInTheDocument();
    expect(await within(table).findByText('Not released yet')).toBeInTheDocument();
  });

  it('looks at an out-of-date pack again, so a rebuild elsewhere shows without reloading', async () => {
    vi.useFakeTimers({ shouldAdvanceTime: true });
    let rebuilt = false;
    stubDesk(true, () => (rebuilt ? { id: 'e-new', safetyChanged: false } : { safetyChanged: true }));
    const { user } = renderApp('/release-desk', { token: 't' });
    await user.click(await screen.findByRole('button', { name: 'Open Turned squares' }));
    const job = await screen.findByTestId('desk-job');
    await within(job).findByTestId('cut-pack-safety-changed');
    // A fabricator rebuilds the pack; within STALE_PACK_REFRESH_MS the desk shows the new one.
    rebuilt = true;
    await vi.advanceTimersByTimeAsync(STALE_PACK_REFRESH_MS + 100);
    await waitFor(() => expect(within(job).queryByTestId('cut-pack-safety-changed')).not.toBeInTheDocument());
  });

  // A done pack with its setup sheet, the file that prints the notices.
  const withSetupSheet = {
    files: [
      ...exportFixture('e-r', released.id, 'done', 100).files,
      {
        name: 'setup-sheet.pdf',
        role: 'setup-sheet',
        contentType: 'application/pdf',
        bytes: 9000,
        sha256: 'c',
      },
    ],
  } satisfies Partial<ExportView>;

  it('looks at a current pack again too, so notices changed elsewhere show without reloading', async () => {
    vi.useFakeTimers({ shouldAdvanceTime: true });
    let changed = false;
    stubDesk(true, () => ({ ...withSetupSheet, safetyChanged: changed }));
    const { user } = renderApp('/release-desk', { token: 't' });
    await user.click(await screen.findByRole('button', { name: 'Open Turned squares' }));
    const job = await screen.findByTestId('desk-job');
    await within(job).findByRole('button', { name: 'Download setup-sheet.pdf' });
    // The supervisor changes the rules elsewhere: within DONE_PACK_REFRESH_MS the desk says the pack is out of date.
    changed = true;
    await vi.advanceTimersByTimeAsync(DONE_PACK_REFRESH_MS + 100);
    expect(await within(job).findByTestId('cut-pack-safety-changed')).toBeInTheDocument();
    expect(within(job).getByRole('button', { name: 'Download setup-sheet.pdf' })).toBeDisabled();
  });

  it('reads the pack again when a download is refused, so the page shows why', async () => {
    let changed = false;
    const { calls } = stubDesk(true, () => ({ ...withSetupSheet, safetyChanged: changed }), {
      'GET /api/exports/e-r/files/setup-sheet.pdf': () => {
        changed = true;
        return json(409, {
          statusCode: 409,
          code: 'EXPORT.SAFETY_CHANGED',
          message: 'The safety notices or workshop rules changed since this cut pack was built',
          requestId: 'r',
        });
      },
    });
    const { user } = renderApp('/release-desk', { token: 't' });
    await user.click(await screen.findByRole('button', { name: 'Open Turned squares' }));
    const job = await screen.findByTestId('desk-job');
    const reads = () => calls.filter((c) => c.url.pathname === `/api/jobs/${released.id}/exports`).length;
    const before = reads();
    await user.click(await within(job).findByRole('button', { name: 'Download setup-sheet.pdf' }));
    expect(await within(job).findByTestId('cut-pack-safety-changed')).toBeInTheDocument();
    expect(reads()).toBeGreaterThan(before);
  });

  it('at phone width (390 px) shows each job as a card whose Open button is in reach, not in a wide table', async () => {
    stubScreenWidth(390);
    stubDesk(true);
    // jsdom does not scroll: the page's move to its top is recorded instead.
    const scrollTo = vi.spyOn(window, 'scrollTo').mockImplementation(() => undefined);
    const { user, router } = renderApp('/release-desk', { token: 't' });
    const cards = await screen.findByRole('list', { name: 'Jobs at the release desk' });
    expect(screen.queryByRole('table', { name: 'Jobs at the release desk' })).not.toBeInTheDocument();
    const card = (await within(cards).findByText('Turned squares')).closest('li') as HTMLElement;
    expect(card).toHaveTextContent('Cast acrylic 3 mm (clear) · CO2 laser v2');
    await user.click(within(card).getByRole('button', { name: 'Open Turned squares' }));
    const job = await screen.findByTestId('desk-job');
    // The files keep to the phone's width: the long names wrap, the buttons say "Download" and name the file.
    const files = await within(job).findByRole('table', { name: 'Cut pack files' });
    expect(within(files).getByRole('button', { name: 'Download sheet-01-clear.svg' })).toHaveTextContent(
      /^Download$/,
    );
    expect(getComputedStyle(files.parentElement!).overflowX).toBe('auto');
    // The opened job takes the list's place, from the top of the page; a button leads back to the list.
    expect(scrollTo).toHaveBeenCalledWith({ top: 0 });
    scrollTo.mockRestore();
    expect(screen.queryByRole('list', { name: 'Jobs at the release desk' })).not.toBeInTheDocument();
    // The keyboard follows: the job's name has the focus, not the page (the button used is gone).
    expect(within(job).getByRole('heading', { name: 'Turned squares' })).toHaveFocus();
    await user.click(screen.getByRole('button', { name: 'Back to the jobs at the desk (2)' }));
    expect(await screen.findByRole('list', { name: 'Jobs at the release desk' })).toBeInTheDocument();
    expect(screen.queryByTestId('desk-job')).not.toBeInTheDocument();
    // Back on the list, on the button of the job just left.
    await waitFor(() => expect(screen.getByRole('button', { name: 'Open Turned squares' })).toHaveFocus());
    // The page's button went back a step: the job is not in the history ahead of the desk's list.
    expect(router.state.location.search).toBe('');
    expect(router.state.historyAction).toBe('POP');
  });
});
