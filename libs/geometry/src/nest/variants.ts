/**
 * Rotated copies ("variants") of each part in integer units, their gap-grown outlines, and a cache of no-fit
 * polygons between variants. No-fit polygons are Minkowski sums computed by Clipper (see clipper-adapter.ts),
 * the construction described in Bennell & Oliveira's tutorial on nesting geometry (EJOR 184, 2008).
 */
import { convexPieces } from './convex-decomposition';
import {
  areaUnits,
  boxOfPaths,
  cleanPath,
  closePolygon,
  growPolygon,
  intersectPaths,
  noFitPolygonByConvolution,
  noFitPolygonFromPieces,
  noFitPolygon,
  pointInPath,
  reflexCorners,
  simplifyContaining,
  toIntPath,
  SCALE_PER_MM,
  type IntPath,
  type IntPaths,
} from './clipper-adapter';
import { boundsOf, convexHull, rotatePolygon, signedArea, type Bounds, type Point } from './polygon';
import { M } from '../math/hot-globals';

/** Extra clearance added to the gap so rounding to integer units never brings parts closer than the gap. */
export const GAP_SAFETY_MM = 0.01;

export interface IntBounds {
  minX: number;
  minY: number;
  maxX: number;
  maxY: number;
}

export interface Variant {
  key: string;
  partIndex: number;
  rotationDeg: number;
  /** Rotated outline, counter-clockwise, integer units. */
  poly: IntPath;
  /** Bounds of the exact (floating) rotated outline, mm. */
  bounds: Bounds;
  /** Bounds rounded outward, integer units. */
  ubounds: IntBounds;
  areaMm2: number;
}

export interface PreparedPart {
  index: number;
  id: string;
  group: string;
  quantity: number;
  /** Counter-clockwise outline in mm, as given (orientation normalised). */
  outline: Point[];
  areaMm2: number;
  rotationsDeg: number[];
  /** Rotations the pattern pass may try (a finer sweep when rotation is free). */
  patternRotationsDeg: number[];
  /** Any rotation allowed ('auto'): the double-lattice search then sweeps the rotation continuously. */
  freeRotation?: boolean;
  /** A counter-clockwise outline containing `outline` in the same frame, for the pattern pass (see nest.ts). */
  envelope?: Point[];
}

function normaliseAngle(deg: number): number {
  const r = ((deg % 360) + 360) % 360;
  const rounded = M.round(r * 1e6) / 1e6;
  return rounded >= 360 ? 0 : rounded;
}

/** A congruence key: the rotated outline moved to its lower-left bounding corner, as a sorted vertex list. */
function shapeKey(outline: Point[], deg: number): string {
  const rot = rotatePolygon(outline, deg);
  const b = boundsOf(rot);
  return rot
    .map(([x, y]) => `${M.round((x - b.minX) * 100)},${M.round((y - b.minY) * 100)}`)
    .sort()
    .join(';');
}

/**
 * Candidate rotations when the caller says 'auto', in this order of preference: 0°, 180°, then for each of the
 * convex-hull edges (longest first) the rotation that lays that edge flat at the bottom and the one that lays
 * it flat at the top, then 90° and 270°.
 * Rotations giving the same shape (by the part's own symmetry) are kept once. At most maxCount are returned,
 * and a rotation's 180° partner is kept with it where possible (double-lattice patterns need both).
 */
export function autoRotations(outline: Point[], maxCount = 4): number[] {
  const hull = convexHull(outline);
  const edges: { len: number; deg: number }[] = [];
  for (let i = 0; i < hull.length; i++) {
    const a = hull[i] as Point;
    const b = hull[(i + 1) % hull.length] as Point;
    const dir = (M.atan2(b[1] - a[1], b[0] - a[0]) * 180) / M.PI;
    edges.push({ len: M.hypot(b[0] - a[0], b[1] - a[1]), deg: normaliseAngle(-dir) });
  }
  edges.sort((p, q) => q.len - p.len);
  const wanted: number[] = [0, 180];
  for (const e of edges) wanted.push(e.deg, normaliseAngle(e.deg + 180));
  wanted.push(90, 270);
  const out: number[] = [];
  const seen = new Set<string>();
  for (const d of wanted) {
    if (out.length >= maxCount) break;
    const deg = normaliseAngle(d);
    if (out.includes(deg)) continue;
    const key = shapeKey(outline, deg);
    if (seen.has(key)) continue;
    seen.add(key);
    out.push(deg);
  }
  return out;
}

