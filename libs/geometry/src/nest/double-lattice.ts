/**
 * Double-lattice search for many congruent pieces, on the convex hull of the piece.
 *
 * A double-lattice packing lays a convex body K on a lattice Λ and its copy turned 180° (−K, a point
 * reflection) on the shifted lattice Λ + t (G. Kuperberg & W. Kuperberg, "Double-lattice packings of convex
 * bodies in the plane", Discrete Comput. Geom. 5, 1990 — venue from memory; they show every convex body has
 * one of density ≥ √3/2, and the densest one of the regular pentagon has density (5 − √5)/3). D. M. Mount
 * ("The densest double-lattice packing of a convex polygon", DIMACS Series 6, 1991) and D. M. Mount & R.
 * Silverman (lattice packings of translates of a convex polygon, J. Algorithms 11, 1990) compute these optima
 * exactly by walking the polygon's boundary (titles and venues from memory). Here the optimum is found
 * numerically instead, the same way for every shape, by searching the three parameters that fix a double lattice
 * once one lattice vector is laid along the sheet's bottom edge:
 *  - the rotation θ of the piece;
 *  - the offset t of the turned copy, taken on the boundary of the no-fit polygon of K with −K (for convex K
 *    that no-fit polygon is K ⊕ K = 2K, so t is a touching position of the pair);
 *  - the horizontal offset bx of the second lattice vector b = (bx, by).
 * For each, the row vector a = (ax, 0) is the shortest one leaving every copy clear, and by is the lowest row
 * height leaving every copy clear: the lattice must avoid the union U of the interiors of the no-fit polygon
 * K ⊕ (−K) (copies on the same lattice, Minkowski difference body) and 2K − t and t − 2K (copies on the other
 * lattice). U is centrally symmetric and star-shaped about the origin, so the shortest clear horizontal vector
 * is where the x-axis leaves U, and the critical lattices of U (Minkowski; Mahler's theory of star bodies) have a
 * vector on its boundary, which is why laying one vector along the x-axis and sweeping θ loses nothing.
 * With no turned copy (t unused) the same search gives the densest single lattice with a horizontal vector.
 *
 * On a sheet the densest lattice is not always the fullest, so every lattice within a few per cent of the
 * densest one found is clipped to the usable rectangle (sheet less margin), at several origins and with its
 * rows horizontal or vertical, and the one holding the most pieces wins (then the densest). The gap is honoured
 * by growing the hull by gap/2 (plus a few µm for rounding) with round joins drawn as circumscribed polygons,
 * so hulls that merely touch keep the true pieces at least the gap apart.
 *
 * Everything here is plain floating point in millimetres; placements are checked again by the caller on the
 * true outlines in integer units.
 */
import { circumscribedConvex, convexHull, rotatePolygon, signedArea, type Point } from './polygon';
import { M, INF } from '../math/hot-globals';

/** A convex polygon, counter-clockwise, with its bounding box. */
interface Convex {
  xs: Float64Array;
  ys: Float64Array;
  minX: number;
  maxX: number;
  minY: number;
  maxY: number;
}

function convex(points: readonly Point[]): Convex {
  const n = points.length;
  const xs = new Float64Array(n);
  const ys = new Float64Array(n);
  let minX = INF;
  let maxX = -INF;
  let minY = INF;
  let maxY = -INF;
  for (let i = 0; i < n; i++) {
    const [x, y] = points[i]!;
    xs[i] = x;
    ys[i] = y;
    if (x < minX) minX = x;
    if (x > maxX) maxX = x;
    if (y < minY) minY = y;
    if (y > maxY) maxY = y;
  }
  return { xs, ys, minX, maxX, minY, maxY };
}

/**
 * The convex polygon grown by r with round joins, each arc replaced by a polygon circumscribing it (steps of at
 * most 15°), so the result contains the exact round offset K ⊕ disc(r).
 */
