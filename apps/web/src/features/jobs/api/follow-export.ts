import { type ExportView } from '@kerfwright/contracts';
import { useQueryClient } from '@tanstack/react-query';
import { useEffect, useState } from 'react';
import { api } from '../../../lib/api-client';
import { readEventStream } from '../../../lib/event-stream';
import { jobsKeys } from './jobs-keys';

const POLL_MS = 1000;

/** GET /api/exports/:id → the export's state, progress and (when done) its files. */
export function getExport(id: string, signal?: AbortSignal): Promise<ExportView> {
  return api.get<ExportView>(`/exports/${encodeURIComponent(id)}`, undefined, signal);
}

const finished = (v: ExportView) => v.state === 'done' || v.state === 'failed';

function sleep(ms: number, signal: AbortSignal): Promise<void> {
  return new Promise((resolve) => {
    const timer = setTimeout(resolve, ms);
    signal.addEventListener('abort', () => {
      clearTimeout(timer);
      resolve();
    });
  });
}

/**
 * Follows an export until it is done or failed: the server-sent events of GET /api/exports/:id/events (read
 * with fetch so the bearer token goes along), and, when the stream cannot be opened or ends early, polling
 * GET /api/exports/:id every second. Calls `onUpdate` with every view seen; resolves with the last one.
 */
export async function followExport(
  id: string,
  onUpdate: (view: ExportView) => void,
  signal: AbortSignal,
): Promise<ExportView | null> {
  let last: ExportView | null = null;
  const seen = (view: ExportView) => {
    last = view;
    onUpdate(view);
  };
  try {
    await readEventStream(
      `/exports/${encodeURIComponent(id)}/events`,
      (event) => {
        if (event.type === 'progress' || event.type === 'done' || event.type === 'failed') {
          seen(JSON.parse(event.data) as ExportView);
        }
      },
      signal,
    );
  } catch (error) {
    if (signal.aborted) return last;
    // Fall through to polling: the stream could not be opened or broke off.
    void error;
  }
  while (!signal.aborted && !(last && finished(last))) {
    try {
      seen(await getExport(id, signal));
    } catch (error) {
      if (signal.aborted) break;
      throw error;
    }
    if (last && finished(last)) break;
    await sleep(POLL_MS, signal);
  }
  return last;
}

/**
 * The live view of one export while it runs (null until the first answer). Keeps the job's export list in
 * the query cache current, and once the export ends refreshes the job (a release moves it to released) and
 * the lists.
 */
export function useFollowExport(
  exportId: string | null,
  jobId: string,
): { view: ExportView | null; error: unknown } {
  const queryClient = useQueryClient();
  const [state, setState] = useState<{ id: string | null; view: ExportView | null; error: unknown }>({
    id: null,
    view: null,
    error: null,
  });
  useEffect(() => {
    if (!exportId) return;
    const abort = new AbortController();
    const update = (view: ExportView) => {
      setState({ id: exportId, view, error: null });
      queryClient.setQueryData<ExportView[]>(jobsKeys.exports(jobId), (list) =>
        list ? list.map((e) => (e.id === view.id ? view : e)) : list,
      );
    };
    followExport(exportId, update, abort.signal)
      .then((last) => {
        if (abort.signal.aborted || !last) return;
        void queryClient.invalidateQueries({ queryKey: jobsKeys.exports(jobId) });
        void queryClient.invalidateQueries({ queryKey: jobsKeys.detail(jobId) });
        void queryClient.invalidateQueries({ queryKey: jobsKeys.lists() });
      })
      .catch((error: unknown) => {
        if (!abort.signal.aborted) setState((s) => ({ ...s, id: exportId, error }));
      });
    return () => abort.abort();
  }, [exportId, jobId, queryClient]);
  return state.id === exportId ? { view: state.view, error: state.error } : { view: null, error: null };
}
