import type { MachineSpec } from '@kerfwright/contracts';
import { type Vec2, add2, at, scale2, sub2, toRad } from '../math/vec';
import { type Polygon, lineIntervals } from '../math/polygon';
import { type Crossing, crossingDirIn, defaultSlotOption } from '../crossings/crossings';
import { type PieceFrame, toFrame } from '../pieces/place';
import { lit, solveTwoSat } from './two-sat';

/**
 * One half-way slot in one piece, in that piece's frame (mm): it opens at `end` on the piece's edge
 * and runs along `axis` (unit, pointing into the piece) for `depth`, `width` wide.
 */
export interface Slot {
  crossing: number;
  piece: number;
  partner: number;
  end: Vec2;
  axis: Vec2;
  depth: number;
  width: number;
  /** How far the cut-out starts outside the opening so that both walls clear the edge. */
  lead: number;
  /** Precomputed for collision tests: the rectangle from opening to bottom and its bounding circle. */
  inner: Vec2[];
  bounds: { cx: number; cy: number; r: number };
}

/** Nominal slot width: t·cot(θ/2) for rigid stock cut square to its faces, t for flexible stock. */
/**
 * The narrowest slot a laser may be asked to draw after its kerf is taken off (mm): below it the two cut lines
 * of the slot's walls merge into one and no slot is left (the cut pack's coupon keeps the same limit).
 */
export const MIN_DRAWN_SLOT_MM = 0.01;

/**
 * Whether a slot of this width can be cut by the machine: wider than a laser's kerf by MIN_DRAWN_SLOT_MM, or at
 * least as wide as a router's bit (1e-9 mm absorbs rounding, e.g. tan 45° = 0.9999999999999999).
 */
export function slotCuttable(widthMm: number, machine: MachineSpec): boolean {
  return machine.kind === 'laser'
    ? widthMm - machine.kerfMm >= MIN_DRAWN_SLOT_MM - 1e-9
    : widthMm >= machine.toolDiameterMm - 1e-9;
}

export function nominalSlotWidth(thicknessMm: number, angleDeg: number, flexible: boolean): number {
  if (flexible) return thicknessMm;
  return thicknessMm / Math.tan(toRad(angleDeg) / 2);
}

export interface SlotPlanInput {
  frames: readonly PieceFrame[];
  outlines: readonly Polygon[];
  crossings: readonly Crossing[];
  /** Slot width per crossing (nominal + fit). */
  widths: readonly number[];
  depthClearanceMm: number;
}

export interface SlotPlan {
  /** Chosen option per crossing (1: piece a opens at t1, b at t0), or null when not assemblable. */
  options: (0 | 1 | null)[];
  /** Slots per piece. */
  slots: Slot[][];
  /** Pairs of crossing indices whose slots overlap in one piece, after the search. */
  collisions: { piece: number; crossings: [number, number] }[];
  /** Whether the 2-SAT search was needed to avoid collisions. */
  searched: boolean;
  /**
   * Crossings of one pair of pieces (several along their common line, as stars give) whose slots cannot all
   * open the same way: each group lists crossing indices. Slid together along the line, the partner would
   * have to move both ways at once, so the pair cannot be assembled.
   */
  opposed: number[][];
}