export function roundGrow(hull: readonly Point[], r: number): Point[] {
  if (r <= 0) return hull.map((p) => [p[0], p[1]] as Point);
  const n = hull.length;
  const out: Point[] = [];
  for (let i = 0; i < n; i++) {
    const prev = hull[(i - 1 + n) % n]!;
    const v = hull[i]!;
    const next = hull[(i + 1) % n]!;
    const a1 = M.atan2(-(v[0] - prev[0]), v[1] - prev[1]); // outward normal of the incoming edge
    const a2 = M.atan2(-(next[0] - v[0]), next[1] - v[1]);
    let turn = a2 - a1;
    while (turn < 0) turn += 2 * M.PI;
    while (turn >= 2 * M.PI) turn -= 2 * M.PI;
    const m = M.max(1, M.ceil(turn / (M.PI / 12)));
    const step = turn / m;
    const R = r / M.cos(step / 2);
    for (let k = 0; k < m; k++) {
      const ang = a1 + (k + 0.5) * step;
      out.push([v[0] + R * M.cos(ang), v[1] + R * M.sin(ang)]);
    }
  }
  return convexHull(out);
}

/** Result of the last verticalSpan call (kept in module scope: the sweep calls it millions of times). */
let spanLo = 0;
let spanHi = 0;

/** Whether the interior of c shifted by (ox, oy) meets the vertical line at x; the open interval in spanLo/Hi. */
function verticalSpan(c: Convex, x: number, ox: number, oy: number): boolean {
  const u = x - ox;
  if (u <= c.minX || u >= c.maxX) return false;
  let lo = INF;
  let hi = -INF;
  const xs = c.xs;
  const ys = c.ys;
  const n = xs.length;
  for (let i = 0; i < n; i++) {
    const j = i + 1 === n ? 0 : i + 1;
    const ax = xs[i]!;
    const bx = xs[j]!;
    if (ax === bx || (u < ax && u < bx) || (u > ax && u > bx)) continue;
    const ay = ys[i]!;
    const y = ay + ((u - ax) * (ys[j]! - ay)) / (bx - ax);
    if (y < lo) lo = y;
    if (y > hi) hi = y;
  }
  if (!(hi > lo)) return false;
  spanLo = lo + oy;
  spanHi = hi + oy;
  return true;
}

/** The same for the horizontal line at y. */
function horizontalSpan(c: Convex, y: number, ox: number, oy: number): [number, number] | null {
  const v = y - oy;
  if (v <= c.minY || v >= c.maxY) return null;
  let lo = INF;
  let hi = -INF;
  const n = c.xs.length;
  for (let i = 0; i < n; i++) {
    const ay = c.ys[i]!;
    const by = c.ys[(i + 1) % n]!;
    if (ay === by || (v < ay && v < by) || (v > ay && v > by)) continue;
    const ax = c.xs[i]!;
    const x = ax + ((v - ay) * (c.xs[(i + 1) % n]! - ax)) / (by - ay);
    if (x < lo) lo = x;
    if (x > hi) hi = x;
  }
  return hi > lo ? [lo + ox, hi + ox] : null;
}

/** True when (px, py) lies strictly inside c shifted by (ox, oy) (more than 1e-9 mm² of cross product). */
function strictlyInsideConvex(c: Convex, px: number, py: number, ox: number, oy: number): boolean {
  const u = px - ox;
  const v = py - oy;
  if (u <= c.minX || u >= c.maxX || v <= c.minY || v >= c.maxY) return false;
  const n = c.xs.length;
  for (let i = 0; i < n; i++) {
    const ax = c.xs[i]!;
    const ay = c.ys[i]!;
    const j = (i + 1) % n;
    if ((c.xs[j]! - ax) * (v - ay) - (c.ys[j]! - ay) * (u - ax) <= 1e-9) return false;
  }
  return true;
}

/** The forbidden region U as shifted convex pieces: lattice points (other than 0) must avoid every interior. */
interface Component {
  c: Convex;
  ox: number;
  oy: number;
}

function inU(comps: readonly Component[], x: number, y: number): boolean {
  for (const k of comps) if (strictlyInsideConvex(k.c, x, y, k.ox, k.oy)) return true;
  return false;
}

/** Where the positive x-axis leaves U (U is star-shaped about 0): the shortest clear row vector. */
function rowLength(comps: readonly Component[]): number {
  let ax = 0;
  for (const k of comps) {
    const s = horizontalSpan(k.c, 0, k.ox, k.oy);
    if (s && s[0] <= 1e-7 && s[1] > ax) ax = s[1];
  }
  return ax;
}

