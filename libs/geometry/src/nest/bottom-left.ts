/**
 * Bottom-left fill over no-fit polygons (Burke, Hellier, Kendall & Whitwell, "A new bottom-left-fill heuristic
 * algorithm for the two-dimensional irregular packing problem", Oper. Res. 54(3), 2006; Bennell & Oliveira,
 * EJOR 184, 2008 — venues from memory). For each part and each allowed rotation, the feasible translations are
 * the inner-fit rectangle of the sheet minus the union of the no-fit polygons of the parts already placed; the
 * chosen position is the feasible vertex with the smallest right edge (then the lowest bottom edge), so the
 * sheet fills as a strip from its left edge.
 *
 * The free space of each sheet (its usable rectangle less the placed parts grown by the gap and a little more,
 * ε) is kept as connected components, outer contours only. A part eroded by ε is still connected (checked)
 * and lies wholly inside one of them, so for a part not yet searched on a sheet only these translations are
 * searched ("windows"): those that put the eroded part's bounding box inside a component's, with the
 * component's area at least the eroded part's, and the centre of a disc inside the part (its pole of
 * inaccessibility, from polylabel) inside the component shrunk by the disc's radius. The windows are cut into
 * strips about as wide as the part and searched in order of the best rank a position in them could have,
 * until none can beat the best position found; only the no-fit polygons of parts near a searched strip are
 * built and subtracted. The ε closes the hairline channels left between neighbours, so the packed area and
 * the closed pockets drop out: on a crowded sheet of different parts, every placement subtracted every placed
 * part's no-fit polygon before.
 */
import {
  areaUnits,
  boxOfPaths,
  differenceAcross,
  differenceComponents,
  differenceNear,
  differencePaths,
  growPolygon,
  simplifyOutline,
  SCALE_PER_MM,
  type Component,
  type IntPaths,
} from './clipper-adapter';
import polylabel from 'polylabel';
import { clearOfItems, translatePaths, type GeometryCache, type Variant } from './variants';

export interface PlacedItem {
  variant: Variant;
  /** Translation in integer units. */
  tx: number;
  ty: number;
}

export interface SheetState {
  group: string;
  items: PlacedItem[];
  usedAreaMm2: number;
  method: 'true-shape' | 'pattern';
  /** Parts (by index) that already failed to fit here: later copies will fail too. */
  full?: Set<number>;
  /** Feasible region per variant, with how many items have been subtracted from it so far. */
  regions?: Map<string, { paths: IntPaths; done: number }>;
  /** Free space: usable rectangle less the items grown by the gap, with how many items are subtracted. */
  free?: { components: Component[]; done: number };
  /** Variants already searched in free-space windows on this sheet. */
  windowed?: Set<string>;
}

/**
 * A variant not yet searched on a sheet with at least this many items, mostly of different parts, is searched
 * inside free-space windows.
 */
const FREE_SPACE_MIN_ITEMS = 8;
/**
 * From this many items on, a variant's first search on a sheet uses free-space windows even when the items are
 * copies of a few parts: a kept region would start from the whole sheet less every item's no-fit polygon (40
 * parts × 50 copies on a 2440 × 1220 mm sheet spent 17 of its 24 s on those first differences; 8.7 s after).
 */
const FREE_SPACE_CROWDED = 40;
/** Slack (integer units) on free-space windows and areas, for rounding in the offsets and the difference. */
const FREE_SPACE_SLACK = 5;
/** Least width (mm) of the strips a free-space window is searched in. */
const STRIP_MIN_MM = 10;
/** ε (mm) as a share of the gap plus a constant: closes channels up to the mitred no-fit polygons' spacing. */
function freeSpaceEpsMm(gapMm: number): number {
  return 0.5 * gapMm + 0.05;
}

const freeGrown = new WeakMap<Variant, IntPaths>();
const erodedBox = new WeakMap<
  Variant,
  { minX: number; minY: number; maxX: number; maxY: number; area: number } | null
>();

/** Bounds and area of the variant eroded by ε, or null when erosion splits it (or leaves nothing). */
function eroded(v: Variant, epsMm: number) {
  let e = erodedBox.get(v);
  if (e === undefined) {
    const paths = growPolygon(v.poly, -epsMm, 'round');
    e =
      paths.length === 1 && areaUnits(paths[0]!) > 0
        ? { ...boxOfPaths(paths), area: areaUnits(paths[0]!) }
        : null;
    erodedBox.set(v, e);
  }
  return e;
}

