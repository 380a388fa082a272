/**
 * Pieces are slabs of the stock's thickness, not the plane polygons the crossings are computed on. Where two
 * pieces come near the line their planes share without crossing on it (a tip stopping just short of a
 * neighbour, or two chords on the line missing each other by less than the stock's thickness), the slabs can
 * still run into each other, and no slot makes room. This check finds those places.
 *
 * Method (our own, derived): for a pair of pieces with planes meeting along the line L, look at cross-sections
 * perpendicular to L. In a cross-section at t (along L), a piece is a set of segments along its plane's trace
 * (its outline's chords across L, slots and reliefs already cut), each thickened to the stock's thickness. Two
 * thickened segments meet exactly where both lie inside both slabs, i.e. inside the rhombus where the two slabs
 * cross; in coordinates (u, s) = offsets from L along each plane, the rhombus is a parallelogram and each pair
 * of segments is a box [u0, u1] × [s0, s1], tested by separating axes. Only the outlines' parts within reach
 * of L matter; between two consecutive events (a vertex within reach, an edge leaving the reach, the end of a
 * stretch) every chord end moves linearly along one edge, so each separating-axis test is a linear inequality
 * in t and the stretches where the slabs meet are found exactly, not sampled. A slot of the nominal width
 * t·(1 + cos φ)/sin φ (slots.ts) clears the rhombus exactly, so a crossing's own slots never count, and
 * stretches of the line where the pieces cross (given by the caller) are left out; the slabs are shrunk by a
 * tolerance so that a press fit (negative fit allowance) does not count either, and meetings shorter than the
 * tolerance along L are dropped.
 */
import { type Vec2, type Vec3, cross3, dot3, scale3, add3 } from '../math/vec';
import { type Polygon, simplePolygonHull } from '../math/polygon';
import { type PieceFrame, dirToFrame, planeLine, toFrame } from '../pieces/place';

export interface SlabPiece {
  frame: PieceFrame;
  /** Outline as cut (slots and reliefs included), a simple polygon in the piece's frame, mm. */
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
 * module comment). `toleranceMm` is how deep the slabs may overlap, and along how much of the common line,
 * before it counts.
 */
export function thicknessClashes(
  pieces: readonly SlabPiece[],
  thicknessMm: number,
  toleranceMm = CLASH_TOLERANCE_MM,
  crossings: readonly { a: number; b: number; t0: number; t1: number }[] = [],
): ThicknessClash[] {
  // Along a crossing both pieces are slotted (slots.ts makes room there): those stretches are left out.
  const crossed = new Map<string, [number, number][]>();
  for (const c of crossings) {
    const key = `${Math.min(c.a, c.b)}-${Math.max(c.a, c.b)}`;
    crossed.set(key, [...(crossed.get(key) ?? []), [c.t0, c.t1]]);
  }
  const h = thicknessMm / 2 - toleranceMm;
  if (!(h > 0)) return [];
  const out: ThicknessClash[] = [];
  const hulls = pieces.map((p) => flatten(simplePolygonHull(p.outline)));
  const longest = Math.max(0, ...hulls.map((b) => b.xs.length));
  const scratch = { ts: new Float64Array(longest), us: new Float64Array(longest) };
  // Each piece's distance from its frame's origin.
  const radius = hulls.map(({ xs, ys }) => xs.reduce((r, x, k) => Math.max(r, Math.hypot(x, ys[k]!)), 0));
  // Flattened when a pair first needs them.
  const outlines: Flat[] = [];
  const outline = (i: number) => (outlines[i] ??= flatten((pieces[i] as SlabPiece).outline));
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
      // Where both hulls come within reach of L: the outlines' chords can meet there only.
      const ra = bandRange(project(A.frame, hulls[i]!, line.point, line.dir, scratch), reach);
      const rb = ra && bandRange(project(B.frame, hulls[j]!, line.point, line.dir, scratch), reach);
      if (!ra || !rb) continue;
      const skip = crossed.get(`${i}-${j}`) ?? [];
      if (!openStretches(Math.max(ra.from, rb.from), Math.min(ra.to, rb.to), skip).length) continue;
      // The same for the outlines themselves (slots take material away near L): the stretches examined.
      const pa = project(A.frame, outline(i), line.point, line.dir);
      const sa = bandRange(pa, reach);
      if (!sa) continue;
      const pb = project(B.frame, outline(j), line.point, line.dir);
      const sb = bandRange(pb, reach);
      if (!sb) continue;
      const t0 = Math.max(sa.from, sb.from);
      const t1 = Math.min(sa.to, sb.to);
      const stretches = openStretches(t0, t1, skip);
      if (!stretches.length) continue;
      const quad = rhombus(A, B, pa.e, pb.e, h);
      const chordsA = sweep(pa, t0, t1, reach);
      const chordsB = sweep(pb, t0, t1, reach);
      const events = [...eventTimes(pa, reach, t0, t1), ...eventTimes(pb, reach, t0, t1)].sort(
        (x, y) => x - y,
      );
      const runs: [number, number][] = [];
      for (const [w0, w1] of stretches) {
        // The events inside the stretch cut it into pieces on which every chord end is linear in t.
        let from = w0;
        let e = lowerBound(events, w0);
        while (from < w1) {
          while (e < events.length && events[e]! <= from + EVENT_EPS_MM) e++;
          const to = e < events.length && events[e]! < w1 - EVENT_EPS_MM ? events[e]! : w1;
          const mid = (from + to) / 2;
          const ca = chordsA(mid);
          if (ca.length > 0) {
            const cb = chordsB(mid);
            for (const iv of meetings(ca, cb, quad, mid, from, to).sort((x, y) => x[0] - y[0]))
              addRun(runs, iv);
          }
          from = to;
        }
      }
      for (const [from, to] of runs) {
        if (to - from >= toleranceMm) out.push({ a: i, b: j, from, to, ...line });
      }
    }
  }
  return out;
}

