import { createTaskWorkerClient, type TaskRun, taskWorkersAvailable } from '../../../lib/task-worker';
import { type LayoutTaskName } from './layout-tasks';

/**
 * The page's one layout worker, started on first use (see createTaskWorkerClient): requests run one at a
 * time in the order asked; a cancelled running one terminates the worker.
 */
const client = createTaskWorkerClient<LayoutTaskName>(
  () => new Worker(new URL('../workers/layout.worker.ts', import.meta.url), { type: 'module' }),
  'the layout worker stopped',
);

/** True where the page can run layouts in a worker (not in jsdom). */
export function layoutWorkerAvailable(): boolean {
  return taskWorkersAvailable();
}

/** Runs a layout task in the worker; `cancel` drops it (its promise then never settles). */
export function runInLayoutWorker(task: LayoutTaskName, args: readonly unknown[]): TaskRun {
  return client.run(task, args);
}
