import { type Vec2, at } from './vec';
import { M } from './hot-globals';

/** A simple polygon as a list of 2D points (mm), without repeating the first point. */
export type Polygon = readonly Vec2[];

/** Signed area (positive when counter-clockwise). */
export function signedArea(poly: Polygon): number {
  let s = 0;
  for (let i = 0, n = poly.length; i < n; i++) {
    const a = at(poly, i);
    const b = at(poly, (i + 1) % n);
    s += a[0] * b[1] - b[0] * a[1];
  }
  return s / 2;
}

export function perimeter(poly: Polygon): number {
  let s = 0;
  for (let i = 0, n = poly.length; i < n; i++) {
    const a = at(poly, i);
    const b = at(poly, (i + 1) % n);
    s += M.hypot(b[0] - a[0], b[1] - a[1]);
  }
  return s;
}

export function ensureCounterClockwise(poly: Polygon): Vec2[] {
  return signedArea(poly) < 0 ? [...poly].reverse() : [...poly];
}

/**
 * Parameter intervals where the line p + t·d lies inside the polygon (even–odd rule).
 * Vertices exactly on the line count as lying on its negative side, so a line through a vertex is
 * handled once. Intervals are sorted and disjoint; t is in units of |d|.
 */
export function lineIntervals(poly: Polygon, p: Vec2, d: Vec2): [number, number][] {
  const ts: number[] = [];
  const n = poly.length;
  const [px, py] = p;
  const [dx, dy] = d;
  const dd = dx * dx + dy * dy;
  let prev = poly[n - 1];
  if (!prev) return [];
  let sa = dx * (prev[1] - py) - dy * (prev[0] - px);
  for (let i = 0; i < n; i++) {
    const b = poly[i] as Vec2;
    const sb = dx * (b[1] - py) - dy * (b[0] - px);
    if (sa > 0 !== sb > 0) {
      const k = sa / (sa - sb);
      const x = prev[0] + (b[0] - prev[0]) * k - px;
      const y = prev[1] + (b[1] - prev[1]) * k - py;
      ts.push((x * dx + y * dy) / dd);
    }
    prev = b;
    sa = sb;
  }
  if (ts.length > 2) ts.sort((x, y) => x - y);
  else if (ts.length === 2 && (ts[0] as number) > (ts[1] as number)) ts.reverse();
  const out: [number, number][] = [];
  for (let i = 0; i + 1 < ts.length; i += 2) {
    const t0 = ts[i] as number;
    const t1 = ts[i + 1] as number;
    if (t1 > t0) out.push([t0, t1]);
  }
  return out;
}

/** Overlaps of two sorted interval lists. */
export function intersectIntervals(
  a: readonly (readonly [number, number])[],
  b: readonly (readonly [number, number])[],
): [number, number][] {
  const out: [number, number][] = [];
  let i = 0;
  let j = 0;
  while (i < a.length && j < b.length) {
    const x = at(a, i);
    const y = at(b, j);
    const lo = M.max(x[0], y[0]);
    const hi = M.min(x[1], y[1]);
    if (hi > lo) out.push([lo, hi]);
    if (x[1] < y[1]) i++;
    else j++;
  }
  return out;
}

/** Distance from point (qx, qy) to segment ab (no allocation: this runs in hot loops). */
function pointSegDist(qx: number, qy: number, ax: number, ay: number, bx: number, by: number): number {
  const abx = bx - ax;
  const aby = by - ay;
  const l2 = abx * abx + aby * aby;
  let t = l2 > 0 ? ((qx - ax) * abx + (qy - ay) * aby) / l2 : 0;
  t = t < 0 ? 0 : t > 1 ? 1 : t;
  const ex = qx - (ax + abx * t);
  const ey = qy - (ay + aby * t);
  return M.sqrt(ex * ex + ey * ey);
}

/** Distance from point q to segment ab. */
export function pointSegmentDistance(q: Vec2, a: Vec2, b: Vec2): number {
  return pointSegDist(q[0], q[1], a[0], a[1], b[0], b[1]);
}

const orient = (ax: number, ay: number, bx: number, by: number, cx: number, cy: number): number =>
  (bx - ax) * (cy - ay) - (by - ay) * (cx - ax);

/** Twice the signed area of o, a, b: positive when o → a → b turns left (counter-clockwise). */
const turn = (o: Vec2, a: Vec2, b: Vec2): number => orient(o[0], o[1], a[0], a[1], b[0], b[1]);

/** Whether the segments ab and cd cross at a single interior point. */
export function segmentsIntersect(a: Vec2, b: Vec2, c: Vec2, d: Vec2): boolean {
  const d1 = orient(a[0], a[1], b[0], b[1], c[0], c[1]);
  const d2 = orient(a[0], a[1], b[0], b[1], d[0], d[1]);
  const d3 = orient(c[0], c[1], d[0], d[1], a[0], a[1]);
  const d4 = orient(c[0], c[1], d[0], d[1], b[0], b[1]);
  return d1 > 0 !== d2 > 0 && d3 > 0 !== d4 > 0 && d1 !== 0 && d3 !== 0;
}

export function segmentSegmentDistance(a: Vec2, b: Vec2, c: Vec2, d: Vec2): number {
  if (segmentsIntersect(a, b, c, d)) return 0;
  return M.min(
    pointSegDist(a[0], a[1], c[0], c[1], d[0], d[1]),
    pointSegDist(b[0], b[1], c[0], c[1], d[0], d[1]),
    pointSegDist(c[0], c[1], a[0], a[1], b[0], b[1]),
    pointSegDist(d[0], d[1], a[0], a[1], b[0], b[1]),
  );
}

