import { type DesignSpecInput } from '@kerfwright/contracts';
import { type ColourRule } from '@kerfwright/geometry';
import { useDeferredValue, useEffect, useMemo, useRef, useState } from 'react';
import { type TaskRun, taskWorkersAvailable } from '../../../lib/task-worker';
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
 * How long a model whose last build took longer than this waits for a pause in the edits before it is built:
 * a value typed key by key is then built once, not once per key (each build holds the worker until it ends,
 * so the last key's model would wait behind the first key's). Quicker models are built at once: waiting
 * would cost more than a build they might queue behind. Keys typed at an ordinary pace come well within it.
 */
export const TYPING_PAUSE_MS = 300;

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
  const lastBuildMs = useRef(0);
  useEffect(() => {
    if (!inWorker || !input.spec) return;
    const { spec: asked, colourCount: count, colourRule: rule, key } = input;
    let live = true;
    let run: TaskRun | null = null;
    const build = () => {
      run = runInPreviewWorker(asked, count, rule);
      run.promise.then(
        (value) => {
          if (!live) return;
          const answer = value as BuiltPreview;
          lastBuildMs.current = answer.buildMs;
          // The page's own spec and key: the preview is of them (the worker's copies are equal, not the same).
          setFromWorker({ ...answer, spec: asked, key });
        },
        (error: unknown) => live && setFromWorker(emptyPreview(asked, count, rule, asSentence(error))),
      );
    };
    const timer = lastBuildMs.current > TYPING_PAUSE_MS ? setTimeout(build, TYPING_PAUSE_MS) : null;
    if (!timer) build();
    return () => {
      live = false;
      if (timer) clearTimeout(timer);
      (run as TaskRun | null)?.cancel();
    };
  }, [inWorker, input]);
  if (!input.spec) return { preview: emptyPreview(null, colourCount, colourRule), building: false };
  const preview = (inWorker ? fromWorker : onPage) ?? emptyPreview(null, colourCount, colourRule);
  return { preview, building: preview.key !== input.key };
}
