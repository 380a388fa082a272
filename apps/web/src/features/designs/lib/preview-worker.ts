import { type DesignSpecInput } from '@kerfwright/contracts';
import { type ColourRule } from '@kerfwright/geometry';
import { createTaskWorkerClient, type TaskRun } from '../../../lib/task-worker';
import { type PreviewTaskName } from './build-preview';

/**
 * The studio's model worker, apart from the layout worker: a fit-to-sheets search queued there takes
 * seconds, and the model of the next edit must not wait behind it. A build no longer wanted is dropped: one
 * still queued never runs, and the one running finishes unheard. Terminating it instead would cost more than
 * it saves: a fresh worker loads the engine, rebuilds the solid and the colour plan and runs cold. Typing a
 * size into a 120-piece design near the work limit (Chromium, a loaded 2-core machine), the model came 3.5–4.7 s
 * after the last key that way (cold builds of 2.3–3.8 s), against a median of 2.1 s in a warm worker. Every
 * build is bounded by that limit (see buildModel's workLimit), so a dropped one never holds the worker long.
 */
const client = createTaskWorkerClient<PreviewTaskName>(
  () => new Worker(new URL('../workers/preview.worker.ts', import.meta.url), { type: 'module' }),
  'the model could not be built (the preview worker stopped)',
  'discard',
);

/** Builds the preview of a spec in the worker (see buildPreview); its promise gives a BuiltPreview. */
export function runInPreviewWorker(
  spec: DesignSpecInput,
  colourCount: number,
  colourRule: ColourRule,
): TaskRun {
  return client.run('preview', [spec, colourCount, colourRule]);
}
