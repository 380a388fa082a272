import type { DesignReport } from '@kerfwright/contracts';

/**
 * A suggested assembly order. Heuristic (our own): start from the piece with the most crossings (it
 * becomes the spine the rest hang on), then repeatedly add the unplaced piece that crosses the most
 * pieces already placed — so each new piece is held by at least one placed piece, and pieces that lock
 * several others go in early, keeping the model standing. Ties go to the piece with more crossings
 * overall, then to the piece whose slots run in the most nearly one direction (see below), then to the lower
 * piece number. A piece joining several placed pieces slides onto all of them at once; the guide lists every
 * slot it engages.
 *
 * A rigid piece moves in one direction at a time, so it can slide onto several placed pieces at once only
 * when its slots for them run the same way. Given each crossing's slide direction (the way piece `a` moves
 * relative to piece `b` to go home, a unit vector; `b` moves the opposite way), each step reports the widest
 * angle between the directions of its joins: 0 for one join, and anything more means the pieces have to
 * flex, or earlier joints be left loose, for that step to go in. With `preferStraight` (rigid stock), a piece
 * whose slots all run one way (within STRAIGHT_DEG) goes before one that would need flex, as long as it is
 * held by a placed piece; the other rules then break ties. On a dodecahedron of {5/2} stars this halves the
 * steps that need flex (10 → 6 of 12; cube of squares 4 → 3, octahedron of hexagons 4 → 3).
 */
export interface AssemblyStep {
  piece: string;
  /** Placed pieces this piece slides onto in this step, with the crossing index. */
  joins: { piece: string; crossing: number }[];
  /** Widest angle between the slide directions of this step's joins, degrees (0 when unknown or one join). */
  spreadDeg: number;
}

type Dir = readonly [number, number, number];

/** Widest angle between the slide directions of a piece onto the given crossings, degrees. */
function spreadOf(
  piece: string,
  crossingIndices: readonly number[],
  crossings: readonly { a: string; b: string; slide?: Dir }[],
): number {
  const dirs: Dir[] = [];
  for (const i of crossingIndices) {
    const c = crossings[i]!;
    if (!c.slide) continue;
    const s = c.a === piece ? 1 : -1;
    dirs.push([s * c.slide[0], s * c.slide[1], s * c.slide[2]]);
  }
  let widest = 0;
  for (let i = 0; i < dirs.length; i++)
    for (let j = i + 1; j < dirs.length; j++) {
      const d = dirs[i]![0] * dirs[j]![0] + dirs[i]![1] * dirs[j]![1] + dirs[i]![2] * dirs[j]![2];
      widest = Math.max(widest, (Math.acos(Math.max(-1, Math.min(1, d))) * 180) / Math.PI);
    }
  return widest;
}

/** Whether a comes after b in lexicographic order of equal-length number lists. */
function lexGreater(a: readonly number[], b: readonly number[]): boolean {
  for (let i = 0; i < a.length; i++) if (a[i] !== b[i]) return a[i]! > b[i]!;
  return false;
}

/** Slots whose slide directions differ by no more than this (degrees) count as running one way. */
export const STRAIGHT_DEG = 2;

export function assemblyOrder(
  pieceIds: readonly string[],
  crossings: readonly { a: string; b: string; slide?: Dir }[],
  options: { preferStraight?: boolean } = {},
): AssemblyStep[] {
  // Each piece's crossings, in crossing order: its partner and the crossing's index.
  const links = new Map<string, { piece: string; crossing: number }[]>(pieceIds.map((id) => [id, []]));
  crossings.forEach((c, i) => {
    links.get(c.a)?.push({ piece: c.b, crossing: i });
    links.get(c.b)?.push({ piece: c.a, crossing: i });
  });
  const degree = (id: string) => links.get(id)?.length ?? 0;
  const placed = new Set<string>();
  const steps: AssemblyStep[] = [];
  const index = new Map(pieceIds.map((id, i) => [id, i]));
  const joinsOf = (id: string) => (links.get(id) ?? []).filter((l) => placed.has(l.piece));
  while (placed.size < pieceIds.length) {
    let best: string | null = null;
    let bestKey: number[] = [];
    for (const id of pieceIds) {
      if (placed.has(id)) continue;
      const joins = joinsOf(id);
      // Spread rounded to whole degrees, so numerical noise does not break ties between symmetric pieces.
      const spread = Math.round(
        spreadOf(
          id,
          joins.map((j) => j.crossing),
          crossings,
        ),
      );
      const rest = [joins.length, degree(id), -spread, -(index.get(id) ?? 0)];
      const key = options.preferStraight
        ? [joins.length > 0 ? 1 : 0, spread <= STRAIGHT_DEG ? 1 : 0, ...rest]
        : rest;
      if (best === null || lexGreater(key, bestKey)) {
        best = id;
        bestKey = key;
      }
    }
    if (best === null) break;
    const joins = joinsOf(best);
    const spreadDeg = spreadOf(
      best,
      joins.map((j) => j.crossing),
      crossings,
    );
    steps.push({ piece: best, joins, spreadDeg });
    placed.add(best);
  }
  return steps;
}

/**
 * The suggested order for a built design, from its report alone (so a browser can show it): each crossing's
 * slide direction is piece a's motion out of its own slot, against the slot's direction, turned into the
 * model frame by the piece's frame axes. Rigid stock prefers straight steps (see assemblyOrder).
 */
export function assemblyStepsOfReport(report: DesignReport): AssemblyStep[] {
  const byId = new Map(report.pieces.map((p) => [p.id, p]));
  const crossings = report.crossings.map((c, i) => {
    const piece = byId.get(c.a);
    const slot = piece?.slots?.find((s) => s.crossing === i);
    if (!piece || !slot) return { a: c.a, b: c.b };
    const [dx, dy] = slot.direction;
    const slide = [0, 1, 2].map((k) => -(piece.frameX[k]! * dx + piece.frameY[k]! * dy));
    const len = Math.hypot(slide[0]!, slide[1]!, slide[2]!);
    return len > 0
      ? { a: c.a, b: c.b, slide: slide.map((v) => v / len) as [number, number, number] }
      : { a: c.a, b: c.b };
  });
  return assemblyOrder(
    report.pieces.map((p) => p.id),
    crossings,
    { preferStraight: !report.stock.flexible },
  );
}
