/**
 * Pattern pass for many congruent pieces: a "cell" of one piece, or of a piece and its copy turned 180° placed
 * touching it (a point-symmetric pair), is repeated on a lattice, as in double-lattice packings of convex
 * bodies (G. Kuperberg & W. Kuperberg, "Double-lattice packings of convex bodies in the plane", Discrete
 * Comput. Geom. 5, 1990 — from memory of the venue). The row vector is the shortest horizontal translation
 * leaving the cell clear of its own no-fit polygon; the second vector is the lowest clear translation over a
 * sweep of horizontal offsets. The lattice is clipped to the sheet less its margin, and the arrangement holding
 * the most pieces on one sheet wins. The double-lattice search on the part's convex hull (double-lattice.ts)
 * adds its arrangements to the same contest.
 */
import { boxOfPaths, pointInPath, unionPaths, SCALE_PER_MM, type IntPaths } from './clipper-adapter';
import { innerFit, type PlacedItem, type SheetFrame } from './bottom-left';
import { sheetLattices } from './double-lattice';
import { convexHull, type Point } from './polygon';
import {
  clearOfItems,
  PlacedIndex,
  distinctRotations,
  normaliseAngle,
  strictlyInside,
  symmetryPeriodDeg,
  translatePaths,
  type GeometryCache,
  type Variant,
} from './variants';
import { M, INF } from '../math/hot-globals';

interface CellPiece {
  variant: Variant;
  dx: number;
  dy: number;
}

export interface PatternResult {
  /** Slots on one sheet, ordered by right edge then bottom edge (fill order). */
  slots: PlacedItem[];
  /** Pieces per unit area of the infinite lattice (per mm²). */
  densityPerMm2: number;
  description: string;
  /** Already checked on the true outlines (inside the sheet, at least the gap apart). */
  verified?: boolean;
}

function crossingsAtY(paths: IntPaths, y: number): number[] {
  const xs: number[] = [];
  for (const p of paths)
    for (let i = 0; i < p.length; i++) {
      const a = p[i]!;
      const b = p[(i + 1) % p.length]!;
      if (a.Y > y !== b.Y > y) xs.push(a.X + ((y - a.Y) * (b.X - a.X)) / (b.Y - a.Y));
    }
  return xs.sort((u, v) => u - v);
}

/** Edges of a path set bucketed by x, for fast vertical-line crossings. */
class VerticalIndex {
  private readonly bins: number[][] = [];
  private readonly coords: number[] = [];
  private readonly minX: number;
  private readonly width: number;
  private readonly count = 64;

  constructor(paths: IntPaths) {
    let minX = INF;
    let maxX = -INF;
    for (const p of paths)
      for (const q of p) {
        minX = M.min(minX, q.X);
        maxX = M.max(maxX, q.X);
      }
    this.minX = minX;
    this.width = M.max(1, maxX - minX) / this.count;
    for (let i = 0; i < this.count; i++) this.bins.push([]);
    for (const p of paths)
      for (let i = 0; i < p.length; i++) {
        const a = p[i]!;
        const b = p[(i + 1) % p.length]!;
        if (a.X === b.X) continue;
        const e = this.coords.length;
        this.coords.push(a.X, a.Y, b.X, b.Y);
        const lo = this.bin(M.min(a.X, b.X));
        const hi = this.bin(M.max(a.X, b.X));
        for (let k = lo; k <= hi; k++) this.bins[k]!.push(e);
      }
  }

  private bin(x: number): number {
    return M.min(this.count - 1, M.max(0, M.floor((x - this.minX) / this.width)));
  }

  /** Sorted y values where the vertical line at x crosses the paths (half-open rule at vertices). */
  crossingsAt(x: number): number[] {
    const ys: number[] = [];
    const c = this.coords;
    for (const e of this.bins[this.bin(x)]!) {
      const ax = c[e]!;
      const ay = c[e + 1]!;
      const bx = c[e + 2]!;
      const by = c[e + 3]!;
      if (ax > x !== bx > x) ys.push(ay + ((x - ax) * (by - ay)) / (bx - ax));
    }
    return ys.sort((u, v) => u - v);
  }

