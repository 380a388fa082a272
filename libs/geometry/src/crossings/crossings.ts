import { type Vec2, type Vec3, add3, at, cross3, dot3, scale3, sub3, toDeg } from '../math/vec';
import { type Polygon, intersectIntervals, lineIntervals } from '../math/polygon';
import { type PieceFrame, dirToFrame, planeLine, toFrame } from '../pieces/place';

/** A piece as the crossing search needs it: its frame and its (un-slotted) outline in that frame. */
export interface PlacedPiece {
  frame: PieceFrame;
  outline: Polygon;
}

/**
 * A crossing: one overlap of two pieces along the line where their planes meet. Parameters t run along
 * `dir` from `point` (mm). `a` < `b` are piece indices.
 */
export interface Crossing {
  index: number;
  a: number;
  b: number;
  point: Vec3;
  dir: Vec3;
  /** Acute angle between the planes, degrees. */
  angleDeg: number;
  t0: number;
  t1: number;
  length: number;
  /** Whether the crossing's ends (t0, t1) lie on piece a's edge / on piece b's edge. */
  endOnA: [boolean, boolean];
  endOnB: [boolean, boolean];
}

export interface PlanePairIntervals {
  a: number;
  b: number;
  point: Vec3;
  dir: Vec3;
  intervalsA: [number, number][];
  intervalsB: [number, number][];
}

/** Each piece's intervals on the line of every pair of non-parallel piece planes. */
export function computePairIntervals(pieces: readonly PlacedPiece[]): PlanePairIntervals[] {
  const out: PlanePairIntervals[] = [];
  for (let i = 0; i < pieces.length; i++) {
    const A = at(pieces, i);
    for (let j = i + 1; j < pieces.length; j++) {
      const B = at(pieces, j);
      const line = planeLine(A.frame, B.frame);
      if (!line) continue;
      const intervalsA = lineIntervals(
        A.outline,
        toFrame(A.frame, line.point),
        dirToFrame(A.frame, line.dir),
      );
      if (intervalsA.length === 0) continue;
      const intervalsB = lineIntervals(
        B.outline,
        toFrame(B.frame, line.point),
        dirToFrame(B.frame, line.dir),
      );
      if (intervalsB.length === 0) continue;
      out.push({ a: i, b: j, point: line.point, dir: line.dir, intervalsA, intervalsB });
    }
  }
  return out;
}

/**
 * How close (mm) a crossing's end must be to a piece's interval end to count as lying on that piece's edge.
 * Uploaded solids carry rounded coordinates (an OFF file with 6 decimals, facets merged within
 * COPLANAR_TOLERANCE), so ends that coincide on the exact solid differ by micrometres; a slot opening there
 * starts its cut-out at least 0.05 mm outside the piece (leadOut in slots.ts), so treating an end a hundredth
 * of a millimetre inside the edge as on it never leaves a closed hole.
 */
export const END_ON_EDGE_MM = 0.01;

/**
 * Crossings of placed pieces: for every pair of planes, the overlaps of the two pieces' intervals on
 * their common line. Overlaps no longer than `minLength` (mm; default 1 µm, as the README says) are ignored:
 * pieces that barely touch hold nothing.
 */
export function computeCrossings(pieces: readonly PlacedPiece[], minLength = 1e-3): Crossing[] {
  const out: Crossing[] = [];
  for (const p of computePairIntervals(pieces)) {
    const na = at(pieces, p.a).frame.normal;
    const nb = at(pieces, p.b).frame.normal;
    const angleDeg = toDeg(Math.acos(Math.min(1, Math.abs(dot3(na, nb)))));
    for (const [t0, t1] of intersectIntervals(p.intervalsA, p.intervalsB)) {
      if (t1 - t0 <= minLength) continue;
      const eps = Math.max(END_ON_EDGE_MM, 1e-9 * Math.max(Math.abs(t0), Math.abs(t1)));
      const onEnd = (ivs: [number, number][], t: number, k: 0 | 1) =>
        ivs.some((iv) => Math.abs(iv[k] - t) <= eps);
      out.push({
        index: out.length,
        a: p.a,
        b: p.b,
        point: p.point,
        dir: p.dir,
        angleDeg,
        t0,
        t1,
        length: t1 - t0,
        endOnA: [onEnd(p.intervalsA, t0, 0), onEnd(p.intervalsA, t1, 1)],
        endOnB: [onEnd(p.intervalsB, t0, 0), onEnd(p.intervalsB, t1, 1)],
      });
    }
  }
  return out;
}

export const crossingPoint = (c: Crossing, t: number): Vec3 => add3(c.point, scale3(c.dir, t));

/**
 * Which end the default slot-end rule gives piece a: walking along the line with a piece's own centre
 * on its left (seen from outside), each piece takes the half of the crossing ahead of it. Returns 1
 * when a's slot opens at t1 (b's at t0), else 0. Both pieces' walks run in opposite directions, so the
 * rule always hands them opposite halves, and a rotation of the solid maps it onto itself.
 */
export function defaultSlotOption(c: Crossing, frameA: PieceFrame): 0 | 1 {
  const left = cross3(frameA.normal, c.dir);
  const side = dot3(left, sub3(frameA.centre, crossingPoint(c, (c.t0 + c.t1) / 2)));
  return side >= 0 ? 1 : 0;
}

/** Unit vector of the crossing line in a piece's frame. */
export const crossingDirIn = (c: Crossing, frame: PieceFrame): Vec2 => dirToFrame(frame, c.dir);
