/**
 * More copies of one shape on a sheet by overlap minimisation, for pieces so large against the sheet that only
 * a handful fit: there the edges decide, the best lattice (pattern.ts) is cut off by them, and bottom-left fill
 * is greedy. Six {8/3} stars of 185 mm sit on a 600 × 400 mm sheet in a 3 × 2 grid by either method; eight
 * fit when they interlock near the edges.
 *
 * Method: the iterated local search over overlapping layouts of Imamichi, Yagiura & Nagamochi, "An iterated
 * local search algorithm based on nonlinear programming for the irregular strip packing problem" (Kyoto
 * University, Dept. of Applied Mathematics and Physics, technical report 2007-009; in Discrete Optimization
 * 6, 2009, from memory), in a simple form, with the container fixed (one sheet) and the count raised one at a
 * time as in Egeblad, Nielsen & Odgaard, "Fast neighborhood search for two- and three-dimensional nesting
 * problems" (EJOR 183, 2007, from memory):
 *  - the layout may overlap; a pair's overlap is measured by its penetration depth, the distance from their
 *    relative position to the boundary of their no-fit polygon (the same polygons bottom-left fill uses, so
 *    the gap is built in), and leaving the sheet's usable rectangle by the distance outside the inner-fit
 *    rectangle;
 *  - separation: every overlapping pair is pushed apart along its shortest way out of the no-fit polygon, each
 *    piece by 0.8 of that way (over-relaxed: with half each, as plain projection would, seven 8-point stars were
 *    found in 15 of 30 seeded runs near the limit, with 0.8 in 22), and every piece is clamped into the sheet,
 *    until nothing overlaps or the total stops falling;
 *  - when it stalls, the piece that overlaps most is moved to the position and rotation (sampled over the sheet)
 *    where it overlaps least, and separation goes on; a few restarts from random layouts follow.
 * A layout found is rounded to whole units and checked directly against the true outlines (clearOfItems); the
 * search is deterministic (a seeded generator, counted work rather than a clock) so a layout never depends on
 * the machine's speed.
 */
import { innerFit, type PlacedItem, type SheetFrame } from './bottom-left';
import { clearOfItems, strictlyInside, type GeometryCache, type NfpEntry, type Variant } from './variants';
import { M, INF } from '../math/hot-globals';

interface Piece {
  /** The piece's shape (index into the search's shapes) and its variant (index into all usable variants). */
  t: number;
  v: number;
  x: number;
  y: number;
}

interface Fit {
  x0: number;
  y0: number;
  x1: number;
  y1: number;
}

/** Floating point-in-polygon (Clipper's rule: 1 inside, 0 outside, −1 on the boundary) for no-fit polygons. */
function pointIn(x: number, y: number, path: readonly { X: number; Y: number }[]): number {
  let inside = false;
  const n = path.length;
  for (let i = 0, j = n - 1; i < n; j = i++) {
    const a = path[i]!;
    const b = path[j]!;
    const cross = (b.X - a.X) * (y - a.Y) - (b.Y - a.Y) * (x - a.X);
    if (
      cross === 0 &&
      x >= M.min(a.X, b.X) &&
      x <= M.max(a.X, b.X) &&
      y >= M.min(a.Y, b.Y) &&
      y <= M.max(a.Y, b.Y)
    )
      return -1;
    if (a.Y > y !== b.Y > y && x < ((b.X - a.X) * (y - a.Y)) / (b.Y - a.Y) + a.X) inside = !inside;
  }
  return inside ? 1 : 0;
}