  /**
   * Whether (x, y) lies inside the paths (even–odd), by counting the crossings of the vertical line at x
   * below y; undefined when a crossing is within a unit of y (on or next to the boundary), where the caller
   * asks the exact test. Off the boundary the count is exact (the half-open rule counts each vertex once).
   */
  insideByCount(x: number, y: number): boolean | undefined {
    const c = this.coords;
    let below = 0;
    for (const e of this.bins[this.bin(x)]!) {
      const ax = c[e]!;
      const bx = c[e + 2]!;
      if (ax > x === bx > x) continue;
      const ay = c[e + 1]!;
      const yc = ay + ((x - ax) * (c[e + 3]! - ay)) / (bx - ax);
      if (M.abs(yc - y) <= 1) return undefined;
      if (yc < y) below++;
    }
    return below % 2 === 1;
  }
}

/** Whether the rounded point is strictly inside the cell's no-fit polygon (the index first, Clipper near edges). */
function insideAt({ paths, box, index }: CellNfp, x: number, y: number): boolean {
  const rx = M.round(x);
  const ry = M.round(y);
  if (rx <= box.minX || rx >= box.maxX || ry <= box.minY || ry >= box.maxY) return false;
  return index.insideByCount(rx, ry) ?? strictlyInside(paths, rx, ry, pointInPath);
}

/** No-fit polygon of the cell against a translated copy of itself. */
function cellNfp(cache: GeometryCache, cell: readonly CellPiece[]): IntPaths {
  const all: IntPaths = [];
  for (const a of cell)
    for (const b of cell) {
      const n = cache.nfp(a.variant, b.variant);
      for (const p of translatePaths(n.paths, a.dx - b.dx, a.dy - b.dy)) all.push(p);
    }
  return unionPaths(all);
}

/** Whether every k·(ax, 0), k ≥ 1, is clear of the cell's no-fit polygon (up to `width`, its extent). */
function rowClear(nfp: CellNfp, ax: number, width: number): boolean {
  for (let k = 1; k * ax <= width + ax; k++) if (insideAt(nfp, k * ax, 0)) return false;
  return true;
}

/** Whether the second row of the lattice, 2b + k·a for small k, is clear too. */
function secondRowClear(nfp: CellNfp, { ax, bx, by }: Lattice): boolean {
  for (let k = -3; k <= 3; k++) if (insideAt(nfp, 2 * bx + k * ax, 2 * by)) return false;
  return true;
}

/** Smallest ax > 0 such that every k·(ax, 0), k ≥ 1, is clear of the cell's no-fit polygon. */
function rowPeriod(nfp: CellNfp, width: number): number | null {
  const xs = crossingsAtY(nfp.paths, 0);
  for (let i = 1; i < xs.length; i += 2) {
    if (!(xs[i]! > 0)) continue;
    const ax = M.ceil(xs[i]!) + 1;
    if (rowClear(nfp, ax, width)) return ax;
  }
  return null;
}

/** Lowest by > 0 such that (bx + k·ax, by) is clear for every k. */
function lowestClear(nfp: VerticalIndex, box: ReturnType<typeof boxOfPaths>, ax: number, bx: number): number {
  const intervals: [number, number][] = [];
  const kMin = M.floor((box.minX - bx) / ax) - 1;
  const kMax = M.ceil((box.maxX - bx) / ax) + 1;
  for (let k = kMin; k <= kMax; k++) {
    const ys = nfp.crossingsAt(bx + k * ax);
    for (let i = 0; i + 1 < ys.length; i += 2) intervals.push([ys[i]!, ys[i + 1]!]);
  }
  intervals.sort((p, q) => p[0] - q[0]);
  // Sorted by lower end: walk up while the current height is covered.
  let y = 0.5;
  for (const [lo, hi] of intervals) {
    if (lo >= y) break;
    if (hi > y) y = hi;
  }
  return M.ceil(y) + 1;
}

