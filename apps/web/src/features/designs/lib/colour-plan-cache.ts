import { type ColourPlan, type ColourRule, type Solid, solveColourPlan } from '@kerfwright/geometry';

/**
 * Colour plans depend on the base solid's faces, the count and the rule, never on the size or the piece
 * shape: a size edit reuses the plan solved before (solving one can take longer than building the model).
 * Keyed by the solid object, which the geometry library reuses (one per catalogue solid, and the last upload).
 */
const plans = new WeakMap<Solid, Map<string, ColourPlan>>();

export function cachedColourPlan(
  solid: Solid,
  pieceIds: readonly string[],
  count: number,
  rule: ColourRule,
): ColourPlan {
  let perSolid = plans.get(solid);
  if (!perSolid) {
    perSolid = new Map();
    plans.set(solid, perSolid);
  }
  const key = `${count}|${rule}|${pieceIds.join(',')}`;
  let plan = perSolid.get(key);
  if (!plan) {
    plan = solveColourPlan({
      faceCount: solid.faces.length,
      faceVertices: solid.faces.map((f) => f.vertices),
      normals: solid.faces.map((f) => f.normal),
      opposite: solid.oppositeFaces,
      rule,
      count,
      pieceIds,
      countCap: 0,
    });
    if (perSolid.size > 50) perSolid.clear();
    perSolid.set(key, plan);
  }
  return plan;
}