/**
 * The smallest rotation (360°/k) that maps the outline onto itself, found by comparing congruence keys;
 * 360 for an outline with no rotational symmetry.
 */
export function symmetryPeriodDeg(outline: Point[]): number {
  const base = shapeKey(outline, 0);
  for (let k = 12; k >= 2; k--) if (shapeKey(outline, 360 / k) === base) return 360 / k;
  return 360;
}

/**
 * Rotations for the pattern pass when rotation is free: the auto set plus an even sweep over one symmetry
 * period of the outline (sweeps primaries of them), each with its 180° partner, congruent duplicates removed.
 * Twelve steps (every 15°, with partners, for a slotted piece with no symmetry): on the bench, coarser sweeps missed the
 * interlocking arrangements of {7/2} and {8/3} stars (two more pieces per sheet), at no cost to the layouts.
 */
export function patternRotations(outline: Point[], sweeps = 12): number[] {
  const list: number[] = [];
  for (const d of autoRotations(outline)) list.push(d, d + 180);
  const period = symmetryPeriodDeg(outline);
  const span = M.min(period, 180);
  for (let i = 0; i < sweeps; i++) {
    const d = (i * span) / sweeps;
    list.push(d, d + 180);
  }
  return distinctRotations(outline, list);
}

/** Removes rotations that give congruent placements of the same outline (keeps the first of each). */
export function distinctRotations(outline: Point[], rotationsDeg: readonly number[]): number[] {
  const out: number[] = [];
  const seen = new Set<string>();
  for (const d of rotationsDeg) {
    const deg = normaliseAngle(d);
    const key = shapeKey(outline, deg);
    if (seen.has(key)) continue;
    seen.add(key);
    out.push(deg);
  }
  return out;
}

export { normaliseAngle };

export interface NfpEntry {
  paths: IntPaths;
  box: IntBounds;
}

/**
 * Outline used for no-fit polygons, as a rotated and shifted copy of a shared "NFP shape": the part's outline
 * with its narrow notches closed (see nfpOutline). closed(part) ≈ R(thetaDeg)·shape + (ox, oy), integer units.
 */
interface ShapeRef {
  shape: number;
  thetaDeg: number;
  ox: number;
  oy: number;
}

/** One rotation of an NFP shape: its closed outline and that outline grown by the gap (integer units). */
interface ShapeVariant {
  poly: IntPath;
  grown: IntPaths;
  grownPieces?: IntPaths | null;
  negatedPieces?: IntPaths | null;
}

/**
 * How far (µm) the closed outlines of two parts may differ and still share one NFP shape; the shared shapes are
 * grown by this much more (plus rounding) so the shared no-fit polygons still contain every true one.
 */
const SHARE_TOL_UNITS = 4;
const SHARE_EXTRA_MM = (2 * SHARE_TOL_UNITS + 5) / SCALE_PER_MM;

/**
 * Extra closing radius beyond the gap (mm): notches narrower than 2 × (gap + this) are closed for no-fit
 * polygons. Why this loses (almost) nothing: a point of another part must stay at least the gap away from this
 * part, so it can never lie inside a notch narrower than 2 × gap (every point there is within half the notch
 * width of a wall); in a notch narrower than 2 × gap + 2 × NOTCH_SLACK_MM only a feature thinner than
 * 2 × NOTCH_SLACK_MM could enter. Closing the notch also forbids positions near its mouth that are within the
 * gap of the filled mouth but not of the part: a lens at most gap − √(gap² − w²/4) deep (0.4 mm for a 3 mm slot
 * with a 3 mm gap). Validity never depends on this: the closed outline contains the true one, so its no-fit
 * polygon contains the true no-fit polygon, and every placement is checked against the true outlines.
 */
export const NOTCH_SLACK_MM = 0.5;

/**
 * A piece whose convex hull exceeds its closed outline by at most this fraction of the outline's area uses the
 * hull for no-fit polygons (slotted triangles of a 30-plane design: 12–17 %; squares with dog-boned slots: 3 %).
 * The pockets lost are the wide notches only a small part could use; the hull is convex, so its no-fit polygons
 * are single convex sums, and congruent pieces with different slots share one shape. Validity as above.
 */
export const HULL_NOTCH_FRACTION = 0.2;

/**
 * Drops hull vertices lying within tol units of the line through their neighbours (notch mouths on an edge,
 * left by floating-point noise), so congruent pieces with different notches get the same hull. Moves the hull
 * inward by at most tol, which SHARE_EXTRA_MM covers.
 */
