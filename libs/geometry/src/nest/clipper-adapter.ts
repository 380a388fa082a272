/**
 * The one place where nesting talks to clipper-lib (Angus Johnson's Clipper, JavaScript port 6.4.2).
 * Clipper works on integer coordinates: every length in millimetres is multiplied by SCALE_PER_MM here and
 * nowhere else in src/nest. All polygons are closed; orientation follows Clipper (positive area = CCW with
 * y up).
 */
import * as ClipperLib from 'clipper-lib';
import simplify from 'simplify-js';
import { convexMinkowskiSum, turningOf, turnsOnce } from './convex-decomposition';

/** Integer units per millimetre (1 unit = 1 µm). Coordinates up to ~1e9 units stay in Clipper's fast range. */
export const SCALE_PER_MM = 1000;

export interface IntPoint {
  X: number;
  Y: number;
}
export type IntPath = IntPoint[];
export type IntPaths = IntPath[];

/** Millimetres to integer units, rounded to the nearest unit. */
export function toUnits(mm: number): number {
  return Math.round(mm * SCALE_PER_MM);
}

/** Integer units to millimetres. */
export function toMm(units: number): number {
  return units / SCALE_PER_MM;
}

/** A polygon in millimetres ([x, y] pairs) to an integer Clipper path. */
export function toIntPath(points: readonly (readonly [number, number])[]): IntPath {
  return points.map(([x, y]) => ({ X: toUnits(x), Y: toUnits(y) }));
}

/** Signed area in square millimetres of an integer path (positive when CCW). */
export function areaMm2(path: IntPath): number {
  return ClipperLib.Clipper.Area(path) / (SCALE_PER_MM * SCALE_PER_MM);
}

/** Signed area in square units. */
export function areaUnits(path: IntPath): number {
  return ClipperLib.Clipper.Area(path);
}

/**
 * Grows a closed polygon outward by deltaMm, with mitred joins (miter limit 2, so very sharp tips are squared
 * off) or round ones. A mitred offset contains the round offset, so every point of its boundary is at least
 * deltaMm from the polygon: safe for gaps.
 */
export function growPolygon(
  path: IntPath,
  deltaMm: number,
  joins: 'miter' | 'round' = 'miter',
  /** Round joins: how far inside the true arc its chords may lie (mm). */
  arcToleranceMm = 0.01,
): IntPaths {
  const offset = new ClipperLib.ClipperOffset(2, (joins === 'round' ? arcToleranceMm : 0.25) * SCALE_PER_MM);
  const join = joins === 'round' ? ClipperLib.JoinType.jtRound : ClipperLib.JoinType.jtMiter;
  offset.AddPath(path, join, ClipperLib.EndType.etClosedPolygon);
  const out: IntPaths = [];
  offset.Execute(out, deltaMm * SCALE_PER_MM);
  return out;
}

/**
 * The path with vertices within `distanceUnits` of a neighbour, and nearly collinear ones, removed (Clipper's
 * CleanPolygon); the closed outline it bounds moves by at most that distance. Rotating and rounding a sharp tip
 * can leave two vertices a unit apart whose edges cross: a twist no triangulation can cut into convex pieces.
 */
export function cleanPath(path: IntPath, distanceUnits: number): IntPath {
  return ClipperLib.Clipper.CleanPolygon(path, distanceUnits);
}

/**
 * Morphological closing of a closed CCW polygon by radiusMm (grow, then shrink by the same amount), united
 * with the polygon itself so the result always contains it: notches and slots narrower than 2 × radiusMm are
 * filled, convex corners stay where they were. Returns the outer outline (largest positive area).
 */
export function closePolygon(path: IntPath, radiusMm: number): IntPath {
  if (radiusMm <= 0) return path;
  const grow = new ClipperLib.ClipperOffset(4, 0.25 * SCALE_PER_MM);
  grow.AddPath(path, ClipperLib.JoinType.jtMiter, ClipperLib.EndType.etClosedPolygon);
  const grown: IntPaths = [];
  grow.Execute(grown, radiusMm * SCALE_PER_MM);
  const shrink = new ClipperLib.ClipperOffset(4, 0.25 * SCALE_PER_MM);
  shrink.AddPaths(grown, ClipperLib.JoinType.jtMiter, ClipperLib.EndType.etClosedPolygon);
  const shrunk: IntPaths = [];
  shrink.Execute(shrunk, -radiusMm * SCALE_PER_MM);
  const merged = unionPaths([...shrunk, path]);
  let best: IntPath | null = null;
  for (const p of merged) if (!best || ClipperLib.Clipper.Area(p) > ClipperLib.Clipper.Area(best)) best = p;
  return best && ClipperLib.Clipper.Area(best) >= ClipperLib.Clipper.Area(path) ? best : path;
}

