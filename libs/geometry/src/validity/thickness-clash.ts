/**
 * Pieces are slabs of the stock's thickness, not the plane polygons the crossings are computed on. Where two
 * pieces come near the line their planes share without crossing on it (a tip stopping just short of a
 * neighbour, or two chords on the line missing each other by less than the stock's thickness), the slabs can
 * still run into each other, and no slot makes room. This check finds those places.
 *
 * Method (our own, derived): for a pair of pieces with planes meeting along the line L, look at cross-sections
 * perpendicular to L at steps along it. In a cross-section, a piece is a set of segments along its plane's
 * trace (its outline's chords across L, slots and reliefs already cut), each thickened to the stock's
 * thickness. Two thickened segments meet exactly where both lie inside both slabs, i.e. inside the rhombus
 * where the two slabs cross; in coordinates (u, s) = offsets from L along each plane, the rhombus is a
 * parallelogram and each pair of segments is a box [u0, u1] × [s0, s1], tested by separating axes. A slot of
 * the nominal width t·(1 + cos φ)/sin φ (slots.ts) clears the rhombus exactly, so a crossing's own slots never
 * count, and stretches of the line where the pieces cross (given by the caller) are not sampled at all; the
 * slabs are shrunk by a tolerance so that a press fit (negative fit allowance) does not count either.
 */
import { type Vec2, type Vec3, cross3, dot3, scale3, add3 } from '../math/vec';
import { type Polygon, convexHull2 } from '../math/polygon';
import { type PieceFrame, dirToFrame, planeLine, toFrame } from '../pieces/place';

export interface SlabPiece {
  frame: PieceFrame;
  /** Outline as cut (slots and reliefs included), in the piece's frame, mm. */
  outline: Polygon;
}

export interface ThicknessClash {
  a: number;
  b: number;
  /** Where along the planes' common line the slabs meet: parameter range along `dir` from `point`, mm. */
  from: number;
  to: number;
  point: Vec3;
  dir: Vec3;
}

/** Slabs must overlap by more than this (mm) to count; a press fit adds its interference. */
export const CLASH_TOLERANCE_MM = 0.1;

/**
 * Places where two pieces of `thicknessMm` stock run into each other through their thickness (see the
 * module comment). `toleranceMm` is how deep the slabs may overlap before it counts. Sampled along the
 * common line every max(0.25, t/4) mm; a clash shorter than a step can be missed.
 */
export function thicknessClashes(
  pieces: readonly SlabPiece[],
  thicknessMm: number,
  toleranceMm = CLASH_TOLERANCE_MM,
  crossings: readonly { a: number; b: number; t0: number; t1: number }[] = [],
): ThicknessClash[] {
  // Along a crossing both pieces are slotted (slots.ts makes room there): those stretches are not sampled.
  const crossed = new Map<string, [number, number][]>();
  for (const c of crossings) {
    const key = `${Math.min(c.a, c.b)}-${Math.max(c.a, c.b)}`;
    crossed.set(key, [...(crossed.get(key) ?? []), [c.t0, c.t1]]);
  }
  const h = thicknessMm / 2 - toleranceMm;
  if (!(h > 0)) return [];
  const out: ThicknessClash[] = [];
  const step = Math.max(0.25, thicknessMm / 4);
  // Each piece's distance from its frame's origin.
  const radius = pieces.map((p) => p.outline.reduce((r, q) => Math.max(r, Math.hypot(q[0], q[1])), 0));
  // Convex hulls: a quick first look at each pair (a hull's stretch near L contains the outline's).
  const hulls = pieces.map((p) => convexHull2(p.outline));
  for (let i = 0; i < pieces.length; i++) {
    for (let j = i + 1; j < pieces.length; j++) {
      const A = pieces[i] as SlabPiece;
      const B = pieces[j] as SlabPiece;
      const line = planeLine(A.frame, B.frame);
      if (!line) continue;
      const cos = dot3(A.frame.normal, B.frame.normal);
      const sin = Math.sqrt(Math.max(0, 1 - cos * cos));
      if (sin < 1e-6) continue;
      // Offset from L (along each plane) beyond which a piece's slab is clear of the other's slab.
      const reach = (h * (1 + Math.abs(cos))) / sin;
      // A piece farther from L (in its plane) than its radius plus the reach cannot take part.
      if (inPlaneDistance(A.frame, line.point, line.dir) > radius[i]! + reach) continue;
      if (inPlaneDistance(B.frame, line.point, line.dir) > radius[j]! + reach) continue;
      const skip = crossed.get(`${i}-${j}`) ?? [];
      const ha = bandRange(A.frame, hulls[i]!, line.point, line.dir, reach);
      const hb = ha && bandRange(B.frame, hulls[j]!, line.point, line.dir, reach);
      if (!ha || !hb) continue;
      if (samplePoints(Math.max(ha.from, hb.from), Math.min(ha.to, hb.to), step, skip).next().done) continue;
      const sa = bandSection(A.frame, A.outline, line.point, line.dir, reach);
      if (!sa) continue;
      const sb = bandSection(B.frame, B.outline, line.point, line.dir, reach);
      if (!sb) continue;
      const t0 = Math.max(sa.from, sb.from);
      const t1 = Math.min(sa.to, sb.to);
      if (!(t1 > t0)) continue;
      const quad = rhombus(A, B, sa.e, sb.e, h);
      let runStart: number | null = null;
      let runEnd = 0;
      const flush = () => {
        if (runStart !== null) out.push({ a: i, b: j, from: runStart, to: runEnd, ...line });
        runStart = null;
      };
      let previous = -Infinity;
      for (const t of samplePoints(t0, t1, step, skip)) {
        // A skipped stretch ends a run.
        if (t - previous > step * 1.5) flush();
        previous = t;
        const ca = sa.chords(t);
        if (ca.length > 0 && slabsMeet(ca, sb.chords(t), quad)) {
          runStart ??= t - step / 2;
          runEnd = t + step / 2;
        } else flush();
      }
      flush();
    }
  }
  return out;
}