function dropNearlyCollinear(path: IntPath, tol: number): IntPath {
  const out = [...path];
  for (let i = 0; out.length > 3 && i < out.length;) {
    const a = out[(i - 1 + out.length) % out.length]!;
    const b = out[i]!;
    const c = out[(i + 1) % out.length]!;
    const len = M.hypot(c.X - a.X, c.Y - a.Y);
    const dist = len === 0 ? 0 : M.abs((b.X - a.X) * (c.Y - a.Y) - (b.Y - a.Y) * (c.X - a.X)) / len;
    if (dist <= tol) out.splice(i, 1);
    else i++;
  }
  return out;
}

/**
 * Most reflex corners an outline for no-fit polygons may keep. A no-fit polygon is the union of the sums of
 * the two outlines' convex pieces, about (r + 1)² of them for r reflex corners each: 24 keeps one under about
 * 30 ms, where a finely sampled wavy outline of 380 vertices (190 reflex) took minutes.
 */
export const NFP_MAX_REFLEX = 24;

/**
 * An outline within the reflex-corner budget that contains `path`: `path` itself when it is within it, else
 * the first containing simplification (simplifyContaining) within it, the tolerance doubling from 0.05 mm up
 * to a twentieth of the outline's size; else the convex hull. Only pockets shallower than the tolerance are
 * given up, so finely sampled curves lose almost nothing; validity never depends on it (see NOTCH_SLACK_MM).
 */
function withinReflexBudget(path: IntPath, hull: IntPath): IntPath {
  if (reflexCorners(path) <= NFP_MAX_REFLEX) return path;
  const box = boxOfPaths([path]);
  const sizeMm = M.max(box.maxX - box.minX, box.maxY - box.minY) / SCALE_PER_MM;
  for (let tolMm = 0.05; tolMm <= sizeMm / 20; tolMm *= 2) {
    const simpler = simplifyContaining(path, tolMm);
    if (simpler && reflexCorners(simpler) <= NFP_MAX_REFLEX) return simpler;
  }
  return hull;
}

/**
 * The outline used for no-fit polygons: narrow notches closed, the hull for convex-ish pieces, and at most
 * NFP_MAX_REFLEX reflex corners.
 */
export function nfpOutline(outline: Point[], gapMm: number): IntPath {
  const path = toIntPath(outline);
  const hull = dropNearlyCollinear(toIntPath(convexHull(outline)), 1);
  // The closed outline lies between the outline and its hull: a hull within the fraction of the outline's own
  // area is within it of the closed outline's too, and the (slower) closing is skipped.
  if (areaUnits(hull) <= (1 + HULL_NOTCH_FRACTION) * areaUnits(path)) return hull;
  const closed = closePolygon(path, gapMm + NOTCH_SLACK_MM);
  return areaUnits(hull) <= (1 + HULL_NOTCH_FRACTION) * areaUnits(closed)
    ? hull
    : withinReflexBudget(closed, hull);
}

function centroidOf(path: IntPath): { x: number; y: number } {
  let a = 0;
  let cx = 0;
  let cy = 0;
  for (let i = 0; i < path.length; i++) {
    const p = path[i]!;
    const q = path[(i + 1) % path.length]!;
    const c = p.X * q.Y - q.X * p.Y;
    a += c;
    cx += (p.X + q.X) * c;
    cy += (p.Y + q.Y) * c;
  }
  return { x: cx / (3 * a), y: cy / (3 * a) };
}

/**
 * If `b` is `a` turned by some angle θ and shifted (same vertex cycle, every vertex within tol units), returns
 * θ (degrees) and the shift (units) with b ≈ R(θ)·a + shift; otherwise null. Mirror images are not matched.
 */
export function congruence(
  a: IntPath,
  b: IntPath,
  tol: number,
): { thetaDeg: number; ox: number; oy: number } | null {
  const n = a.length;
  if (b.length !== n || n < 3) return null;
  const ca = centroidOf(a);
  const cb = centroidOf(b);
  const a0 = a[0]!;
  const ra = M.hypot(a0.X - ca.x, a0.Y - ca.y);
  for (let i = 0; i < n; i++) {
    const bi = b[i]!;
    if (M.abs(M.hypot(bi.X - cb.x, bi.Y - cb.y) - ra) > tol) continue;
    const t = M.atan2(bi.Y - cb.y, bi.X - cb.x) - M.atan2(a0.Y - ca.y, a0.X - ca.x);
    const c = M.cos(t);
    const s = M.sin(t);
    let ok = true;
    for (let j = 0; j < n && ok; j++) {
      const p = a[j]!;
      const q = b[(i + j) % n]!;
      const x = (p.X - ca.x) * c - (p.Y - ca.y) * s + cb.x;
      const y = (p.X - ca.x) * s + (p.Y - ca.y) * c + cb.y;
      if (M.abs(x - q.X) > tol || M.abs(y - q.Y) > tol) ok = false;
    }
    if (!ok) continue;
    const thetaDeg = (t * 180) / M.PI;
    return { thetaDeg, ox: cb.x - (ca.x * c - ca.y * s), oy: cb.y - (ca.x * s + ca.y * c) };
  }
  return null;
}

