import { type DesignSpecInput } from '@kerfwright/contracts';
import {
  assertDesignWork,
  type BuiltModel,
  buildModel,
  type ColourPlan,
  type ColourRule,
  resolveSolid,
  validateSpec,
} from '@kerfwright/geometry';
import { useDeferredValue, useMemo } from 'react';
import { cachedColourPlan } from './colour-plan-cache';

export interface BuiltPreview {
  /** The spec this preview was built from. */
  spec: DesignSpecInput | null;
  model: BuiltModel | null;
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

/**
 * Runs the geometry library in the browser on every change. The spec is deferred, so typing stays responsive
 * while a large model builds; the last finished model stays on screen meanwhile. The colour plan does not
 * depend on the size, so it is solved once per solid, count and rule (see colour-plan-cache).
 */
export function useBuiltModel(
  spec: DesignSpecInput | null,
  colourCount: number,
  colourRule: ColourRule,
): BuiltPreview {
  const input = useMemo(() => ({ spec, colourCount, colourRule }), [spec, colourCount, colourRule]);
  const deferred = useDeferredValue(input);
  return useMemo(() => buildPreview(deferred.spec, deferred.colourCount, deferred.colourRule), [deferred]);
}

/** The preview of one spec (see useBuiltModel). */
export function buildPreview(
  spec: DesignSpecInput | null,
  colourCount: number,
  colourRule: ColourRule,
): BuiltPreview {
  const key = JSON.stringify([spec, colourCount, colourRule]);
  const empty = {
    spec,
    model: null,
    pieceColour: {},
    colourPlan: null,
    colourMessage: null,
    colourFewest: null,
    buildMs: 0,
    key,
  };
  if (!spec) return { ...empty, failure: null };
  const started = performance.now();
  let model: BuiltModel;
  try {
    // A design the API refuses as too heavy (DESIGN.TOO_HEAVY) would hold this page for many seconds: said,
    // not built.
    const checked = validateSpec(spec);
    if (checked.ok) assertDesignWork(checked.spec.piece.sides, resolveSolid(checked.spec).faces.length);
    model = buildModel(spec);
  } catch (error) {
    const said = error instanceof Error ? error.message : String(error);
    // Shown as a sentence of its own (the engine's messages start in lower case, to follow a code or a colon).
    return { ...empty, failure: said.charAt(0).toUpperCase() + said.slice(1) };
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
    model,
    pieceColour,
    colourPlan,
    colourMessage,
    colourFewest,
    failure: null,
    buildMs: performance.now() - started,
    key,
  };
}
