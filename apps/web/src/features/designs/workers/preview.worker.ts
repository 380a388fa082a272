/// <reference lib="webworker" />
import { serveTasks } from '../../../lib/task-worker';
import { type PreviewTaskName, runPreviewTask } from '../lib/build-preview';

/**
 * The preview worker: a design near the cost limit takes from a few hundred milliseconds to a few seconds to
 * build, so the studio builds its model here and the form stays responsive. Its caches (the last uploaded
 * solid's hull, colour plans) live as long as the worker does.
 */
serveTasks(self as unknown as DedicatedWorkerGlobalScope, (task, args) =>
  runPreviewTask(task as PreviewTaskName, args),
);