/**
 * Vertices of no-fit polygons a cache keeps (per map), least recently used first out. Different parts rarely
 * meet again once placed, so their polygons are seldom used twice: unbounded, 800 different parts kept
 * about 7 million vertices (gigabytes); bounded, the same layouts come out as fast (measured on 400 and 800
 * random parts), and copies of a few parts, whose polygons are used again and again, stay well inside it.
 */
export const NFP_CACHE_VERTICES = 300_000;

/** A map of no-fit polygons that keeps at most `budget` vertices, dropping the least recently used. */
export class NfpLru {
  private readonly map = new Map<string, NfpEntry & { vertices: number }>();
  private vertices = 0;
  constructor(private readonly budget: number) {}

  get(key: string): NfpEntry | undefined {
    const hit = this.map.get(key);
    if (hit) {
      // Most recently used last (a Map keeps insertion order).
      this.map.delete(key);
      this.map.set(key, hit);
    }
    return hit;
  }

  set(key: string, entry: NfpEntry): void {
    let vertices = 0;
    for (const p of entry.paths) vertices += p.length;
    this.vertices += vertices - (this.map.get(key)?.vertices ?? 0);
    this.map.delete(key);
    this.map.set(key, { ...entry, vertices });
    if (this.vertices <= this.budget) return;
    // Down to three quarters of the budget at once, so that eviction runs now and then, not every time.
    for (const [k, e] of this.map) {
      if (this.vertices <= 0.75 * this.budget || k === key) break;
      this.map.delete(k);
      this.vertices -= e.vertices;
    }
  }
}

/** Builds and caches variants and no-fit polygons for one nesting run. */
export class GeometryCache {
  private readonly variants = new Map<string, Variant>();
  private readonly nfps = new NfpLru(NFP_CACHE_VERTICES);
  private readonly shapeNfps = new NfpLru(NFP_CACHE_VERTICES);
  private readonly shapeVariants = new Map<string, ShapeVariant>();
  /** Closed outlines (integer units, CCW, about the first part's origin) of the distinct NFP shapes. */
  private readonly shapes: IntPath[] = [];
  private readonly refOf: ShapeRef[];
  nfpCount = 0;

  constructor(
    readonly parts: readonly PreparedPart[],
    readonly gapMm: number,
  ) {
    this.refOf = parts.map((p) => {
      const closed = nfpOutline(p.outline, gapMm);
      for (let k = 0; k < this.shapes.length; k++) {
        const m = congruence(this.shapes[k]!, closed, SHARE_TOL_UNITS);
        if (m) return { shape: k, ...m };
      }
      this.shapes.push(closed);
      return { shape: this.shapes.length - 1, thetaDeg: 0, ox: 0, oy: 0 };
    });
  }

  /** Number of distinct NFP shapes (parts whose closed outlines are congruent share one). */
  get shapeCount(): number {
    return this.shapes.length;
  }

  variant(partIndex: number, rotationDeg: number): Variant {
    const deg = normaliseAngle(rotationDeg);
    const key = `${partIndex}@${deg}`;
    const hit = this.variants.get(key);
    if (hit) return hit;
    const part = this.parts[partIndex];
    if (!part) throw new Error(`no part ${partIndex}`);
    const rot = rotatePolygon(part.outline, deg);
    let poly = toIntPath(rot);
    if (signedArea(rot) < 0) poly = poly.reverse();
    const bounds = boundsOf(rot);
    const ubounds: IntBounds = {
      minX: M.floor(bounds.minX * SCALE_PER_MM),
      minY: M.floor(bounds.minY * SCALE_PER_MM),
      maxX: M.ceil(bounds.maxX * SCALE_PER_MM),
      maxY: M.ceil(bounds.maxY * SCALE_PER_MM),
    };
    const v: Variant = {
      key,
      partIndex,
      rotationDeg: deg,
      poly,
      bounds,
      ubounds,
      areaMm2: part.areaMm2,
    };
    this.variants.set(key, v);
    return v;
  }

