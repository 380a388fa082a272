import { type Vec2, at } from '../math/vec';
import { type Polygon, containsPoint, pointSegmentDistance } from '../math/polygon';

/** Distance from q to the nearest edge of a polygon. */
function edgeDistance(poly: Polygon, q: Vec2): number {
  let best = Infinity;
  for (let i = 0; i < poly.length; i++) {
    best = Math.min(best, pointSegmentDistance(q, at(poly, i), at(poly, (i + 1) % poly.length)));
  }
  return best;
}

const labelCache = new WeakMap<Polygon, { point: Vec2; clearance: number }>();

/**
 * A point well inside a polygon for a label, and its distance to the nearest edge: the best of a 24 × 24
 * grid, refined twice around the winner. Deterministic; good to a few percent of the piece size.
 */
export function labelPoint(poly: Polygon): { point: Vec2; clearance: number } {
  const hit = labelCache.get(poly);
  if (hit) return hit;
  const found = searchLabelPoint(poly);
  labelCache.set(poly, found);
  return found;
}

function searchLabelPoint(poly: Polygon): { point: Vec2; clearance: number } {
  let x0 = Infinity;
  let x1 = -Infinity;
  let y0 = Infinity;
  let y1 = -Infinity;
  for (const p of poly) {
    x0 = Math.min(x0, p[0]);
    x1 = Math.max(x1, p[0]);
    y0 = Math.min(y0, p[1]);
    y1 = Math.max(y1, p[1]);
  }
  let best: Vec2 = [(x0 + x1) / 2, (y0 + y1) / 2];
  let bestD = containsPoint(poly, best) ? edgeDistance(poly, best) : -1;
  let hx = (x1 - x0) / 2;
  let hy = (y1 - y0) / 2;
  let cx = best[0];
  let cy = best[1];
  const n = 24;
  for (let round = 0; round < 3; round++) {
    for (let i = 0; i <= n; i++) {
      for (let j = 0; j <= n; j++) {
        const q: Vec2 = [cx - hx + (2 * hx * i) / n, cy - hy + (2 * hy * j) / n];
        if (!containsPoint(poly, q)) continue;
        const d = edgeDistance(poly, q);
        if (d > bestD) {
          bestD = d;
          best = q;
        }
      }
    }
    cx = best[0];
    cy = best[1];
    hx = (2 * hx) / n;
    hy = (2 * hy) / n;
  }
  return { point: best, clearance: Math.max(0, bestD) };
}

/** The smallest label worth engraving or reading on a drawing, mm. */
export const MIN_LABEL_HEIGHT_MM = 1.5;

/**
 * Text height for a piece label, mm: fits the clearance (the text's box, about 0.6 × height per character
 * wide, stays inside the circle of that radius), at most 6 mm; null when the piece leaves no room for
 * MIN_LABEL_HEIGHT_MM, so that the label is left off instead of running over the cut line.
 */
export function labelHeight(clearance: number, text: string): number | null {
  const h = Math.min(6, (clearance * 1.6) / Math.max(2, text.length));
  return h >= MIN_LABEL_HEIGHT_MM ? h : null;
}