const ivLo = new Float64Array(256);
const ivHi = new Float64Array(256);

/**
 * Lowest by > 0 with every point (bx + k·ax, by) outside U, and the lattice rows above it clear too; null when
 * that row height leaves a higher row inside U.
 */
function rowHeight(comps: readonly Component[], ax: number, bx: number, topY: number): number | null {
  let count = 0;
  for (const k of comps) {
    const k0 = M.ceil((k.c.minX + k.ox - bx) / ax);
    const k1 = M.floor((k.c.maxX + k.ox - bx) / ax);
    for (let q = k0; q <= k1 && count < ivLo.length; q++)
      if (verticalSpan(k.c, bx + q * ax, k.ox, k.oy) && spanHi > 0) {
        ivLo[count] = spanLo;
        ivHi[count] = spanHi;
        count++;
      }
  }
  // Lowest y > 0 in no open interval: raise y past every interval containing it until none does.
  let y = 1e-6;
  for (let changed = true; changed;) {
    changed = false;
    for (let i = 0; i < count; i++)
      if (ivLo[i]! < y && ivHi[i]! > y) {
        y = ivHi[i]!;
        changed = true;
      }
  }
  for (let m = 2; m * y < topY; m++) {
    const x0 = m * bx;
    for (let q = M.floor((-topY - x0) / ax) - 1; q * ax + x0 <= topY + ax; q++)
      if (inU(comps, x0 + q * ax, m * y)) return null;
  }
  return y;
}

/** One double (or single) lattice: pieces at θ on Λ = {i·a + j·b}, the turned copies at Λ + t. */
export interface LatticeSpec {
  thetaDeg: number;
  partner: boolean;
  t: [number, number];
  ax: number;
  bx: number;
  by: number;
  /** Pieces' area (true outline) per unit area of the plane. */
  density: number;
}

/** The geometry of one piece for the search: true outline, hull grown by half the clearance, and its sums. */
interface Prepared {
  outline: Point[];
  area: number;
  q0: Point[];
  d0: Point[];
  s0: Point[];
  /** Perimeter parameters of s0's vertices (fractions), to sample t on its boundary. */
  sPerim: number[];
}

/** Most vertices of the hull the search works on; a finer hull is replaced by a containing one this coarse. */
const HULL_VERTICES = 64;

function prepare(outline: readonly Point[], clearanceMm: number): Prepared {
  const own = outline.map((p) => [p[0], p[1]] as Point);
  // The sweep's cost grows with the hull's vertices (a finely drawn 1,000-point circle took 19 s): search on a
  // containing polygon of at most HULL_VERTICES vertices, which is the hull itself for any usual piece.
  const hull = circumscribedConvex(convexHull(own), HULL_VERTICES);
  const q0 = roundGrow(hull, clearanceMm / 2);
  // Minkowski difference body Q ⊕ (−Q) and sum Q ⊕ Q = 2Q (convex), as hulls of the vertex sums.
  const diff: Point[] = [];
  for (const p of q0) for (const q of q0) diff.push([p[0] - q[0], p[1] - q[1]]);
  const d0 = convexHull(diff);
  const s0 = q0.map((p) => [2 * p[0], 2 * p[1]] as Point);
  const lens: number[] = [];
  let total = 0;
  for (let i = 0; i < s0.length; i++) {
    const a = s0[i]!;
    const b = s0[(i + 1) % s0.length]!;
    const l = M.hypot(b[0] - a[0], b[1] - a[1]);
    lens.push(total);
    total += l;
  }
  return {
    outline: own,
    area: M.abs(signedArea(own)),
    q0,
    d0,
    s0,
    sPerim: lens.map((l) => l / total),
  };
}

/** Point on the boundary of polygon `poly` at perimeter fraction f. */
function boundaryPoint(poly: readonly Point[], f: number): [number, number] {
  let total = 0;
  const lens = poly.map((a, i) => {
    const b = poly[(i + 1) % poly.length]!;
    const l = M.hypot(b[0] - a[0], b[1] - a[1]);
    total += l;
    return l;
  });
  let s = (((f % 1) + 1) % 1) * total;
  for (let i = 0; i < poly.length; i++) {
    const l = lens[i]!;
    if (s <= l || i === poly.length - 1) {
      const a = poly[i]!;
      const b = poly[(i + 1) % poly.length]!;
      const u = l === 0 ? 0 : M.min(1, s / l);
      return [a[0] + u * (b[0] - a[0]), a[1] + u * (b[1] - a[1])];
    }
    s -= l;
  }
  return [poly[0]![0], poly[0]![1]];
}

