import { type LayoutRequest, type LayoutResponse, type LayoutTaskName } from './layout-tasks';

interface Pending {
  request: LayoutRequest;
  resolve: (value: unknown) => void;
  reject: (error: Error) => void;
}

/**
 * The page's one layout worker, started on first use. Requests run one at a time in the order asked.
 * Cancelling a queued request drops it; cancelling the running one terminates the worker (a layout cannot be
 * interrupted otherwise), and the next request starts a fresh one.
 */
let worker: Worker | null = null;
let running: Pending | null = null;
const queue: Pending[] = [];
let nextId = 1;

function startWorker(): Worker {
  const w = new Worker(new URL('../workers/layout.worker.ts', import.meta.url), { type: 'module' });
  w.onmessage = (event: MessageEvent<LayoutResponse>) => {
    const done = running;
    if (!done || done.request.id !== event.data.id) return;
    running = null;
    if (event.data.ok) done.resolve(event.data.value);
    else done.reject(new Error(event.data.message));
    pump();
  };
  w.onerror = (event: ErrorEvent) => {
    event.preventDefault();
    const failed = running;
    running = null;
    w.terminate();
    if (worker === w) worker = null;
    failed?.reject(new Error(event.message || 'the layout worker stopped'));
    pump();
  };
  return w;
}

function pump(): void {
  if (running || queue.length === 0) return;
  running = queue.shift() as Pending;
  worker ??= startWorker();
  worker.postMessage(running.request);
}

/** True where the page can run layouts in a worker (not in jsdom). */
export function layoutWorkerAvailable(): boolean {
  return typeof Worker !== 'undefined';
}

/** Runs a layout task in the worker; `cancel` drops it (its promise then never settles). */
export function runInLayoutWorker(
  task: LayoutTaskName,
  args: readonly unknown[],
): { promise: Promise<unknown>; cancel: () => void } {
  let entry: Pending | null = null;
  const promise = new Promise<unknown>((resolve, reject) => {
    entry = { request: { id: nextId++, task, args: [...args] }, resolve, reject };
    queue.push(entry);
    pump();
  });
  const cancel = () => {
    const i = queue.indexOf(entry as unknown as Pending);
    if (i >= 0) queue.splice(i, 1);
    else if (running === entry && worker) {
      worker.terminate();
      worker = null;
      running = null;
      pump();
    }
  };
  return { promise, cancel };
}
