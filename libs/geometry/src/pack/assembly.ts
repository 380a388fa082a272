/**
 * A suggested assembly order. Heuristic (our own): start from the piece with the most crossings (it
 * becomes the spine the rest hang on), then repeatedly add the unplaced piece that crosses the most
 * pieces already placed — so each new piece is held by at least one placed piece, and pieces that lock
 * several others go in early, keeping the model standing. Ties go to the piece with more crossings
 * overall, then to the lower piece number. A piece joining several placed pieces slides onto all of them
 * at once; the guide lists every slot it engages.
 */
export interface AssemblyStep {
  piece: string;
  /** Placed pieces this piece slides onto in this step, with the crossing index. */
  joins: { piece: string; crossing: number }[];
}

export function assemblyOrder(
  pieceIds: readonly string[],
  crossings: readonly { a: string; b: string }[],
): AssemblyStep[] {
  const degree = new Map(pieceIds.map((id) => [id, 0]));
  for (const c of crossings) {
    degree.set(c.a, (degree.get(c.a) ?? 0) + 1);
    degree.set(c.b, (degree.get(c.b) ?? 0) + 1);
  }
  const placed = new Set<string>();
  const steps: AssemblyStep[] = [];
  const index = new Map(pieceIds.map((id, i) => [id, i]));
  while (placed.size < pieceIds.length) {
    let best: string | null = null;
    let bestKey: [number, number, number] = [-1, -1, 0];
    for (const id of pieceIds) {
      if (placed.has(id)) continue;
      const links = crossings.filter(
        (c) => (c.a === id && placed.has(c.b)) || (c.b === id && placed.has(c.a)),
      ).length;
      const key: [number, number, number] = [links, degree.get(id) ?? 0, -(index.get(id) ?? 0)];
      if (
        best === null ||
        key[0] > bestKey[0] ||
        (key[0] === bestKey[0] && (key[1] > bestKey[1] || (key[1] === bestKey[1] && key[2] > bestKey[2])))
      ) {
        best = id;
        bestKey = key;
      }
    }
    if (best === null) break;
    const joins = crossings
      .map((c, i) => ({ c, i }))
      .filter(({ c }) => (c.a === best && placed.has(c.b)) || (c.b === best && placed.has(c.a)))
      .map(({ c, i }) => ({ piece: c.a === best ? c.b : c.a, crossing: i }));
    steps.push({ piece: best, joins });
    placed.add(best);
  }
  return steps;
}
