import { type DesignSpecInput } from '@kerfwright/contracts';
import { type ColourRule } from '@kerfwright/geometry';
import { createTaskWorkerClient, type TaskRun } from '../../../lib/task-worker';
import { type PreviewTaskName } from './build-preview';

/**
 * The studio's model worker, apart from the layout worker: a fit-to-sheets search queued there takes
 * seconds, and the model of the next edit must not wait behind it. A build that is no longer wanted is
 * dropped by terminating the worker (see createTaskWorkerClient); the next one starts a fresh worker.
 */
const client = createTaskWorkerClient<PreviewTaskName>(
  () => new Worker(new URL('../workers/preview.worker.ts', import.meta.url), { type: 'module' }),
  'the model could not be built (the preview worker stopped)',
);

/** Builds the preview of a spec in the worker (see buildPreview); its promise gives a BuiltPreview. */
export function runInPreviewWorker(
  spec: DesignSpecInput,
  colourCount: number,
  colourRule: ColourRule,
): TaskRun {
  return client.run('preview', [spec, colourCount, colourRule]);
}