/** Events closer than this (mm) are merged. */
const EVENT_EPS_MM = 1e-9;

/** [t0, t1] less the skipped stretches, as open stretches in increasing order. */
function openStretches(t0: number, t1: number, skip: readonly [number, number][]): [number, number][] {
  let parts: [number, number][] = t1 > t0 ? [[t0, t1]] : [];
  for (const [s0, s1] of skip) {
    parts = parts.flatMap(([a, b]): [number, number][] => {
      if (s1 <= a || s0 >= b) return [[a, b]];
      const left: [number, number][] = s0 > a ? [[a, s0]] : [];
      return s1 < b ? [...left, [s1, b]] : left;
    });
  }
  return parts.filter(([a, b]) => b - a > EVENT_EPS_MM).sort((x, y) => x[0] - y[0]);
}

/** The first index whose value is at least x, in a sorted array. */
function lowerBound(sorted: readonly number[], x: number): number {
  let lo = 0;
  let hi = sorted.length;
  while (lo < hi) {
    const m = (lo + hi) >> 1;
    if (sorted[m]! < x) lo = m + 1;
    else hi = m;
  }
  return lo;
}

/**
 * Where the chords within reach of L can change along it, within [t0, t1]: at the vertices within reach, and
 * where an edge crosses the reach's edges u = ±reach.
 */
function eventTimes({ ts, us }: Projected, reach: number, t0: number, t1: number): number[] {
  const out: number[] = [];
  const n = ts.length;
  for (let k = 0; k < n; k++) {
    const ta = ts[k]!;
    const ua = us[k]!;
    if (Math.abs(ua) <= reach && ta > t0 && ta < t1) out.push(ta);
    const k2 = k + 1 === n ? 0 : k + 1;
    const tb = ts[k2]!;
    const ub = us[k2]!;
    for (const level of [-reach, reach]) {
      if ((ua - level) * (ub - level) < 0) {
        const t = ta + ((level - ua) * (tb - ta)) / (ub - ua);
        if (t > t0 && t < t1) out.push(t);
      }
    }
  }
  return out;
}

/** Adds [a, b] to runs kept in increasing order, joining it to the last run when they touch. */
function addRun(runs: [number, number][], [a, b]: [number, number]): void {
  const last = runs[runs.length - 1];
  if (last && a <= last[1] + EVENT_EPS_MM) last[1] = Math.max(last[1], b);
  else runs.push([a, b]);
}

/** An outline's coordinates, flat. */
interface Flat {
  xs: Float64Array;
  ys: Float64Array;
}