/** The sheet's free space, brought up to date with the items placed since the last call. */
function freeSpace(frame: SheetFrame, sheet: SheetState, gapMm: number): Component[] {
  if (!sheet.free) {
    const m = frame.marginMm;
    const x0 = Math.floor(m * SCALE_PER_MM);
    const y0 = Math.floor(m * SCALE_PER_MM);
    const x1 = Math.ceil((frame.widthMm - m) * SCALE_PER_MM);
    const y1 = Math.ceil((frame.heightMm - m) * SCALE_PER_MM);
    const paths = [rectPath({ x0, y0, x1, y1 })];
    sheet.free = {
      components: [{ paths, minX: x0, minY: y0, maxX: x1, maxY: y1, area: (x1 - x0) * (y1 - y0) }],
      done: 0,
    };
  }
  const free = sheet.free;
  for (; free.done < sheet.items.length; free.done++) {
    const it = sheet.items[free.done]!;
    let grown = freeGrown.get(it.variant);
    if (!grown) {
      // The outline simplified within τ = ε/2 (Douglas–Peucker), grown by gap + ε − τ with round joins whose
      // chords lie inside the true offset: within gap + ε of the part, with a bounded vertex count. The
      // chords may lie up to ε/4 inside: the free space only grows by that, and its outlines stay short.
      const eps = freeSpaceEpsMm(gapMm);
      const simple = simplifyOutline(it.variant.poly, eps / 2);
      grown = simple
        ? growPolygon(simple, gapMm + eps / 2, 'round', eps / 4)
        : growPolygon(it.variant.poly, gapMm + eps, 'round', eps / 4);
      freeGrown.set(it.variant, grown);
    }
    const clip = translatePaths(grown, it.tx, it.ty);
    const box = boxOfPaths(clip);
    // Only the components the grown item reaches change; the others are kept as they are.
    const kept: Component[] = [];
    const touched: IntPaths = [];
    for (const c of free.components) {
      if (c.maxX <= box.minX || c.minX >= box.maxX || c.maxY <= box.minY || c.minY >= box.maxY) kept.push(c);
      else touched.push(...c.paths);
    }
    if (touched.length === 0) continue;
    // Holes (items standing alone in a component) are dropped, and the component's area with them: a larger
    // free space only prunes less, and the outer contours stay short.
    const split = differenceComponents(touched, clip).map((c) => ({
      ...c,
      paths: [c.paths[0]!],
      area: areaUnits(c.paths[0]!),
    }));
    free.components = kept.concat(split);
  }
  return free.components;
}

/**
 * True when at least half the items are of different parts. Then most searches are a variant's first on the
 * sheet, which the free space speeds up; copies of a few parts reuse their kept regions instead, and keeping
 * the free space up to date would cost more than it saves.
 */
function mostlyDifferent(items: readonly PlacedItem[]): boolean {
  const parts = new Set<number>();
  for (const it of items) parts.add(it.variant.partIndex);
  return 2 * parts.size >= items.length;
}

type Window = { x0: number; y0: number; x1: number; y1: number };

/** A window and, when the inscribed-disc test applies, the region the disc's centre must lie in (units). */
interface FreeWindow extends Window {
  centres: IntPaths | null;
}

const discs = new WeakMap<Variant, { x: number; y: number; r: number }>();

/**
 * A disc inside the variant (centre and radius, integer units): the pole of inaccessibility found by polylabel
 * (V. Agafonkin, mapbox, 2016). Its distance is a true distance from the point to the outline, so the disc
 * lies inside the part even when it is not quite the largest one.
 */
function discOf(v: Variant): { x: number; y: number; r: number } {
  let d = discs.get(v);
  if (!d) {
    const span = Math.max(v.ubounds.maxX - v.ubounds.minX, v.ubounds.maxY - v.ubounds.minY);
    const pole = polylabel([v.poly.map((q) => [q.X, q.Y])], Math.max(span / 200, 1));
    d = { x: pole[0]!, y: pole[1]!, r: Math.max(0, pole.distance) };
    discs.set(v, d);
  }
  return d;
}

