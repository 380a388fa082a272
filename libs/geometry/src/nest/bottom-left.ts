/**
 * Bottom-left fill over no-fit polygons (Burke, Hellier, Kendall & Whitwell, "A new bottom-left-fill heuristic
 * algorithm for the two-dimensional irregular packing problem", Oper. Res. 54(3), 2006; Bennell & Oliveira,
 * EJOR 184, 2008 — venues from memory). For each part and each allowed rotation, the feasible translations are
 * the inner-fit rectangle of the sheet minus the union of the no-fit polygons of the parts already placed; the
 * chosen position is the feasible vertex with the smallest right edge (then the lowest bottom edge), so the
 * sheet fills as a strip from its left edge.
 */
import { differencePaths, SCALE_PER_MM, type IntPaths } from './clipper-adapter';
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
): Candidate | null {
  let best: Candidate | null = null;
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
    // Lower bound on this variant's right edge: no better than the best found so far → skip.
    if (best && candidate(rule, v, fit.x0, fit.y0).primary > best.primary) continue;
    // Feasible region = inner-fit rectangle minus the no-fit polygons of the placed items, kept per sheet and
    // variant and updated with only the items placed since the last call.
    const regions = (sheet.regions ??= new Map());
    const cached = regions.get(v.key) ?? {
      paths: [
        [
          { X: fit.x0, Y: fit.y0 },
          { X: x1, Y: fit.y0 },
          { X: x1, Y: y1 },
          { X: fit.x0, Y: y1 },
        ],
      ],
      done: 0,
    };
    const clips: IntPaths = [];
    for (let k = cached.done; k < sheet.items.length; k++) {
      const it = sheet.items[k]!;
      const nfp = cache.nfp(it.variant, v);
      if (
        nfp.box.maxX + it.tx <= fit.x0 ||
        nfp.box.minX + it.tx >= x1 ||
        nfp.box.maxY + it.ty <= fit.y0 ||
        nfp.box.minY + it.ty >= y1
      )
        continue;
      for (const p of translatePaths(nfp.paths, it.tx, it.ty)) clips.push(p);
    }
    const region = clips.length === 0 ? cached.paths : differencePaths(cached.paths, clips);
    regions.set(v.key, { paths: region, done: sheet.items.length });
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
  return all.find((c) => clearOfItems(sheet.items, c.variant, c.tx, c.ty, cache.gapMm)) ?? null;
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