/**
 * The closed polygon `path` simplified by Douglas–Peucker at tolerance tolMm (simplify-js): its vertices are
 * some of the outline's, and the two boundaries are within tolMm of each other. Null when fewer than three
 * vertices are left or the orientation flips.
 */
export function simplifyOutline(path: IntPath, tolMm: number): IntPath | null {
  const open = [...path, path[0]!].map((p) => ({ x: p.X, y: p.Y }));
  const kept = simplify(open, tolMm * SCALE_PER_MM, true).slice(0, -1);
  if (kept.length < 3) return null;
  const simplified = kept.map((p) => ({ X: p.x, Y: p.y }));
  return ClipperLib.Clipper.Area(simplified) > 0 ? simplified : null;
}

/**
 * A polygon with fewer vertices that contains the closed CCW polygon `path`: the outline simplified by
 * Douglas–Peucker at tolerance tolMm (simplify-js), then grown by tolMm with mitred joins. Every point of the
 * outline lies within tolMm of the simplified one, so the grown polygon contains it; that is checked with a
 * Clipper difference all the same, and null is returned when it fails (a simplification that crossed itself).
 */
export function simplifyContaining(path: IntPath, tolMm: number): IntPath | null {
  const simplified = simplifyOutline(path, tolMm);
  if (!simplified) return null;
  const outer = growPolygon(simplified, tolMm).filter((p) => ClipperLib.Clipper.Area(p) > 0);
  if (outer.length !== 1) return null;
  const left = differencePaths([path], outer);
  const leftArea = left.reduce((s, p) => s + ClipperLib.Clipper.Area(p), 0);
  return leftArea <= path.length ? outer[0]! : null;
}

/** Number of reflex (inward) corners of a CCW polygon: it bounds the convex pieces it is cut into. */
export function reflexCorners(path: IntPath): number {
  let n = 0;
  for (let i = 0; i < path.length; i++) {
    const a = path[(i + path.length - 1) % path.length]!;
    const b = path[i]!;
    const c = path[(i + 1) % path.length]!;
    if ((b.X - a.X) * (c.Y - b.Y) - (b.Y - a.Y) * (c.X - b.X) < 0) n++;
  }
  return n;
}

/**
 * No-fit polygon of a moving path around a fixed one: the set of translations t for which moving + t meets
 * the interior of fixed, i.e. the Minkowski sum fixed ⊕ (−moving). Built as the union of the sums of convex
 * pieces (both polygons cut into convex pieces beforehand: convex-decomposition.ts), each a convex hull of
 * vertex sums; Clipper only does the union. Pass the pieces of the fixed polygon and of the negated moving one.
 * Holes are dropped: a union of many overlapping polygons can leave sliver holes a few µm² in size, and a
 * placement in one would overlap. Losing true pockets (a part wholly inside another's cavity) is the safe side.
 */
export function noFitPolygonFromPieces(fixedPieces: IntPaths, negatedMovingPieces: IntPaths): IntPaths {
  const count = fixedPieces.length * negatedMovingPieces.length;
  if (count > CORE_SUMS * 2) return coreFirstUnion(fixedPieces, negatedMovingPieces);
  // One union per fixed piece first: its sums overlap one another heavily, and uniting them in one sweep
  // with every other piece's sums made Clipper process several times more edge crossings.
  const rows: IntPaths[] = [];
  for (const a of fixedPieces) {
    const sums = negatedMovingPieces.map((b) => convexMinkowskiSum(a, b));
    rows.push(sums.length === 1 ? sums : unionTree(sums.map((x) => [x])));
  }
  return unionTree(rows).filter((p) => ClipperLib.Clipper.Area(p) > 0);
}

/** How many of the largest sums make the core that the others are tested against. */
const CORE_SUMS = 24;

