import type { DesignIssue } from '@kerfwright/contracts';
import { type Vec2, add2, scale2 } from '../math/vec';
import { type Polygon, pointSegmentDistance, segmentSegmentDistance } from '../math/polygon';
import { bestFitRatio } from '../scale/fit-ratio';
import { type Slot } from '../slots/slots';

/** Least material between a slot's inner part and the piece's edge, mm. The inner part is the deeper
 * half of both walls plus the bottom; the edge is the piece shape's outline before slotting. Distances
 * of `limit` or more are not searched: the result is then `limit`. */
export function slotWeb(shape: Polygon, s: Slot, limit = Infinity): number {
  const n: Vec2 = [-s.axis[1], s.axis[0]];
  const h = s.width / 2;
  const mid = add2(s.end, scale2(s.axis, s.depth / 2));
  const bottom = add2(s.end, scale2(s.axis, s.depth));
  const path: Vec2[] = [
    add2(mid, scale2(n, -h)),
    add2(bottom, scale2(n, -h)),
    add2(bottom, scale2(n, h)),
    add2(mid, scale2(n, h)),
  ];
  // Skip edges that cannot beat the best so far: their distance to the slot's bounding circle.
  const cx = (s.end[0] + bottom[0]) / 2;
  const cy = (s.end[1] + bottom[1]) / 2;
  const rad = Math.sqrt((s.depth / 2) ** 2 + h * h);
  let best = limit;
  const m = shape.length;
  for (let k = 0; k < m; k++) {
    const a = shape[k] as Vec2;
    const b = shape[(k + 1) % m] as Vec2;
    if (pointSegmentDistance([cx, cy], a, b) - rad >= best) continue;
    for (let i = 0; i + 1 < path.length; i++) {
      best = Math.min(best, segmentSegmentDistance(path[i] as Vec2, path[i + 1] as Vec2, a, b));
    }
  }
  return best;
}

/** Least distance between two slots of one piece (their rectangles from opening to bottom), mm. */
export function slotGap(s: Slot, t: Slot, limit = Infinity): number {
  const a = s.bounds;
  const b = t.bounds;
  const centres = Math.sqrt((a.cx - b.cx) ** 2 + (a.cy - b.cy) ** 2);
  if (centres - a.r - b.r >= limit) return centres - a.r - b.r;
  let best = Infinity;
  for (let i = 0; i < 4; i++) {
    for (let k = 0; k < 4; k++) {
      best = Math.min(
        best,
        segmentSegmentDistance(
          s.inner[i] as Vec2,
          s.inner[(i + 1) % 4] as Vec2,
          t.inner[k] as Vec2,
          t.inner[(k + 1) % 4] as Vec2,
        ),
      );
    }
  }
  return best;
}

/** Whether a contour fits a width × height bed in some orientation (every 0.5°, refined: see bestFitRatio). */
export function fitsBed(outline: Polygon, widthMm: number, heightMm: number): boolean {
  return bestFitRatio(outline, widthMm, heightMm).ratio <= 1 + 1e-9;
}

/** Collects design errors (which block files) and warnings (which do not). */
export class IssueList {
  readonly errors: DesignIssue[] = [];
  readonly warnings: DesignIssue[] = [];
  error(code: string, message: string, pieces: string[] = []): void {
    this.errors.push({ code, message, pieces });
  }
  warn(code: string, message: string, pieces: string[] = []): void {
    this.warnings.push({ code, message, pieces });
  }
}