/** The slot that option `option` gives piece `which` ('a' or 'b') for a crossing. */
export function slotFor(
  input: SlotPlanInput,
  c: Crossing,
  option: 0 | 1,
  which: 'a' | 'b',
  withLead = true,
): Slot {
  const piece = which === 'a' ? c.a : c.b;
  const frame = at(input.frames, piece);
  // Option 1: a opens at t1, b at t0. Option 0: the reverse.
  const atT1 = (which === 'a') === (option === 1);
  const tEnd = atT1 ? c.t1 : c.t0;
  const d = crossingDirIn(c, frame);
  const axis = atT1 ? scale2(d, -1) : d;
  const origin = toFrame(frame, c.point);
  const end = add2(origin, scale2(d, tEnd));
  const width = at(input.widths, c.index);
  const depth = c.length / 2 + input.depthClearanceMm;
  const slot: Slot = {
    crossing: c.index,
    piece,
    partner: which === 'a' ? c.b : c.a,
    end,
    axis,
    depth,
    width,
    lead: 0,
    inner: [],
    bounds: {
      cx: end[0] + (axis[0] * depth) / 2,
      cy: end[1] + (axis[1] * depth) / 2,
      r: Math.sqrt((depth / 2) ** 2 + (width / 2) ** 2),
    },
  };
  slot.inner = slotRectangle(slot, false);
  if (withLead) slot.lead = leadOut(at(input.outlines, piece), end, axis, width, depth);
  return slot;
}

/**
 * How far before the opening the cut-out must start so each wall line has left the piece: the distance
 * back from the opening to where each wall exits the outline, plus a small margin.
 */
function leadOut(outline: Polygon, end: Vec2, axis: Vec2, width: number, depth: number): number {
  const n: Vec2 = [-axis[1], axis[0]];
  let lead = 0;
  for (const side of [-0.5, 0.5]) {
    const p = add2(end, scale2(n, side * width));
    const ivs = lineIntervals(outline, p, axis);
    // The inside run of this wall that reaches toward the slot's bottom: exit at its start.
    const probe = Math.min(depth, width) / 2;
    const run = ivs.find((iv) => iv[0] <= probe && iv[1] >= probe) ?? ivs.find((iv) => iv[1] > 0);
    if (run) lead = Math.max(lead, -run[0]);
  }
  return Math.max(0, lead) + 0.05 + 0.1 * width;
}

/** Corners of the slot's cut-out rectangle (counter-clockwise), from `lead` outside to the bottom. */
export function slotRectangle(
  s: Pick<Slot, 'end' | 'axis' | 'lead' | 'depth' | 'width'>,
  withLead = true,
): Vec2[] {
  const n: Vec2 = [-s.axis[1], s.axis[0]];
  const a = add2(s.end, scale2(s.axis, withLead ? -s.lead : 0));
  const b = add2(s.end, scale2(s.axis, s.depth));
  const h = s.width / 2;
  return [add2(a, scale2(n, -h)), add2(b, scale2(n, -h)), add2(b, scale2(n, h)), add2(a, scale2(n, h))];
}

function separated(rs: readonly Vec2[], rt: readonly Vec2[], ax: number, ay: number, tol: number): boolean {
  let s0 = Infinity;
  let s1 = -Infinity;
  let t0 = Infinity;
  let t1 = -Infinity;
  for (const p of rs) {
    const d = p[0] * ax + p[1] * ay;
    if (d < s0) s0 = d;
    if (d > s1) s1 = d;
  }
  for (const p of rt) {
    const d = p[0] * ax + p[1] * ay;
    if (d < t0) t0 = d;
    if (d > t1) t1 = d;
  }
  return s0 >= t1 - tol || t0 >= s1 - tol;
}

/** Whether two slots' rectangles (opening to bottom) overlap by more than `tol` mm (separating axes). */
export function slotsOverlap(s: Slot, t: Slot, tol = 1e-6): boolean {
  const a = s.bounds;
  const b = t.bounds;
  const dx = a.cx - b.cx;
  const dy = a.cy - b.cy;
  if (dx * dx + dy * dy >= (a.r + b.r) ** 2) return false;
  return !(
    separated(s.inner, t.inner, s.axis[0], s.axis[1], tol) ||
    separated(s.inner, t.inner, -s.axis[1], s.axis[0], tol) ||
    separated(s.inner, t.inner, t.axis[0], t.axis[1], tol) ||
    separated(s.inner, t.inner, -t.axis[1], t.axis[0], tol)
  );
}