/**
 * The same union when there are many sums (two outlines of many convex pieces each): most of them lie inside
 * the union of the largest ones and add nothing to its outer contour, which is all that is kept. The largest
 * sums are united first ("core"); the sums left that lie inside one of the core's outer contours are dropped,
 * the largest of the others join the core, and so on until none is left.
 */
function coreFirstUnion(fixedPieces: IntPaths, negatedMovingPieces: IntPaths): IntPaths {
  const sums: { path: IntPath; area: number }[] = [];
  for (const a of fixedPieces)
    for (const b of negatedMovingPieces) {
      const path = convexMinkowskiSum(a, b);
      sums.push({ path, area: ClipperLib.Clipper.Area(path) });
    }
  sums.sort((x, y) => y.area - x.area);
  // Rounds: the core grows by the next largest sums not inside it, and the others are tested again.
  let core: IntPaths = [];
  let left = sums.map((x) => x.path);
  while (left.length > 0) {
    const take = left.slice(0, CORE_SUMS);
    core = unionTree([core, ...take.map((p) => [p])]).filter((p) => ClipperLib.Clipper.Area(p) > 0);
    left = left.slice(CORE_SUMS).filter((path) => !core.some((o) => convexInside(path, o)));
  }
  return core;
}

/**
 * True when the convex CCW polygon lies inside the simple polygon `outer` (closed sets): no edge of `outer`
 * meets the convex polygon's open interior, so that interior lies wholly inside or wholly outside, and a
 * point of it (the vertices' mean) is strictly inside.
 */
export function convexInside(convex: IntPath, outer: IntPath): boolean {
  const box = boxOfPaths([convex]);
  const cx = convex.reduce((s, q) => s + q.X, 0) / convex.length;
  const cy = convex.reduce((s, q) => s + q.Y, 0) / convex.length;
  if (ClipperLib.Clipper.PointInPolygon({ X: cx, Y: cy }, outer) !== 1) return false;
  for (let i = 0; i < outer.length; i++) {
    const p = outer[i]!;
    const q = outer[(i + 1) % outer.length]!;
    if (Math.max(p.X, q.X) <= box.minX || Math.min(p.X, q.X) >= box.maxX) continue;
    if (Math.max(p.Y, q.Y) <= box.minY || Math.min(p.Y, q.Y) >= box.maxY) continue;
    if (segmentMeetsInterior(p, q, convex)) return false;
  }
  return true;
}

/**
 * Whether the segment pq meets the open interior of a convex CCW polygon: the parameters t in [0, 1] where
 * p + t(q − p) lies strictly left of every edge form an open interval (Cyrus–Beck clipping); it is non-empty.
 */
function segmentMeetsInterior(p: IntPoint, q: IntPoint, convex: IntPath): boolean {
  let lo = 0;
  let hi = 1;
  for (let i = 0; i < convex.length; i++) {
    const a = convex[i]!;
    const b = convex[(i + 1) % convex.length]!;
    const ex = b.X - a.X;
    const ey = b.Y - a.Y;
    const f0 = ex * (p.Y - a.Y) - ey * (p.X - a.X);
    const f1 = ex * (q.Y - a.Y) - ey * (q.X - a.X);
    if (f0 <= 0 && f1 <= 0) return false;
    if (f0 > 0 && f1 > 0) continue;
    // f(t) = f0 + t(f1 − f0) changes sign at t0: the side with f > 0 is kept.
    const t0 = f0 / (f0 - f1);
    if (f1 > f0) lo = Math.max(lo, t0);
    else hi = Math.min(hi, t0);
    if (lo >= hi) return false;
  }
  return lo < hi;
}

/**
 * Whether direction w lies within the turn a tracing makes at a vertex from direction u to direction v: the
 * counter-clockwise sweep at a convex vertex, the clockwise one at a reflex vertex, none at a straight one.
 * The sweep is half open so that an edge parallel to u or v is attached once: `atStart` says whether w = u
 * counts at a convex vertex (and w = v at a reflex one, where the sweep runs the other way).
 */
function inTurn(ux: number, uy: number, vx: number, vy: number, wx: number, wy: number, atStart: boolean) {
  const turn = ux * vy - uy * vx;
  if (turn === 0) return false;
  const a = ux * wy - uy * wx;
  const b = wx * vy - wy * vx;
  if (a === 0 && ux * wx + uy * wy > 0) return turn > 0 ? atStart : !atStart;
  if (b === 0 && wx * vx + wy * vy > 0) return turn > 0 ? !atStart : atStart;
  return turn > 0 ? a > 0 && b > 0 : a < 0 && b < 0;
}