  private shapeVariant(shape: number, deg: number): ShapeVariant {
    const key = `${shape}@${deg}`;
    const hit = this.shapeVariants.get(key);
    if (hit) return hit;
    const base = this.shapes[shape]!;
    const t = (deg * M.PI) / 180;
    const c = M.cos(t);
    const s = M.sin(t);
    const poly = base.map((q) => ({ X: M.round(q.X * c - q.Y * s), Y: M.round(q.X * s + q.Y * c) }));
    const sv: ShapeVariant = { poly, grown: growPolygon(poly, this.gapMm + GAP_SAFETY_MM + SHARE_EXTRA_MM) };
    this.shapeVariants.set(key, sv);
    return sv;
  }

  /** No-fit polygon between two NFP shapes at the given rotations (fixed at the origin). */
  private shapeNfp(fs: number, fixedDeg: number, ms: number, movingDeg: number): NfpEntry {
    const key = `${fs}@${fixedDeg}|${ms}@${movingDeg}`;
    const hit = this.shapeNfps.get(key);
    if (hit) return hit;
    // Rotating both parts by θ rotates their no-fit polygon by θ (Minkowski sums commute with rotation), so
    // only the relative rotation needs a Minkowski sum; the rest are rotated copies. Rounding the rotated
    // vertices moves them by under 1 µm, inside the safety margins.
    const relative = normaliseAngle(movingDeg - fixedDeg);
    let paths: IntPaths;
    if (fixedDeg === 0 && (fs > ms || (fs === ms && relative > 180))) {
      // Mirror pair: NFP(F, M) = −NFP(M, F) up to the way the gap is grown (both contain the exact set of
      // positions closer than the gap), and NFP(M_r, F_0) is NFP(M_0, F_−r) turned by r.
      const mirror = this.shapeNfp(ms, 0, fs, normaliseAngle(-relative));
      paths = rotatePaths(mirror.paths, relative + 180);
    } else if (fixedDeg === 0) {
      const fixed = this.shapeVariant(fs, 0);
      const moving = this.shapeVariant(ms, relative);
      // The convolution first (one union, about three times faster for stars); the convex pieces' sums, then
      // Clipper's own, when it cannot be used.
      const outer = fixed.grown.filter((p) => areaUnits(p) > 0);
      const byConvolution =
        outer.length === 1
          ? noFitPolygonByConvolution(
              outer[0]!,
              moving.poly.map((q) => ({ X: -q.X, Y: -q.Y })),
            )
          : null;
      if (byConvolution) paths = byConvolution;
      else {
        const fp = grownPiecesOf(fixed);
        const mp = negatedPiecesOf(moving);
        paths = fp && mp ? noFitPolygonFromPieces(fp, mp) : noFitPolygon(fixed.grown, moving.poly);
      }
      this.nfpCount++;
    } else {
      const base = this.shapeNfp(fs, 0, ms, relative);
      paths = rotatePaths(base.paths, fixedDeg);
    }
    const entry = { paths, box: boxOfPaths(paths) };
    this.shapeNfps.set(key, entry);
    return entry;
  }

  /**
   * No-fit polygon of `moving` around `fixed` placed at the origin: a set of translations containing every one
   * that brings the parts closer than the gap (built from the parts' closed outlines, so slightly larger
   * around narrow notches). Congruent parts share the Minkowski sums; only the shift differs.
   */
  nfp(fixed: Variant, moving: Variant): NfpEntry {
    const key = `${fixed.key}|${moving.key}`;
    const hit = this.nfps.get(key);
    if (hit) return hit;
    const a = this.refOf[fixed.partIndex]!;
    const b = this.refOf[moving.partIndex]!;
    const base = this.shapeNfp(
      a.shape,
      normaliseAngle(fixed.rotationDeg + a.thetaDeg),
      b.shape,
      normaliseAngle(moving.rotationDeg + b.thetaDeg),
    );
    // closed(part at r) = R(r + θ)·shape + R(r)·offset: the shift of the pair is R(ra)·oa − R(rb)·ob.
    const ta = (fixed.rotationDeg * M.PI) / 180;
    const tb = (moving.rotationDeg * M.PI) / 180;
    const dx = M.round(a.ox * M.cos(ta) - a.oy * M.sin(ta) - (b.ox * M.cos(tb) - b.oy * M.sin(tb)));
    const dy = M.round(a.ox * M.sin(ta) + a.oy * M.cos(ta) - (b.ox * M.sin(tb) + b.oy * M.cos(tb)));
    const entry =
      dx === 0 && dy === 0
        ? base
        : {
            paths: translatePaths(base.paths, dx, dy),
            box: {
              minX: base.box.minX + dx,
              minY: base.box.minY + dy,
              maxX: base.box.maxX + dx,
              maxY: base.box.maxY + dy,
            },
          };
    this.nfps.set(key, entry);
    return entry;
  }
}