/** The pieces of U for one rotation and partner offset. */
interface Rotated {
  thetaDeg: number;
  d: Convex;
  s: Convex;
  negS: Convex;
  sPts: Point[];
  topY: number;
}

function rotated(p: Prepared, thetaDeg: number): Rotated {
  const d = convex(rotatePolygon(p.d0, thetaDeg));
  const sPts = rotatePolygon(p.s0, thetaDeg);
  const s = convex(sPts);
  const negS = convex(sPts.map((q) => [-q[0], -q[1]] as Point));
  const topY = M.max(d.maxY, s.maxY - s.minY) + 1;
  return { thetaDeg, d, s, negS, sPts, topY };
}

function componentsFor(r: Rotated, t: [number, number] | null): Component[] {
  const comps: Component[] = [{ c: r.d, ox: 0, oy: 0 }];
  if (t) {
    comps.push({ c: r.s, ox: -t[0], oy: -t[1] });
    comps.push({ c: r.negS, ox: t[0], oy: t[1] });
  }
  return comps;
}

/** Lattice for rotation r, partner offset t (or none) and second-vector offset fraction f of the row. */
function latticeAt(p: Prepared, r: Rotated, t: [number, number] | null, f: number): LatticeSpec | null {
  const comps = componentsFor(r, t);
  const ax = rowLength(comps);
  if (!(ax > 0)) return null;
  const bx = (((f % 1) + 1) % 1) * ax;
  const by = rowHeight(comps, ax, bx, r.topY);
  if (by === null) return null;
  const cells = t ? 2 : 1;
  return {
    thetaDeg: r.thetaDeg,
    partner: t !== null,
    t: t ?? [0, 0],
    ax,
    bx,
    by,
    density: (cells * p.area) / (ax * by),
  };
}

function normDeg(d: number): number {
  const r = ((d % 360) + 360) % 360;
  return M.round(r * 1e6) / 1e6 >= 360 ? 0 : M.round(r * 1e6) / 1e6;
}

/** Search space of one run. */
export interface SearchOptions {
  /** Rotations to try (degrees); with `free`, refined continuously around the best. */
  anglesDeg: readonly number[];
  /** Whether any rotation is allowed (continuous refinement of θ). */
  free: boolean;
  /** Whether the turned copy at θ + 180° may be used for rotation θ. */
  partnerAllowed: (thetaDeg: number) => boolean;
  /** Boundary samples of t per search, and offsets of the second vector per row. */
  tSamples?: number;
  fSamples?: number;
}

interface Sample {
  r: Rotated;
  t: [number, number] | null;
  sParam: number;
  f: number;
  lat: LatticeSpec;
  /** Shared by the samples of one rotation and t: inner-fit rectangles, rows along the width / the height. */
  cell?: { members: (Member[] | undefined)[] };
}

function tParams(p: Prepared, count: number): number[] {
  const set = new Set<number>(p.sPerim);
  for (let i = 0; i < count; i++) set.add(i / count);
  return [...set];
}

/**
 * Coarse sweep over θ, t and bx: the valid lattices found, less those already below `keepFraction` of the
 * densest found so far (they would be dropped later anyway).
 */
function sweep(p: Prepared, opts: SearchOptions, keepFraction = 0): Sample[] {
  const out: Sample[] = [];
  let maxDensity = 0;
  const push = (s: Sample) => {
    if (s.lat.density < keepFraction * maxDensity) return;
    if (s.lat.density > maxDensity) maxDensity = s.lat.density;
    out.push(s);
  };
  const sParams = tParams(p, opts.tSamples ?? 64);
  const fCount = opts.fSamples ?? 24;
  for (const deg of opts.anglesDeg) {
    const r = rotated(p, deg);
    const single = { members: [] };
    for (let k = 0; k < fCount; k++) {
      const lat = latticeAt(p, r, null, k / fCount);
      if (lat) push({ r, t: null, sParam: 0, f: k / fCount, lat, cell: single });
    }
    if (!opts.partnerAllowed(deg)) continue;
    for (const sp of sParams) {
      const t = boundaryPoint(r.sPts, sp);
      const cell = { members: [] };
      for (let k = 0; k < fCount; k++) {
        const lat = latticeAt(p, r, t, k / fCount);
        if (lat) push({ r, t, sParam: sp, f: k / fCount, lat, cell });
      }
    }
  }
  return out;
}