/**
 * The outline as the convolution takes it: cleaned of vertices within 2 units of a neighbour or of the line
 * through their neighbours (a rounded tip's micro-zigzag turns the tracing a whole extra turn, which would
 * cancel part of the sum), and only if it then turns exactly once counter-clockwise (else null).
 */
function tracingOutline(path: IntPath): IntPath | null {
  const clean = cleanPath(path, 2);
  if (clean.length < 3) return null;
  const turning = turningOf(clean);
  return turning && turnsOnce(turning.total) ? clean : null;
}

/**
 * No-fit polygon of a moving outline around a fixed one by the convolution method: the Minkowski sum
 * fixed ⊕ (−moving) is the set of points of non-zero winding number with respect to the convolution cycles of
 * the two outlines (Guibas, Ramshaw & Stolfi, "A kinetic framework for computational geometry", FOCS 1983; used
 * for Minkowski sums by Wein, "Exact and efficient construction of planar Minkowski sums using the convolution
 * method", ESA 2006 — from memory). The convolution holds each edge of one outline placed at each vertex of the
 * other whose turn contains the edge's direction (reversed at reflex vertices); its segments are chained into
 * closed cycles and Clipper takes their non-zero region in one union, where the piece method unites some fifty
 * convex sums for two stars. Outer contours only, as noFitPolygonFromPieces gives them. Null when the segments
 * do not close up, an outline does not turn exactly once (tracingOutline), or the result is smaller than the
 * two areas together (the Brunn–Minkowski inequality: area(A ⊕ B) ≥ area(A) + area(B)): the caller falls back
 * to the pieces. Cleaning moves an outline by at most 2 units, inside the no-fit polygons' safety margin.
 */
export function noFitPolygonByConvolution(fixed: IntPath, negatedMoving: IntPath): IntPaths | null {
  const a = tracingOutline(fixed);
  const b = tracingOutline(negatedMoving);
  if (!a || !b) return null;
  const xs: number[] = [];
  const ys: number[] = [];
  const xe: number[] = [];
  const ye: number[] = [];
  const push = (x0: number, y0: number, x1: number, y1: number, reversed: boolean) => {
    xs.push(reversed ? x1 : x0);
    ys.push(reversed ? y1 : y0);
    xe.push(reversed ? x0 : x1);
    ye.push(reversed ? y0 : y1);
  };
  // The edges of one outline at the vertices of the other: a's edges in b's turns, half open at the start;
  // b's edges in a's turns, half open at the end, so parallel edges of the two are attached once, in order.
  const attach = (p: IntPath, q: IntPath, atStart: boolean, pFirst: boolean) => {
    const np = p.length;
    const nq = q.length;
    for (let j = 0; j < nq; j++) {
      const prev = q[(j - 1 + nq) % nq]!;
      const at = q[j]!;
      const next = q[(j + 1) % nq]!;
      const ux = at.X - prev.X;
      const uy = at.Y - prev.Y;
      const vx = next.X - at.X;
      const vy = next.Y - at.Y;
      const reflex = ux * vy - uy * vx < 0;
      for (let i = 0; i < np; i++) {
        const s = p[i]!;
        const e = p[(i + 1) % np]!;
        if (!inTurn(ux, uy, vx, vy, e.X - s.X, e.Y - s.Y, atStart)) continue;
        // Sums are taken in the same order either way round (a's point + b's point).
        if (pFirst) push(s.X + at.X, s.Y + at.Y, e.X + at.X, e.Y + at.Y, reflex);
        else push(at.X + s.X, at.Y + s.Y, at.X + e.X, at.Y + e.Y, reflex);
      }
    }
  };
  attach(a, b, false, true);
  attach(b, a, true, false);
  // Chain the segments into closed cycles: every sum point has as many segments leaving as arriving.
  const count = xs.length;
  const starting = new Map<string, number[]>();
  for (let k = 0; k < count; k++) {
    const key = `${xs[k]},${ys[k]}`;
    const list = starting.get(key);
    if (list) list.push(k);
    else starting.set(key, [k]);
  }
  const used = new Uint8Array(count);
  const cycles: IntPaths = [];
  for (let first = 0; first < count; first++) {
    if (used[first]) continue;
    const cycle: IntPath = [];
    let k: number | undefined = first;
    while (k !== undefined) {
      used[k] = 1;
      cycle.push({ X: xs[k]!, Y: ys[k]! });
      const x = xe[k]!;
      const y = ye[k]!;
      if (x === xs[first] && y === ys[first]) break;
      const list: number[] | undefined = starting.get(`${x},${y}`);
      k = list?.find((q) => !used[q]);
      if (k === undefined) return null;
    }
    cycles.push(cycle);
  }
  const outer = unionPaths(cycles).filter((p) => ClipperLib.Clipper.Area(p) > 0);
  const area = outer.reduce((s, p) => s + ClipperLib.Clipper.Area(p), 0);
  const least = Math.abs(ClipperLib.Clipper.Area(a)) + Math.abs(ClipperLib.Clipper.Area(b));
  return area >= least * (1 - 1e-9) ? outer : null;
}

