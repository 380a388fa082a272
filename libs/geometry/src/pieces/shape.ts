import { type Vec2, gcd, toRad } from '../math/vec';

/** Piece shape {sides/step}, rotation (degrees, counter-clockwise) and size (circumradius ÷ plane distance). */
export interface PieceShape {
  sides: number;
  step: number;
  rotationDeg: number;
  size: number;
}

export const MAX_PIECE_SIDES = 60;

/** Problems with a piece shape, as sentences; empty when the shape is a single regular polygon or star. */
export function checkPieceShape(sides: number, step: number): string[] {
  const out: string[] = [];
  if (!Number.isInteger(sides) || sides < 3 || sides > MAX_PIECE_SIDES) {
    out.push(`sides must be a whole number from 3 to ${MAX_PIECE_SIDES}`);
    return out;
  }
  if (!Number.isInteger(step) || step < 1 || step >= sides / 2) {
    out.push(`step must be a whole number with 1 ≤ step < sides/2 (here below ${sides / 2})`);
  } else if (gcd(sides, step) !== 1) {
    const g = gcd(sides, step);
    out.push(
      `{${sides}/${step}} is a compound of ${g} separate {${sides / g}/${step / g}} figures, not one piece; ` +
        'choose a step that shares no factor with sides',
    );
  }
  return out;
}

/**
 * Outline of a regular polygon or star {sides/step} of circumradius `radius` (any unit), counter-
 * clockwise, tip 0 at angle `rotationDeg`. Stars give 2·sides corners: tips on the circle and the inner
 * corners where neighbouring edges cross, at radius R·cos(π·step/n) / cos(π·(step − 1)/n).
 */
export function starOutline(sides: number, step: number, radius: number, rotationDeg: number): Vec2[] {
  const a0 = toRad(rotationDeg);
  const out: Vec2[] = [];
  const inner =
    step > 1 ? (radius * Math.cos((Math.PI * step) / sides)) / Math.cos((Math.PI * (step - 1)) / sides) : 0;
  for (let j = 0; j < sides; j++) {
    const a = a0 + (2 * Math.PI * j) / sides;
    out.push([radius * Math.cos(a), radius * Math.sin(a)]);
    if (step > 1) {
      const b = a + Math.PI / sides;
      out.push([inner * Math.cos(b), inner * Math.sin(b)]);
    }
  }
  return out;
}

/** Tip directions (unit vectors) of the piece, tip 0 at `rotationDeg`. */
export function tipDirections(sides: number, rotationDeg: number): Vec2[] {
  const a0 = toRad(rotationDeg);
  return Array.from({ length: sides }, (_, j) => {
    const a = a0 + (2 * Math.PI * j) / sides;
    return [Math.cos(a), Math.sin(a)] as Vec2;
  });
}
