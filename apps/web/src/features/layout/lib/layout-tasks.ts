import { type TaskRequest } from '../../../lib/task-worker';
import { layOutStudio } from '../../designs/lib/studio-layout';
import { layOutJob } from '../../jobs/lib/job-layout';

/**
 * The layouts the browser computes, by name: plain data in and out, so that each runs in the layout worker
 * (layout.worker.ts) or, where there is no Worker (jsdom in unit tests), on the main thread.
 */
export const layoutTasks = {
  studio: layOutStudio,
  job: layOutJob,
};

export type LayoutTaskName = keyof typeof layoutTasks;
export type LayoutTaskArgs<K extends LayoutTaskName> = Parameters<(typeof layoutTasks)[K]>;
export type LayoutTaskResult<K extends LayoutTaskName> = ReturnType<(typeof layoutTasks)[K]>;

/** A request to the worker (its answer is a TaskResponse). */
export type LayoutRequest = TaskRequest<LayoutTaskName>;

/** Runs a task by name (in the worker, or on the main thread as the fallback). */
export function runLayoutTask(task: LayoutTaskName, args: readonly unknown[]): unknown {
  const run = layoutTasks[task] as (...a: unknown[]) => unknown;
  return run(...args);
}