/**
 * Sample points t0 + step/2 + k·step below t1, leaving out the skipped stretches; after a stretch the
 * sampling starts again half a step past its end.
 */
function* samplePoints(
  t0: number,
  t1: number,
  step: number,
  skip: readonly [number, number][],
): Generator<number> {
  for (let t = t0 + step / 2; t < t1; t += step) {
    const inside = skip.find((iv) => t > iv[0] && t < iv[1]);
    if (inside) t = inside[1] - step / 2;
    else yield t;
  }
}

/**
 * Parameter range along the line (point, dir) of the outline's parts within `reach` of it in the piece's
 * plane (the band region's extent along the line is reached on its boundary, and the band lines' pieces
 * inside the outline end on the outline). Null when the outline stays farther away.
 */
function bandRange(
  frame: PieceFrame,
  outline: Polygon,
  point: Vec3,
  dir: Vec3,
  reach: number,
): { from: number; to: number } | null {
  const e = cross3(frame.normal, dir);
  const o = toFrame(frame, point);
  const d2 = dirToFrame(frame, dir);
  const e2 = dirToFrame(frame, e);
  let from = Infinity;
  let to = -Infinity;
  const n = outline.length;
  for (let k = 0; k < n; k++) {
    const qa = outline[k] as Vec2;
    const qb = outline[(k + 1) % n] as Vec2;
    const ta = (qa[0] - o[0]) * d2[0] + (qa[1] - o[1]) * d2[1];
    const ua = (qa[0] - o[0]) * e2[0] + (qa[1] - o[1]) * e2[1];
    const tb = (qb[0] - o[0]) * d2[0] + (qb[1] - o[1]) * d2[1];
    const ub = (qb[0] - o[0]) * e2[0] + (qb[1] - o[1]) * e2[1];
    // Clip the edge to |u| ≤ reach.
    let lo = 0;
    let hi = 1;
    const du = ub - ua;
    if (Math.abs(du) < 1e-12) {
      if (Math.abs(ua) > reach) continue;
    } else {
      const k1 = (-reach - ua) / du;
      const k2 = (reach - ua) / du;
      lo = Math.max(lo, Math.min(k1, k2));
      hi = Math.min(hi, Math.max(k1, k2));
      if (lo > hi) continue;
    }
    const x0 = ta + (tb - ta) * lo;
    const x1 = ta + (tb - ta) * hi;
    from = Math.min(from, x0, x1);
    to = Math.max(to, x0, x1);
  }
  return to > from ? { from, to } : null;
}

/** Distance from a piece's frame origin to the line (point, dir) lying in its plane. */
function inPlaneDistance(frame: PieceFrame, point: Vec3, dir: Vec3): number {
  const o = toFrame(frame, point);
  const d = dirToFrame(frame, dir);
  return Math.abs(o[0] * d[1] - o[1] * d[0]) / Math.hypot(d[0], d[1]);
}

interface BandSection {
  /** The piece's in-plane direction perpendicular to L (3D, unit). */
  e: Vec3;
  /** Range along L where the piece's outline comes within `reach` of L. */
  from: number;
  to: number;
  /**
   * Chords of the piece across L at parameter t: offsets along e, within reach of L. Calls must come in
   * increasing t (a sweep: only the edges spanning t are kept, so a chord costs the few edges it crosses).
   */
  chords: (t: number) => [number, number][];
}

