import { type ExportView } from '@kerfwright/contracts';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { json, stubFetch } from '../../../testing/fetch-stub';
import { followExport } from './follow-export';

function view(state: ExportView['state'], progress: number): ExportView {
  return {
    id: 'e1',
    jobId: 'j1',
    state,
    progress,
    attempts: 1,
    errorCode: null,
    errorMessage: null,
    files:
      state === 'done'
        ? [
            {
              name: 'manifest.json',
              role: 'manifest',
              contentType: 'application/json',
              bytes: 812,
              sha256: 'ab',
            },
          ]
        : [],
    createdAt: '2026-12-01T10:00:00.000Z',
    finishedAt: null,
    replaced: false,
  };
}

describe('following an export', () => {
  afterEach(() => vi.unstubAllGlobals());

  it('reads the progress from the server-sent events until done', async () => {
    const body = [view('running', 30), view('done', 100)]
      .map((v) => `event: ${v.state === 'done' ? 'done' : 'progress'}\ndata: ${JSON.stringify(v)}\n\n`)
      .join('');
    const { calls } = stubFetch({
      'GET /api/exports/e1/events': () => new Response(body, { status: 200 }),
    });
    const seen: number[] = [];
    const last = await followExport('e1', (v) => seen.push(v.progress), new AbortController().signal);
    expect(seen).toEqual([30, 100]);
    expect(last?.state).toBe('done');
    expect(calls.every((c) => c.url.pathname.endsWith('/events'))).toBe(true);
  });

  it('falls back to polling GET /api/exports/:id when the stream cannot be opened', async () => {
    vi.useFakeTimers({ shouldAdvanceTime: true });
    const answers = [view('queued', 0), view('running', 60), view('done', 100)];
    const { calls } = stubFetch({
      'GET /api/exports/e1/events': () =>
        json(503, { statusCode: 503, code: 'X', message: 'no', requestId: 'r' }),
      'GET /api/exports/e1': () => json(200, answers.shift()),
    });
    const seen: string[] = [];
    const following = followExport('e1', (v) => seen.push(v.state), new AbortController().signal);
    await vi.advanceTimersByTimeAsync(2500);
    const last = await following;
    vi.useRealTimers();
    expect(seen).toEqual(['queued', 'running', 'done']);
    expect(last?.files).toHaveLength(1);
    expect(calls.filter((c) => c.url.pathname === '/api/exports/e1')).toHaveLength(3);
  });
});
