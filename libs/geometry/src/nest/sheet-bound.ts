/**
 * Lower bounds on the sheets a set of parts needs, found without laying anything out.
 *
 * Parts on a sheet are at least the gap g apart and inside its usable rectangle, so the parts grown by g/2
 * never overlap and lie inside the usable rectangle grown by g/2: each sheet then holds grown parts of total
 * area at most that rectangle's. The sheets of any layout are therefore bins of a one-dimensional bin packing
 * of the grown parts' areas, and any lower bound of that bin packing bounds the sheets too. The bound used is
 * L2 of Martello & Toth, "Lower bounds and reduction procedures for the bin packing problem", Discrete
 * Applied Mathematics 28 (1990) 59–70 (from memory): for each threshold α ≤ C/2 it counts the items larger
 * than C − α (one bin each, shared with nothing of size ≥ α), the items in (C/2, C − α] (one bin each, the
 * room left in those bins taking items of size in [α, C/2]), and the rest of the items of size in [α, C/2]
 * by area. L2 is at least the plain area bound ⌈Σ w / C⌉.
 */
import { areaUnits, growPolygon, toIntPath, SCALE_PER_MM } from './clipper-adapter';
import type { Point } from './polygon';

/**
 * What the grown parts are grown by, less this (mm): a layout whose parts come closer than the gap by a
 * numerical sliver (a plan the direct check rejects, see nest.ts) must still obey the bound.
 */
export const BOUND_SLACK_MM = 0.05;

/** Items of one size and how many of them. */
export interface SizedItems {
  size: number;
  count: number;
}

/**
 * Martello & Toth's L2 lower bound on the bins of capacity `capacity` that hold the items (sizes > 0). Items
 * larger than the capacity cannot be held at all: Infinity.
 */
export function binPackingBound(items: readonly SizedItems[], capacity: number): number {
  const sorted = items.filter((i) => i.count > 0).sort((a, b) => b.size - a.size);
  if (sorted.length === 0) return 0;
  if (sorted[0]!.size > capacity) return Infinity;
  const total = sorted.reduce((s, i) => s + i.size * i.count, 0);
  let best = Math.ceil(total / capacity - 1e-9);
  // α = 0 and every item size up to C/2: L2 changes only at item sizes.
  const alphas = [0, ...sorted.filter((i) => i.size <= capacity / 2).map((i) => i.size)];
  for (const alpha of alphas) {
    let big = 0; // J1: size > C − α
    let half = 0; // J2: C/2 < size ≤ C − α
    let halfSize = 0;
    let small = 0; // J3 total size: α ≤ size ≤ C/2
    for (const i of sorted) {
      if (i.size > capacity - alpha) big += i.count;
      else if (i.size > capacity / 2) {
        half += i.count;
        halfSize += i.size * i.count;
      } else if (i.size >= alpha) small += i.size * i.count;
    }
    const room = half * capacity - halfSize;
    const rest = Math.max(0, Math.ceil((small - room) / capacity - 1e-9));
    best = Math.max(best, big + half + rest);
  }
  return best;
}

/**
 * Lower bound on the sheets that hold `parts` (outlines in mm, with their quantities) at least `gapMm` apart
 * inside a usable rectangle of usableW × usableH mm: L2 over the parts' areas grown by half the gap (less
 * BOUND_SLACK_MM), against the usable rectangle grown by as much. The grown areas are Clipper's round offsets,
 * whose arcs are chords inside the true ones, so they never exceed the true grown areas.
 */
export function sheetsLowerBound(
  parts: readonly { outline: readonly Point[]; quantity: number }[],
  usableW: number,
  usableH: number,
  gapMm: number,
): number {
  const r = Math.max(0, gapMm / 2 - BOUND_SLACK_MM);
  // The rectangle is grown by 1 µm more: placements may pass the margin by that much of rounding.
  const capacity = (usableW + 2 * r + 0.002) * (usableH + 2 * r + 0.002);
  const items = parts.map((p) => {
    const path = toIntPath(p.outline as Point[]);
    const grown = r > 0 ? growPolygon(path, r, 'round') : [path];
    const units = Math.abs(grown.reduce((s, q) => s + areaUnits(q), 0));
    return { size: units / (SCALE_PER_MM * SCALE_PER_MM), count: p.quantity };
  });
  return binPackingBound(items, capacity);
}