interface Lattice {
  ax: number;
  bx: number;
  by: number;
}

/** A cell's no-fit polygon with its bounding box and vertical-line index, built once per cell. */
interface CellNfp {
  paths: IntPaths;
  box: ReturnType<typeof boxOfPaths>;
  index: VerticalIndex;
}

function cellNfpView(paths: IntPaths): CellNfp {
  return { paths, box: boxOfPaths(paths), index: new VerticalIndex(paths) };
}

/**
 * Candidate lattices for the cell: the row period, then the lowest clear second vector for a sweep of
 * horizontal offsets. Returns the densest few plus the rectangular one (bx = 0), since the fullest sheet is
 * not always the densest lattice.
 */
function candidateLattices(view: CellNfp, keep = 6): Lattice[] {
  const { paths: nfp, box, index } = view;
  const ax = rowPeriod(view, box.maxX - box.minX);
  if (ax === null) return [];
  const samples = new Set<number>();
  const steps = 32;
  for (let i = 0; i < steps; i++) samples.add(M.round((i * ax) / steps));
  // Offsets where a vertex of the no-fit polygon lines up (at most 64 of them, evenly picked).
  const vertexXs: number[] = [];
  for (const p of nfp) for (const q of p) vertexXs.push(((q.X % ax) + ax) % ax);
  const stride = M.max(1, M.ceil(vertexXs.length / 64));
  for (let i = 0; i < vertexXs.length; i += stride) {
    samples.add(M.round(vertexXs[i]!));
    samples.add(M.round(vertexXs[i]! + 1) % ax);
  }
  const found: Lattice[] = [];
  for (const bx of samples) {
    const lat = { ax, bx, by: lowestClear(index, box, ax, bx) };
    if (secondRowClear(view, lat)) found.push(lat);
  }
  found.sort((p, q) => p.by - q.by || p.bx - q.bx);
  const out: Lattice[] = [];
  for (const l of found) {
    if (out.length >= keep) break;
    if (out.some((o) => M.abs(o.by - l.by) < 1000)) continue;
    out.push(l);
  }
  const rect = found.find((l) => l.bx === 0);
  if (rect && !out.includes(rect)) out.push(rect);
  return out;
}

/**
 * Lattices with their rows stretched to the sheet: the row period is widened so that the same number of cells
 * still fits every row when the rows alternate by half a period, which lets each row sit lower between the
 * cells of the row below and can gain a whole row. (Decagons of R 60 on 600 × 400: rows of 4 at a period of
 * 137 mm instead of 123 mm nest 95 mm apart instead of 104, so four rows fit instead of three.) `span` is the
 * range the cell's reference point may take across the sheet, in integer units; fewer cells per row are tried
 * too.
 */
function stretchedLattices(view: CellNfp, base: readonly Lattice[], span: number): Lattice[] {
  if (base.length === 0 || !(span > 0)) return [];
  const { box, index } = view;
  const ax0 = base[0]!.ax;
  const perRow = M.floor(span / ax0) + 1;
  const out: Lattice[] = [];
  for (let n = perRow; n >= M.max(2, perRow - 1); n--) {
    const ax = M.floor(span / (n - 0.5));
    if (ax <= ax0 || !rowClear(view, ax, box.maxX - box.minX)) continue;
    const bx = M.round(ax / 2);
    const lat = { ax, bx, by: lowestClear(index, box, ax, bx) };
    if (secondRowClear(view, lat)) out.push(lat);
  }
  return out;
}

/**
 * Slots of a lattice of cells on one sheet, for a few origin shifts; the fullest wins. The count comes at
 * once and the slots when asked for: a search weighs dozens of lattices, and thousands of small pieces to a
 * sheet would otherwise keep every lattice's slots in memory (a gigabyte for 8,000 small triangles).
 */
