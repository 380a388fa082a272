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
 * and lies wholly inside one of them, so for a part not yet searched on a sheet only the translations that put
 * the eroded part's bounding box inside a component's, with the component's area at least the eroded part's,
 * are searched, and
 * only the no-fit polygons of parts near those windows are built and subtracted. The ε closes the hairline
 * channels left between neighbours, so the packed area and the closed pockets drop out: on a crowded sheet
 * of different parts, every placement subtracted every placed part's no-fit polygon before.
 */
import {
  areaUnits,
  boxOfPaths,
  differenceComponents,
  differencePaths,
  growPolygon,
  simplifyOutline,
  SCALE_PER_MM,
  type Component,
  type IntPaths,
} from './clipper-adapter';
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
/** Slack (integer units) on free-space windows and areas, for rounding in the offsets and the difference. */
const FREE_SPACE_SLACK = 5;
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
      // chords lie inside the true offset: within gap + ε of the part, with a bounded vertex count.
      const eps = freeSpaceEpsMm(gapMm);
      const simple = simplifyOutline(it.variant.poly, eps / 2);
      grown = simple
        ? growPolygon(simple, gapMm + eps / 2, 'round')
        : growPolygon(it.variant.poly, gapMm + eps, 'round');
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

/**
 * Translations of v (within the inner-fit rectangle) that put its eroded bounding box inside the bounding box
 * of a free-space component at least as large as the eroded part; null when v is not searched this way.
 */
