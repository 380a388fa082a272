import { type DesignReport, type DesignSpecInput } from '@kerfwright/contracts';
import {
  type BuiltModel,
  buildModel,
  type ColourPlan,
  type ColourRule,
  DESIGN_WORK_LIMIT,
} from '@kerfwright/geometry';
import { cachedColourPlan } from './colour-plan-cache';

/**
 * The studio's model of one spec: plain data only (it crosses from the preview worker by structured clone),
 * so the built model's working parts (solid, frames, outlines) stay where it was built; the page draws and
 * lists everything from the report.
 */
export interface BuiltPreview {
  /** The spec this preview was built from. */
  spec: DesignSpecInput | null;
  /** The built model's report; null when there is no spec or the engine refused it. */
  report: DesignReport | null;
  /** Colour index per piece id (all 0 when one colour, or when the rule has no plan). */
  pieceColour: Record<string, number>;
  /** The plan behind pieceColour when there are several colours (the layout reuses it). */
  colourPlan: ColourPlan | null;
  colourMessage: string | null;
  /** When the rule has no plan with this many colours: the fewest it needs. */
  colourFewest: number | null;
  /** Why the engine refused the spec (field errors or a failure), when it did. */
  failure: string | null;
  /** Time spent in the geometry library for this preview (model build and, when not cached, colour plan). */
  buildMs: number;
  /** Identifies the spec this preview was built from. */
  key: string;
}

/** Names a spec with its colours: the key of its preview. */
export function previewKey(
  spec: DesignSpecInput | null,
  colourCount: number,
  colourRule: ColourRule,
): string {
  return JSON.stringify([spec, colourCount, colourRule]);
}

/** A preview with no model: none asked for yet, or `failure` says why there is none. */
export function emptyPreview(
  spec: DesignSpecInput | null,
  colourCount: number,
  colourRule: ColourRule,
  failure: string | null = null,
): BuiltPreview {
  return {
    spec,
    report: null,
    pieceColour: {},
    colourPlan: null,
    colourMessage: null,
    colourFewest: null,
    failure,
    buildMs: 0,
    key: previewKey(spec, colourCount, colourRule),
  };
}

/** An engine message as a sentence of its own (the engine's start in lower case, to follow a code or colon). */
export function asSentence(error: unknown): string {
  const said = (error instanceof Error ? error.message : String(error)).trim();
  // The engine's messages follow a code or a colon: begun in lower case, without a full stop.
  const ended = /[.!?)]$/.test(said) || said === '' ? said : `${said}.`;
  return ended.charAt(0).toUpperCase() + ended.slice(1);
}

/**
 * Builds the preview of one spec (in the preview worker, or on the main thread where there is none). A
 * design the API refuses as too heavy (DESIGN.TOO_HEAVY) would hold the worker for many seconds: buildModel's
 * work limit refuses it once the spec is validated and its solid resolved, before anything is built. The
 * colour plan does not depend on the size, so it is solved once per solid, count and rule (colour-plan-cache).
 */
export function buildPreview(
  spec: DesignSpecInput | null,
  colourCount: number,
  colourRule: ColourRule,
): BuiltPreview {
  if (!spec) return emptyPreview(spec, colourCount, colourRule);
  const started = performance.now();
  let model: BuiltModel;
  try {
    model = buildModel(spec, { workLimit: DESIGN_WORK_LIMIT });
  } catch (error) {
    return emptyPreview(spec, colourCount, colourRule, asSentence(error));
  }
  let pieceColour: Record<string, number> = Object.fromEntries(model.pieces.map((p) => [p.id, 0]));
  let colourPlan: ColourPlan | null = null;
  let colourMessage: string | null = null;
  let colourFewest: number | null = null;
  if (colourCount > 1) {
    try {
      const ids = model.pieces.map((p) => p.id);
      const plan = cachedColourPlan(model.solid, ids, colourCount, colourRule);
      if (plan.feasible) {
        pieceColour = plan.assignment;
        colourPlan = plan;
      } else {
        colourMessage = plan.message ?? `No colour plan for this rule with ${colourCount} colours.`;
        colourFewest = plan.fewestColours ?? null;
      }
    } catch (error) {
      colourMessage = error instanceof Error ? error.message : String(error);
    }
  }
  return {
    spec,
    report: model.report,
    pieceColour,
    colourPlan,
    colourMessage,
    colourFewest,
    failure: null,
    buildMs: performance.now() - started,
    key: previewKey(spec, colourCount, colourRule),
  };
}

/** The tasks of the preview worker, by name (see preview-worker.ts). */
export const previewTasks = { preview: buildPreview };
export type PreviewTaskName = keyof typeof previewTasks;

/** Runs a preview task by name. */
export function runPreviewTask(task: PreviewTaskName, args: readonly unknown[]): unknown {
  const run = previewTasks[task] as (...a: unknown[]) => unknown;
  return run(...args);
}