/**
 * Chooses which end each crossing's slots open from. Feasible options need the opening on the slotted
 * piece's own edge; where both are feasible the default rule (see defaultSlotOption) picks, and if that
 * makes slots of one piece collide, a 2-SAT search over the free choices looks for a collision-free set.
 */
export function planSlots(input: SlotPlanInput): SlotPlan {
  const { crossings, frames } = input;
  const feasible = crossings.map(
    (c) => [c.endOnA[0] && c.endOnB[1], c.endOnA[1] && c.endOnB[0]] as [boolean, boolean],
  );
  // A pair's crossings lie on one line, and the pieces slide together along it one way only: all of them
  // must take the same option (option 1 makes piece a's slots face one way along the line, option 0 the other).
  // (Crossings with no feasible option are reported on their own and left out.)
  const byPair = new Map<string, Crossing[]>();
  for (const c of crossings) {
    if (!at(feasible, c.index).some(Boolean)) continue;
    const key = `${c.a}-${c.b}`;
    byPair.set(key, [...(byPair.get(key) ?? []), c]);
  }
  const groups = [...byPair.values()].filter((g) => g.length > 1);
  const opposed: number[][] = [];
  for (const g of groups) {
    const f0 = g.every((c) => at(feasible, c.index)[0]);
    const f1 = g.every((c) => at(feasible, c.index)[1]);
    if (!f0 && !f1) opposed.push(g.map((c) => c.index));
    else for (const c of g) feasible[c.index] = [f0, f1];
  }
  const preferred = crossings.map((c): 0 | 1 | null => {
    const [f0, f1] = at(feasible, c.index);
    if (!f0 && !f1) return null;
    const d = defaultSlotOption(c, at(frames, c.a));
    return (d === 1 ? f1 : f0) ? d : d === 1 ? 0 : 1;
  });
  // The default rule gives every crossing of a pair the same side (their midpoints share the line): make
  // sure of it, so one pair's slots never face opposite ways.
  for (const g of groups) {
    const first = at(preferred, at(g, 0).index);
    const [f0, f1] = at(feasible, at(g, 0).index);
    if (f0 && f1) for (const c of g) preferred[c.index] = first;
  }
  // Candidate slots per crossing and option.
  const cand = crossings.map((c) =>
    ([0, 1] as const).map((o) =>
      at(feasible, c.index)[o] ? [slotFor(input, c, o, 'a', false), slotFor(input, c, o, 'b', false)] : null,
    ),
  );
  // Per piece: its crossings with the candidate slot for each option and a circle around both.
  interface Entry {
    ci: number;
    opt: [Slot | null, Slot | null];
    cx: number;
    cy: number;
    r: number;
  }
  const byPiece: Entry[][] = frames.map(() => []);
  for (const c of crossings) {
    if (preferred[c.index] === null) continue;
    const pairs = cand[c.index] as (Slot[] | null)[];
    for (const [piece, k] of [
      [c.a, 0],
      [c.b, 1],
    ] as const) {
      const opt: [Slot | null, Slot | null] = [pairs[0]?.[k] ?? null, pairs[1]?.[k] ?? null];
      const live = opt.filter((x): x is Slot => x !== null);
      const cx = live.reduce((sum, x) => sum + x.bounds.cx, 0) / live.length;
      const cy = live.reduce((sum, x) => sum + x.bounds.cy, 0) / live.length;
      const r = Math.max(...live.map((x) => Math.hypot(x.bounds.cx - cx, x.bounds.cy - cy) + x.bounds.r));
      (byPiece[piece] as Entry[]).push({ ci: c.index, opt, cx, cy, r });
    }
  }
  /** Calls visit for each pair of a piece's crossings whose candidate slots could touch. */
  const nearPairs = (visit: (piece: number, e: Entry, f: Entry) => void) => {
    byPiece.forEach((list, piece) => {
      for (let i = 0; i < list.length; i++) {
        const e = list[i] as Entry;
        for (let j = i + 1; j < list.length; j++) {
          const f = list[j] as Entry;
          const dx = e.cx - f.cx;
          const dy = e.cy - f.cy;
          if (dx * dx + dy * dy < (e.r + f.r) ** 2) visit(piece, e, f);
        }
      }
    });
  };
  const conflicts = (options: readonly (0 | 1 | null)[]) => {
    const found: { piece: number; crossings: [number, number] }[] = [];
    nearPairs((piece, e, f) => {
      const oi = options[e.ci];
      const oj = options[f.ci];
      if (oi === null || oj === null || oi === undefined || oj === undefined) return;
      const si = e.opt[oi];
      const sj = f.opt[oj];
      if (si && sj && slotsOverlap(si, sj)) found.push({ piece, crossings: [e.ci, f.ci] });
    });
    return found;
  };
  let options = preferred;
  let collisions = conflicts(options);
  let searched = false;
  if (collisions.length) {
    searched = true;
    const clauses: [number, number][] = [];
    // Variable per crossing: true = option 1.
    crossings.forEach((c) => {
      const [f0, f1] = at(feasible, c.index);
      if (preferred[c.index] === null) return;
      if (!f0) clauses.push([lit(c.index, true), lit(c.index, true)]);
      if (!f1) clauses.push([lit(c.index, false), lit(c.index, false)]);
    });
    // One option for all crossings of a pair (see above): x_i ⇔ x_j.
    for (const g of groups) {
      for (let k = 1; k < g.length; k++) {
        const [i, j] = [at(g, k - 1).index, at(g, k).index];
        clauses.push([lit(i, true), lit(j, false)], [lit(i, false), lit(j, true)]);
      }
    }
    nearPairs((_piece, e, f) => {
      for (const oi of [0, 1] as const) {
        for (const oj of [0, 1] as const) {
          const si = e.opt[oi];
          const sj = f.opt[oj];
          // Forbid (ci = oi ∧ cj = oj): clause ¬(ci = oi) ∨ ¬(cj = oj).
          if (si && sj && slotsOverlap(si, sj)) clauses.push([lit(e.ci, oi === 0), lit(f.ci, oj === 0)]);
        }
      }
    });
    const solution = solveTwoSat(crossings.length, clauses);
    if (solution) {
      options = crossings.map((c) => (preferred[c.index] === null ? null : at(solution, c.index) ? 1 : 0));
      collisions = conflicts(options);
    }
  }
  const slots: Slot[][] = frames.map(() => []);
  for (const c of crossings) {
    const o = at(options, c.index);
    if (o === null) continue;
    const pair = at(at(cand, c.index), o);
    if (!pair) continue;
    // The lead-out (how far the cut starts outside the edge) is only needed for the chosen slots.
    for (const s of pair) s.lead = leadOut(at(input.outlines, s.piece), s.end, s.axis, s.width, s.depth);
    at(slots, c.a).push(at(pair, 0));
    at(slots, c.b).push(at(pair, 1));
  }
  return { options, slots, collisions, searched, opposed };
}

/** Points where a slot's walls meet its bottom, for dog-bone reliefs: corner, and the two walls' inward directions from it. */
export function slotInnerCorners(s: Slot): { corner: Vec2; walls: [Vec2, Vec2] }[] {
  const n: Vec2 = [-s.axis[1], s.axis[0]];
  const bottom = add2(s.end, scale2(s.axis, s.depth));
  const back = scale2(s.axis, -1);
  return [-1, 1].map((side) => ({
    corner: add2(bottom, scale2(n, (side * s.width) / 2)),
    // From the corner, one wall runs back toward the opening, the bottom runs across the slot.
    walls: [back, scale2(n, -side)] as [Vec2, Vec2],
  }));
}

export const slotBottomCentre = (s: Slot): Vec2 => add2(s.end, scale2(s.axis, s.depth));
export const slotVector = (s: Slot): Vec2 => sub2(slotBottomCentre(s), s.end);
