/**
 * Rotated copies ("variants") of each part in integer units, their gap-grown outlines, and a cache of no-fit
 * polygons between variants. No-fit polygons are Minkowski sums computed by Clipper (see clipper-adapter.ts),
 * the construction described in Bennell & Oliveira's tutorial on nesting geometry (EJOR 184, 2008).
 */
import { convexPieces } from './convex-decomposition';
import {
  areaUnits,
  growPolygon,
  intersectPaths,
  noFitPolygonFromPieces,
  noFitPolygon,
  toIntPath,
  SCALE_PER_MM,
  type IntPath,
  type IntPaths,
} from './clipper-adapter';
import { boundsOf, convexHull, rotatePolygon, signedArea, type Bounds, type Point } from './polygon';

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
  /** Rotated outline grown by gap + safety, integer units (used for no-fit polygons). */
  grown: IntPaths;
  /** Convex pieces of the outer grown outline and of the negated outline (lazily built). */
  grownPieces?: IntPaths | null;
  negatedPieces?: IntPaths | null;
  /** Rotated outline grown by gap + half the safety, round joins (used to check placements directly). */
  checkGrown: IntPaths;
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
}

function normaliseAngle(deg: number): number {
  const r = ((deg % 360) + 360) % 360;
  const rounded = Math.round(r * 1e6) / 1e6;
  return rounded >= 360 ? 0 : rounded;
}

