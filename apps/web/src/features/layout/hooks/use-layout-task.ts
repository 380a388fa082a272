import { useEffect, useState } from 'react';
import {
  type LayoutTaskArgs,
  type LayoutTaskName,
  type LayoutTaskResult,
  runLayoutTask,
} from '../lib/layout-tasks';
import { layoutWorkerAvailable, runInLayoutWorker } from '../lib/layout-worker';

/**
 * Runs a layout task `delayMs` after the last change of `key`, in the layout worker, and keeps the last
 * result meanwhile (`pending` says a newer one is on its way). A change of key drops the run in progress.
 * Without Worker support (jsdom) the task runs on the main thread after the page has painted. `args` is read
 * when the key changes; the key names everything the arguments depend on.
 */
export function useLayoutTask<K extends LayoutTaskName>(
  key: string | null,
  task: K,
  args: () => LayoutTaskArgs<K>,
  delayMs = 0,
): { value: LayoutTaskResult<K> | null; pending: boolean; error: unknown } {
  const [state, setState] = useState<{
    key: string | null;
    value: LayoutTaskResult<K> | null;
    error: unknown;
  }>({ key: null, value: null, error: null });
  useEffect(() => {
    if (key === null) return;
    let cancelRun: (() => void) | null = null;
    let live = true;
    const timer = setTimeout(() => {
      if (!layoutWorkerAvailable()) {
        try {
          setState({ key, value: runLayoutTask(task, args()) as LayoutTaskResult<K>, error: null });
        } catch (error) {
          setState({ key, value: null, error });
        }
        return;
      }
      const run = runInLayoutWorker(task, args());
      cancelRun = run.cancel;
      run.promise.then(
        (value) => live && setState({ key, value: value as LayoutTaskResult<K>, error: null }),
        (error: unknown) => live && setState({ key, value: null, error }),
      );
    }, delayMs);
    return () => {
      live = false;
      clearTimeout(timer);
      cancelRun?.();
    };
    // args is read when the key changes; the key names everything it depends on.
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [key, task, delayMs]);
  if (key === null) return { value: null, pending: false, error: null };
  return { value: state.value, pending: state.key !== key, error: state.key === key ? state.error : null };
}