/** The same with Clipper's own MinkowskiSum (edge-pair parallelograms); a fallback for odd inputs. */
export function noFitPolygon(fixed: IntPaths, moving: IntPath): IntPaths {
  const negated = moving.map((p) => ({ X: -p.X, Y: -p.Y }));
  const sum = ClipperLib.Clipper.MinkowskiSum(negated, fixed, true);
  return sum.filter((p) => ClipperLib.Clipper.Area(p) > 0);
}

/**
 * Union of groups of paths, eight groups at a time and then the results in pairs (a balanced tree): the edges
 * inside each partial union are gone before the next sweep, so heavily overlapping sums cost fewer crossings
 * than one sweep over all of them (about a fifth less time on awkward outlines).
 */
function unionTree(groups: IntPaths[]): IntPaths {
  if (groups.length <= 8) return unionPaths(groups.flat());
  const mid = groups.length >> 1;
  return unionPaths([...unionTree(groups.slice(0, mid)), ...unionTree(groups.slice(mid))]);
}

/** Union of closed paths (non-zero fill). */
export function unionPaths(paths: IntPaths): IntPaths {
  const c = new ClipperLib.Clipper();
  c.AddPaths(paths, ClipperLib.PolyType.ptSubject, true);
  const out: IntPaths = [];
  c.Execute(
    ClipperLib.ClipType.ctUnion,
    out,
    ClipperLib.PolyFillType.pftNonZero,
    ClipperLib.PolyFillType.pftNonZero,
  );
  return out;
}

/** subject minus the union of clips (non-zero fill on both). */
export function differencePaths(subject: IntPaths, clips: IntPaths): IntPaths {
  const c = new ClipperLib.Clipper();
  c.AddPaths(subject, ClipperLib.PolyType.ptSubject, true);
  if (clips.length > 0) c.AddPaths(clips, ClipperLib.PolyType.ptClip, true);
  const out: IntPaths = [];
  c.Execute(
    ClipperLib.ClipType.ctDifference,
    out,
    ClipperLib.PolyFillType.pftNonZero,
    ClipperLib.PolyFillType.pftNonZero,
  );
  return out;
}

/** A subject at least this many times as long as high, and this long (mm), is clipped across (differenceAcross). */
export const ACROSS_ASPECT = 4;
export const ACROSS_MIN_MM = 2500;

/**
 * The subject minus the union of the clips, as differencePaths gives it, for regions laid along a long sheet
 * (a roll): Clipper's sweep (Vatti, "A generic solution to polygon clipping", CACM 35(7), 1992; from memory)
 * runs along y, and its cost grows with the edges every horizontal scanline crosses, which on a 10 m sheet is
 * every part along its length. A subject whose bounds are at least ACROSS_ASPECT times as wide as high and
 * ACROSS_MIN_MM wide is clipped with x and y swapped, so the scanlines run across the sheet's short side, and
 * swapped back (each path reversed, so outer contours keep their counter-clockwise turn). Intersection points
 * may then round to the other neighbouring unit (1 µm, inside the no-fit polygons' safety margin); other
 * subjects, every stock sheet among them, are clipped as before.
 */
