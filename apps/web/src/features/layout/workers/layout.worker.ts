/// <reference lib="webworker" />
import { serveTasks } from '../../../lib/task-worker';
import { runLayoutTask } from '../lib/layout-tasks';

/**
 * The layout worker: nesting a model (and the fit-to-sheets search, a dozen nestings) takes from a few
 * milliseconds to a few seconds, so it runs here, off the page's main thread, and typing never waits for it.
 * One request at a time; the page terminates the worker to drop a request that is no longer wanted.
 */
serveTasks(self as unknown as DedicatedWorkerGlobalScope, (task, args) =>
  runLayoutTask(task as Parameters<typeof runLayoutTask>[0], args),
);
