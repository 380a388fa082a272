import { type DesignSpecInput } from '@kerfwright/contracts';
import { type ColourRule } from '@kerfwright/geometry';
import { useDeferredValue, useEffect, useMemo, useState } from 'react';
import { taskWorkersAvailable } from '../../../lib/task-worker';
import { asSentence, type BuiltPreview, buildPreview, emptyPreview, previewKey } from '../lib/build-preview';
import { runInPreviewWorker } from '../lib/preview-worker';

/** The studio's model as on screen: the last preview finished, and whether a newer one is being built. */
export interface BuiltModelState {
  /** The last preview finished (for an earlier spec while `building`). */
  preview: BuiltPreview;
  /** A preview of the current spec is being built; `preview` is an earlier one meanwhile. */
  building: boolean;
}

/**
 * Builds the studio's model on every change, in the preview worker, so that typing never waits for the
 * geometry library; the last finished model stays on screen meanwhile (`building`). A change drops the build
 * in progress. Without Worker support (jsdom) the model is built on the main thread from a deferred value, so
 * typing still renders before the build.
 */
export function useBuiltModel(
  spec: DesignSpecInput | null,
  colourCount: number,
  colourRule: ColourRule,
): BuiltModelState {
  const inWorker = taskWorkersAvailable();
  const input = useMemo(
    () => ({ spec, colourCount, colourRule, key: previewKey(spec, colourCount, colourRule) }),
    [spec, colourCount, colourRule],
  );
  const deferred = useDeferredValue(input);
  const onPage = useMemo(
    () => (inWorker ? null : buildPreview(deferred.spec, deferred.colourCount, deferred.colourRule)),
    [inWorker, deferred],
  );
  const [fromWorker, setFromWorker] = useState<BuiltPreview | null>(null);
  useEffect(() => {
    if (!inWorker || !input.spec) return;
    const { spec: asked, colourCount: count, colourRule: rule, key } = input;
    let live = true;
    const run = runInPreviewWorker(asked, count, rule);
    run.promise.then(
      // The page's own spec and key: the preview is of them (the worker's copies are equal, not the same).
      (value) => live && setFromWorker({ ...(value as BuiltPreview), spec: asked, key }),
      (error: unknown) => live && setFromWorker(emptyPreview(asked, count, rule, asSentence(error))),
    );
    return () => {
      live = false;
      run.cancel();
    };
  }, [inWorker, input]);
  if (!input.spec) return { preview: emptyPreview(null, colourCount, colourRule), building: false };
  const preview = (inWorker ? fromWorker : onPage) ?? emptyPreview(null, colourCount, colourRule);
  return { preview, building: preview.key !== input.key };
}