/** Local pattern search on (θ, t, f) maximising density, from a sample. */
function refineDensity(p: Prepared, start: Sample, opts: SearchOptions, rounds = 60): Sample {
  let best = start;
  let dTheta = opts.free ? 1 : 0;
  let dS = 0.01;
  let dF = 1 / 48;
  const rotCache = new Map<number, Rotated>();
  const rot = (deg: number) => {
    const key = normDeg(deg);
    let r = rotCache.get(key);
    if (!r) {
      r = rotated(p, key);
      rotCache.set(key, r);
    }
    return r;
  };
  const evalAt = (deg: number, sp: number, f: number): Sample | null => {
    if (best.t && !opts.partnerAllowed(normDeg(deg))) return null;
    const r = rot(deg);
    const t = best.t ? boundaryPoint(r.sPts, sp) : null;
    const lat = latticeAt(p, r, t, f);
    return lat ? { r, t, sParam: sp, f, lat } : null;
  };
  for (let i = 0; i < rounds; i++) {
    let improved = false;
    const moves: [number, number, number][] = [
      [dTheta, 0, 0],
      [-dTheta, 0, 0],
      [0, dS, 0],
      [0, -dS, 0],
      [0, 0, dF],
      [0, 0, -dF],
    ];
    for (const [a, b, c] of moves) {
      if (a === 0 && b === 0 && c === 0) continue;
      if (b !== 0 && !best.t) continue;
      const s = evalAt(best.r.thetaDeg + a, best.sParam + b, best.f + c);
      if (s && s.lat.density > best.lat.density + 1e-12) {
        best = s;
        improved = true;
      }
    }
    if (!improved) {
      dTheta /= 2;
      dS /= 2;
      dF /= 2;
      if (dS < 1e-7 && dF < 1e-7) break;
    }
  }
  return best;
}

function symmetricAngles(periodDeg: number, steps: number): number[] {
  return Array.from({ length: steps }, (_, i) => (i * periodDeg) / steps);
}

/**
 * Densest double lattice (and single lattice) of the piece on the whole plane, with every copy at least
 * clearanceMm apart: the search above with θ free over one symmetry period, then refined. Density counts the
 * true outline's area.
 */
export function densestDoubleLattice(
  outline: readonly Point[],
  clearanceMm = 0,
  symmetryPeriodDeg = 360,
): LatticeSpec | null {
  const p = prepare(outline, clearanceMm);
  const opts: SearchOptions = {
    anglesDeg: symmetricAngles(M.min(symmetryPeriodDeg, 360), 24),
    free: true,
    partnerAllowed: () => true,
    tSamples: 48,
    fSamples: 24,
  };
  const samples = sweep(p, opts);
  samples.sort((a, b) => b.lat.density - a.lat.density);
  let best: Sample | null = null;
  for (const s of samples.slice(0, 8)) {
    const r = refineDensity(p, s, opts);
    if (!best || r.lat.density > best.lat.density) best = r;
  }
  return best?.lat ?? null;
}

/** The usable rectangle and the clearance for the sheet search. */
export interface SheetSpec {
  widthMm: number;
  heightMm: number;
  marginMm: number;
  gapMm: number;
}

export interface LatticePlacement {
  /** Rotation of the piece, degrees CCW, and its translation in mm (sheet frame). */
  rotationDeg: number;
  x: number;
  y: number;
}

export interface SheetLattice {
  lattice: LatticeSpec;
  /** Rows along the sheet's width (false) or its height (true). */
  columns: boolean;
  placements: LatticePlacement[];
  description: string;
}

interface Member {
  deg: number;
  dx: number;
  dy: number;
  x0: number;
  x1: number;
  y0: number;
  y1: number;
}