/** Squared distance from point p to segment ab (coordinates relative, so the squares stay exact enough). */
function pointSegmentDist2(px: number, py: number, ax: number, ay: number, bx: number, by: number): number {
  const dx = bx - ax;
  const dy = by - ay;
  const l2 = dx * dx + dy * dy;
  let t = l2 === 0 ? 0 : ((px - ax) * dx + (py - ay) * dy) / l2;
  t = t < 0 ? 0 : t > 1 ? 1 : t;
  const ex = px - ax - t * dx;
  const ey = py - ay - t * dy;
  return ex * ex + ey * ey;
}

/**
 * True when the boundaries of a (shifted by (ax, ay)) and b (shifted by (bx, by)) are at least d apart
 * (d > 0, integer units). The distance of two segments that do not cross is the least of the four
 * endpoint-to-segment distances; two that cross are 0 apart, though each endpoint may be far from the other
 * segment (two long star tips crossing in an X), so crossings are tested first.
 */
function boundariesApart(
  va: Pick<Variant, 'poly' | 'ubounds'>,
  ax: number,
  ay: number,
  vb: Pick<Variant, 'poly' | 'ubounds'>,
  bx: number,
  by: number,
  d: number,
) {
  const d2 = d * d;
  const a = va.poly;
  const b = vb.poly;
  // Two points closer than d lie in both outlines' bounds (the variants' own, placed) grown by d: only the
  // edges that reach that region are compared (outlines of hundreds of vertices meet their neighbours along a
  // few of them).
  const region = {
    minX: M.max(va.ubounds.minX + ax, vb.ubounds.minX + bx) - d,
    minY: M.max(va.ubounds.minY + ay, vb.ubounds.minY + by) - d,
    maxX: M.min(va.ubounds.maxX + ax, vb.ubounds.maxX + bx) + d,
    maxY: M.min(va.ubounds.maxY + ay, vb.ubounds.maxY + by) + d,
  };
  if (region.minX > region.maxX || region.minY > region.maxY) return true;
  const near = edgesReaching(b, bx, by, region);
  if (near.length === 0) return true;
  for (const i of edgesReaching(a, ax, ay, region)) {
    const p = a[i]!;
    const q = a[(i + 1) % a.length]!;
    const p0x = p.X + ax;
    const p0y = p.Y + ay;
    const p1x = q.X + ax;
    const p1y = q.Y + ay;
    const minX = M.min(p0x, p1x) - d;
    const maxX = M.max(p0x, p1x) + d;
    const minY = M.min(p0y, p1y) - d;
    const maxY = M.max(p0y, p1y) + d;
    for (const j of near) {
      const r = b[j]!;
      const s = b[(j + 1) % b.length]!;
      const r0x = r.X + bx;
      const r0y = r.Y + by;
      const r1x = s.X + bx;
      const r1y = s.Y + by;
      if ((r0x < minX && r1x < minX) || (r0x > maxX && r1x > maxX)) continue;
      if ((r0y < minY && r1y < minY) || (r0y > maxY && r1y > maxY)) continue;
      if (
        segmentsCross(p0x, p0y, p1x, p1y, r0x, r0y, r1x, r1y) ||
        pointSegmentDist2(p0x, p0y, r0x, r0y, r1x, r1y) < d2 ||
        pointSegmentDist2(p1x, p1y, r0x, r0y, r1x, r1y) < d2 ||
        pointSegmentDist2(r0x, r0y, p0x, p0y, p1x, p1y) < d2 ||
        pointSegmentDist2(r1x, r1y, p0x, p0y, p1x, p1y) < d2
      )
        return false;
    }
  }
  return true;
}

/**
 * Whether segments pq and rs cross at a point inside both (each one's ends strictly on either side of the
 * other's line). Touching and collinear cases are left to the endpoint distances, which are 0 for them.
 * Integer units: the products stay exact below 2^53.
 */