function flatten(outline: Polygon): Flat {
  const n = outline.length;
  const xs = new Float64Array(n);
  const ys = new Float64Array(n);
  for (let k = 0; k < n; k++) {
    const q = outline[k] as Vec2;
    xs[k] = q[0];
    ys[k] = q[1];
  }
  return { xs, ys };
}

/** An outline in (t, u): t along the line L, u across it in the piece's plane (along e). */
interface Projected {
  e: Vec3;
  ts: Float64Array;
  us: Float64Array;
}

/** The outline in (t, u) coordinates; into `reuse`'s arrays when given (they must be long enough). */
function project(
  frame: PieceFrame,
  { xs, ys }: Flat,
  point: Vec3,
  dir: Vec3,
  reuse?: Pick<Projected, 'ts' | 'us'>,
): Projected {
  const e = cross3(frame.normal, dir);
  const [ox, oy] = toFrame(frame, point);
  const [dx, dy] = dirToFrame(frame, dir);
  const [ex, ey] = dirToFrame(frame, e);
  const n = xs.length;
  const ts = reuse ? reuse.ts.subarray(0, n) : new Float64Array(n);
  const us = reuse ? reuse.us.subarray(0, n) : new Float64Array(n);
  for (let k = 0; k < n; k++) {
    const x = xs[k]! - ox;
    const y = ys[k]! - oy;
    ts[k] = x * dx + y * dy;
    us[k] = x * ex + y * ey;
  }
  return { e, ts, us };
}

/**
 * Parameter range along L of the outline's parts within `reach` of it in the piece's plane (the band
 * region's extent along the line is reached on its boundary, and the band lines' pieces inside the outline
 * end on the outline). Null when the outline stays farther away.
 */