const centreRegions = new WeakMap<Component, Map<number, IntPaths>>();

/**
 * Where the centre of an inscribed disc of radius r − ε can lie in a component: its outer contour shrunk by
 * that radius (less a little slack). Clipper's round joins draw the arcs with chords inside the true arcs,
 * so the shrunk polygon contains the exact set. Cached per component and radius.
 */
function centreRegion(c: Component, radius: number): IntPaths {
  let byRadius = centreRegions.get(c);
  if (!byRadius) centreRegions.set(c, (byRadius = new Map()));
  let paths = byRadius.get(radius);
  if (!paths) {
    // Coarse arcs (chords up to 0.2 mm inside): fewer vertices, and the region only grows.
    paths = growPolygon(c.paths[0]!, -radius / SCALE_PER_MM, 'round', 0.2).filter((p) => areaUnits(p) > 0);
    byRadius.set(radius, paths);
  }
  return paths;
}

/**
 * Translations of v (within the inner-fit rectangle) that put its eroded bounding box inside the bounding box
 * of a free-space component at least as large as the eroded part, and the centre of its inscribed disc, shrunk
 * by ε, inside the component shrunk by the disc's radius; null when v is not searched this way.
 */
function freeWindows(
  components: Component[],
  v: Variant,
  fit: Window,
  epsMm: number,
  discRadius: number,
): FreeWindow[] | null {
  const e = eroded(v, epsMm);
  if (!e) return null;
  const disc = discOf(v);
  // Slack for rounding in the offsets; rounded down to a quarter millimetre so that parts of about the same
  // size share the shrunk components. Below 1 mm the test prunes too little to pay for itself.
  const quarter = SCALE_PER_MM / 4;
  const radius = Math.floor((discRadius - epsMm * SCALE_PER_MM - 2 * FREE_SPACE_SLACK) / quarter) * quarter;
  const out: FreeWindow[] = [];
  for (const c of components) {
    if (c.area * 1.001 + SCALE_PER_MM * SCALE_PER_MM < e.area) continue;
    const x0 = Math.max(fit.x0, c.minX - e.minX - FREE_SPACE_SLACK);
    const x1 = Math.min(fit.x1, c.maxX - e.maxX + FREE_SPACE_SLACK);
    const y0 = Math.max(fit.y0, c.minY - e.minY - FREE_SPACE_SLACK);
    const y1 = Math.min(fit.y1, c.maxY - e.maxY + FREE_SPACE_SLACK);
    if (x1 < x0 || y1 < y0) continue;
    const w = { x0, y0, x1: Math.max(x1, x0 + 1), y1: Math.max(y1, y0 + 1) };
    if (radius < SCALE_PER_MM) {
      out.push({ ...w, centres: null });
      continue;
    }
    // The disc needs a component at least its diameter wide and high.
    if (c.maxX - c.minX < 2 * radius || c.maxY - c.minY < 2 * radius) continue;
    for (const piece of centreRegion(c, radius)) {
      const b = boxOfPaths([piece]);
      const px0 = Math.max(w.x0, Math.floor(b.minX - disc.x));
      const px1 = Math.min(w.x1, Math.ceil(b.maxX - disc.x));
      const py0 = Math.max(w.y0, Math.floor(b.minY - disc.y));
      const py1 = Math.min(w.y1, Math.ceil(b.maxY - disc.y));
      if (px1 < px0 || py1 < py0) continue;
      out.push({
        x0: px0,
        y0: py0,
        x1: Math.max(px1, px0 + 1),
        y1: Math.max(py1, py0 + 1),
        centres: [piece],
      });
    }
  }
  return out;
}

/**
 * The y-range of a region within the vertical slab x0 ≤ x ≤ x1, or null when they do not meet. A bounded
 * region meets the slab only where its boundary does, so clipping its edges to the slab is enough.
 */