function freeWindows(components: Component[], v: Variant, fit: Window, epsMm: number): Window[] | null {
  const e = eroded(v, epsMm);
  if (!e) return null;
  const out: Window[] = [];
  for (const c of components) {
    if (c.area * 1.001 + SCALE_PER_MM * SCALE_PER_MM < e.area) continue;
    const x0 = Math.max(fit.x0, c.minX - e.minX - FREE_SPACE_SLACK);
    const x1 = Math.min(fit.x1, c.maxX - e.maxX + FREE_SPACE_SLACK);
    const y0 = Math.max(fit.y0, c.minY - e.minY - FREE_SPACE_SLACK);
    const y1 = Math.min(fit.y1, c.maxY - e.maxY + FREE_SPACE_SLACK);
    if (x1 >= x0 && y1 >= y0) out.push({ x0, y0, x1: Math.max(x1, x0 + 1), y1: Math.max(y1, y0 + 1) });
  }
  return out;
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
  const x1 = Math.floor((frame.widthMm - m - v.bounds.maxX) * SCALE_PER_MM + 1e-6);
  const y1 = Math.floor((frame.heightMm - m - v.bounds.maxY) * SCALE_PER_MM + 1e-6);
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

function better(a: Candidate, b: Candidate | null): boolean {
  if (!b) return true;
  if (a.primary !== b.primary) return a.primary < b.primary;
  return a.secondary < b.secondary;
}

/** Best bottom-left position for any of the variants on a sheet, or null when none fits. */
export function findPosition(
  cache: GeometryCache,
  frame: SheetFrame,
  sheet: SheetState,
  variants: readonly Variant[],
  rule: FillRule = 'right',
  /** Search first-time variants inside free-space windows (false: always the whole inner-fit rectangle). */
  windowsAllowed = true,
): Candidate | null {
  let best: Candidate | null = null;
  let anyCut = false;
  const all: Candidate[] = [];
  for (const v of variants) {
    const fit = innerFit(frame, v);
    if (!fit) continue;
    // A degenerate inner-fit rectangle (part exactly as wide as the usable sheet) is widened by one unit.
    const x1 = Math.max(fit.x1, fit.x0 + 1);
    const y1 = Math.max(fit.y1, fit.y0 + 1);
    if (sheet.items.length === 0) {
      const c = candidate(rule, v, fit.x0, fit.y0);
      if (better(c, best)) best = c;
      continue;
    }
    // Feasible region = inner-fit rectangle minus the no-fit polygons of the placed items, kept per sheet and
    // variant and updated with only the items placed since the last call. A variant met for the first time on
    // a crowded sheet starts from its free-space windows instead of the whole rectangle.
    const regions = (sheet.regions ??= new Map());
    const cached = regions.get(v.key);
    let start: IntPaths;
    let from: number;
    let windows: Window[] | null = null;
    const whole = { x0: fit.x0, y0: fit.y0, x1, y1 };
    if (cached) {
      start = cached.paths;
      from = cached.done;
    } else {
      if (windowsAllowed && sheet.items.length >= FREE_SPACE_MIN_ITEMS && mostlyDifferent(sheet.items))
        windows = freeWindows(freeSpace(frame, sheet, cache.gapMm), v, whole, freeSpaceEpsMm(cache.gapMm));
      start = windows ? windows.map(rectPath) : [rectPath(whole)];
      from = 0;
    }
    // The first time, windows are cut to the translations that could beat the best found so far (ties kept),
    // and the region is not kept. A variant searched again (more copies of its part) gets its whole region,
    // kept and updated from then on.
    let cut = false;
    const seen = (sheet.windowed ??= new Set<string>());
    if (windows && best && !seen.has(v.key)) {
      const limit = best.primary - candidate(rule, v, 0, 0).primary;
      cut = windows.some((w) => w.x1 > limit);
      windows = windows.filter((w) => w.x0 <= limit).map((w) => ({ ...w, x1: Math.min(w.x1, limit) }));
      start = windows.map(rectPath);
    }
    anyCut ||= cut;
    // Lower bound on this variant's right edge: no better than the best found so far → skip.
    const lowX = windows ? Math.min(...windows.map((w) => w.x0)) : fit.x0;
    if (best && (windows?.length === 0 || candidate(rule, v, lowX, fit.y0).primary > best.primary)) continue;
    const spans = windows ?? [whole];
    const reaches = (b: { minX: number; minY: number; maxX: number; maxY: number }, dx: number, dy: number) =>
      spans.some((w) => b.maxX + dx > w.x0 && b.minX + dx < w.x1 && b.maxY + dy > w.y0 && b.minY + dy < w.y1);
    // Items whose no-fit polygon cannot reach a searched window are skipped before it is built: the polygon
    // lies within the item's bounds less the part's, grown by the gap and 1 mm.
    const reach = Math.ceil((cache.gapMm + 1) * SCALE_PER_MM);
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
      for (const p of translatePaths(nfp.paths, it.tx, it.ty)) clips.push(p);
    }
    const region =
      start.length === 0 ? [] : clips.length === 0 && !windows ? start : differencePaths(start, clips);
    if (windows) seen.add(v.key);
    if (!cut) regions.set(v.key, { paths: region, done: sheet.items.length });
    for (const path of region)
      for (const q of path) {
        const tx = Math.min(Math.max(q.X, fit.x0), fit.x1 < fit.x0 + 1 ? fit.x0 : fit.x1);
        const ty = Math.min(Math.max(q.Y, fit.y0), fit.y1 < fit.y0 + 1 ? fit.y0 : fit.y1);
        if (tx !== q.X || ty !== q.Y) continue;
        const c = candidate(rule, v, tx, ty);
        all.push(c);
        if (better(c, best)) best = c;
      }
  }
  if (!best || sheet.items.length === 0) return best;
  // Best first, each checked directly against its neighbours.
  all.sort((a, b) => a.primary - b.primary || a.secondary - b.secondary);
  const found = all.find((c) => clearOfItems(sheet.items, c.variant, c.tx, c.ty, cache.gapMm));
  // Cut windows hold only the positions that could beat the first best; when none of them passes the direct
  // check, the search is repeated over whole regions, as it would have run without windows.
  if (!found && anyCut) return findPosition(cache, frame, sheet, variants, rule, false);
  return found ?? null;
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
  for (let i = 0; i < copies.length; i++) {
    const variants = copies[i] as readonly Variant[];
    const area = variants[0]?.areaMm2 ?? 0;
    let placed = false;
    for (const sheet of sheets) {
      if (sheet.group !== group) continue;
      if (sheet.usedAreaMm2 + area > sheetArea) continue;
      const partIndex = variants[0]?.partIndex ?? -1;
      if (sheet.full?.has(partIndex)) continue;
      const c = findPosition(cache, frame, sheet, variants, rule);
      if (!c) (sheet.full ??= new Set<number>()).add(partIndex);
      if (c) {
        sheet.items.push({ variant: c.variant, tx: c.tx, ty: c.ty });
        sheet.usedAreaMm2 += area;
        placed = true;
        break;
      }
    }
    if (placed) continue;
    const fresh: SheetState = { group, items: [], usedAreaMm2: 0, method: 'true-shape' };
    const c = findPosition(cache, frame, fresh, variants, rule);
    if (!c) return { sheets, failed: i };
    fresh.items.push({ variant: c.variant, tx: c.tx, ty: c.ty });
    fresh.usedAreaMm2 += area;
    sheets.push(fresh);
  }
  return { sheets, failed: null };
}