function bandSection(
  frame: PieceFrame,
  outline: Polygon,
  point: Vec3,
  dir: Vec3,
  reach: number,
): BandSection | null {
  const range = bandRange(frame, outline, point, dir, reach);
  if (!range) return null;
  const e = cross3(frame.normal, dir);
  const o = toFrame(frame, point);
  const d2 = dirToFrame(frame, dir);
  const e2 = dirToFrame(frame, e);
  // The outline in (t, u): t along L, u along e.
  const n = outline.length;
  const ts = new Float64Array(n);
  const us = new Float64Array(n);
  for (let k = 0; k < n; k++) {
    const q = outline[k] as Vec2;
    const dx = q[0] - o[0];
    const dy = q[1] - o[1];
    ts[k] = dx * d2[0] + dy * d2[1];
    us[k] = dx * e2[0] + dy * e2[1];
  }
  // Edges by their lower t; a chord at t crosses the edges with tLow ≤ t < tHigh (half-open, so a vertex
  // on the chord is counted once).
  let order: number[] | null = null;
  let next = 0;
  const active: number[] = [];
  return {
    e,
    ...range,
    chords: (t) => {
      // Sorted on first use: most pairs are turned away on their ranges alone.
      if (!order) {
        const low = new Float64Array(n);
        for (let k = 0; k < n; k++) low[k] = Math.min(ts[k]!, ts[(k + 1) % n]!);
        order = Array.from({ length: n }, (_, k) => k).sort((a, b) => low[a]! - low[b]!);
      }
      while (next < n) {
        const k = order[next]!;
        if (Math.min(ts[k]!, ts[(k + 1) % n]!) > t) break;
        active.push(k);
        next++;
      }
      // Drop the edges that end before t (in place), and cut the others.
      const cuts: number[] = [];
      let kept = 0;
      for (let i = 0; i < active.length; i++) {
        const k = active[i]!;
        const k2 = (k + 1) % n;
        const ta = ts[k]!;
        const tb = ts[k2]!;
        if (Math.max(ta, tb) <= t) continue;
        active[kept++] = k;
        if (ta === tb || t < Math.min(ta, tb)) continue;
        cuts.push(us[k]! + ((t - ta) * (us[k2]! - us[k]!)) / (tb - ta));
      }
      active.length = kept;
      cuts.sort((a, b) => a - b);
      const out: [number, number][] = [];
      for (let i = 0; i + 1 < cuts.length; i += 2) {
        const lo = cuts[i]!;
        const hi = cuts[i + 1]!;
        if (hi > -reach && lo < reach && hi > lo) out.push([lo, hi]);
      }
      return out;
    },
  };
}

/** The slabs' crossing (shrunk to half-thickness h) in (u, s) coordinates: 4 corners and 2 edge normals. */
interface Quad {
  corners: Vec2[];
  normals: Vec2[];
}

function rhombus(A: SlabPiece, B: SlabPiece, eA: Vec3, eB: Vec3, h: number): Quad {
  const nA = A.frame.normal;
  const nB = B.frame.normal;
  // Cross-section coordinates x = p·eA + q·nA: nB = α eA + β nA.
  const alpha = dot3(nB, eA);
  const beta = dot3(nB, nA);
  const corners: Vec2[] = [];
  for (const [sq, sr] of [
    [-1, -1],
    [1, -1],
    [1, 1],
    [-1, 1],
  ] as const) {
    const q = sq * h;
    const p = (sr * h - beta * q) / alpha;
    const x = add3(scale3(eA, p), scale3(nA, q));
    corners.push([dot3(x, eA), dot3(x, eB)]);
  }
  const normals: Vec2[] = [];
  for (let k = 0; k < 2; k++) {
    const a = corners[k] as Vec2;
    const b = corners[k + 1] as Vec2;
    normals.push([-(b[1] - a[1]), b[0] - a[0]]);
  }
  return { corners, normals };
}

function slabsMeet(ca: [number, number][], cb: [number, number][], quad: Quad): boolean {
  if (ca.length === 0 || cb.length === 0) return false;
  let uMin = Infinity;
  let uMax = -Infinity;
  let sMin = Infinity;
  let sMax = -Infinity;
  for (const c of quad.corners) {
    uMin = Math.min(uMin, c[0]);
    uMax = Math.max(uMax, c[0]);
    sMin = Math.min(sMin, c[1]);
    sMax = Math.max(sMax, c[1]);
  }
  for (const [u0, u1] of ca) {
    if (u1 <= uMin || u0 >= uMax) continue;
    for (const [s0, s1] of cb) {
      if (s1 <= sMin || s0 >= sMax) continue;
      let apart = false;
      for (const [nx, ny] of quad.normals) {
        let qMin = Infinity;
        let qMax = -Infinity;
        for (const c of quad.corners) {
          const v = c[0] * nx + c[1] * ny;
          qMin = Math.min(qMin, v);
          qMax = Math.max(qMax, v);
        }
        // The box's extent along the normal: from its corners.
        const b0 = Math.min(u0 * nx, u1 * nx) + Math.min(s0 * ny, s1 * ny);
        const b1 = Math.max(u0 * nx, u1 * nx) + Math.max(s0 * ny, s1 * ny);
        if (b1 <= qMin || b0 >= qMax) {
          apart = true;
          break;
        }
      }
      if (!apart) return true;
    }
  }
  return false;
}