export function slabRange(paths: IntPaths, x0: number, x1: number): { y0: number; y1: number } | null {
  let y0 = Infinity;
  let y1 = -Infinity;
  for (const path of paths)
    for (let i = 0; i < path.length; i++) {
      const a = path[i]!;
      const b = path[(i + 1) % path.length]!;
      const lo = Math.max(x0, Math.min(a.X, b.X));
      const hi = Math.min(x1, Math.max(a.X, b.X));
      if (lo > hi) continue;
      if (a.X === b.X) {
        y0 = Math.min(y0, a.Y, b.Y);
        y1 = Math.max(y1, a.Y, b.Y);
        continue;
      }
      for (const x of [lo, hi]) {
        const y = a.Y + ((b.Y - a.Y) * (x - a.X)) / (b.X - a.X);
        y0 = Math.min(y0, y);
        y1 = Math.max(y1, y);
      }
    }
  return y0 <= y1 ? { y0: Math.floor(y0), y1: Math.ceil(y1) } : null;
}

function rectPath(w: Window) {
  return [
    { X: w.x0, Y: w.y0 },
    { X: w.x1, Y: w.y0 },
    { X: w.x1, Y: w.y1 },
    { X: w.x0, Y: w.y1 },
  ];
}

export interface SheetFrame {
  widthMm: number;
  heightMm: number;
  marginMm: number;
}

/** Inner-fit rectangle: translations keeping the variant inside the sheet less its margin (integer units). */
export function innerFit(
  frame: SheetFrame,
  v: Variant,
): { x0: number; y0: number; x1: number; y1: number } | null {
  const m = frame.marginMm;
  const x0 = Math.ceil((m - v.bounds.minX) * SCALE_PER_MM - 1e-6);
  const y0 = Math.ceil((m - v.bounds.minY) * SCALE_PER_MM - 1e-6);
  let x1 = Math.floor((frame.widthMm - m - v.bounds.maxX) * SCALE_PER_MM + 1e-6);
  let y1 = Math.floor((frame.heightMm - m - v.bounds.maxY) * SCALE_PER_MM + 1e-6);
  // A part exactly as wide as the usable sheet fits (up to 1 µm of rounding past the margin), as the check
  // that a part fits an empty sheet says.
  if (x1 === x0 - 1) x1 = x0;
  if (y1 === y0 - 1) y1 = y0;
  if (x1 < x0 || y1 < y0) return null;
  return { x0, y0, x1, y1 };
}

/**
 * Which point counts as "bottom-left": 'left' ranks by the part's left edge then bottom edge (the classic
 * rule), 'right' by the right edge then bottom edge (keeps the used strip short).
 */
export type FillRule = 'left' | 'right';

interface Candidate {
  variant: Variant;
  tx: number;
  ty: number;
  primary: number;
  secondary: number;
}

function candidate(rule: FillRule, variant: Variant, tx: number, ty: number): Candidate {
  const x = rule === 'left' ? tx + variant.ubounds.minX : tx + variant.ubounds.maxX;
  return { variant, tx, ty, primary: x, secondary: ty + variant.ubounds.minY };
}

/** Candidates in ranking order: primary, then secondary, then the variant's place in the list, then tx. */
function compareCandidates(a: Candidate & { order: number }, b: Candidate & { order: number }): number {
  return a.primary - b.primary || a.secondary - b.secondary || a.order - b.order || a.tx - b.tx;
}

/** A strip of a free-space window, searched on its own, and the least rank any position in it can have. */
interface Strip {
  variant: Variant;
  order: number;
  fit: Window;
  window: Window;
  bound: number;
}

/**
 * Best bottom-left position for any of the variants on a sheet, or null when none fits.
 *
 * A variant met for the first time on a crowded sheet of mostly different parts is searched in free-space
 * windows, each cut into vertical strips about as wide as the part. The strips of all variants are searched in
 * order of the least rank a position in them can have (branch and bound): a strip that cannot beat the best
 * position found so far, checked directly against its neighbours, is never searched, and its no-fit polygons
 * are never built. The lexicographic least point of a region is a vertex of the part of it in the strip that
 * holds it, so the position found is the one a search of the whole sheet finds.
 */
