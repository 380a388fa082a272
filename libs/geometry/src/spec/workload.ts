/**
 * The rough amount of work one build of a design takes, known before building it: every piece (one per face)
 * is cut along its crossing with every other piece, and each crossing is tried against every side of the
 * piece's outline, so pieces × (pieces − 1) × sides. Measured on a 2-core machine, one build takes about
 * 10–20 µs per unit (120 pieces of 60 sides, 856,800 units: 9–20 s; 120 pieces of 12 sides, 171,360: 2.3 s;
 * the sample designs stay under 1,000).
 */
export function designWork(pieceCount: number, sides: number): number {
  return pieceCount * Math.max(0, pieceCount - 1) * sides;
}

/** The most work a design may take in the server (a few seconds of one thread, a fit search several times). */
export const DESIGN_WORK_LIMIT = 200_000;

/** A design refused before it is built because building it would take too long (see designWork). */
export class DesignTooHeavyError extends Error {
  readonly code = 'DESIGN.TOO_HEAVY';
  constructor(
    readonly work: number,
    readonly limit: number,
    message: string,
  ) {
    super(message);
    this.name = 'DesignTooHeavyError';
  }
}

/**
 * Refuses at once a design whose build would take too long: which to lighten, and by how much, in the message.
 * `sides`: the piece's; `pieceCount`: the solid's face count.
 */
export function assertDesignWork(sides: number, pieceCount: number, limit = DESIGN_WORK_LIMIT): void {
  const work = designWork(pieceCount, sides);
  if (work <= limit) return;
  const fitSides = Math.floor(limit / (pieceCount * Math.max(1, pieceCount - 1)));
  const lighter =
    fitSides >= 3
      ? `pieces of at most ${fitSides} sides on this solid, or a solid with fewer faces`
      : 'a solid with fewer faces';
  throw new DesignTooHeavyError(
    work,
    limit,
    `this design is too heavy to compute in time: ${pieceCount} pieces of ${sides} sides, each crossing up to ` +
      `${pieceCount - 1} others (${work.toLocaleString('en')} against at most ${limit.toLocaleString('en')}); ` +
      `choose ${lighter}`,
  );
}
