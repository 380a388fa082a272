/** Plain polygon helpers in millimetres. Points are [x, y]; angles in degrees, counter-clockwise. */

export type Point = readonly [number, number];
export type Polygon = readonly Point[];

export interface Bounds {
  minX: number;
  minY: number;
  maxX: number;
  maxY: number;
}

/** Signed area (shoelace formula): positive when the vertices run counter-clockwise. */
export function signedArea(poly: Polygon): number {
  let s = 0;
  for (let i = 0; i < poly.length; i++) {
    const a = poly[i] as Point;
    const b = poly[(i + 1) % poly.length] as Point;
    s += a[0] * b[1] - b[0] * a[1];
  }
  return s / 2;
}

/** The same polygon with counter-clockwise vertex order. */
export function toCounterClockwise(poly: Polygon): Point[] {
  const copy = poly.map((p) => [p[0], p[1]] as Point);
  return signedArea(copy) < 0 ? copy.reverse() : copy;
}

/** Rotates about the origin by angleDeg, counter-clockwise. */
export function rotatePolygon(poly: Polygon, angleDeg: number): Point[] {
  const t = (angleDeg * Math.PI) / 180;
  const c = Math.cos(t);
  const s = Math.sin(t);
  return poly.map(([x, y]) => [x * c - y * s, x * s + y * c] as Point);
}

export function translatePolygon(poly: Polygon, dx: number, dy: number): Point[] {
  return poly.map(([x, y]) => [x + dx, y + dy] as Point);
}

export function boundsOf(poly: Polygon): Bounds {
  let minX = Infinity;
  let minY = Infinity;
  let maxX = -Infinity;
  let maxY = -Infinity;
  for (const [x, y] of poly) {
    minX = Math.min(minX, x);
    minY = Math.min(minY, y);
    maxX = Math.max(maxX, x);
    maxY = Math.max(maxY, y);
  }
  return { minX, minY, maxX, maxY };
}

/**
 * Drops a repeated closing vertex and consecutive duplicates (within tolMm), so [a, b, c, a] becomes [a, b, c].
 */
export function cleanPolygon(poly: Polygon, tolMm = 1e-9): Point[] {
  const out: Point[] = [];
  for (const p of poly) {
    const last = out[out.length - 1];
    if (last && Math.hypot(p[0] - last[0], p[1] - last[1]) <= tolMm) continue;
    out.push([p[0], p[1]]);
  }
  while (out.length > 1) {
    const first = out[0] as Point;
    const last = out[out.length - 1] as Point;
    if (Math.hypot(first[0] - last[0], first[1] - last[1]) > tolMm) break;
    out.pop();
  }
  return out;
}

function cross(o: Point, a: Point, b: Point): number {
  return (a[0] - o[0]) * (b[1] - o[1]) - (a[1] - o[1]) * (b[0] - o[0]);
}

function onSegment(p: Point, q: Point, r: Point): boolean {
  return (
    Math.min(p[0], r[0]) <= q[0] &&
    q[0] <= Math.max(p[0], r[0]) &&
    Math.min(p[1], r[1]) <= q[1] &&
    q[1] <= Math.max(p[1], r[1])
  );
}

function segmentsIntersect(p1: Point, p2: Point, p3: Point, p4: Point): boolean {
  const d1 = cross(p3, p4, p1);
  const d2 = cross(p3, p4, p2);
  const d3 = cross(p1, p2, p3);
  const d4 = cross(p1, p2, p4);
  if (((d1 > 0 && d2 < 0) || (d1 < 0 && d2 > 0)) && ((d3 > 0 && d4 < 0) || (d3 < 0 && d4 > 0))) return true;
  if (d1 === 0 && onSegment(p3, p1, p4)) return true;
  if (d2 === 0 && onSegment(p3, p2, p4)) return true;
  if (d3 === 0 && onSegment(p1, p3, p2)) return true;
  if (d4 === 0 && onSegment(p1, p4, p2)) return true;
  return false;
}

/** True when no two non-adjacent edges meet (O(n²); outlines are small). */
export function isSimplePolygon(poly: Polygon): boolean {
  const n = poly.length;
  if (n < 3) return false;
  for (let i = 0; i < n; i++) {
    const a1 = poly[i] as Point;
    const a2 = poly[(i + 1) % n] as Point;
    for (let j = i + 1; j < n; j++) {
      if (j === i || (j + 1) % n === i || (i + 1) % n === j) continue;
      const b1 = poly[j] as Point;
      const b2 = poly[(j + 1) % n] as Point;
      if (segmentsIntersect(a1, a2, b1, b2)) return false;
    }
  }
  return true;
}