/** Even–odd point-in-polygon test. */
export function containsPoint(poly: Polygon, q: Vec2): boolean {
  let inside = false;
  for (let i = 0, n = poly.length, j = n - 1; i < n; j = i++) {
    const a = at(poly, i);
    const b = at(poly, j);
    if (a[1] > q[1] !== b[1] > q[1] && q[0] < ((b[0] - a[0]) * (q[1] - a[1])) / (b[1] - a[1]) + a[0]) {
      inside = !inside;
    }
  }
  return inside;
}

/** Convex hull (Andrew's monotone chain), counter-clockwise, collinear points dropped. */
export function convexHull2(points: readonly Vec2[]): Vec2[] {
  const pts = [...points].sort((p, q) => p[0] - q[0] || p[1] - q[1]);
  if (pts.length < 3) return pts;
  const chain = (from: number, to: number, by: number): Vec2[] => {
    const out: Vec2[] = [];
    for (let i = from; i !== to; i += by) {
      const p = pts[i] as Vec2;
      while (out.length >= 2 && turn(out[out.length - 2] as Vec2, out[out.length - 1] as Vec2, p) <= 0)
        out.pop();
      out.push(p);
    }
    out.pop();
    return out;
  };
  return chain(0, pts.length, 1).concat(chain(pts.length - 1, -1, -1));
}

/**
 * Convex hull of a simple polygon (no self-crossings) in linear time: Melkman's algorithm (A. A. Melkman,
 * "On-line construction of the convex hull of a simple polyline", Information Processing Letters 25(1),
 * 1987), counter-clockwise, without collinear points, and checked to contain every vertex (O(n log h)). Falls
 * back to convexHull2 when the first three vertices are collinear or the outline is not simple after all (a
 * boolean's result may touch itself). The outlines the checks look at have hundreds of vertices (router
 * reliefs): this takes a quarter of the time of sorting them.
 */
export function simplePolygonHull(poly: readonly Vec2[]): Vec2[] {
  const n = poly.length;
  if (n < 4) return convexHull2(poly);
  const [p0, p1, p2] = [poly[0], poly[1], poly[2]] as [Vec2, Vec2, Vec2];
  const first = turn(p0, p1, p2);
  if (first === 0) return convexHull2(poly);
  // A deque in an array of 2n + 1 slots, bottom and top both holding the last point added.
  const d: Vec2[] = new Array(2 * n + 1);
  let bot = n - 2;
  let top = bot + 3;
  d[top] = d[bot] = p2;
  if (first > 0) {
    d[bot + 1] = p0;
    d[bot + 2] = p1;
  } else {
    d[bot + 1] = p1;
    d[bot + 2] = p0;
  }
  for (let i = 3; i < n; i++) {
    const v = poly[i] as Vec2;
    // Inside the hull so far: nothing changes.
    if (turn(d[bot] as Vec2, d[bot + 1] as Vec2, v) > 0 && turn(d[top - 1] as Vec2, d[top] as Vec2, v) > 0)
      continue;
    // The walks stop at an edge v lies left of; one always exists for a simple polyline, so running off
    // the deque means the outline was not simple (or degenerate): then the general hull is used.
    while (turn(d[bot] as Vec2, d[bot + 1] as Vec2, v) <= 0) if (++bot >= top) return convexHull2(poly);
    d[--bot] = v;
    while (turn(d[top - 1] as Vec2, d[top] as Vec2, v) <= 0) if (--top <= bot) return convexHull2(poly);
    d[++top] = v;
  }
  // The walk never revisits where the outline closes, so a vertex there can lie on a hull edge: drop such.
  const hull = d.slice(bot, top);
  const out: Vec2[] = [];
  for (let i = 0; i < hull.length; i++) {
    const prev = out.length ? (out[out.length - 1] as Vec2) : (hull[hull.length - 1] as Vec2);
    if (turn(prev, hull[i] as Vec2, hull[(i + 1) % hull.length] as Vec2) > 0) out.push(hull[i] as Vec2);
  }
  // An outline that touches itself (a vertex on another edge, as a boolean's result may) can mislead the
  // walk: every vertex must lie in the result, or the general hull is used. O(n log h).
  if (out.length < 3 || !poly.every((p) => inConvex(out, p))) return convexHull2(poly);
  return out;
}

/** Whether p lies in the counter-clockwise convex polygon c (on its boundary counts), by a fan search. */
function inConvex(c: readonly Vec2[], p: Vec2): boolean {
  const o = c[0] as Vec2;
  const n = c.length;
  // Slack for rounding: relative to the polygon's size.
  const eps = 1e-9 * (M.abs(o[0]) + M.abs(o[1]) + M.abs(p[0]) + M.abs(p[1]) + 1) ** 2;
  if (turn(o, c[1] as Vec2, p) < -eps || turn(o, c[n - 1] as Vec2, p) > eps) return false;
  // The fan triangle o, c[k], c[k + 1] that holds p's direction.
  let lo = 1;
  let hi = n - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (turn(o, c[mid] as Vec2, p) >= 0) lo = mid;
    else hi = mid;
  }
  return turn(c[lo] as Vec2, c[hi] as Vec2, p) >= -eps;
}
