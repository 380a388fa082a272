/**
 * Convex decomposition of a simple polygon: ear-clipping triangulation, then Hertel & Mehlhorn's greedy removal
 * of diagonals whose removal keeps both neighbours convex (Hertel & Mehlhorn, 1983 — from memory; at most four
 * times the optimal number of pieces). Used to build Minkowski sums as unions of convex-pair sums, as in
 * Bennell & Oliveira's tutorial (EJOR 184, 2008).
 */
/** Integer point as Clipper uses it (kept here so this file does not import the adapter). */
export interface IntPoint {
  X: number;
  Y: number;
}
export type IntPath = IntPoint[];

function cross(o: IntPoint, a: IntPoint, b: IntPoint): number {
  return (a.X - o.X) * (b.Y - o.Y) - (a.Y - o.Y) * (b.X - o.X);
}

function inTriangle(p: IntPoint, a: IntPoint, b: IntPoint, c: IntPoint): boolean {
  return cross(a, b, p) >= 0 && cross(b, c, p) >= 0 && cross(c, a, p) >= 0;
}

/** Triangles (vertex index triples, counter-clockwise) of a counter-clockwise simple polygon. */
export function triangulate(poly: IntPath): [number, number, number][] {
  const idx = poly.map((_, i) => i);
  const out: [number, number, number][] = [];
  let guard = 0;
  while (idx.length > 3 && guard++ < 10 * poly.length * poly.length) {
    const m = idx.length;
    let clipped = false;
    for (let i = 0; i < m; i++) {
      const ia = idx[(i - 1 + m) % m]!;
      const ib = idx[i]!;
      const ic = idx[(i + 1) % m]!;
      const a = poly[ia]!;
      const b = poly[ib]!;
      const c = poly[ic]!;
      const turn = cross(a, b, c);
      if (turn < 0) continue;
      if (turn === 0) {
        // Collinear (or repeated) vertex: drop it, no triangle.
        idx.splice(i, 1);
        clipped = true;
        break;
      }
      let ear = true;
      for (const j of idx) {
        if (j === ia || j === ib || j === ic) continue;
        const p = poly[j]!;
        if ((p.X === a.X && p.Y === a.Y) || (p.X === c.X && p.Y === c.Y)) continue;
        if (inTriangle(p, a, b, c)) {
          ear = false;
          break;
        }
      }
      if (!ear) continue;
      out.push([ia, ib, ic]);
      idx.splice(i, 1);
      clipped = true;
      break;
    }
    if (!clipped) break;
  }
  if (idx.length === 3) {
    const [a, b, c] = idx as [number, number, number];
    if (cross(poly[a]!, poly[b]!, poly[c]!) > 0) out.push([a, b, c]);
  } else if (idx.length > 3) {
    // Numerically stuck (should not happen for simple polygons): fan the rest; callers check total area.
    for (let i = 1; i + 1 < idx.length; i++) out.push([idx[0]!, idx[i]!, idx[i + 1]!]);
  }
  return out;
}

function isConvexAt(piece: readonly number[], poly: IntPath, k: number): boolean {
  const n = piece.length;
  return cross(poly[piece[(k - 1 + n) % n]!]!, poly[piece[k]!]!, poly[piece[(k + 1) % n]!]!) >= 0;
}

/** Tries to merge two pieces sharing an edge; returns the merged piece if it is convex. */
function tryMerge(p: number[], q: number[], poly: IntPath): number[] | null {
  for (let i = 0; i < p.length; i++) {
    const u = p[i]!;
    const v = p[(i + 1) % p.length]!;
    const j = q.findIndex((x, k) => x === v && q[(k + 1) % q.length] === u);
    if (j < 0) continue;
    // p: … u v …, q: … v u …  → merged: p from v round to u, then q from u (exclusive) round to v (exclusive).
    const merged: number[] = [];
    for (let k = 0; k < p.length; k++) merged.push(p[(i + 1 + k) % p.length]!);
    for (let k = 2; k < q.length; k++) merged.push(q[(j + k) % q.length]!);
    const iu = p.length - 1; // u sits at the end of the first run
    const iv = 0;
    if (isConvexAt(merged, poly, iu) && isConvexAt(merged, poly, iv)) return merged;
    return null;
  }
  return null;
}

/** Convex pieces (counter-clockwise integer paths) covering a counter-clockwise simple polygon. */
export function convexPieces(poly: IntPath): IntPath[] {
  const pieces: number[][] = triangulate(poly).map((t) => [...t]);
  let merged = true;
  while (merged) {
    merged = false;
    for (let a = 0; a < pieces.length && !merged; a++)
      for (let b = a + 1; b < pieces.length && !merged; b++) {
        const m = tryMerge(pieces[a]!, pieces[b]!, poly);
        if (m) {
          pieces[a] = m;
          pieces.splice(b, 1);
          merged = true;
        }
      }
  }
  return pieces.map((p) => p.map((i) => poly[i]!));
}