function fillSheet(
  frame: SheetFrame,
  cell: readonly CellPiece[],
  lat: Lattice,
): { count: number; slots: () => PlacedItem[] } {
  const none = { count: 0, slots: () => [] };
  const fits = cell.map((c) => innerFit(frame, c.variant));
  if (fits.some((f) => f === null)) return none;
  let cellMinY = INF;
  let cellMinX = INF;
  for (let i = 0; i < cell.length; i++) {
    const f = fits[i]!;
    cellMinY = M.min(cellMinY, cell[i]!.dy - f.y0);
    cellMinX = M.min(cellMinX, cell[i]!.dx - f.x0);
  }
  // Origin o such that the lowest piece of row 0 sits on the margin; try shifts so some row starts flush left.
  // (Lowering the lattice by fractions of a row or shifting it by fractions of the period was tried: no more
  // pieces on the bench designs, at many times the cost.)
  const W = frame.widthMm * SCALE_PER_MM;
  const H = frame.heightMm * SCALE_PER_MM;
  const oys = [-cellMinY];
  const oxs = [0, 1, 2].map((shiftRow) => -cellMinX - shiftRow * lat.bx);
  // Counts first (no allocation), then the slots of the fullest origin.
  const visit = (ox0: number, oy: number, out: PlacedItem[] | null): number => {
    const ox = ox0 - M.floor(ox0 / lat.ax) * lat.ax - lat.ax;
    let count = 0;
    for (let j = 0; ; j++) {
      const rowY = oy + j * lat.by;
      if (rowY + cellMinY > H) break;
      const rowX = ox + j * lat.bx - M.ceil((ox + j * lat.bx) / lat.ax + 2) * lat.ax;
      for (let i = 0; ; i++) {
        const x = rowX + i * lat.ax;
        if (x + cellMinX > W) break;
        for (let p = 0; p < cell.length; p++) {
          const c = cell[p]!;
          const f = fits[p]!;
          const tx = x + c.dx;
          const ty = rowY + c.dy;
          if (tx >= f.x0 && tx <= f.x1 && ty >= f.y0 && ty <= f.y1) {
            count++;
            out?.push({ variant: c.variant, tx, ty });
          }
        }
      }
    }
    return count;
  };
  let bestCount = 0;
  let bestOrigin: [number, number] | null = null;
  for (const oy of oys)
    for (const ox0 of oxs) {
      const n = visit(ox0, oy, null);
      if (n > bestCount) {
        bestCount = n;
        bestOrigin = [ox0, oy];
      }
    }
  const origin = bestOrigin;
  if (!origin) return none;
  const slots = () => {
    const best: PlacedItem[] = [];
    visit(origin[0], origin[1], best);
    return best.sort(
      (p, q) =>
        p.tx + p.variant.ubounds.maxX - (q.tx + q.variant.ubounds.maxX) ||
        p.ty + p.variant.ubounds.minY - (q.ty + q.variant.ubounds.minY),
    );
  };
  return { count: bestCount, slots };
}

/** The range (integer units) the cell's reference point may take across the sheet with every piece inside. */
function rowSpan(frame: SheetFrame, cell: readonly CellPiece[]): number {
  let lo = -INF;
  let hi = INF;
  for (const c of cell) {
    const f = innerFit(frame, c.variant);
    if (!f) return 0;
    lo = M.max(lo, f.x0 - c.dx);
    hi = M.min(hi, f.x1 - c.dx);
  }
  return hi - lo;
}