/** Convex hull (Andrew's monotone chain), counter-clockwise, no collinear points. */
export function convexHull(points: Polygon): Point[] {
  const pts = [...points].sort((a, b) => a[0] - b[0] || a[1] - b[1]);
  if (pts.length < 3) return pts.map((p) => [p[0], p[1]] as Point);
  const lower: Point[] = [];
  for (const p of pts) {
    while (
      lower.length >= 2 &&
      cross(lower[lower.length - 2] as Point, lower[lower.length - 1] as Point, p) <= 0
    )
      lower.pop();
    lower.push(p);
  }
  const upper: Point[] = [];
  for (let i = pts.length - 1; i >= 0; i--) {
    const p = pts[i] as Point;
    while (
      upper.length >= 2 &&
      cross(upper[upper.length - 2] as Point, upper[upper.length - 1] as Point, p) <= 0
    )
      upper.pop();
    upper.push(p);
  }
  lower.pop();
  upper.pop();
  return lower.concat(upper);
}

/**
 * A convex polygon of at most `maxVertices` vertices containing the convex polygon `hull` (counter-clockwise,
 * as convexHull gives it), made by removing edges greedily: an edge is removed by extending its two neighbours
 * until they meet, which adds the triangle between the edge and that meeting point; the edge adding the least
 * area goes first (the greedy form of minimum-area circumscribing polygons, after Aggarwal, Chang & Yap,
 * "Minimum area circumscribing polygons", The Visual Computer 1, 1985 — from memory). An edge whose neighbours
 * turn by 180° or more together cannot be removed. A hull already small enough is returned as it is; a
 * finely drawn circle of 1,000 vertices becomes a 64-gon about 0.1 % larger in area.
 */
export function circumscribedConvex(hull: readonly Point[], maxVertices: number): Point[] {
  const n = hull.length;
  if (n <= maxVertices || n < 4) return hull.map((p) => [p[0], p[1]] as Point);
  const xs = hull.map((p) => p[0]);
  const ys = hull.map((p) => p[1]);
  const next = Array.from({ length: n }, (_, i) => (i + 1) % n);
  const prev = Array.from({ length: n }, (_, i) => (i - 1 + n) % n);
  const alive = new Array<boolean>(n).fill(true);
  // Edge i runs from vertex i to vertex next[i]; removing it replaces vertices i and next[i] by the meeting
  // point of the lines of edges prev[i] and next[i].
  const meet = (i: number): { x: number; y: number; cost: number } | null => {
    const a = prev[i]!;
    const b = i;
    const c = next[i]!;
    const d = next[c]!;
    const ux = xs[b]! - xs[a]!;
    const uy = ys[b]! - ys[a]!;
    const vx = xs[d]! - xs[c]!;
    const vy = ys[d]! - ys[c]!;
    const den = ux * vy - uy * vx;
    // The neighbours must turn left into each other (less than 180° together) to meet beyond the edge.
    if (den <= 1e-12 * Math.hypot(ux, uy) * Math.hypot(vx, vy)) return null;
    const t = ((xs[c]! - xs[b]!) * vy - (ys[c]! - ys[b]!) * vx) / den;
    if (t < 0) return null;
    const x = xs[b]! + t * ux;
    const y = ys[b]! + t * uy;
    const cost = Math.abs((xs[c]! - xs[b]!) * (y - ys[b]!) - (ys[c]! - ys[b]!) * (x - xs[b]!)) / 2;
    return { x, y, cost };
  };
  let count = n;
  while (count > maxVertices) {
    let best = -1;
    let bestMeet: { x: number; y: number; cost: number } | null = null;
    for (let i = 0; i < n; i++) {
      if (!alive[i]) continue;
      const m = meet(i);
      if (m && (bestMeet === null || m.cost < bestMeet.cost)) {
        best = i;
        bestMeet = m;
      }
    }
    if (bestMeet === null) break;
    // Vertex `best` moves to the meeting point; vertex next[best] goes.
    const gone = next[best]!;
    xs[best] = bestMeet.x;
    ys[best] = bestMeet.y;
    alive[gone] = false;
    next[best] = next[gone]!;
    prev[next[gone]!] = best;
    count--;
  }
  const out: Point[] = [];
  let start = 0;
  while (!alive[start]) start++;
  let i = start;
  do {
    out.push([xs[i]!, ys[i]!]);
    i = next[i]!;
  } while (i !== start);
  return out;
}
