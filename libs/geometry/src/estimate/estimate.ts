/**
 * Job estimates: cut and mark length, pierces, rapid travel, time and cost. Time model (REFERENCES, "Stock
 * and machines"): length ÷ speed for cutting (times the passes) and marking, plus pierces × pierce time, plus
 * travel ÷ rapid speed; no acceleration term (it adds about 1–2 % at hobby laser speeds). Cost: hours ×
 * the machine's hourly rate, and sheets × the stock's price per sheet. Lengths mm, speeds mm/s.
 */
import { type Vec2 } from '../math/vec';
import { perimeter, signedArea } from '../math/polygon';
import { offsetPolygons } from '../compensation/clipper-adapter';
import { type OrderedContours, orderContours } from './cut-order';

export interface EstimateMachine {
  cutSpeedMmS: number;
  markSpeedMmS: number;
  pierceTimeS: number;
  rapidSpeedMmS: number;
  /** Passes over every cut contour (default 1). */
  passes?: number;
  hourlyRate: number;
  /**
   * Routers: the bit's diameter. Their files carry the nominal outline and the machine's tool offset runs the
   * bit's centre half a diameter outside each outline (inside each hole), so that longer path is what is cut.
   */
  toolDiameterMm?: number;
}

/**
 * A machine's estimate speeds with the cutter the sheets were drawn for: a router's bit diameter (so the cut
 * length is that of the bit centre's path, see toolPathLength), nothing for a beam or blade.
 */
export function withCutter(
  machine: EstimateMachine,
  cutter: { kind: 'laser' } | { kind: 'router'; toolDiameterMm: number },
): EstimateMachine {
  const { toolDiameterMm: _ignored, ...rest } = machine;
  return cutter.kind === 'router' ? { ...rest, toolDiameterMm: cutter.toolDiameterMm } : rest;
}

/** One sheet's work: closed cut contours and open mark strokes, sheet coordinates (mm). */
export interface SheetWork {
  cut: readonly (readonly Vec2[])[];
  mark: readonly (readonly Vec2[])[];
}

export interface SheetEstimate {
  cutLengthMm: number;
  markLengthMm: number;
  pierces: number;
  travelMm: number;
  seconds: number;
}

export interface JobEstimate extends SheetEstimate {
  sheets: SheetEstimate[];
  minutes: number;
  machineCost: number;
  materialCost: number;
}

const polylineLength = (s: readonly Vec2[]): number => {
  let len = 0;
  for (let i = 1; i < s.length; i++) len += Math.hypot(s[i]![0] - s[i - 1]![0], s[i]![1] - s[i - 1]![1]);
  return len;
};

/**
 * Length (mm) of the path the cutter's centre follows round one closed contour: the contour itself for a beam
 * (its files already carry the compensated outline), and for a router bit of radius r the contour offset by r
 * with round corners, outward for a counter-clockwise outline and inward for a clockwise hole. A convex
 * outline gains 2πr (Steiner's formula); a hole smaller than the bit leaves no path.
 */
export function toolPathLength(contour: readonly Vec2[], toolDiameterMm = 0): number {
  if (!(toolDiameterMm > 0) || contour.length < 3) return perimeter(contour);
  const r = toolDiameterMm / 2;
  const hole = signedArea(contour) < 0;
  const ring = hole ? [...contour].reverse() : contour;
  return offsetPolygons([ring], hole ? -r : r, 'round').reduce((s, c) => s + perimeter(c), 0);
}

/** The order a sheet is worked in: mark strokes (each possibly reversed), then cut contours. */
export interface SheetSequence {
  marks: { index: number; reversed: boolean }[];
  cut: OrderedContours;
  travelMm: number;
}

/**
 * The working order of a sheet from the origin: mark strokes in nearest-neighbour order (marks go first,
 * while the sheet is whole and nothing has shifted), then the cut contours inner-first (see orderContours).
 * Travel is the sum of the rapid moves between them; no return move.
 */
export function sequenceSheet(work: SheetWork, origin: Vec2 = [0, 0]): SheetSequence {
  let at = origin;
  let travel = 0;
  const marks: { index: number; reversed: boolean }[] = [];
  const left = work.mark.map((_, i) => i).filter((i) => (work.mark[i]?.length ?? 0) > 0);
  while (left.length) {
    let bi = 0;
    let bd = Infinity;
    let rev = false;
    left.forEach((i, k) => {
      const s = work.mark[i]!;
      const d0 = Math.hypot(s[0]![0] - at[0], s[0]![1] - at[1]);
      const d1 = Math.hypot(s[s.length - 1]![0] - at[0], s[s.length - 1]![1] - at[1]);
      if (d0 < bd) [bd, bi, rev] = [d0, k, false];
      if (d1 < bd) [bd, bi, rev] = [d1, k, true];
    });
    const index = left[bi]!;
    const s = work.mark[index]!;
    travel += bd;
    at = rev ? s[0]! : s[s.length - 1]!;
    marks.push({ index, reversed: rev });
    left.splice(bi, 1);
  }
  const cut = orderContours(work.cut, at);
  return { marks, cut, travelMm: travel + cut.travelMm };
}

/** Rapid travel of sequenceSheet, mm. */
export function sheetTravel(work: SheetWork, origin: Vec2 = [0, 0]): number {
  return sequenceSheet(work, origin).travelMm;
}

/** Estimate for one sheet with a machine's speeds. */
export function estimateSheet(
  work: SheetWork,
  machine: EstimateMachine,
  origin: Vec2 = [0, 0],
): SheetEstimate {
  const passes = Math.max(1, Math.floor(machine.passes ?? 1));
  const cutLengthMm = work.cut.reduce((s, c) => s + toolPathLength(c, machine.toolDiameterMm), 0);
  const markLengthMm = work.mark.reduce((s, c) => s + polylineLength(c), 0);
  const pierces = work.cut.filter((c) => c.length >= 2).length;
  const travelMm = sheetTravel(work, origin);
  const seconds =
    (cutLengthMm * passes) / machine.cutSpeedMmS +
    (markLengthMm > 0 ? markLengthMm / machine.markSpeedMmS : 0) +
    pierces * passes * machine.pierceTimeS +
    travelMm / machine.rapidSpeedMmS;
  return { cutLengthMm, markLengthMm, pierces, travelMm, seconds };
}

/** Estimate for a job: sum over sheets, then time and cost. */
export function estimateJob(
  sheets: readonly SheetWork[],
  machine: EstimateMachine,
  pricePerSheet: number,
): JobEstimate {
  const per = sheets.map((w) => estimateSheet(w, machine));
  const sum = (f: (e: SheetEstimate) => number) => per.reduce((s, e) => s + f(e), 0);
  const seconds = sum((e) => e.seconds);
  return {
    sheets: per,
    cutLengthMm: sum((e) => e.cutLengthMm),
    markLengthMm: sum((e) => e.markLengthMm),
    pierces: sum((e) => e.pierces),
    travelMm: sum((e) => e.travelMm),
    seconds,
    minutes: seconds / 60,
    machineCost: (seconds / 3600) * machine.hourlyRate,
    materialCost: sheets.length * pricePerSheet,
  };
}