export function differenceAcross(subject: IntPaths, clips: IntPaths): IntPaths {
  const b = boxOfPaths(subject);
  const w = b.maxX - b.minX;
  if (!(w >= ACROSS_ASPECT * (b.maxY - b.minY) && w >= ACROSS_MIN_MM * SCALE_PER_MM))
    return differencePaths(subject, clips);
  const swap = (paths: IntPaths): IntPaths => paths.map((p) => p.map((q) => ({ X: q.Y, Y: q.X })).reverse());
  return swap(differencePaths(swap(subject), swap(clips)));
}

/**
 * subject minus the union of clips, like differencePaths, but only the subject's paths whose bounds meet a clip's
 * go through Clipper; the others are kept as they are. This is exact for a region given as Clipper gives it
 * (outer contours and holes of opposite orientation, non-zero fill): a path whose bounds meet no clip is
 * disjoint from every clip, so it lies inside (or outside) the same contours of the result as before, and its
 * winding contribution is unchanged. A feasible region of a crowded sheet has hundreds of holes and pieces,
 * while a new item's no-fit polygon meets only a few of them.
 */
export function differenceNear(subject: IntPaths, clips: IntPaths): IntPaths {
  if (clips.length === 0) return subject;
  const boxes = clips.map((p) => boxOfPaths([p]));
  const near: IntPaths = [];
  const kept: IntPaths = [];
  for (const path of subject) {
    const b = boxOfPaths([path]);
    const meets = boxes.some(
      (c) => c.minX <= b.maxX && b.minX <= c.maxX && c.minY <= b.maxY && b.minY <= c.maxY,
    );
    (meets ? near : kept).push(path);
  }
  if (near.length === 0) return subject;
  const out = differenceAcross(near, clips);
  for (const p of kept) out.push(p);
  return out;
}

/** A connected region: its outer contour and holes, the outer contour's bounds, its area (square units). */
export interface Component {
  paths: IntPaths;
  minX: number;
  minY: number;
  maxX: number;
  maxY: number;
  area: number;
}

/**
 * subject minus the union of clips as connected components, read from Clipper's PolyTree: an outer contour
 * with its holes is one component, an island inside a hole another.
 */
export function differenceComponents(subject: IntPaths, clips: IntPaths): Component[] {
  const c = new ClipperLib.Clipper();
  c.AddPaths(subject, ClipperLib.PolyType.ptSubject, true);
  if (clips.length > 0) c.AddPaths(clips, ClipperLib.PolyType.ptClip, true);
  const tree = new ClipperLib.PolyTree();
  c.Execute(
    ClipperLib.ClipType.ctDifference,
    tree,
    ClipperLib.PolyFillType.pftNonZero,
    ClipperLib.PolyFillType.pftNonZero,
  );
  const components: Component[] = [];
  const visitOuter = (node: ClipperLib.PolyNode) => {
    const outer = node.Contour();
    const paths = [outer];
    let area = Math.abs(ClipperLib.Clipper.Area(outer));
    for (const hole of node.Childs()) {
      paths.push(hole.Contour());
      area -= Math.abs(ClipperLib.Clipper.Area(hole.Contour()));
      for (const island of hole.Childs()) visitOuter(island);
    }
    components.push({ paths, ...boxOfPaths([outer]), area });
  };
  for (const node of tree.Childs()) visitOuter(node);
  return components;
}

/** Bounds of a set of paths, integer units. */
export function boxOfPaths(paths: IntPaths): { minX: number; minY: number; maxX: number; maxY: number } {
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

/** Intersection of two path sets (non-zero fill). */
export function intersectPaths(a: IntPaths, b: IntPaths): IntPaths {
  const c = new ClipperLib.Clipper();
  c.AddPaths(a, ClipperLib.PolyType.ptSubject, true);
  c.AddPaths(b, ClipperLib.PolyType.ptClip, true);
  const out: IntPaths = [];
  c.Execute(
    ClipperLib.ClipType.ctIntersection,
    out,
    ClipperLib.PolyFillType.pftNonZero,
    ClipperLib.PolyFillType.pftNonZero,
  );
  return out;
}

/** 1 inside, 0 outside, -1 on the boundary (Clipper's convention) for one path. */
export function pointInPath(x: number, y: number, path: IntPath): number {
  return ClipperLib.Clipper.PointInPolygon({ X: x, Y: y }, path);
}