/** A congruence key: the rotated outline moved to its lower-left bounding corner, as a sorted vertex list. */
function shapeKey(outline: Point[], deg: number): string {
  const rot = rotatePolygon(outline, deg);
  const b = boundsOf(rot);
  return rot
    .map(([x, y]) => `${Math.round((x - b.minX) * 100)},${Math.round((y - b.minY) * 100)}`)
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
    const dir = (Math.atan2(b[1] - a[1], b[0] - a[0]) * 180) / Math.PI;
    edges.push({ len: Math.hypot(b[0] - a[0], b[1] - a[1]), deg: normaliseAngle(-dir) });
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
 */
export function patternRotations(outline: Point[], sweeps = 4): number[] {
  const list: number[] = [];
  for (const d of autoRotations(outline)) list.push(d, d + 180);
  const period = symmetryPeriodDeg(outline);
  const span = Math.min(period, 180);
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

interface NfpEntry {
  paths: IntPaths;
  box: IntBounds;
}

function boxOfPaths(paths: IntPaths): IntBounds {
  let minX = Infinity;
  let minY = Infinity;
  let maxX = -Infinity;
  let maxY = -Infinity;
  for (const p of paths)
    for (const q of p) {
      if (q.X < minX) minX = q.X;
      if (q.Y < minY) minY = q.Y;
      if (q.X > maxX) maxX = q.X;
      if (q.Y > maxY) maxY = q.Y;
    }
  return { minX, minY, maxX, maxY };
}

/** Builds and caches variants and no-fit polygons for one nesting run. */
export class GeometryCache {
  private readonly variants = new Map<string, Variant>();
  private readonly nfps = new Map<string, NfpEntry>();
  nfpCount = 0;

  /** Index of the first part with the same outline: parts that differ only by id or group share geometry. */
  private readonly shapeOf: number[];

  constructor(
    readonly parts: readonly PreparedPart[],
    readonly gapMm: number,
  ) {
    const seen = new Map<string, number>();
    this.shapeOf = parts.map((p) => {
      const key = JSON.stringify(p.outline);
      const first = seen.get(key);
      if (first !== undefined) return first;
      seen.set(key, p.index);
      return p.index;
    });
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
    const grown = growPolygon(poly, this.gapMm + GAP_SAFETY_MM);
    const checkGrown = growPolygon(poly, this.gapMm + GAP_SAFETY_MM / 2, 'round');
    const bounds = boundsOf(rot);
    const ubounds: IntBounds = {
      minX: Math.floor(bounds.minX * SCALE_PER_MM),
      minY: Math.floor(bounds.minY * SCALE_PER_MM),
      maxX: Math.ceil(bounds.maxX * SCALE_PER_MM),
      maxY: Math.ceil(bounds.maxY * SCALE_PER_MM),
    };
    const v: Variant = {
      key,
      partIndex,
      rotationDeg: deg,
      poly,
      grown,
      checkGrown,
      bounds,
      ubounds,
      areaMm2: part.areaMm2,
    };
    this.variants.set(key, v);
    return v;
  }

  /** No-fit polygon of `moving` around `fixed` placed at the origin (translations that violate the gap). */
  nfp(fixed: Variant, moving: Variant): NfpEntry {
    const fs = this.shapeOf[fixed.partIndex] ?? fixed.partIndex;
    const ms = this.shapeOf[moving.partIndex] ?? moving.partIndex;
    const key = `${fs}@${fixed.rotationDeg}|${ms}@${moving.rotationDeg}`;
    const hit = this.nfps.get(key);
    if (hit) return hit;
    // Rotating both parts by θ rotates their no-fit polygon by θ (Minkowski sums commute with rotation), so
    // only the relative rotation needs a Minkowski sum; the rest are rotated copies. Rounding the rotated
    // vertices moves them by under 1 µm, well inside GAP_SAFETY_MM.
    const relative = normaliseAngle(moving.rotationDeg - fixed.rotationDeg);
    let paths: IntPaths;
    if (fixed.rotationDeg === 0 && (fs > ms || (fs === ms && relative > 180))) {
      // Mirror pair: NFP(F, M) = −NFP(M, F) up to the way the gap is grown (both contain the exact set of
      // positions closer than the gap, the round-joined one), and NFP(M_r, F_0) is NFP(M_0, F_−r) turned by r.
      const mirror = this.nfp(this.variant(ms, 0), this.variant(fs, normaliseAngle(-relative)));
      paths = rotatePaths(mirror.paths, relative + 180);
    } else if (fixed.rotationDeg === 0) {
      const fp = grownPiecesOf(fixed);
      const mp = negatedPiecesOf(moving);
      paths = fp && mp ? noFitPolygonFromPieces(fp, mp) : noFitPolygon(fixed.grown, moving.poly);
      this.nfpCount++;
    } else {
      const base = this.nfp(this.variant(fs, 0), this.variant(ms, relative));
      paths = rotatePaths(base.paths, fixed.rotationDeg);
    }
    const entry = { paths, box: boxOfPaths(paths) };
    this.nfps.set(key, entry);
    return entry;
  }
}

/**
 * Direct placement check, independent of no-fit polygons: true when moving at (tx, ty) stays at least the gap
 * (less about 10 µm of arc tolerance) away from every item. Guards against the rare sliver artefacts of Clipper's Minkowski unions.
 */
export function clearOfItems(
  items: readonly { variant: Variant; tx: number; ty: number }[],
  moving: Variant,
  tx: number,
  ty: number,
  gapMm: number,
): boolean {
  const reach = Math.ceil((gapMm + 1) * SCALE_PER_MM);
  const mb = moving.ubounds;
  let path: IntPath | null = null;
  for (const it of items) {
    const b = it.variant.ubounds;
    if (
      it.tx + b.maxX + reach < tx + mb.minX ||
      tx + mb.maxX + reach < it.tx + b.minX ||
      it.ty + b.maxY + reach < ty + mb.minY ||
      ty + mb.maxY + reach < it.ty + b.minY
    )
      continue;
    path ??= moving.poly.map((q) => ({ X: q.X + tx, Y: q.Y + ty }));
    if (intersectPaths(translatePaths(it.variant.checkGrown, it.tx, it.ty), [path]).length > 0) return false;
  }
  return true;
}

function piecesOrNull(path: IntPath): IntPaths | null {
  const pieces = convexPieces(path);
  const total = pieces.reduce((s, p) => s + areaUnits(p), 0);
  // A decomposition that does not add up (numerical trouble) is not used: fall back to Clipper's sums.
  return Math.abs(total - areaUnits(path)) <= 1e-9 * Math.abs(areaUnits(path)) + 1 ? pieces : null;
}

function grownPiecesOf(v: Variant): IntPaths | null {
  if (v.grownPieces === undefined) {
    const outer = v.grown.filter((p) => areaUnits(p) > 0);
    v.grownPieces = outer.length === 1 ? piecesOrNull(outer[0]!) : null;
  }
  return v.grownPieces;
}

function negatedPiecesOf(v: Variant): IntPaths | null {
  if (v.negatedPieces === undefined)
    v.negatedPieces = piecesOrNull(v.poly.map((q) => ({ X: -q.X, Y: -q.Y })));
  return v.negatedPieces;
}

function rotatePaths(paths: IntPaths, angleDeg: number): IntPaths {
  const t = (angleDeg * Math.PI) / 180;
  const c = Math.cos(t);
  const sn = Math.sin(t);
  return paths.map((p) =>
    p.map((q) => ({ X: Math.round(q.X * c - q.Y * sn), Y: Math.round(q.X * sn + q.Y * c) })),
  );
}

export function translatePaths(paths: IntPaths, dx: number, dy: number): IntPaths {
  return paths.map((p) => p.map((q) => ({ X: q.X + dx, Y: q.Y + dy })));
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