/** Small seeded generator (mulberry32): the same search, and so the same layout, on every run. */
function generator(seed: number): () => number {
  let s = seed >>> 0;
  return () => {
    s = (s + 0x6d2b79f5) >>> 0;
    let t = s;
    t = M.imul(t ^ (t >>> 15), t | 1);
    t ^= t + M.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** Share of a pair's way out of overlap that each of the two pieces moves (see separation above). */
const PUSH_SHARE = 0.8;

/** Units a pair is pushed past its no-fit polygon's boundary, so rounding to whole units keeps it clear. */
const PUSH_PAST_UNITS = 2;

export interface OverlapSearchOptions {
  /** Work limit: pair evaluations over the whole search (deterministic, unlike a clock). */
  workLimit?: number;
  seed?: number;
}

export interface DenserSheetOptions extends OverlapSearchOptions {
  /** Stop at this many copies (the count that saves a sheet). */
  targetCount: number;
}

/** A placed item of a given shape, as a starting layout takes it. */
export interface ShapedItem {
  shape: number;
  item: PlacedItem;
}

/**
 * The search over one sheet for pieces of the given shapes (each a list of allowed rotations of one part),
 * sharing one work limit across its calls. `solve` returns a clear layout of the start items plus one piece
 * of each shape in `add`, or null when the work runs out first.
 */
function overlapSearch(
  cache: GeometryCache,
  frame: SheetFrame,
  shapes: readonly (readonly Variant[])[],
  options: OverlapSearchOptions,
) {
  const vs: Variant[] = [];
  const fits: Fit[] = [];
  const ofShape: number[][] = shapes.map((variants) => {
    const list: number[] = [];
    for (const v of variants) {
      const fit = innerFit(frame, v);
      if (!fit) continue;
      list.push(vs.length);
      vs.push(v);
      fits.push(fit);
    }
    return list;
  });
  const indexOf = new Map(vs.map((v, i) => [v.key, i]));
  // The no-fit polygon of every ordered pair of usable variants, looked up by index: a search evaluates a pair
  // hundreds of thousands of times, and the cache's string keys and recency bookkeeping took a seventh of a
  // fit-to-sheets search. The entries are the cache's own, so the search sees the very same polygons.
  const nfps: (NfpEntry | undefined)[] = new Array<NfpEntry | undefined>(vs.length * vs.length);
  const nfpOf = (a: number, b: number): NfpEntry => (nfps[a * vs.length + b] ??= cache.nfp(vs[a]!, vs[b]!));
  const random = generator(options.seed ?? 0x5eed);
  let work = 0;
  const workLimit = options.workLimit ?? 400_000;

  /** A piece of shape t at a random rotation and position on the sheet. */
  const randomPiece = (t: number): Piece => {
    const list = ofShape[t]!;
    const v = list[M.floor(random() * list.length)]!;
    const f = fits[v]!;
    return { t, v, x: f.x0 + random() * (f.x1 - f.x0), y: f.y0 + random() * (f.y1 - f.y0) };
  };

  /** Penetration of b into a's no-fit polygon: the push (on b) that clears the pair, or null when clear. */
  const push = (a: Piece, b: Piece): { dx: number; dy: number; depth: number } | null => {
    work++;
    const e = nfpOf(a.v, b.v);
    const rx = b.x - a.x;
    const ry = b.y - a.y;
    if (rx <= e.box.minX || rx >= e.box.maxX || ry <= e.box.minY || ry >= e.box.maxY) return null;
    if (!strictlyInside(e.paths, rx, ry, pointIn)) return null;
    let best = INF;
    let qx = 0;
    let qy = 0;
    for (const p of e.paths)
      for (let i = 0, j = p.length - 1; i < p.length; j = i++) {
        const ax = p[j]!.X;
        const ay = p[j]!.Y;
        const ex = p[i]!.X - ax;
        const ey = p[i]!.Y - ay;
        const l2 = ex * ex + ey * ey;
        let t = l2 === 0 ? 0 : ((rx - ax) * ex + (ry - ay) * ey) / l2;
        t = t < 0 ? 0 : t > 1 ? 1 : t;
        const cx = ax + t * ex - rx;
        const cy = ay + t * ey - ry;
        const d2 = cx * cx + cy * cy;
        if (d2 < best) {
          best = d2;
          qx = cx;
          qy = cy;
        }
      }
    const depth = M.sqrt(best);
    const k = depth > 0 ? (depth + PUSH_PAST_UNITS) / depth : 0;
    // A point exactly on the boundary of a hole or a degenerate edge: push straight up, any way out will do.
    return depth > 0
      ? { dx: qx * k, dy: qy * k, depth }
      : { dx: 0, dy: PUSH_PAST_UNITS, depth: PUSH_PAST_UNITS };
  };

  const clamp = (p: Piece) => {
    const f = fits[p.v]!;
    p.x = M.min(M.max(p.x, f.x0), f.x1);
    p.y = M.min(M.max(p.y, f.y0), f.y1);
  };

  /** Sum of penetration depths of piece i against the others. */
  const overlapOf = (ps: readonly Piece[], i: number, at: Piece): number => {
    let s = 0;
    for (let j = 0; j < ps.length; j++) {
      if (j === i) continue;
      const q = push(ps[j]!, at);
      if (q) s += q.depth;
    }
    return s;
  };

  /** Pushes overlapping pairs apart until none overlap (true) or the total stops falling (false). */
  const separate = (ps: Piece[]): boolean => {
    let bestTotal = INF;
    let stale = 0;
    const mx = new Float64Array(ps.length);
    const my = new Float64Array(ps.length);
    while (work < workLimit) {
      mx.fill(0);
      my.fill(0);
      let total = 0;
      for (let i = 0; i < ps.length; i++)
        for (let j = i + 1; j < ps.length; j++) {
          const q = push(ps[i]!, ps[j]!);
          if (!q) continue;
          total += q.depth;
          mx[j] = mx[j]! + q.dx * PUSH_SHARE;
          my[j] = my[j]! + q.dy * PUSH_SHARE;
          mx[i] = mx[i]! - q.dx * PUSH_SHARE;
          my[i] = my[i]! - q.dy * PUSH_SHARE;
        }
      if (total === 0) return true;
      for (let i = 0; i < ps.length; i++) {
        const p = ps[i]!;
        p.x += mx[i]!;
        p.y += my[i]!;
        clamp(p);
      }
      if (total < bestTotal * 0.995) {
        bestTotal = total;
        stale = 0;
      } else if (++stale > 60) return false;
    }
    return false;
  };

  /**
   * An overlapping piece (the one overlapping most, or now and then another, so the search does not cycle)
   * goes where, over sampled positions and all rotations, it overlaps least.
   */
  const relocateWorst = (ps: Piece[]) => {
    const overlaps = ps.map((p, i) => overlapOf(ps, i, p));
    let pick = 0;
    if (random() < 0.7) {
      for (let i = 1; i < ps.length; i++) if (overlaps[i]! > overlaps[pick]!) pick = i;
    } else {
      const sum = overlaps.reduce((a, b) => a + b, 0);
      let r = random() * sum;
      for (pick = 0; pick < ps.length - 1 && r >= overlaps[pick]!; pick++) r -= overlaps[pick]!;
    }
    ps[pick] = leastOverlap(ps, pick, ps[pick]!.t);
  };

  /** Of `samples` random positions and rotations of shape t for piece i, the one overlapping the others least. */
  const leastOverlap = (ps: readonly Piece[], i: number, t: number, samples = 60): Piece => {
    let best: Piece | null = null;
    let bestOverlap = INF;
    for (let s = 0; s < samples && bestOverlap > 0; s++) {
      const at = randomPiece(t);
      const o = overlapOf(ps, i, at);
      if (o < bestOverlap) {
        bestOverlap = o;
        best = at;
      }
    }
    return best!;
  };

  /** Rounded to whole units, inside the sheet and clear of each other by the direct check; else null. */
  const finish = (ps: readonly Piece[]): PlacedItem[] | null => {
    const items: PlacedItem[] = [];
    for (const p of ps) {
      const f = fits[p.v]!;
      const tx = M.min(M.max(M.round(p.x), f.x0), f.x1);
      const ty = M.min(M.max(M.round(p.y), f.y0), f.y1);
      const variant = vs[p.v]!;
      if (!clearOfItems(items, variant, tx, ty, cache.gapMm)) return null;
      items.push({ variant, tx, ty });
    }
    return items;
  };

  /** A clear layout of the start pieces and one piece of each shape in `add` (they go where they overlap least). */
  const solve = (start: readonly ShapedItem[], add: readonly number[]): PlacedItem[] | null => {
    const seedLayout: Piece[] = [];
    for (const { shape, item } of start) {
      const v = indexOf.get(item.variant.key);
      if (v === undefined) return null; // a start in a rotation outside the lists: nothing to build on
      seedLayout.push({ t: shape, v, x: item.tx, y: item.ty });
    }
    if (add.some((t) => ofShape[t]!.length === 0)) return null;
    const types = [...seedLayout.map((p) => p.t), ...add];
    const count = types.length;
    let restart = 0;
    while (work < workLimit) {
      const ps: Piece[] =
        restart === 0 ? seedLayout.map((p) => ({ ...p })) : types.map((t) => randomPiece(t));
      while (ps.length < count) ps.push(leastOverlap(ps, ps.length, types[ps.length]!, 200));
      for (let kick = 0; kick < 12 * count && work < workLimit; kick++) {
        if (separate(ps)) {
          const items = finish(ps);
          if (items) return items;
        }
        relocateWorst(ps);
      }
      restart++;
    }
    return null;
  };

  return { solve };
}

/**
 * Tries to lay more copies of one shape on a sheet than `start` holds, raising the count by one at a time up
 * to targetCount. `variants` are the shape's allowed rotations (one part index). Returns the fullest clear
 * layout found with more copies than `start`, or null.
 */
export function denserSheet(
  cache: GeometryCache,
  frame: SheetFrame,
  variants: readonly Variant[],
  start: readonly PlacedItem[],
  options: DenserSheetOptions,
): PlacedItem[] | null {
  const search = overlapSearch(cache, frame, [variants], options);
  let layout: ShapedItem[] = start.map((item) => ({ shape: 0, item }));
  let found: PlacedItem[] | null = null;
  for (let count = start.length + 1; count <= options.targetCount; count++) {
    const items = search.solve(layout, [0]);
    if (!items) break;
    found = items;
    layout = items.map((item) => ({ shape: 0, item }));
  }
  return found;
}

/**
 * Lays the `start` items (kept, but free to move) and one more piece of each shape in `add` on one sheet
 * without overlap, by the same search; null when no such layout is found within the work limit.
 */
export function overlapLayout(
  cache: GeometryCache,
  frame: SheetFrame,
  shapes: readonly (readonly Variant[])[],
  start: readonly ShapedItem[],
  add: readonly number[],
  options: OverlapSearchOptions = {},
): PlacedItem[] | null {
  return overlapSearch(cache, frame, shapes, options).solve(start, add);
}