function segmentsCross(
  px: number,
  py: number,
  qx: number,
  qy: number,
  rx: number,
  ry: number,
  sx: number,
  sy: number,
): boolean {
  const side = (ax: number, ay: number, bx: number, by: number, cx: number, cy: number) =>
    M.sign((bx - ax) * (cy - ay) - (by - ay) * (cx - ax));
  return (
    side(px, py, qx, qy, rx, ry) * side(px, py, qx, qy, sx, sy) < 0 &&
    side(rx, ry, sx, sy, px, py) * side(rx, ry, sx, sy, qx, qy) < 0
  );
}

/** Indices of the edges (from vertex i to i + 1) of the placed path whose bounds meet the region. */
function edgesReaching(
  path: IntPath,
  dx: number,
  dy: number,
  region: { minX: number; minY: number; maxX: number; maxY: number },
): number[] {
  const out: number[] = [];
  for (let i = 0; i < path.length; i++) {
    const p = path[i]!;
    const q = path[(i + 1) % path.length]!;
    const x0 = p.X + dx;
    const x1 = q.X + dx;
    const y0 = p.Y + dy;
    const y1 = q.Y + dy;
    if ((x0 < region.minX && x1 < region.minX) || (x0 > region.maxX && x1 > region.maxX)) continue;
    if ((y0 < region.minY && y1 < region.minY) || (y0 > region.maxY && y1 > region.maxY)) continue;
    out.push(i);
  }
  return out;
}

/**
 * Direct placement check on the true outlines, independent of no-fit polygons: true when moving at (tx, ty)
 * stays at least the gap (less 1 µm of rounding) away from every item and neither contains the other. With no
 * gap (under 1 µm) it tests for an overlap of more than 1 µm² instead (touching is allowed). Guards against the rare sliver
 * artefacts of Clipper's Minkowski unions and checks the positions found on simplified (closed or hull)
 * outlines.
 */
export function clearOfItems(
  items: readonly PlacedAt[] | PlacedIndex,
  moving: Variant,
  tx: number,
  ty: number,
  gapMm: number,
): boolean {
  const reach = M.ceil((gapMm + 1) * SCALE_PER_MM);
  const d = gapMm * SCALE_PER_MM - 1;
  const mb = moving.ubounds;
  let path: IntPath | null = null;
  const near =
    items instanceof PlacedIndex
      ? items.near(tx + mb.minX - reach, ty + mb.minY - reach, tx + mb.maxX + reach, ty + mb.maxY + reach)
      : items;
  for (const it of near) {
    const b = it.variant.ubounds;
    if (
      it.tx + b.maxX + reach < tx + mb.minX ||
      tx + mb.maxX + reach < it.tx + b.minX ||
      it.ty + b.maxY + reach < ty + mb.minY ||
      ty + mb.maxY + reach < it.ty + b.minY
    )
      continue;
    if (d > 0) {
      if (!boundariesApart(it.variant, it.tx, it.ty, moving, tx, ty, d)) return false;
      // Boundaries apart: the outlines are disjoint unless one lies inside the other.
      const m0 = moving.poly[0]!;
      const i0 = it.variant.poly[0]!;
      if (pointInPath(m0.X + tx - it.tx, m0.Y + ty - it.ty, it.variant.poly) !== 0) return false;
      if (pointInPath(i0.X + it.tx - tx, i0.Y + it.ty - ty, moving.poly) !== 0) return false;
      continue;
    }
    // No gap: the outlines may touch (an exact fit, such as a grid of squares) but not overlap; an overlap of
    // more than a square micrometre counts.
    path ??= moving.poly.map((q) => ({ X: q.X + tx, Y: q.Y + ty }));
    const common = intersectPaths(translatePaths([it.variant.poly], it.tx, it.ty), [path]);
    if (common.reduce((a, q) => a + M.abs(areaUnits(q)), 0) > 1) return false;
  }
  return true;
}

/** A part placed on a sheet: its variant, translated by (tx, ty) integer units. */
export interface PlacedAt {
  variant: Variant;
  tx: number;
  ty: number;
}

/**
 * Placed parts bucketed by a uniform grid over their bounds, so that clearOfItems looks only at the parts near
 * the one it checks: with thousands of copies on one sheet, scanning every part made the checks quadratic
 * (40,000 small squares took minutes). Cells are `cellUnits` wide; a part is listed in every cell it covers.
 */
export class PlacedIndex {
  private readonly cells = new Map<number, PlacedAt[]>();

  constructor(private readonly cellUnits: number) {}

