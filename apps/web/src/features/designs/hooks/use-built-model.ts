import { type DesignSpec } from '@kerfwright/contracts';
import { type BuiltModel, buildModel, type ColourRule, solveColourPlan } from '@kerfwright/geometry';
import { useDeferredValue, useMemo } from 'react';

export interface BuiltPreview {
  model: BuiltModel | null;
  /** Colour index per piece id (all 0 when one colour, or when the rule has no plan). */
  pieceColour: Record<string, number>;
  colourMessage: string | null;
  /** Why the engine refused the spec (field errors or a failure), when it did. */
  failure: string | null;
  buildMs: number;
  /** Identifies the spec this preview was built from. */
  key: string;
}

/**
 * Runs the geometry library in the browser on every change. The spec is deferred, so typing stays responsive
 * while a large model builds; the last finished model stays on screen meanwhile.
 */
export function useBuiltModel(
  spec: DesignSpec | null,
  colourCount: number,
  colourRule: ColourRule,
): BuiltPreview {
  const input = useMemo(() => ({ spec, colourCount, colourRule }), [spec, colourCount, colourRule]);
  const deferred = useDeferredValue(input);
  return useMemo(() => build(deferred.spec, deferred.colourCount, deferred.colourRule), [deferred]);
}

function build(spec: DesignSpec | null, colourCount: number, colourRule: ColourRule): BuiltPreview {
  const key = JSON.stringify([spec, colourCount, colourRule]);
  if (!spec) return { model: null, pieceColour: {}, colourMessage: null, failure: null, buildMs: 0, key };
  const started = performance.now();
  let model: BuiltModel;
  try {
    model = buildModel(spec);
  } catch (error) {
    const message = error instanceof Error ? error.message : String(error);
    return { model: null, pieceColour: {}, colourMessage: null, failure: message, buildMs: 0, key };
  }
  let pieceColour: Record<string, number> = Object.fromEntries(model.pieces.map((p) => [p.id, 0]));
  let colourMessage: string | null = null;
  if (colourCount > 1) {
    try {
      const plan = solveColourPlan({
        faceCount: model.solid.faces.length,
        faceVertices: model.solid.faces.map((f) => f.vertices),
        normals: model.solid.faces.map((f) => f.normal),
        opposite: model.solid.oppositeFaces,
        rule: colourRule,
        count: colourCount,
        pieceIds: model.pieces.map((p) => p.id),
        countCap: 0,
      });
      if (plan.feasible) pieceColour = plan.assignment;
      else colourMessage = plan.message ?? `No colour plan for this rule with ${colourCount} colours.`;
    } catch (error) {
      colourMessage = error instanceof Error ? error.message : String(error);
    }
  }
  return { model, pieceColour, colourMessage, failure: null, buildMs: performance.now() - started, key };
}
