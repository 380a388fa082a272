/**
 * A Web Worker that runs named tasks: plain data in and out (structured clone), one request at a time. The
 * page keeps one per kind of work (layouts, the studio's model), so a long layout never holds up a model.
 */

/** A request to a task worker and its answer. */
export interface TaskRequest<Name extends string = string> {
  id: number;
  task: Name;
  args: unknown[];
}
export type TaskResponse =
  { id: number; ok: true; value: unknown } | { id: number; ok: false; message: string };

/** A task run in the worker: `cancel` drops it (its promise then never settles). */
export interface TaskRun {
  promise: Promise<unknown>;
  cancel: () => void;
}

interface Pending {
  request: TaskRequest;
  resolve: (value: unknown) => void;
  reject: (error: Error) => void;
  /** Cancelled while running, and left to finish: its answer is not passed on. */
  dropped?: boolean;
}

/**
 * What cancelling the running request does: `terminate` stops the worker at once (the next request starts a
 * fresh one, which loads the engine and warms up anew); `discard` lets it finish in the worker, which stays
 * warm, and passes its answer on to no one.
 */
export type CancelRunning = 'terminate' | 'discard';

/** True where the page can run tasks in a worker (not in jsdom). */
export function taskWorkersAvailable(): boolean {
  return typeof Worker !== 'undefined';
}

/**
 * The client of one worker, started on first use by `start` (which names the worker's module, so that the
 * bundler finds it). Requests run one at a time in the order asked. Cancelling a queued request drops it;
 * cancelling the running one terminates the worker (a task cannot be interrupted otherwise) or lets it
 * finish unheard, as `cancelRunning` says. `stopped` is the message of a worker that failed without saying why.
 */
export function createTaskWorkerClient<Name extends string>(
  start: () => Worker,
  stopped: string,
  cancelRunning: CancelRunning = 'terminate',
): { run: (task: Name, args: readonly unknown[]) => TaskRun } {
  let worker: Worker | null = null;
  let running: Pending | null = null;
  const queue: Pending[] = [];
  let nextId = 1;

  const startWorker = (): Worker => {
    const w = start();
    w.onmessage = (event: MessageEvent<TaskResponse>) => {
      const done = running;
      if (!done || done.request.id !== event.data.id) return;
      running = null;
      if (done.dropped) {
        // Asked for no more: the answer goes to no one.
      } else if (event.data.ok) done.resolve(event.data.value);
      else done.reject(new Error(event.data.message));
      pump();
    };
    w.onerror = (event: ErrorEvent) => {
      event.preventDefault();
      const failed = running;
      running = null;
      w.terminate();
      if (worker === w) worker = null;
      failed?.reject(new Error(event.message || stopped));
      pump();
    };
    return w;
  };

  const pump = (): void => {
    if (running || queue.length === 0) return;
    running = queue.shift() as Pending;
    worker ??= startWorker();
    worker.postMessage(running.request);
  };

  const run = (task: Name, args: readonly unknown[]): TaskRun => {
    let entry: Pending | null = null;
    const promise = new Promise<unknown>((resolve, reject) => {
      entry = { request: { id: nextId++, task, args: [...args] }, resolve, reject };
      queue.push(entry);
      pump();
    });
    const cancel = () => {
      const i = queue.indexOf(entry as unknown as Pending);
      if (i >= 0) queue.splice(i, 1);
      else if (running === entry && cancelRunning === 'discard') (entry as Pending).dropped = true;
      else if (running === entry && worker) {
        worker.terminate();
        worker = null;
        running = null;
        pump();
      }
    };
    return { promise, cancel };
  };
  return { run };
}

/**
 * The worker's side: answers each request with its task's value, or with the message of what it threw.
 * `scope` is the worker's global scope; `runTask` runs a task by name.
 */
export function serveTasks(
  scope: {
    onmessage: ((event: MessageEvent<TaskRequest>) => void) | null;
    postMessage: (answer: TaskResponse) => void;
  },
  runTask: (task: string, args: readonly unknown[]) => unknown,
): void {
  scope.onmessage = (event) => {
    const { id, task, args } = event.data;
    let answer: TaskResponse;
    try {
      answer = { id, ok: true, value: runTask(task, args) };
    } catch (error) {
      answer = { id, ok: false, message: error instanceof Error ? error.message : String(error) };
    }
    scope.postMessage(answer);
  };
}
