import { type DesignSpecInput } from '@kerfwright/contracts';
import { type ColourRule } from '@kerfwright/geometry';
import { useMemo, useRef } from 'react';
import { useLayoutTask } from '../../layout/hooks/use-layout-task';
import { type StudioSheets } from '../lib/studio-layout';
import { type BuiltPreview } from '../lib/build-preview';
import { useBuiltModel } from './use-built-model';

/** A "fit to sheets" search for the studio's spec: running, or what it found. */
export interface StudioFit {
  /** The sheets asked for. */
  sheets: number;
  /** The search for the current spec is still running (the layout worker). */
  pending: boolean;
  /** The search's answer (the last one while a newer search runs): the sheets and the diameter found. */
  result: StudioSheets | null;
  /** Why the search could not run. */
  error: unknown;
}

export interface StudioPreview {
  /** The model on screen: for "fit to sheets", built at the diameter the search found. */
  preview: BuiltPreview;
  /** The search, when the spec fits to sheets; null for every other scale. */
  fit: StudioFit | null;
  /**
   * The size is being fitted: the search for the current spec (or the build at the size it found) is under
   * way. The model on screen meanwhile, if any, is an earlier fit.
   */
  fitting: boolean;
  /** The model of the current spec is being built (in the preview worker); the one on screen is earlier. */
  building: boolean;
}

/**
 * The studio's model. A fixed or bed-fitted size is built straight away (useBuiltModel, in the preview worker). "Fit to sheets" is a
 * search (about a second: a dozen nestings), so it runs in the layout worker first, and the model is then built
 * at the diameter found (`{ by: 'diameter', mm }`, as the library's resolvedSpec reproduces a fit): every
 * figure and view shows the fitted size, never the search's upper bound. While a search runs (`fitting`)
 * the last fitted model stays on screen, or none before the first answer.
 */
export function useStudioPreview(
  spec: DesignSpecInput | null,
  colourCount: number,
  colourRule: ColourRule,
): StudioPreview {
  const fitSheets = spec?.scale.by === 'fitSheets' ? spec.scale.sheets : null;
  const fitKey = fitSheets !== null ? JSON.stringify(['fit', spec, colourCount, colourRule]) : null;
  const task = useLayoutTask(
    fitKey,
    'studio',
    () => [spec as DesignSpecInput, colourCount, colourRule, null],
    150,
  );
  const foundMm = !task.pending && task.value ? task.value.diameterMm : null;
  const fitted = useMemo(
    () =>
      spec && fitSheets !== null && foundMm !== null && Number.isFinite(foundMm) && foundMm > 0
        ? ({ ...spec, scale: { by: 'diameter', mm: foundMm } } satisfies DesignSpecInput)
        : null,
    // fitKey names the spec, colours and rule; the diameter is the search's answer for them.
    // eslint-disable-next-line react-hooks/exhaustive-deps
    [fitKey, foundMm],
  );
  // The model last shown (a fitted one, or at the size typed before the fit was chosen) stays on screen,
  // dimmed, while the next search runs: the page keeps its layout instead of folding up for seconds.
  const lastShown = useRef<DesignSpecInput | null>(null);
  const searching = fitSheets !== null && task.pending;
  const previewSpec = fitSheets === null ? spec : (fitted ?? (searching ? lastShown.current : null));
  if (previewSpec) lastShown.current = previewSpec;
  const { preview, building } = useBuiltModel(previewSpec, colourCount, colourRule);
  if (fitSheets === null) return { preview, fit: null, fitting: false, building };
  const fit: StudioFit = { sheets: fitSheets, pending: task.pending, result: task.value, error: task.error };
  if (!searching && !fitted && !preview.failure) {
    const reason = task.error instanceof Error ? task.error.message : task.error ? String(task.error) : null;
    return {
      preview: { ...preview, failure: reason ?? 'The search found no size for these sheets.' },
      fit,
      fitting: false,
      building: false,
    };
  }
  // Until the build of the fitted spec has finished, the model on screen is an earlier one.
  return { preview, fit, fitting: searching || building, building };
}
