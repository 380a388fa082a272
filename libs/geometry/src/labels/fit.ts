/**
 * Fitting a rectangle (a label's box) inside a polygon with a clearance from every edge. Lengths in mm,
 * angles in degrees counter-clockwise.
 */
import { type Vec2 } from '../math/vec';
import { containsPoint } from '../math/polygon';

/** A rectangle centred at `centre`, turned by angleDeg, half extents along its own x and y. */
export interface LabelBox {
  centre: Vec2;
  angleDeg: number;
  halfW: number;
  halfH: number;
}

/** Corners of a box, counter-clockwise. */
export function boxCorners(b: LabelBox, grow = 0): Vec2[] {
  const a = (b.angleDeg * Math.PI) / 180;
  const c = Math.cos(a);
  const s = Math.sin(a);
  const w = b.halfW + grow;
  const h = b.halfH + grow;
  return (
    [
      [-w, -h],
      [w, -h],
      [w, h],
      [-w, h],
    ] as const
  ).map(([x, y]) => [b.centre[0] + x * c - y * s, b.centre[1] + x * s + y * c] as Vec2);
}

/** Whether segment p→q meets the axis-aligned rectangle |x| ≤ w, |y| ≤ h (Liang–Barsky clipping). */
function segmentMeetsRect(p: Vec2, q: Vec2, w: number, h: number): boolean {
  let t0 = 0;
  let t1 = 1;
  const dx = q[0] - p[0];
  const dy = q[1] - p[1];
  const clip = (den: number, num: number): boolean => {
    // Keeps the part of the segment with den·t ≤ num.
    if (den === 0) return num >= 0;
    const t = num / den;
    if (den > 0) {
      if (t < t0) return false;
      if (t < t1) t1 = t;
    } else {
      if (t > t1) return false;
      if (t > t0) t0 = t;
    }
    return true;
  };
  return clip(dx, w - p[0]) && clip(-dx, w + p[0]) && clip(dy, h - p[1]) && clip(-dy, h + p[1]) && t0 <= t1;
}

/**
 * Whether the box lies inside the polygon and at least `clearance` from each of its edges (measured to the
 * box grown by the clearance with square corners, which is on the safe side).
 */
export function boxFitsInside(poly: readonly Vec2[], box: LabelBox, clearance: number): boolean {
  return containsPoint(poly, box.centre) && !edgesMeetBox(poly, box, clearance);
}

/** Whether the box lies outside the polygon and at least `clearance` from each of its edges. */
export function boxClearOf(poly: readonly Vec2[], box: LabelBox, clearance: number): boolean {
  return !containsPoint(poly, box.centre) && !edgesMeetBox(poly, box, clearance);
}

function edgesMeetBox(poly: readonly Vec2[], box: LabelBox, clearance: number): boolean {
  const a = (-box.angleDeg * Math.PI) / 180;
  const c = Math.cos(a);
  const s = Math.sin(a);
  const w = box.halfW + clearance;
  const h = box.halfH + clearance;
  const local = (p: Vec2): Vec2 => {
    const x = p[0] - box.centre[0];
    const y = p[1] - box.centre[1];
    return [x * c - y * s, x * s + y * c];
  };
  let prev = local(poly[poly.length - 1] as Vec2);
  for (const p of poly) {
    const cur = local(p);
    if (segmentMeetsRect(prev, cur, w, h)) return true;
    prev = cur;
  }
  return false;
}

/** Whether two boxes, each grown by `gap`/2, overlap (separating axes). */
export function boxesOverlap(a: LabelBox, b: LabelBox, gap: number): boolean {
  const ca = boxCorners(a, gap / 2);
  const cb = boxCorners(b, gap / 2);
  for (const angle of [a.angleDeg, a.angleDeg + 90, b.angleDeg, b.angleDeg + 90]) {
    const r = (angle * Math.PI) / 180;
    const ax = Math.cos(r);
    const ay = Math.sin(r);
    const pa = ca.map((p) => p[0] * ax + p[1] * ay);
    const pb = cb.map((p) => p[0] * ax + p[1] * ay);
    if (Math.max(...pa) <= Math.min(...pb) || Math.max(...pb) <= Math.min(...pa)) return false;
  }
  return true;
}