/** Inner-fit rectangle (mm, shrunk by 1 µm for rounding) of the outline at deg on a W × H sheet. */
function memberFor(
  p: Prepared,
  deg: number,
  dx: number,
  dy: number,
  W: number,
  H: number,
  m: number,
): Member {
  const rot = rotatePolygon(p.outline, deg);
  let minX = INF;
  let maxX = -INF;
  let minY = INF;
  let maxY = -INF;
  for (const [x, y] of rot) {
    if (x < minX) minX = x;
    if (x > maxX) maxX = x;
    if (y < minY) minY = y;
    if (y > maxY) maxY = y;
  }
  const e = 0.001;
  return { deg, dx, dy, x0: m - minX + e, x1: W - m - maxX - e, y0: m - minY + e, y1: H - m - maxY - e };
}

/** Pieces of the lattice inside the usable rectangle for origin (ox, oy); pushes them to out when given. */
function countAt(
  members: readonly Member[],
  lat: LatticeSpec,
  ox: number,
  oy: number,
  out: { member: Member; x: number; y: number }[] | null,
): number {
  let n = 0;
  const { ax, bx, by } = lat;
  for (const mb of members) {
    if (mb.x1 < mb.x0 || mb.y1 < mb.y0) continue;
    const j0 = M.ceil((mb.y0 - oy - mb.dy) / by - 1e-9);
    const j1 = M.floor((mb.y1 - oy - mb.dy) / by + 1e-9);
    for (let j = j0; j <= j1; j++) {
      const xs = ox + j * bx + mb.dx;
      const i0 = M.ceil((mb.x0 - xs) / ax - 1e-9);
      const i1 = M.floor((mb.x1 - xs) / ax + 1e-9);
      if (i1 < i0) continue;
      n += i1 - i0 + 1;
      if (out)
        for (let i = i0; i <= i1; i++) out.push({ member: mb, x: xs + i * ax, y: oy + j * by + mb.dy });
    }
  }
  return n;
}

/** Fullest origin for a lattice on a W × H usable sheet: rows aligned to an edge, some row flush left/right. */
function bestOrigin(members: readonly Member[], lat: LatticeSpec): { count: number; ox: number; oy: number } {
  const oys: number[] = [];
  for (const mb of members) oys.push(mb.y0 - mb.dy, mb.y1 - mb.dy);
  let best = { count: 0, ox: 0, oy: 0 };
  for (const oy of oys) {
    const oxs: number[] = [];
    for (const mb of members)
      for (let j = -3; j <= 3; j++) {
        const row = M.round(((mb.y0 - oy - mb.dy) / lat.by) as number) + j;
        oxs.push(mb.x0 - mb.dx - row * lat.bx, mb.x1 - mb.dx - row * lat.bx);
      }
    for (const ox of oxs) {
      const c = countAt(members, lat, ox, oy, null);
      if (c > best.count) best = { count: c, ox, oy };
    }
  }
  return best;
}

function membersFor(p: Prepared, lat: LatticeSpec, W: number, H: number, m: number): Member[] {
  const list = [memberFor(p, lat.thetaDeg, 0, 0, W, H, m)];
  if (lat.partner) list.push(memberFor(p, lat.thetaDeg + 180, lat.t[0], lat.t[1], W, H, m));
  return list;
}

/** Upper bound on countAt over all origins: per member, its most rows times its most pieces per row. */
function countBound(members: readonly Member[], lat: LatticeSpec): number {
  let n = 0;
  for (const mb of members) {
    if (mb.x1 < mb.x0 || mb.y1 < mb.y0) continue;
    n += (M.floor((mb.y1 - mb.y0) / lat.by + 1e-9) + 1) * (M.floor((mb.x1 - mb.x0) / lat.ax + 1e-9) + 1);
  }
  return n;
}

/**
 * Lattices within this fraction of the densest found are clipped to the sheet and counted. The fullest sheets
 * of the bench shapes came from lattices 4–7 % below the densest (hexagons: rows shifted so one more row fits).
 */
const NEAR_DENSEST = 0.92;

/**
 * Lattice arrangements of copies of one piece on a sheet, fullest first (at most `keep`): double lattices of the
 * piece and its 180° copy and single lattices, over the rotations allowed, rows along the width or the height.
 * Placements are in sheet millimetres; the caller checks them on the true outlines.
 */