export function findPosition(
  cache: GeometryCache,
  frame: SheetFrame,
  sheet: SheetState,
  variants: readonly Variant[],
  rule: FillRule = 'right',
  /** Search first-time variants inside free-space windows (false: always the whole inner-fit rectangle). */
  windowsAllowed = true,
): Candidate | null {
  type Ranked = Candidate & { order: number };
  let best: Ranked | null = null;
  const all: Ranked[] = [];
  const strips: Strip[] = [];
  const reach = Math.ceil((cache.gapMm + 1) * SCALE_PER_MM);
  /** No-fit polygons of the items from index `from` on that can reach one of the spans, placed. */
  const clipsNear = (v: Variant, spans: readonly Window[], from: number): IntPaths => {
    const reaches = (b: { minX: number; minY: number; maxX: number; maxY: number }, dx: number, dy: number) =>
      spans.some((w) => b.maxX + dx > w.x0 && b.minX + dx < w.x1 && b.maxY + dy > w.y0 && b.minY + dy < w.y1);
    // Items whose no-fit polygon cannot reach a searched span are skipped before it is built: the polygon lies
    // within the item's bounds less the part's, grown by the gap and 1 mm.
    const vb = v.ubounds;
    const clips: IntPaths = [];
    for (let k = from; k < sheet.items.length; k++) {
      const it = sheet.items[k]!;
      const ib = it.variant.ubounds;
      const rough = {
        minX: ib.minX - vb.maxX - reach,
        minY: ib.minY - vb.maxY - reach,
        maxX: ib.maxX - vb.minX + reach,
        maxY: ib.maxY - vb.minY + reach,
      };
      if (!reaches(rough, it.tx, it.ty)) continue;
      const nfp = cache.nfp(it.variant, v);
      if (!reaches(nfp.box, it.tx, it.ty)) continue;
      // Neighbouring strips of one variant meet the same items: each placed polygon is built once per call.
      const key = `${k}|${v.key}`;
      let placed = placedNfps.get(key);
      if (!placed) placedNfps.set(key, (placed = translatePaths(nfp.paths, it.tx, it.ty)));
      for (const p of placed) clips.push(p);
    }
    return clips;
  };
  const placedNfps = new Map<string, IntPaths>();
  /** Vertices of a feasible region inside the inner-fit rectangle, as ranked candidates. */
  const vertices = (region: IntPaths, v: Variant, order: number, fit: Window, out: Ranked[]) => {
    for (const path of region)
      for (const q of path) {
        const tx = Math.min(Math.max(q.X, fit.x0), fit.x1 < fit.x0 + 1 ? fit.x0 : fit.x1);
        const ty = Math.min(Math.max(q.Y, fit.y0), fit.y1 < fit.y0 + 1 ? fit.y0 : fit.y1);
        if (tx !== q.X || ty !== q.Y) continue;
        // As candidate() gives, built in one object: crowded regions have many thousands of vertices.
        out.push({
          variant: v,
          tx,
          ty,
          primary: rule === 'left' ? tx + v.ubounds.minX : tx + v.ubounds.maxX,
          secondary: ty + v.ubounds.minY,
          order,
        });
      }
  };
  const seen = (sheet.windowed ??= new Set<string>());
  // One disc radius for all the variants (turns of one part): each turn's disc lies inside it.
  let radius: number | undefined;
  const discRadius = () => (radius ??= Math.min(...variants.map((v) => discOf(v).r)));
  for (let order = 0; order < variants.length; order++) {
    const v = variants[order]!;
    const fit = innerFit(frame, v);
    if (!fit) continue;
    // A degenerate inner-fit rectangle (part exactly as wide as the usable sheet) is widened by one unit.
    const whole = {
      x0: fit.x0,
      y0: fit.y0,
      x1: Math.max(fit.x1, fit.x0 + 1),
      y1: Math.max(fit.y1, fit.y0 + 1),
    };
    if (sheet.items.length === 0) {
      const c = { ...candidate(rule, v, fit.x0, fit.y0), order };
      if (!best || compareCandidates(c, best) < 0) best = c;
      continue;
    }
    // Feasible region = inner-fit rectangle minus the no-fit polygons of the placed items, kept per sheet and
    // variant and updated with only the items placed since the last call.
    const regions = (sheet.regions ??= new Map());
    const cached = regions.get(v.key);
    let windows: FreeWindow[] | null = null;
    if (
      !cached &&
      windowsAllowed &&
      sheet.items.length >= FREE_SPACE_MIN_ITEMS &&
      (mostlyDifferent(sheet.items) || sheet.items.length >= FREE_SPACE_CROWDED)
    )
      windows = freeWindows(
        freeSpace(frame, sheet, cache.gapMm),
        v,
        whole,
        freeSpaceEpsMm(cache.gapMm),
        discRadius(),
      );
    if (windows && !seen.has(v.key)) {
      // First search of this variant here: its windows, in strips, join the branch and bound below.
      seen.add(v.key);
      const width = Math.max(v.ubounds.maxX - v.ubounds.minX, STRIP_MIN_MM * SCALE_PER_MM);
      const disc = discOf(v);
      for (const w of windows)
        for (let x0 = w.x0; x0 < w.x1; x0 += width) {
          const x1 = Math.min(w.x1, x0 + width);
          // Only the rows where the disc's centre can be, in this strip, are searched.
          let { y0, y1 } = w;
          if (w.centres) {
            const ys = slabRange(w.centres, x0 + disc.x - 1, x1 + disc.x + 1);
            if (!ys) continue;
            y0 = Math.max(y0, Math.floor(ys.y0 - disc.y) - 1);
            y1 = Math.min(y1, Math.ceil(ys.y1 - disc.y) + 1);
            if (y1 < y0) continue;
          }
          const window = { x0, x1, y0, y1: Math.max(y1, y0 + 1) };
          strips.push({ variant: v, order, fit, window, bound: candidate(rule, v, x0, y0).primary });
        }
      continue;
    }
    // Lower bound on this variant's rank: no better than the best found so far → skip.
    const lowX = windows ? Math.min(...windows.map((w) => w.x0)) : fit.x0;
    if (best && (windows?.length === 0 || candidate(rule, v, lowX, fit.y0).primary > best.primary)) continue;
    // A variant searched again (more copies of its part) gets its whole region, kept and updated from then on.
    const start = cached ? cached.paths : windows ? windows.map(rectPath) : [rectPath(whole)];
    const from = cached ? cached.done : 0;
    const clips = clipsNear(v, windows ?? [whole], from);
    // A kept region is Clipper's output: only its paths near the new items need Clipper again.
    const region =
      start.length === 0
        ? []
        : cached
          ? differenceNear(start, clips)
          : clips.length === 0 && !windows
            ? start
            : differenceAcross(start, clips);
    regions.set(v.key, { paths: region, done: sheet.items.length });
    const before = all.length;
    vertices(region, v, order, fit, all);
    for (let i = before; i < all.length; i++)
      if (!best || compareCandidates(all[i]!, best) < 0) best = all[i]!;
  }
  if (sheet.items.length === 0) return best;
  // Best first, each checked directly against its neighbours.
  const clear = (c: Candidate) => clearOfItems(sheet.items, c.variant, c.tx, c.ty, cache.gapMm);
  // The best vertex (best, unless it came from no region) nearly always passes: the others are sorted only
  // when it does not.
  let found: Ranked | null;
  if (best && all.length > 0 && clear(best)) found = best;
  else {
    all.sort(compareCandidates);
    found = all.find(clear) ?? null;
  }
  strips.sort((a, b) => a.bound - b.bound || a.order - b.order || a.window.x0 - b.window.x0);
  /** Whether a vertex of a strip's region failed the direct check. */
  let rejected = false;
  for (const s of strips) {
    if (found && s.bound > found.primary) break;
    const clips = clipsNear(s.variant, [s.window], 0);
    const region = differencePaths([rectPath(s.window)], clips);
    const mine: Ranked[] = [];
    vertices(region, s.variant, s.order, s.fit, mine);
    mine.sort(compareCandidates);
    for (const c of mine) {
      if (found && compareCandidates(c, found) >= 0) break;
      if (clear(c)) {
        found = c;
        break;
      }
      rejected = true;
    }
  }
  // Windows hold every feasible translation: strips whose regions are empty prove there is none. Only when a
  // vertex of them failed the direct check (a sliver of a Minkowski union) is the search run again over whole
  // regions, as it would have run without windows.
  if (!found && rejected) return findPosition(cache, frame, sheet, variants, rule, false);
  return found;
}