  /** A cell size for parts like these: the largest side of their bounds (at least one unit). */
  static cellFor(variants: readonly Variant[]): number {
    let size = 1;
    for (const v of variants)
      size = M.max(size, v.ubounds.maxX - v.ubounds.minX, v.ubounds.maxY - v.ubounds.minY);
    return size;
  }

  add(it: PlacedAt): void {
    const b = it.variant.ubounds;
    this.visit(it.tx + b.minX, it.ty + b.minY, it.tx + b.maxX, it.ty + b.maxY, (key) => {
      const list = this.cells.get(key);
      if (list) list.push(it);
      else this.cells.set(key, [it]);
    });
  }

  /** The parts listed in the cells that a box (integer units) covers, each once. */
  near(x0: number, y0: number, x1: number, y1: number): PlacedAt[] {
    const out = new Set<PlacedAt>();
    this.visit(x0, y0, x1, y1, (key) => {
      for (const it of this.cells.get(key) ?? []) out.add(it);
    });
    return [...out];
  }

  private visit(x0: number, y0: number, x1: number, y1: number, each: (key: number) => void): void {
    const c = this.cellUnits;
    // Cell coordinates offset into [0, 2^21): keys stay exact doubles for sheets up to kilometres.
    const [i0, i1] = [M.floor(x0 / c) + 1048576, M.floor(x1 / c) + 1048576];
    const [j0, j1] = [M.floor(y0 / c) + 1048576, M.floor(y1 / c) + 1048576];
    for (let i = i0; i <= i1; i++) for (let j = j0; j <= j1; j++) each(i * 2097152 + j);
  }
}

/** How far (integer units) a vertex may move when an outline is cleaned for its convex pieces. */
const CLEAN_UNITS = 2;

export function piecesOrNull(path: IntPath): IntPaths | null {
  const adds = (pieces: IntPaths, of: IntPath) =>
    M.abs(pieces.reduce((s, p) => s + areaUnits(p), 0) - areaUnits(of)) <= 1e-9 * M.abs(areaUnits(of)) + 1;
  const pieces = convexPieces(path);
  if (adds(pieces, path)) return pieces;
  // A decomposition that does not add up (numerical trouble, mostly a rounded tip twisted over a unit or two)
  // is tried again on the outline cleaned of such vertices: it moves by at most CLEAN_UNITS, well inside the
  // no-fit polygons' safety margin (GAP_SAFETY_MM), and every position is checked on the true outlines anyway.
  const clean = cleanPath(path, CLEAN_UNITS);
  if (clean.length >= 3 && areaUnits(clean) > 0) {
    const again = convexPieces(clean);
    if (adds(again, clean)) return again;
  }
  // Still no good: fall back to Clipper's sums.
  return null;
}

function grownPiecesOf(v: ShapeVariant): IntPaths | null {
  if (v.grownPieces === undefined) {
    const outer = v.grown.filter((p) => areaUnits(p) > 0);
    v.grownPieces = outer.length === 1 ? piecesOrNull(outer[0]!) : null;
  }
  return v.grownPieces;
}

function negatedPiecesOf(v: ShapeVariant): IntPaths | null {
  if (v.negatedPieces === undefined)
    v.negatedPieces = piecesOrNull(v.poly.map((q) => ({ X: -q.X, Y: -q.Y })));
  return v.negatedPieces;
}

function rotatePaths(paths: IntPaths, angleDeg: number): IntPaths {
  const t = (angleDeg * M.PI) / 180;
  const c = M.cos(t);
  const sn = M.sin(t);
  return paths.map((p) => p.map((q) => ({ X: M.round(q.X * c - q.Y * sn), Y: M.round(q.X * sn + q.Y * c) })));
}

/**
 * Paths moved by (dx, dy), kept on whole units for Clipper: a grid's copies may sit at fractions of a unit
 * (rectangleGridPlan), and half a unit is far inside the no-fit polygons' safety margin (GAP_SAFETY_MM).
 */
export function translatePaths(paths: IntPaths, dx: number, dy: number): IntPaths {
  const x = M.round(dx);
  const y = M.round(dy);
  return paths.map((p) => p.map((q) => ({ X: q.X + x, Y: q.Y + y })));
}

/** True when (x, y) lies strictly inside the region bounded by paths (outer and hole paths, even-odd). */
export function strictlyInside(
  paths: IntPaths,
  x: number,
  y: number,
  pointIn: (x: number, y: number, p: IntPath) => number,
): boolean {
  let inside = false;
  for (const p of paths) {
    const r = pointIn(x, y, p);
    if (r === -1) return false;
    if (r === 1) inside = !inside;
  }
  return inside;
}