export function sheetLattices(
  outline: readonly Point[],
  sheet: SheetSpec,
  opts: SearchOptions,
  keep = 4,
): SheetLattice[] {
  // Clearance: the gap plus 10 µm. Rounding positions and outlines to whole µm moves pieces by under 2 µm, and
  // the caller's direct check (clearOfItems) asks for the gap less 1 µm, or with no gap for 5 µm of daylight.
  const p = prepare(outline, sheet.gapMm + 0.01);
  const samples = sweep(p, opts, NEAR_DENSEST);
  if (samples.length === 0) return [];
  // The densest lattices themselves, refined from the best few samples of the sweep, are candidates too.
  const top: Sample[] = [];
  for (const s of samples) {
    if (top.length < 3) top.push(s);
    else if (s.lat.density > top[2]!.lat.density) top[2] = s;
    else continue;
    top.sort((a, b) => b.lat.density - a.lat.density);
  }
  for (const s of top) samples.push(refineDensity(p, s, opts));
  let maxDensity = 0;
  for (const s of samples) maxDensity = M.max(maxDensity, s.lat.density);
  // Sheets favour lattices whose rows fit the edges; those within 12 % of the densest are clipped and counted.
  const near = samples.filter((s) => s.lat.density >= NEAR_DENSEST * maxDensity);
  near.sort((a, b) => b.lat.density - a.lat.density);
  const { widthMm: W, heightMm: H, marginMm: m } = sheet;
  interface Scored {
    s: Sample;
    columns: boolean;
    count: number;
    ox: number;
    oy: number;
  }
  const scored: Scored[] = [];
  // Members (inner-fit rectangles) depend on the rotation and t only: built once per cell.
  let bestCount = 0;
  for (const s of near) {
    const lat = s.lat;
    const cell = (s.cell ??= { members: [] });
    for (const columns of [false, true]) {
      const slot = columns ? 1 : 0;
      let members = cell.members[slot];
      if (!members) {
        members = columns ? membersFor(p, lat, H, W, m) : membersFor(p, lat, W, H, m);
        cell.members[slot] = members;
      }
      // Cannot beat the fullest so far: skip the origin search.
      if (countBound(members, lat) < bestCount) continue;
      const o = bestOrigin(members, lat);
      if (o.count > 0) scored.push({ s, columns, count: o.count, ox: o.ox, oy: o.oy });
      bestCount = M.max(bestCount, o.count);
    }
  }
  scored.sort((a, b) => b.count - a.count || b.s.lat.density - a.s.lat.density);
  const out: SheetLattice[] = [];
  const seen = new Set<string>();
  for (const sc of scored) {
    if (out.length >= keep) break;
    const sig = `${sc.count}|${sc.columns}|${sc.s.lat.partner}|${sc.s.lat.density.toFixed(4)}`;
    if (seen.has(sig)) continue;
    seen.add(sig);
    const lat = sc.s.lat;
    const members = sc.columns ? membersFor(p, lat, H, W, m) : membersFor(p, lat, W, H, m);
    const pts: { member: Member; x: number; y: number }[] = [];
    countAt(members, lat, sc.ox, sc.oy, pts);
    // Rows along the height: lay out on the H × W sheet, then turn the layout 90° CCW and shift it by W.
    const placements = pts.map((q) =>
      sc.columns
        ? { rotationDeg: normDeg(q.member.deg + 90), x: W - q.y, y: q.x }
        : { rotationDeg: normDeg(q.member.deg), x: q.x, y: q.y },
    );
    const kind = lat.partner ? 'double lattice' : 'lattice';
    out.push({
      lattice: lat,
      columns: sc.columns,
      placements,
      description:
        `${kind} ${normDeg(lat.thetaDeg + (sc.columns ? 90 : 0)).toFixed(1)}°` +
        `${lat.partner ? `/${normDeg(lat.thetaDeg + 180 + (sc.columns ? 90 : 0)).toFixed(1)}°` : ''}` +
        `, ${sc.columns ? 'columns' : 'rows'}, density ${lat.density.toFixed(3)}`,
    });
  }
  return out;
}