/** Convex hull (monotone chain) of integer points, counter-clockwise. */
export function convexHullInt(points: IntPoint[]): IntPath {
  const pts = [...points].sort((a, b) => a.X - b.X || a.Y - b.Y);
  if (pts.length < 3) return pts;
  const lower: IntPoint[] = [];
  for (const p of pts) {
    while (lower.length >= 2 && cross(lower[lower.length - 2]!, lower[lower.length - 1]!, p) <= 0)
      lower.pop();
    lower.push(p);
  }
  const upper: IntPoint[] = [];
  for (let i = pts.length - 1; i >= 0; i--) {
    const p = pts[i]!;
    while (upper.length >= 2 && cross(upper[upper.length - 2]!, upper[upper.length - 1]!, p) <= 0)
      upper.pop();
    upper.push(p);
  }
  lower.pop();
  upper.pop();
  return lower.concat(upper);
}

/**
 * Minkowski sum of two convex polygons: their edges merged in order of angle, starting from the sum of their
 * lowest vertices (de Berg, Cheong, van Kreveld & Overmars, "Computational Geometry", 3rd ed., §13.3), in
 * O(n + m). Outlines that are not convex and counter-clockwise get the hull of all vertex sums instead.
 */
export function convexMinkowskiSum(a: IntPath, b: IntPath): IntPath {
  if (isConvexCcw(a) && isConvexCcw(b)) return mergedSum(a, b);
  const pts: IntPoint[] = [];
  for (const p of a) for (const q of b) pts.push({ X: p.X + q.X, Y: p.Y + q.Y });
  return convexHullInt(pts);
}

/** Index of the lowest vertex (then the leftmost). */
function lowest(p: IntPath): number {
  let k = 0;
  for (let i = 1; i < p.length; i++) {
    const q = p[i]!;
    const b = p[k]!;
    if (q.Y < b.Y || (q.Y === b.Y && q.X < b.X)) k = i;
  }
  return k;
}

function mergedSum(a: IntPath, b: IntPath): IntPath {
  const n = a.length;
  const m = b.length;
  const ia = lowest(a);
  const ib = lowest(b);
  const out: IntPoint[] = [];
  let i = 0;
  let j = 0;
  while (i < n || j < m) {
    const p = a[(ia + i) % n]!;
    const q = b[(ib + j) % m]!;
    out.push({ X: p.X + q.X, Y: p.Y + q.Y });
    if (i === n) {
      j++;
      continue;
    }
    if (j === m) {
      i++;
      continue;
    }
    const pn = a[(ia + i + 1) % n]!;
    const qn = b[(ib + j + 1) % m]!;
    // Both current edges turn less than half a turn apart, so the sign of their cross product orders them.
    const c = (pn.X - p.X) * (qn.Y - q.Y) - (pn.Y - p.Y) * (qn.X - q.X);
    if (c >= 0) i++;
    if (c <= 0) j++;
  }
  return out;
}

/**
 * How far a closed path turns in all (radians, counter-clockwise positive), and whether it ever turns right;
 * null when it reverses on itself somewhere (a zero-width spike has no turning direction). A simple
 * counter-clockwise outline turns 2π.
 */
export function turningOf(p: IntPath): { total: number; turnsRight: boolean } | null {
  const n = p.length;
  let total = 0;
  let turnsRight = false;
  for (let i = 0; i < n; i++) {
    const a = p[(i + n - 1) % n]!;
    const b = p[i]!;
    const c = p[(i + 1) % n]!;
    const ux = b.X - a.X;
    const uy = b.Y - a.Y;
    const vx = c.X - b.X;
    const vy = c.Y - b.Y;
    const cross = ux * vy - uy * vx;
    const dot = ux * vx + uy * vy;
    if (cross === 0 && dot <= 0) return null;
    if (cross < 0) turnsRight = true;
    total += Math.atan2(cross, dot);
  }
  return { total, turnsRight };
}

/** Whether a total turning is one counter-clockwise turn. */
export const turnsOnce = (total: number) => Math.abs(total - 2 * Math.PI) < 1e-6;

/**
 * True for a polygon of at least three vertices that turns left (or runs straight on) at every vertex and
 * turns once in all: convex, counter-clockwise, not wound twice round like a pentagram.
 */
function isConvexCcw(p: IntPath): boolean {
  if (p.length < 3) return false;
  const t = turningOf(p);
  return t !== null && !t.turnsRight && turnsOnce(t.total);
}
