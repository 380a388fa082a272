/**
 * The smallest piece size at which a design is sound: it builds without errors (every piece slotted, the
 * model in one piece, no slot collisions or cut-apart pieces, slots wider than the kerf or tool) and without
 * the warnings that make it fail in the hand: a slot breaking through a tip, pieces running into each other
 * through the stock, or too thin a web of material beside a slot.
 *
 * The sizes `suggestSizes` gives are thresholds, not designs: at `touch` the tips only reach the other planes
 * and at `overlap` the first crossings have no length, so both build with errors. Soundness is not monotone in
 * the size (large pieces can run their slots into each other), so this searches upwards from `overlap` in
 * 1 % steps for the first sound size and then narrows the step before it by bisection; the answer is always
 * a size that was built and found sound, never an interpolation. Pieces with narrow tips (stars) may have thin
 * webs at every size: when no size is free of them, the search is run again allowing thin webs, and says so.
 */
import { buildModel, resolveSolid } from '../build';
import { suggestSizes } from '../pieces/place';
import { SpecValidationError, validateSpec } from '../spec/validate-spec';

/** Warnings that make a design unsound as well as errors do. */
const UNSOUND_WARNINGS: readonly string[] = ['CROSSING.SHORTER_THAN_SLOT', 'PIECE.THICKNESS_CLASH'];
/** Allowed only when no size within reach is free of it. */
const THIN_WEB = 'SLOT.THIN_WEB';
/**
 * Each step of the upward search multiplies the size by this. Sound sizes can come in windows only 0.5–1.6 %
 * wide (an independent scan found such windows 9–20 % below the first one a 3 % step reached): 1 % steps find
 * all but the narrowest.
 */
const STEP = 1.01;
/** The search looks no further than this multiple of the overlap size. */
const REACH = 3;
/** Bisection steps between the last unsound and the first sound size found (1 % / 2⁵ ≈ 0.03 %). */
const NARROWING = 5;

export interface SoundSize {
  /** The smallest sound size found (× plane distance), rounded up to 4 decimals; null when none. */
  size: number | null;
  /** True when that size still leaves a thin web beside some slot (no size within reach avoids one). */
  thinWebs: boolean;
  /** Where crossings begin (suggestSizes' overlap), the search's start; null when pieces never cross. */
  crossingsFrom: number | null;
  /** Designs built by the search. */
  builds: number;
}

/**
 * Searches the piece size of `input` (a spec as buildModel takes it; its own size is ignored) for the smallest
 * sound one, up to three times the size where crossings begin. Throws SpecValidationError for an invalid spec.
 */
export function smallestSoundSize(input: unknown): SoundSize {
  const v = validateSpec(input);
  if (!v.ok) throw new SpecValidationError(v.errors);
  const { sides, step, rotationDeg } = v.spec.piece;
  const crossingsFrom = suggestSizes(resolveSolid(v.spec), { sides, step, rotationDeg }).overlap;
  const none = { size: null, thinWebs: false, crossingsFrom };
  if (crossingsFrom === null) return { ...none, builds: 0 };
  const raw = input as { piece: Record<string, unknown> };
  let builds = 0;
  const codes = new Map<number, { errors: number; warnings: string[] } | null>();
  /** Errors and warning codes at this size, or null when the build fails outright. */
  const issuesAt = (size: number): { errors: number; warnings: string[] } | null => {
    let found = codes.get(size);
    if (found === undefined) {
      builds++;
      try {
        const { report } = buildModel({ ...raw, piece: { ...raw.piece, size } });
        found = { errors: report.errors.length, warnings: report.warnings.map((w) => w.code) };
      } catch {
        // A size the spec's limits refuse (too large a piece) is not a sound design either.
        found = null;
      }
      codes.set(size, found);
    }
    return found;
  };
  const search = (allowThinWebs: boolean): number | null => {
    const sound = (size: number): boolean => {
      const found = issuesAt(size);
      return (
        found !== null &&
        found.errors === 0 &&
        found.warnings.every((c) => (c === THIN_WEB ? allowThinWebs : !UNSOUND_WARNINGS.includes(c)))
      );
    };
    let below = crossingsFrom;
    let first: number | null = null;
    for (let s = crossingsFrom * STEP; s <= crossingsFrom * REACH; s *= STEP) {
      if (sound(s)) {
        first = s;
        break;
      }
      below = s;
    }
    if (first === null) return null;
    let hi: number = first;
    for (let k = 0; k < NARROWING; k++) {
      const mid = (below + hi) / 2;
      if (sound(mid)) hi = mid;
      else below = mid;
    }
    // Shown and stored with 4 decimals: round up, and keep the rounded size only if it is sound too.
    const rounded = Math.ceil(hi * 1e4) / 1e4;
    return rounded === hi || sound(rounded) ? rounded : hi;
  };
  const strict = search(false);
  if (strict !== null) return { size: strict, thinWebs: false, crossingsFrom, builds };
  const lenient = search(true);
  return { size: lenient, thinWebs: lenient !== null, crossingsFrom, builds };
}