/** Checks every pair of slots against the no-fit polygons (a guard on the construction). */
export function slotsAreClear(cache: GeometryCache, slots: readonly PlacedItem[]): boolean {
  // Each slot against its neighbours only (a grid index of the slots): a whole sheet of small parts holds
  // tens of thousands, and every pair took minutes.
  const placed = new PlacedIndex(PlacedIndex.cellFor(slots.map((s) => s.variant)));
  for (const s of slots) placed.add(s);
  const reach = M.ceil((cache.gapMm + 1) * SCALE_PER_MM);
  for (const a of slots) {
    const u = a.variant.ubounds;
    const near = placed.near(
      a.tx + u.minX - reach,
      a.ty + u.minY - reach,
      a.tx + u.maxX + reach,
      a.ty + u.maxY + reach,
    );
    for (const b of near) {
      if (b === a) continue;
      const n = cache.nfp(a.variant, b.variant);
      const rx = b.tx - a.tx;
      const ry = b.ty - a.ty;
      if (rx <= n.box.minX || rx >= n.box.maxX || ry <= n.box.minY || ry >= n.box.maxY) continue;
      if (strictlyInside(n.paths, rx, ry, pointInPath)) return false;
    }
  }
  return true;
}

function pairOffsets(cache: GeometryCache, a: Variant, b: Variant): { dx: number; dy: number }[] {
  const n = cache.nfp(a, b);
  const scored: { dx: number; dy: number; area: number; w: number; h: number }[] = [];
  const seen = new Set<string>();
  const points: { X: number; Y: number }[] = [];
  for (const p of n.paths)
    for (let i = 0; i < p.length; i++) {
      const q = p[i]!;
      const r = p[(i + 1) % p.length]!;
      // Vertices (point contacts) and points along each edge (sliding edge contacts).
      for (const t of [0, 0.25, 0.5, 0.75])
        points.push({ X: M.round(q.X + t * (r.X - q.X)), Y: M.round(q.Y + t * (r.Y - q.Y)) });
    }
  for (const q of points) {
    const k = `${q.X},${q.Y}`;
    if (seen.has(k)) continue;
    seen.add(k);
    if (strictlyInside(n.paths, q.X, q.Y, pointInPath)) continue;
    const minX = M.min(a.ubounds.minX, b.ubounds.minX + q.X);
    const maxX = M.max(a.ubounds.maxX, b.ubounds.maxX + q.X);
    const minY = M.min(a.ubounds.minY, b.ubounds.minY + q.Y);
    const maxY = M.max(a.ubounds.maxY, b.ubounds.maxY + q.Y);
    const w = maxX - minX;
    const h = maxY - minY;
    scored.push({ dx: q.X, dy: q.Y, area: w * h, w, h });
  }
  const pick = new Map<string, { dx: number; dy: number }>();
  const take = (list: typeof scored, count: number) => {
    for (const s of list.slice(0, count)) pick.set(`${s.dx},${s.dy}`, { dx: s.dx, dy: s.dy });
  };
  // Stars interlock at few of their contact positions: keep enough of the compact ones to find them.
  take(
    [...scored].sort((p, q) => p.area - q.area),
    30,
  );
  take(
    [...scored].sort((p, q) => p.h - q.h || p.w - q.w),
    10,
  );
  take(
    [...scored].sort((p, q) => p.w - q.w || p.h - q.h),
    10,
  );
  return [...pick.values()];
}

/**
 * Sheet slots of the double-lattice search on the part's convex hull (double-lattice.ts), as placed items on
 * the true outline; each arrangement is checked again on the true outlines (inside the usable sheet, at least
 * the gap apart) and dropped if any slot fails. Works for any outline: a lattice of hulls is a valid lattice of
 * the pieces; for stars and slotted pieces the no-fit polygon lattices below usually do better.
 */
/**
 * The allowed rotation giving the same shape as rotation d (d itself when allowed), or undefined: with a
 * fixed list, a rotation's 180° partner often appears only as a rotation congruent to it (for a {5/2} star,
 * 216° for 36°), and distinctRotations keeps one rotation of each shape.
 */