function bandRange({ ts, us }: Projected, reach: number): { from: number; to: number } | null {
  let from = Infinity;
  let to = -Infinity;
  const n = ts.length;
  for (let k = 0; k < n; k++) {
    const k2 = k + 1 === n ? 0 : k + 1;
    const ta = ts[k]!;
    const ua = us[k]!;
    const tb = ts[k2]!;
    const ub = us[k2]!;
    // Clip the edge to |u| ≤ reach.
    let lo = 0;
    let hi = 1;
    const du = ub - ua;
    if (Math.abs(du) < 1e-12) {
      if (Math.abs(ua) > reach) continue;
    } else {
      const k1 = (-reach - ua) / du;
      const k3 = (reach - ua) / du;
      lo = Math.max(lo, Math.min(k1, k3));
      hi = Math.min(hi, Math.max(k1, k3));
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

/** A chord end near t = mid: its offset there and how fast it moves along L (du/dt). */
interface End {
  at: number;
  slope: number;
}

/** A chord of an outline across L, kept within reach of L. */
interface Chord {
  lo: End;
  hi: End;
}

/**
 * A sweep over [t0, t1]: the chords of the outline across L at parameter t, cut to within reach of L, with
 * how their ends move, for t in increasing order and never at an event. Only the edges spanning t are kept, so
 * a chord costs the few edges it crosses; the edges meeting the window are ordered by a counting sort.
 */
function sweep({ ts, us }: Projected, t0: number, t1: number, reach: number): (t: number) => Chord[] {
  const n = ts.length;
  // Edges ordered by their lower t on a grid of n buckets: an edge may join the active list a little early,
  // which the cut test allows for. A chord at t crosses the edges with tLow ≤ t < tHigh.
  const width = (t1 - t0) / n || 1;
  const bucket = new Int32Array(n);
  const start = new Int32Array(n + 1);
  for (let k = 0; k < n; k++) {
    const ta = ts[k]!;
    const tb = ts[k + 1 === n ? 0 : k + 1]!;
    const low = Math.min(ta, tb);
    if (low > t1 || Math.max(ta, tb) <= t0) bucket[k] = -1;
    else {
      const b = Math.max(0, Math.min(n - 1, Math.floor((low - t0) / width)));
      bucket[k] = b;
      start[b + 1]!++;
    }
  }
  for (let b = 0; b < n; b++) start[b + 1]! += start[b]!;
  const order = new Int32Array(start[n]!);
  const fill = start.slice(0, n);
  for (let k = 0; k < n; k++) if (bucket[k]! >= 0) order[fill[bucket[k]!]!++] = k;
  let next = 0;
  const active: number[] = [];
  const cuts: End[] = [];
  const below: End = { at: -reach, slope: 0 };
  const above: End = { at: reach, slope: 0 };
  return (t) => {
    const upTo = start[Math.max(0, Math.min(n, Math.floor((t - t0) / width) + 1))]!;
    for (; next < upTo; next++) active.push(order[next]!);
    // Drop the edges that end before t (in place), and cut the others.
    cuts.length = 0;
    let kept = 0;
    for (let i = 0; i < active.length; i++) {
      const k = active[i]!;
      const k2 = k + 1 === n ? 0 : k + 1;
      const ta = ts[k]!;
      const tb = ts[k2]!;
      if (Math.max(ta, tb) <= t) continue;
      active[kept++] = k;
      if (ta === tb || t < Math.min(ta, tb)) continue;
      const slope = (us[k2]! - us[k]!) / (tb - ta);
      cuts.push({ at: us[k]! + (t - ta) * slope, slope });
    }
    active.length = kept;
    cuts.sort((a, b) => a.at - b.at);
    const out: Chord[] = [];
    for (let i = 0; i + 1 < cuts.length; i += 2) {
      const lo = cuts[i]!;
      const hi = cuts[i + 1]!;
      // No event lies between here and the next one, so an end beyond the reach stays beyond it.
      if (hi.at > -reach && lo.at < reach && hi.at > lo.at) {
        out.push({ lo: lo.at < -reach ? below : lo, hi: hi.at > reach ? above : hi });
      }
    }
    return out;
  };
}

/**
 * The slabs' crossing (shrunk to half-thickness h) in (u, s) coordinates: its bounding box, and its extent
 * along each of its two edge normals (the separating axes).
 */
interface Quad {
  uMin: number;
  uMax: number;
  sMin: number;
  sMax: number;
  axes: { nx: number; ny: number; min: number; max: number }[];
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
  const us = corners.map((c) => c[0]);
  const ss = corners.map((c) => c[1]);
  const axes: Quad['axes'] = [];
  for (let k = 0; k < 2; k++) {
    const a = corners[k] as Vec2;
    const b = corners[k + 1] as Vec2;
    const nx = -(b[1] - a[1]);
    const ny = b[0] - a[0];
    const along = corners.map((c) => c[0] * nx + c[1] * ny);
    axes.push({ nx, ny, min: Math.min(...along), max: Math.max(...along) });
  }
  return {
    uMin: Math.min(...us),
    uMax: Math.max(...us),
    sMin: Math.min(...ss),
    sMax: Math.max(...ss),
    axes,
  };
}

/**
 * Where in (from, to) some chord of A, thickened, meets some chord of B, thickened: box against the rhombus by
 * separating axes, each a linear inequality in t since the chord ends move linearly (`mid` is where the
 * chords were taken). Open intervals, in no particular order.
 */
function meetings(
  ca: readonly Chord[],
  cb: readonly Chord[],
  quad: Quad,
  mid: number,
  from: number,
  to: number,
): [number, number][] {
  const out: [number, number][] = [];
  for (const a of ca) {
    for (const b of cb) {
      let lo = from;
      let hi = to;
      // v + slope·(t − mid) > 0
      const keep = (v: number, slope: number) => {
        if (slope === 0) {
          if (!(v > 0)) hi = lo;
          return;
        }
        const root = mid - v / slope;
        if (slope > 0) lo = Math.max(lo, root);
        else hi = Math.min(hi, root);
      };
      keep(a.hi.at - quad.uMin, a.hi.slope);
      keep(quad.uMax - a.lo.at, -a.lo.slope);
      keep(b.hi.at - quad.sMin, b.hi.slope);
      keep(quad.sMax - b.lo.at, -b.lo.slope);
      for (const { nx, ny, min, max } of quad.axes) {
        // The box's extent along the normal, from the corners that give it.
        const [u0, u1] = nx >= 0 ? [a.lo, a.hi] : [a.hi, a.lo];
        const [s0, s1] = ny >= 0 ? [b.lo, b.hi] : [b.hi, b.lo];
        keep(u1.at * nx + s1.at * ny - min, u1.slope * nx + s1.slope * ny);
        keep(max - u0.at * nx - s0.at * ny, -(u0.slope * nx + s0.slope * ny));
      }
      if (hi > lo) out.push([lo, hi]);
    }
  }
  return out;
}
