/**
 * Cut order for one sheet: every contour that lies inside another (a hole, or a part inside a hole) is cut
 * before the contour enclosing it, so nothing drops out or shifts before its surroundings are done; within
 * that rule the next contour is the one whose start is nearest to where the head is (nearest neighbour).
 * Lengths in mm, sheet coordinates.
 */
import { type Vec2 } from '../math/vec';
import { containsPoint, signedArea } from '../math/polygon';

export interface OrderedContours {
  /** Indices into the input, in cut order. */
  order: number[];
  /** Start point used for each contour (index as in the input): the vertex nearest the approach. */
  startIndex: number[];
  /** Rapid travel from the origin between contour starts, mm (no return move). */
  travelMm: number;
}

/** For each contour, how many other contours enclose it. */
export function nestingDepths(contours: readonly (readonly Vec2[])[]): number[] {
  const areas = contours.map((c) => Math.abs(signedArea(c)));
  return contours.map((c, i) => {
    let depth = 0;
    const probe = c[0];
    if (!probe) return 0;
    contours.forEach((o, j) => {
      if (j !== i && (areas[j] ?? 0) > (areas[i] ?? 0) && containsPoint(o, probe)) depth++;
    });
    return depth;
  });
}

/** Orders contours inner-first, then nearest-neighbour from `origin`; see the module comment. */
export function orderContours(
  contours: readonly (readonly Vec2[])[],
  origin: Vec2 = [0, 0],
): OrderedContours {
  const depths = nestingDepths(contours);
  const enclosers = contours.map((c, i) =>
    contours
      .map((_, j) => j)
      .filter(
        (j) => j !== i && (depths[j] ?? 0) < (depths[i] ?? 0) && c[0] && containsPoint(contours[j]!, c[0]),
      ),
  );
  const done = new Set<number>();
  const order: number[] = [];
  const startIndex = contours.map(() => 0);
  let at: Vec2 = origin;
  let travel = 0;
  while (order.length < contours.length) {
    let best = -1;
    let bestD = Infinity;
    let bestV = 0;
    contours.forEach((c, i) => {
      if (done.has(i)) return;
      // Ready when every contour it encloses is already cut.
      const blocked = contours.some((_, k) => !done.has(k) && k !== i && enclosers[k]!.includes(i));
      if (blocked) return;
      c.forEach((p, v) => {
        const d = Math.hypot(p[0] - at[0], p[1] - at[1]);
        if (d < bestD - 1e-9) {
          bestD = d;
          best = i;
          bestV = v;
        }
      });
    });
    if (best < 0) break;
    done.add(best);
    order.push(best);
    startIndex[best] = bestV;
    travel += bestD;
    at = contours[best]![bestV]!;
  }
  return { order, startIndex, travelMm: travel };
}

/** A closed contour re-started at vertex `start` (same shape, same direction). */
export function rotateContour<T>(contour: readonly T[], start: number): T[] {
  return [...contour.slice(start), ...contour.slice(0, start)];
}