function allowedCongruent(outline: Point[], rotationsDeg: readonly number[], d: number): number | undefined {
  const deg = normaliseAngle(d);
  const same = rotationsDeg.find((r) => M.abs(normaliseAngle(r) - deg) < 1e-6);
  return same ?? rotationsDeg.find((r) => distinctRotations(outline, [r, d]).length === 1);
}

function convexLatticePatterns(
  cache: GeometryCache,
  frame: SheetFrame,
  partIndex: number,
  rotationsDeg: readonly number[],
  free: boolean,
): PatternResult[] {
  const part = cache.parts[partIndex]!;
  const outline = part.outline;
  // A rotation is usable when it is allowed or gives the same shape as an allowed one.
  const usable = (d: number) => free || allowedCongruent(outline, rotationsDeg, d) !== undefined;
  let angles: number[] = [...rotationsDeg];
  if (free) {
    // Rotation is free: sweep one symmetry period of the hull (24 steps; the lattice is one of hulls, so turning
    // by the hull's period gives the same packing), plus the preferred rotations.
    const period = symmetryPeriodDeg(convexHull(outline));
    for (let i = 0; i < 24; i++) angles.push((i * period) / 24);
    angles = [...new Set(angles.map((d) => normaliseAngle(d)))];
  }
  const found = sheetLattices(
    outline,
    { ...frame, gapMm: cache.gapMm },
    { anglesDeg: angles, free, partnerAllowed: (d) => usable(d + 180) },
  );
  const out: PatternResult[] = [];
  /**
   * With fixed rotations, a rotation that is not in the list but gives the same shape as one that is (the part's
   * own symmetry) is reported as that one, shifted so the outline lands in the same place.
   */
  const asAllowed = (d: number): { deg: number; dx: number; dy: number } | null => {
    const a = free ? d : allowedCongruent(outline, rotationsDeg, d);
    if (a === undefined) return null;
    if (a === d) return { deg: d, dx: 0, dy: 0 };
    const bd = cache.variant(partIndex, d).bounds;
    const ba = cache.variant(partIndex, a).bounds;
    return { deg: a, dx: bd.minX - ba.minX, dy: bd.minY - ba.minY };
  };
  for (const arr of found) {
    if (arr.placements.some((pl) => !usable(pl.rotationDeg))) continue;
    const slots: PlacedItem[] = [];
    const placed = new PlacedIndex(
      PlacedIndex.cellFor([cache.variant(partIndex, arr.placements[0]?.rotationDeg ?? 0)]),
    );
    for (const pl of arr.placements) {
      const as = asAllowed(pl.rotationDeg);
      if (!as) continue;
      const variant = cache.variant(partIndex, as.deg);
      const fit = innerFit(frame, variant);
      const tx = M.round((pl.x + as.dx) * SCALE_PER_MM);
      const ty = M.round((pl.y + as.dy) * SCALE_PER_MM);
      if (!fit || tx < fit.x0 || tx > fit.x1 || ty < fit.y0 || ty > fit.y1) continue;
      if (!clearOfItems(placed, variant, tx, ty, cache.gapMm)) continue;
      slots.push({ variant, tx, ty });
      placed.add({ variant, tx, ty });
    }
    if (slots.length === 0) continue;
    slots.sort(
      (p, q) =>
        p.tx + p.variant.ubounds.maxX - (q.tx + q.variant.ubounds.maxX) ||
        p.ty + p.variant.ubounds.minY - (q.ty + q.variant.ubounds.minY),
    );
    const cells = arr.lattice.partner ? 2 : 1;
    out.push({
      slots,
      densityPerMm2: cells / (arr.lattice.ax * arr.lattice.by),
      description: arr.description,
      verified: true,
    });
  }
  return out;
}

/**
 * Best lattice pattern for copies of one part with the given allowed rotations; null when no pattern fits.
 * Pair cells are tried only when a rotation's 180° partner is allowed. With `free` rotation the double-lattice
 * search on the part's hull also sweeps the rotation continuously.
 */
