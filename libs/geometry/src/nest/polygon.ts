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