/**
 * Places items (variants lists, one per copy, largest first) by bottom-left fill: first fit over the open
 * sheets of the group, then a new sheet. Returns the sheets (existing ones are extended in place) or the index
 * of the first copy that cannot fit on an empty sheet.
 */
export function bottomLeftFill(
  cache: GeometryCache,
  frame: SheetFrame,
  group: string,
  copies: readonly (readonly Variant[])[],
  sheets: SheetState[],
  rule: FillRule = 'right',
): { sheets: SheetState[]; failed: number | null } {
  const sheetArea = frame.widthMm * frame.heightMm;
  /** The copy at which each sheet opened by this call was opened. */
  const openedAt = new Map<SheetState, number>();
  // A sheet keeps each variant's feasible region for the part's next copy. Once a part's last copy is
  // placed, or a sheet turns the part away, its regions there are dropped: hundreds of different parts
  // would otherwise keep a region each per turn and sheet (gigabytes for a thousand parts).
  const copiesLeft = new Map<number, number>();
  for (const c of copies) {
    const k = c[0]?.partIndex ?? -1;
    copiesLeft.set(k, (copiesLeft.get(k) ?? 0) + 1);
  }
  const dropRegions = (sheet: SheetState, variants: readonly Variant[]) => {
    for (const v of variants) sheet.regions?.delete(v.key);
  };
  for (let i = 0; i < copies.length; i++) {
    const variants = copies[i] as readonly Variant[];
    const area = variants[0]?.areaMm2 ?? 0;
    const partIndex = variants[0]?.partIndex ?? -1;
    const left = (copiesLeft.get(partIndex) ?? 1) - 1;
    copiesLeft.set(partIndex, left);
    if (left === 0) for (const sheet of sheets) dropRegions(sheet, variants);
    let placed = false;
    for (const sheet of sheets) {
      if (sheet.group !== group) continue;
      if (sheet.usedAreaMm2 + area > sheetArea) continue;
      if (sheet.full?.has(partIndex)) continue;
      const c = findPosition(cache, frame, sheet, variants, rule);
      if (!c || left === 0) dropRegions(sheet, variants);
      if (!c) (sheet.full ??= new Set<number>()).add(partIndex);
      if (c) {
        sheet.items.push({ variant: c.variant, tx: c.tx, ty: c.ty });
        sheet.usedAreaMm2 += area;
        placed = true;
        break;
      }
    }
    if (placed) continue;
    // Copy i was turned away by every open sheet.
    const repeat = repeatedSheet(sheets, openedAt, copies, i);
    if (repeat) {
      sheets.push(repeat);
      openedAt.set(repeat, i);
      // The replica holds copies i … i + n − 1, all of this part.
      copiesLeft.set(partIndex, left - (repeat.items.length - 1));
      i += repeat.items.length - 1;
      continue;
    }
    const fresh: SheetState = { group, items: [], usedAreaMm2: 0, method: 'true-shape' };
    const c = findPosition(cache, frame, fresh, variants, rule);
    if (!c) return { sheets, failed: i };
    fresh.items.push({ variant: c.variant, tx: c.tx, ty: c.ty });
    fresh.usedAreaMm2 += area;
    sheets.push(fresh);
    openedAt.set(fresh, i);
  }
  return { sheets, failed: null };
}