export function bestPattern(
  cache: GeometryCache,
  frame: SheetFrame,
  partIndex: number,
  rotationsDeg: readonly number[],
  free = false,
): PatternResult | null {
  let runs = patternRuns.get(cache);
  if (!runs) patternRuns.set(cache, (runs = new Map()));
  const outline = cache.parts[partIndex]!.outline;
  const runKey = JSON.stringify([
    outline.map((q) => [M.round(q[0] * 1e6), M.round(q[1] * 1e6)]),
    rotationsDeg,
    free,
    frame.widthMm,
    frame.heightMm,
    frame.marginMm,
  ]);
  let found = runs.get(runKey);
  if (found === undefined) {
    found = searchPattern(cache, frame, partIndex, rotationsDeg, free);
    runs.set(runKey, found);
  }
  // The same slots for this part: a congruent part of another colour group gets its own variants.
  return (
    found && {
      ...found,
      slots: found.slots.map((x) => ({ ...x, variant: cache.variant(partIndex, x.variant.rotationDeg) })),
    }
  );
}

/**
 * Pattern searches of one nesting run (one GeometryCache), keyed by outline, rotations and sheet: the colour
 * groups of one model share their piece shapes, so each shape is searched once per run.
 */
const patternRuns = new WeakMap<GeometryCache, Map<string, PatternResult | null>>();

function searchPattern(
  cache: GeometryCache,
  frame: SheetFrame,
  partIndex: number,
  rotationsDeg: readonly number[],
  free: boolean,
): PatternResult | null {
  const outline = cache.parts[partIndex]!.outline;
  // Candidates keep their count; their slots are laid out only for the ones checked (see fillSheet).
  type Candidate = Omit<PatternResult, 'slots'> & { count: number; slots: () => PlacedItem[] };
  const results: Candidate[] = convexLatticePatterns(cache, frame, partIndex, rotationsDeg, free).map(
    (r) => ({
      ...r,
      count: r.slots.length,
      slots: () => r.slots,
    }),
  );
  const consider = (cell: CellPiece[], label: string) => {
    const nfp = cellNfpView(cellNfp(cache, cell));
    const lattices = candidateLattices(nfp);
    for (const lat of [...lattices, ...stretchedLattices(nfp, lattices, rowSpan(frame, cell))]) {
      const filled = fillSheet(frame, cell, lat);
      if (filled.count === 0) continue;
      const density = (cell.length * SCALE_PER_MM * SCALE_PER_MM) / (lat.ax * lat.by);
      results.push({ count: filled.count, slots: filled.slots, densityPerMm2: density, description: label });
    }
  };
  const primaries = new Set<number>();
  for (const deg of rotationsDeg) {
    const v = cache.variant(partIndex, deg);
    consider([{ variant: v, dx: 0, dy: 0 }], `lattice ${v.rotationDeg}°`);
    primaries.add(v.rotationDeg);
    // The turned copy, drawn at the allowed rotation that gives its shape.
    const partner = allowedCongruent(outline, rotationsDeg, v.rotationDeg + 180);
    if (partner === undefined || primaries.has(normaliseAngle(partner))) continue;
    const w = cache.variant(partIndex, partner);
    for (const off of pairOffsets(cache, v, w))
      consider(
        [
          { variant: v, dx: 0, dy: 0 },
          { variant: w, dx: off.dx, dy: off.dy },
        ],
        `double lattice ${v.rotationDeg}°/${w.rotationDeg}°`,
      );
  }
  results.sort((p, q) => q.count - p.count || q.densityPerMm2 - p.densityPerMm2);
  // The construction should always be clear; check the chosen one and fall back to the next if not.
  for (const r of results) {
    const slots = r.slots();
    if (r.verified === true || slotsAreClear(cache, slots))
      return { slots, densityPerMm2: r.densityPerMm2, description: r.description, verified: r.verified };
  }
  return null;
}