/**
 * The sheet that copy i, turned away by every open sheet, would open, when it is a replica of the last sheet:
 * that sheet was opened by this fill at copy j, holds exactly copies j … i − 1, all of one variants list, and
 * copies i … 2i − j − 1 are that list too. Every open sheet has turned that part away (the area check and the `full` mark only ever grow), the
 * search on an empty sheet depends only on the copies placed there, so the fill would repeat the last sheet
 * item for item: it is copied instead of searched again (a job of thousands of copies fills its sheets in
 * one search).
 */
function repeatedSheet(
  sheets: readonly SheetState[],
  openedAt: ReadonlyMap<SheetState, number>,
  copies: readonly (readonly Variant[])[],
  i: number,
): SheetState | null {
  const last = sheets[sheets.length - 1];
  const j = last ? openedAt.get(last) : undefined;
  if (!last || j === undefined) return null;
  const n = i - j;
  if (n <= 0 || last.items.length !== n || i + n > copies.length) return null;
  const list = copies[j];
  for (let k = j + 1; k < i + n; k++) if (copies[k] !== list) return null;
  return {
    group: last.group,
    items: last.items.map((it) => ({ ...it })),
    usedAreaMm2: last.usedAreaMm2,
    method: last.method,
    ...(last.full ? { full: new Set(last.full) } : {}),
  };
}
