/**
 * True-shape nesting of arbitrary simple polygons onto rectangular sheets, one colour group per sheet.
 *
 * Coordinates: millimetres, sheet origin at its lower-left corner, x along the sheet's width, y along its
 * height. A placement means: rotate the part's outline about the part's own origin by rotationDeg
 * (counter-clockwise), then translate by (x, y). Parts never overlap, are at least gapMm apart and stay at
 * least marginMm inside every sheet edge (up to 1 µm of rounding). Outlines may be given clockwise or
 * counter-clockwise, may be non-convex (stars with slot notches), but must be simple (no self-crossing).
 *
 * Two methods run per group and the better result is kept (fewer sheets, then the longer free strip at the
 * right end of the last sheet, then the larger free area on it, then the shorter total used length):
 *  - bottom-left fill over no-fit polygons (bottom-left.ts), largest parts first;
 *  - a pattern pass (pattern.ts): every part with three or more copies covering at least a quarter of the
 *    usable sheet is laid on its best single or double lattice: a double-lattice search on the part's convex
 *    hull (double-lattice.ts: rotation, touching position of the 180° copy and lattice vectors searched, rows
 *    along the width or the height, the fullest sheet kept),
 *    and lattices built on the no-fit polygons of the outline itself (for stars and slotted pieces; with 'auto'
 *    rotation, four extra orientations per symmetry period of the outline are tried). Edge gaps on full sheets
 *    are topped up with more copies by bottom-left fill; the last, partial sheet of a part is either the
 *    lattice's left-most slots or bottom-left fill of the copies left, whichever leaves the longer offcut; the
 *    other parts are added by bottom-left fill into the gaps and onto new sheets.
 * A group of one shape (one class of copies, or one envelope covering every class) whose sheets hold at most
 * 16 copies is then tried with an overlap search (overlap.ts): with few large pieces the sheet's edges decide,
 * and a layout of one or more extra copies that interlock near them can save a sheet. Its plan is kept only
 * when it uses fewer sheets; what it finds is shared by all groups of the shape. A group of several shapes
 * with at most 16 to a sheet tries to share its last sheet's pieces out over its other sheets instead
 * (emptiedLastSheetPlan).
 * No-fit polygons are built on simplified outlines that contain the true ones (notches narrower than about
 * twice the gap closed; the convex hull for convex-ish pieces), and pieces whose simplified outlines are
 * congruent share them up to a shift (nfpOutline and GeometryCache in variants.ts): slotted pieces of one model
 * cost one set of Minkowski sums, not one per piece.
 * Parts of one group with congruent outlines are nested as copies of the first of them (mergeCongruent): a
 * built model gives each of its identical pieces as a part of its own, and only copies reach the pattern pass.
 * Parts may carry an envelope (an outline containing theirs, such as the piece before its slots were cut): the
 * pattern pass then lays them out as copies of the envelope, all parts of a group with congruent envelopes on
 * one lattice (envelopeClasses), while bottom-left fill keeps to the outlines.
 * Every placement is also checked directly against its neighbours (clearOfItems in variants.ts), and a plan
 * failing that check is never preferred, as a guard against numerical slivers in the polygon unions.
 * Rotations: 'auto' tries 0° and 180°, then the rotations laying the longest convex-hull edges flat (at the
 * bottom or the top), then 90° and 270°, keeping the first four that give distinct shapes (autoRotations).
 */
import {
  bottomLeftFill,
  findPosition,
  innerFit,
  type PlacedItem,
  type SheetFrame,
  type SheetState,
} from './bottom-left';
import { denserSheet, overlapLayout, type ShapedItem } from './overlap';
import { bestPattern } from './pattern';
import {
  boundsOf,
  cleanPolygon,
  isSimplePolygon,
  rotatePolygon,
  signedArea,
  toCounterClockwise,
  type Point,
} from './polygon';
import { bestFitRatio } from '../scale/fit-ratio';
import { sheetsLowerBound } from './sheet-bound';
import {
  autoRotations,
  clearOfItems,
  PlacedIndex,
  congruence,
  distinctRotations,
  GeometryCache,
  normaliseAngle,
  patternRotations,
  type PreparedPart,
  type Variant,
} from './variants';
import {
  areaUnits,
  boxOfPaths,
  differencePaths,
  growPolygon,
  SCALE_PER_MM,
  toIntPath,
} from './clipper-adapter';
import { lengthText } from '../math/length-text';
import { MAX_SHEET_MM } from '../spec/validate-spec';

export interface NestSheetSize {
  widthMm: number;
  heightMm: number;
}

export interface NestPartInput {
  id: string;
  /** Closed outline in mm, [x, y] pairs, either orientation, no repeated closing point needed. */
  outline: readonly (readonly [number, number])[];
  quantity: number;
  /** Colour group: each group is nested onto its own sheets. Default "default". */
  group?: string;
  /** Allowed rotations for this part (degrees CCW); overrides the run's setting. */
  rotationsDeg?: readonly number[] | 'auto';
  /**
   * Optional: a simple outline containing this part's outline, in the same frame (for a slotted piece, the
   * piece before its slots were cut). Parts of a group whose envelopes are congruent may be laid out together
   * as copies of the envelope in the pattern pass; bottom-left fill always uses the outlines themselves.
   * Ignored when it does not contain the outline.
   */
  envelope?: readonly (readonly [number, number])[];
}

export interface NestInput {
  sheet: NestSheetSize;
  marginMm: number;
  gapMm: number;
  parts: readonly NestPartInput[];
  /** Allowed rotations (degrees CCW) for every part, or 'auto' (default): see autoRotations(). */
  rotationsDeg?: readonly number[] | 'auto';
  /** 'best' (default) runs both methods and keeps the better; the others force one method. */
  method?: 'best' | 'true-shape' | 'pattern';
}

export interface NestPlacement {
  part: string;
  x: number;
  y: number;
  rotationDeg: number;
}

export interface NestSheetResult {
  group: string;
  placements: NestPlacement[];
  /** Pieces' area ÷ whole sheet area. */
  utilisation: number;
  /** Distance from the sheet's left edge to the right-most point of any piece, mm. */
  usedLengthMm: number;
  /** Part id of each placement, in the same order. */
  partIds: string[];
  method: 'true-shape' | 'pattern';
}

export interface NestTotals {
  sheetCount: number;
  pieceCount: number;
  partAreaMm2: number;
  sheetAreaMm2: number;
  /** Total pieces' area ÷ total sheet area. */
  utilisation: number;
  sheetsByGroup: Record<string, number>;
  /** Per group: sheets used and the strip left free at the right of its last sheet (mm). */
  groups: { group: string; sheets: number; lastOffcutLengthMm: number; method: string }[];
}

export type NestErrorCode = 'INVALID_INPUT' | 'PART_DOES_NOT_FIT';

export type NestResult =
  | { ok: true; sheets: NestSheetResult[]; totals: NestTotals }
  | { ok: false; error: { code: NestErrorCode; message: string; partIds: string[] } };

const DEFAULT_GROUP = 'default';

/**
 * Parts with fewer copies are left to bottom-left fill: a lattice of two copies is one pair, which bottom-left
 * fill finds as well, and the lattice search per part costs far more than placing two copies.
 */
const MIN_PATTERN_COPIES = 3;

/**
 * Nor are parts whose copies together cover less than this share of the usable sheet: bottom-left fill puts
 * them on one sheet in a compact strip, and the lattice search (0.5–1 s per shape) could at most shorten that
 * strip a little. Six 8-sided blobs on a 1000 × 584 mm sheet took 0.9 s with the search, 0.1 s without.
 */
const MIN_PATTERN_SHEET_SHARE = 0.25;

/**
 * What one nesting run takes: beyond these the integer geometry (1 µm units) loses precision or the run
 * would take minutes and gigabytes. A sheet side of 10 m (as a design's stock sheet, MAX_SHEET_MM), a gap or
 * margin of 10 m, points within 1 km of their part's origin, and 100,000 copies in all. Sheets larger than
 * any stock or bed put Clipper past its fast integer range (±47 m in our units) and give bottom-left fill
 * columns of thousands of copies: 2,000 small triangles took 96 s on a 100 m sheet, 2.5 s on 2440 × 2440.
 */
export const NEST_LIMITS = {
  sheetMm: MAX_SHEET_MM,
  spacingMm: 10_000,
  coordinateMm: 1_000_000,
  copies: 100_000,
};

function fail(
  code: NestErrorCode,
  message: string,
  partIds: string[] = [],
): Extract<NestResult, { ok: false }> {
  return { ok: false, error: { code, message, partIds } };
}

/**
 * Consecutive outline points closer than this (mm) are one point: half the integer grid's step (1 µm), so
 * nothing the nesting computes can tell them apart. Float noise from an export (a vertex written twice, 0.1 nm
 * apart in a random direction) otherwise leaves a spike or a loop far below a micrometre, and the outline was
 * refused as self-intersecting.
 */
const NEAR_DUPLICATE_MM = 0.5 / SCALE_PER_MM;

function prepare(input: NestInput): PreparedPart[] | Extract<NestResult, { ok: false }> {
  const parts: PreparedPart[] = [];
  const ids = new Set<string>();
  for (const [index, p] of input.parts.entries()) {
    if (ids.has(p.id)) return fail('INVALID_INPUT', `part id "${p.id}" is used twice`, [p.id]);
    ids.add(p.id);
    const cleaned = cleanPolygon(p.outline as Point[], NEAR_DUPLICATE_MM);
    // Self-crossing first: a symmetric bow tie's two lobes cancel to no signed area.
    if (cleaned.length >= 3 && !isSimplePolygon(cleaned))
      return fail('INVALID_INPUT', `part "${p.id}" has a self-intersecting outline`, [p.id]);
    if (cleaned.length < 3 || Math.abs(signedArea(cleaned)) < 1e-9)
      return fail('INVALID_INPUT', `part "${p.id}" has no area`, [p.id]);
    const outline = toCounterClockwise(cleaned);
    const rot = p.rotationsDeg ?? input.rotationsDeg ?? 'auto';
    const rotationsDeg = rot === 'auto' ? autoRotations(outline) : distinctRotations(outline, rot);
    if (rotationsDeg.length === 0)
      return fail('INVALID_INPUT', `part "${p.id}" has no allowed rotation`, [p.id]);
    const envelope = p.envelope ? containingEnvelope(outline, p.envelope as Point[]) : null;
    parts.push({
      index,
      id: p.id,
      group: p.group ?? DEFAULT_GROUP,
      quantity: p.quantity,
      outline,
      // Measured from the outline's first point: far from the origin the products lose digits.
      areaMm2: signedArea(outline.map((q) => [q[0] - outline[0]![0], q[1] - outline[0]![1]] as Point)),
      rotationsDeg,
      // Set once congruent parts are counted together (mergeCongruent).
      patternRotationsDeg: rotationsDeg,
      freeRotation: rot === 'auto',
      ...(envelope ? { envelope } : {}),
    });
  }
  return parts;
}

/**
 * The envelope, cleaned and counter-clockwise, when it is a simple polygon containing the outline up to 2 µm
 * (rounding in whatever computed the two; the no-fit polygons' safety margin, GAP_SAFETY_MM, absorbs it);
 * else null. The envelope itself is kept as given, so congruent envelopes stay congruent and symmetric.
 */
function containingEnvelope(outline: Point[], given: Point[]): Point[] | null {
  const cleaned = cleanPolygon(given, NEAR_DUPLICATE_MM);
  if (cleaned.length < 3 || !isSimplePolygon(cleaned) || Math.abs(signedArea(cleaned)) < 1e-9) return null;
  const envelope = toCounterClockwise(cleaned);
  const grown = growPolygon(toIntPath(envelope), ENVELOPE_SLACK_MM);
  const outside = differencePaths([toIntPath(outline)], grown);
  return outside.some((q) => Math.abs(areaUnits(q)) > 1) ? null : envelope;
}

const ENVELOPE_SLACK_MM = 0.002;

/** Congruence tolerance (mm): a member's outline lies within this of the class's first outline, turned. */
const CONGRUENT_TOL_MM = 1e-4;

/** A part nested as a copy of a congruent part: its outline ≈ R(thetaDeg)·(the first part's outline) + (ox, oy). */
interface ClassMember {
  partIndex: number;
  quantity: number;
  thetaDeg: number;
  ox: number;
  oy: number;
}

/**
 * Parts of one group whose outlines are congruent (turned and shifted, not mirrored, within 0.1 µm) are
 * nested as copies of one shape, so that the pattern pass sees a model's identical pieces (each its own part,
 * one copy each) as many copies, and copies share feasible regions. The shape is the outline of the first such
 * part in any group: the colour groups of one model then nest the very same shape, and its pattern search
 * (cached per outline) runs once. With free rotation any turn matches; with fixed rotation lists only
 * identical lists and outlines equal up to a shift do, since the allowed angles are in each part's own frame.
 * Returns the parts to nest (each class as one part carrying the class's quantity, with the index and outline
 * of its shape) and each class's members by `group|shape index`.
 */
export function mergeCongruent(parts: readonly PreparedPart[]): {
  nesting: PreparedPart[];
  members: Map<string, ClassMember[]>;
} {
  const nesting: PreparedPart[] = [];
  const members = new Map<string, ClassMember[]>();
  /** The class of each group and shape: its nesting part. */
  const classes = new Map<string, PreparedPart>();
  /** The first part of each shape (its outline is the shape's). */
  const shapes: PreparedPart[] = [];
  for (const p of parts) {
    if (p.quantity === 0) continue;
    const found = congruentShape(shapes, p, p.outline);
    const shape = found?.shape ?? p;
    if (!found) shapes.push(p);
    const key = `${p.group}|${shape.index}`;
    let cls = classes.get(key);
    if (!cls) {
      // Named after its first member (method labels), nested with the shape's index and outline.
      cls = { ...shape, id: p.id, group: p.group, quantity: 0 };
      classes.set(key, cls);
      nesting.push(cls);
      members.set(key, []);
    }
    cls.quantity += p.quantity;
    members.get(key)!.push({ partIndex: p.index, quantity: p.quantity, ...(found?.map ?? IDENTITY) });
  }
  for (const p of nesting)
    // Only repeated parts are laid in patterns; the finer sweep is not needed for single copies.
    if (p.freeRotation && p.quantity >= MIN_PATTERN_COPIES)
      p.patternRotationsDeg = patternRotations(p.outline);
  return { nesting, members };
}

const IDENTITY = { thetaDeg: 0, ox: 0, oy: 0 };

/**
 * The first shape in `shapes` that `outline` (belonging to part p, whose rotation settings apply) is congruent
 * to, and the map R(thetaDeg)·shape + (ox, oy) onto it; mirror images have equal areas but match none. With
 * free rotation any turn matches; with fixed rotation lists only identical lists and a pure shift do, since
 * the allowed angles are in each part's own frame.
 */
function congruentShape(
  shapes: readonly PreparedPart[],
  p: PreparedPart,
  outline: readonly Point[],
): { shape: PreparedPart; map: typeof IDENTITY } | null {
  const area = signedArea(outline as Point[]);
  const asXY = (o: readonly Point[]) => o.map(([x, y]) => ({ X: x, Y: y }));
  for (const h of shapes) {
    if (h.outline.length !== outline.length) continue;
    if (Math.abs(h.areaMm2 - area) > 1e-6 * h.areaMm2 + 1e-9) continue;
    if (h.freeRotation !== p.freeRotation) continue;
    if (!h.freeRotation && h.rotationsDeg.join() !== p.rotationsDeg.join()) continue;
    const c = congruence(asXY(h.outline), asXY(outline), CONGRUENT_TOL_MM);
    const turn = c ? ((c.thetaDeg % 360) + 360) % 360 : 0;
    if (!c || (!p.freeRotation && Math.min(turn, 360 - turn) > 1e-7)) continue;
    return { shape: h, map: c };
  }
  return null;
}

/** A group's copies of one envelope shape: the classes it covers, each placed by a map from the envelope. */
interface EnvelopeClass {
  /** Nested like a part: the envelope shape's index and outline, the covered classes' total quantity. */
  part: PreparedPart;
  covers: { cls: PreparedPart; map: typeof IDENTITY }[];
}

/**
 * Classes of a group whose shapes have congruent envelopes (NestPartInput.envelope) are grouped under the
 * envelope, so that the pattern pass can lay all their copies on one lattice of the envelope (for a model
 * whose pieces differ only in where their slots are, all its pieces instead of a few per slot pattern), and
 * searches that lattice once. A class's envelope is its shape part's; the map of each class takes the
 * envelope shape onto the class's own envelope, inside which the class's outline lies. Envelope shapes get
 * part indices from `firstIndex` on; `shapes` returns them for the geometry cache.
 */
function envelopeClasses(
  nesting: readonly PreparedPart[],
  prepared: readonly PreparedPart[],
  firstIndex: number,
): { shapes: PreparedPart[]; byGroup: Map<string, EnvelopeClass[]> } {
  const shapes: PreparedPart[] = [];
  const byGroup = new Map<string, EnvelopeClass[]>();
  for (const cls of nesting) {
    const envelope = prepared[cls.index]?.envelope;
    if (!envelope || cls.quantity === 0) continue;
    const found = congruentShape(shapes, cls, envelope);
    let shape = found?.shape;
    if (!shape) {
      // A fixed list is in the part's own frame, which the envelope shares.
      const rotationsDeg = cls.freeRotation ? autoRotations(envelope) : [...cls.rotationsDeg];
      shape = {
        index: firstIndex + shapes.length,
        id: `${cls.id} envelope`,
        group: cls.group,
        quantity: 0,
        outline: envelope,
        areaMm2: signedArea(envelope),
        rotationsDeg,
        patternRotationsDeg: cls.freeRotation ? patternRotations(envelope) : rotationsDeg,
        ...(cls.freeRotation !== undefined ? { freeRotation: cls.freeRotation } : {}),
      };
      shapes.push(shape);
    }
    const list = byGroup.get(cls.group) ?? [];
    byGroup.set(cls.group, list);
    let ec = list.find((e) => e.part.index === shape.index);
    if (!ec) {
      ec = { part: { ...shape, id: cls.id, group: cls.group, quantity: 0 }, covers: [] };
      list.push(ec);
    }
    ec.part.quantity += cls.quantity;
    ec.covers.push({ cls, map: found?.map ?? IDENTITY });
  }
  return { shapes, byGroup };
}

/**
 * A placement of a class's first part, given to the member it stands for: the member's outline is R(θ)·A + o,
 * so turning it by φ − θ and shifting by T − R(φ − θ)·o covers the same ground as A turned by φ and shifted by T.
 * The reported angle ψ is φ − θ rounded to 1e-6°, so the shift is worked out about a point of the member's own
 * outline (`ref`, in its frame) rather than its origin: points of the outline then land within ψ's rounding
 * times the part's own size (sub-nanometre) of where A's copy was checked, however far the outline lies from
 * its origin (the rounding times 1 km is 9 µm).
 */
function memberPlacement(m: ClassMember, rotationDeg: number, x: number, y: number, ref: Point) {
  if (m.thetaDeg === 0 && m.ox === 0 && m.oy === 0) return { x, y, rotationDeg };
  const deg = ((((rotationDeg - m.thetaDeg) % 360) + 360) % 360) % 360;
  const psi = round(deg) % 360; // the reported angle
  const turn = (t: number, px: number, py: number) => {
    const r = (t * Math.PI) / 180;
    return [px * Math.cos(r) - py * Math.sin(r), px * Math.sin(r) + py * Math.cos(r)] as const;
  };
  // Where A's copy puts the member's point ref (the exact turn), less where turning by ψ takes ref.
  const [ax, ay] = turn(deg, ref[0] - m.ox, ref[1] - m.oy);
  const [bx, by] = turn(psi, ref[0], ref[1]);
  return { x: round(x + ax - bx), y: round(y + ay - by), rotationDeg: psi };
}

interface GroupPlan {
  sheets: SheetState[];
  method: string;
}

function usedLengthUnits(sheet: SheetState): number {
  let m = 0;
  for (const it of sheet.items) m = Math.max(m, it.tx + it.variant.ubounds.maxX);
  return m;
}

/** Lower is better: sheets, then the last sheet's used length, then its used area, then total used length. */
function planScore(plan: GroupPlan): number[] {
  const last = plan.sheets[plan.sheets.length - 1];
  const total = plan.sheets.reduce((s, sh) => s + usedLengthUnits(sh), 0);
  return [
    plan.sheets.length,
    last ? usedLengthUnits(last) : 0,
    last ? Math.round(last.usedAreaMm2) : 0,
    total,
  ];
}

/**
 * Direct check of a plan, independent of the no-fit polygons: every pair of nearby parts is intersected
 * (one grown by the gap, the other as is). Clipper's Minkowski sums of non-convex outlines can come out
 * incomplete on rare inputs; a plan that fails this check is never returned when another passes.
 */
function planIsClear(plan: GroupPlan, gapMm: number): boolean {
  // The best plan so far is compared with every new one: its verdict is kept while its sheets stay as they were.
  const signature = `${gapMm}|${plan.sheets.map((s) => s.items.length).join(',')}`;
  const known = clearVerdicts.get(plan);
  if (known && known.signature === signature) return known.clear;
  let clear = true;
  check: for (const sheet of plan.sheets) {
    const placed = new PlacedIndex(PlacedIndex.cellFor(sheet.items.map((it) => it.variant)));
    for (const it of sheet.items) {
      if (!clearOfItems(placed, it.variant, it.tx, it.ty, gapMm)) {
        clear = false;
        break check;
      }
      placed.add(it);
    }
  }
  clearVerdicts.set(plan, { signature, clear });
  return clear;
}

const clearVerdicts = new WeakMap<GroupPlan, { signature: string; clear: boolean }>();

function betterPlan(a: GroupPlan, b: GroupPlan | null, gapMm: number): boolean {
  if (b && !planIsClear(a, gapMm)) return false;
  if (b && !planIsClear(b, gapMm)) return true;
  if (!b) return true;
  const sa = planScore(a);
  const sb = planScore(b);
  for (let i = 0; i < sa.length; i++) if (sa[i] !== sb[i]) return sa[i]! < sb[i]!;
  return false;
}

function copiesOf(cache: GeometryCache, parts: readonly PreparedPart[]): Variant[][] {
  const list: { part: PreparedPart; variants: Variant[] }[] = [];
  for (const part of parts) {
    const variants = part.rotationsDeg.map((d) => cache.variant(part.index, d));
    for (let q = 0; q < part.quantity; q++) list.push({ part, variants });
  }
  list.sort((a, b) => b.part.areaMm2 - a.part.areaMm2 || a.part.index - b.part.index);
  return list.map((l) => l.variants);
}

/** Area of the sheet less its margins, mm². */
function usableAreaMm2(frame: SheetFrame): number {
  return Math.max(0, frame.widthMm - 2 * frame.marginMm) * Math.max(0, frame.heightMm - 2 * frame.marginMm);
}

/**
 * The last, partial sheet of a repeated layout: `prefix` (the layout's copies nearest the left edge), or
 * bottom-left fill of as many copies (left edge first), whichever leaves the longer offcut at the right.
 */
/** Copies of one shape a sheet holds (by area) above which only the lattice and grid lay them out. */
const CROWDED_PER_SHEET = 400;

function shorterLastSheet(
  cache: GeometryCache,
  frame: SheetFrame,
  group: string,
  prefix: SheetState,
  variants: readonly Variant[],
): SheetState {
  // Hundreds of copies: the fill would search each one for a shorter strip; the prefix is kept.
  if (prefix.items.length > CROWDED_PER_SHEET) return prefix;
  const copies = Array.from({ length: prefix.items.length }, () => variants);
  const bl = bottomLeftFill(cache, frame, group, copies, [], 'left');
  const alt = bl.failed === null && bl.sheets.length === 1 ? bl.sheets[0]! : null;
  return alt && usedLengthUnits(alt) < usedLengthUnits(prefix) ? alt : prefix;
}

function patternPlan(
  cache: GeometryCache,
  frame: SheetFrame,
  group: string,
  parts: readonly PreparedPart[],
  patterned: readonly PreparedPart[],
  /** The classes each patterned envelope part stands for (see envelopeClasses). */
  covers: ReadonlyMap<PreparedPart, readonly PreparedPart[]> = new Map(),
): GroupPlan | null {
  const sheets: SheetState[] = [];
  const covered = new Set(patterned.flatMap((p) => covers.get(p) ?? []));
  const rest: PreparedPart[] = parts.filter((p) => !patterned.includes(p) && !covered.has(p));
  const labels: string[] = [];
  for (const part of patterned) {
    const pat = bestPattern(cache, frame, part.index, part.patternRotationsDeg, part.freeRotation === true);
    if (!pat) {
      rest.push(...(covers.get(part) ?? [part]));
      continue;
    }
    labels.push(`${part.id}: ${pat.description}`);
    // Gaps the lattice leaves at the sheet edges are topped up by bottom-left fill with further copies.
    const variants = [...new Set([...part.rotationsDeg, ...pat.slots.map((x) => x.variant.rotationDeg)])].map(
      (d) => cache.variant(part.index, d),
    );
    let left = part.quantity;
    // A full sheet topped up until no copy fitted: every later sheet with as many copies left repeats it.
    let template: SheetState | null = null;
    while (left > 0) {
      if (template && left >= template.items.length) {
        sheets.push({ ...template, items: template.items.map((x) => ({ ...x })) });
        left -= template.items.length;
        continue;
      }
      const take = Math.min(left, pat.slots.length);
      if (take < pat.slots.length) {
        // The last, partial sheet: the lattice's left-most slots, or bottom-left fill of the copies left over
        // (left edge first), whichever leaves the longer offcut at the right.
        const prefix: SheetState = {
          group,
          items: pat.slots.slice(0, take).map((x) => ({ ...x })),
          usedAreaMm2: take * part.areaMm2,
          method: 'pattern',
        };
        sheets.push(shorterLastSheet(cache, frame, group, prefix, variants));
        break;
      }
      const items: PlacedItem[] = pat.slots.slice(0, take).map((x) => ({ ...x }));
      const sheet: SheetState = { group, items, usedAreaMm2: take * part.areaMm2, method: 'pattern' };
      sheets.push(sheet);
      left -= take;
      // Hundreds to a sheet: topping up would search the free space left by all of them for a handful more
      // at the edges (a minute for 8,500 stars); the lattice alone is kept.
      if (take > CROWDED_PER_SHEET) {
        template = { ...sheet, items: sheet.items.map((x) => ({ ...x })) };
        continue;
      }
      while (left > 0) {
        const c = findPosition(cache, frame, sheet, variants, 'left');
        if (!c) {
          template = {
            group,
            items: sheet.items.map((x) => ({ ...x })),
            usedAreaMm2: sheet.usedAreaMm2,
            method: 'pattern',
          };
          break;
        }
        sheet.items.push({ variant: c.variant, tx: c.tx, ty: c.ty });
        sheet.usedAreaMm2 += part.areaMm2;
        left--;
      }
    }
  }
  if (labels.length === 0) return null;
  const r = bottomLeftFill(cache, frame, group, copiesOf(cache, rest), sheets);
  if (r.failed !== null) return null;
  return { sheets: r.sheets, method: `pattern (${labels.join('; ')})` };
}

/**
 * A group of one shape whose sheets hold at most this many copies is tried with the overlap search
 * (overlap.ts): with few large pieces the sheet's edges decide, and neither lattices nor bottom-left fill see
 * the interlocking layouts that fit one more. With more per sheet the lattice is close to the best anyway.
 */
const DENSE_MAX_PER_SHEET = 16;
/** Work limit of one overlap search (pair evaluations; about 0.3 s on the bench machine). */
const DENSE_WORK = 200_000;

/**
 * What the overlap search found per shape (part index), shared by all groups: its fullest sheet, and the count
 * it failed to reach (a search for more copies would fail there again, since it raises the count one at a time).
 */
export type DenseLayouts = Map<number, { layout: PlacedItem[]; failedAt: number | null }>;

/**
 * The copies per sheet denserPlan looks for to save a sheet on `best`, or null when it does not look (one
 * sheet, too many copies to a sheet already, or too many for the sheet's area).
 */
function denserTarget(frame: SheetFrame, shape: PreparedPart, best: GroupPlan): number | null {
  const sheetsNow = best.sheets.length;
  if (sheetsNow < 2) return null;
  const most = Math.max(...best.sheets.map((s) => s.items.length));
  if (most > DENSE_MAX_PER_SHEET) return null;
  const target = Math.ceil(shape.quantity / (sheetsNow - 1));
  if (target <= most || target * shape.areaMm2 > usableAreaMm2(frame)) return null;
  return target;
}

/**
 * The fewest sheets denserPlan(…, best, dense) can return, worked out without its search (Infinity when it
 * returns null): a layout already found for the shape is reused as it is, and a search raises the count one
 * copy at a time up to the target and no further, so its plan, if any, has ⌈quantity ÷ target⌉ sheets.
 */
function denserFloor(frame: SheetFrame, shape: PreparedPart, best: GroupPlan, dense: DenseLayouts): number {
  const target = denserTarget(frame, shape, best);
  if (target === null) return Infinity;
  const known = dense.get(shape.index);
  if (known && known.layout.length >= target) return Math.ceil(shape.quantity / known.layout.length);
  if (known && known.failedAt !== null) return Infinity;
  return Math.ceil(shape.quantity / target);
}

/**
 * A plan for a group whose copies are all of one shape (a class, or an envelope covering every class of the
 * group) with fewer sheets than `best`: the overlap search looks for a sheet holding enough copies to save a
 * sheet; full sheets repeat that layout, the last takes its left-most copies or bottom-left fill of the
 * copies left, whichever leaves the longer offcut. Null when no such layout is found.
 */
function denserPlan(
  cache: GeometryCache,
  frame: SheetFrame,
  group: string,
  shape: PreparedPart,
  best: GroupPlan,
  dense: DenseLayouts,
): GroupPlan | null {
  const n = shape.quantity;
  const target = denserTarget(frame, shape, best);
  if (target === null) return null;
  let known = dense.get(shape.index);
  if (!known || (known.layout.length < target && known.failedAt === null)) {
    const rotations = [...new Set([...shape.patternRotationsDeg, ...shape.rotationsDeg])];
    const variants = rotations.map((d) => cache.variant(shape.index, d));
    const start = known?.layout ?? [];
    const found = denserSheet(cache, frame, variants, start, { targetCount: target, workLimit: DENSE_WORK });
    const layout = found ?? start;
    known = { layout, failedAt: layout.length < target ? layout.length + 1 : null };
    dense.set(shape.index, known);
  }
  const layout = known.layout;
  if (layout.length < target) return null;
  const m = layout.length;
  const sheets: SheetState[] = [];
  const sheetOf = (items: readonly PlacedItem[]): SheetState => ({
    group,
    items: items.map((it) => ({ ...it })),
    usedAreaMm2: items.length * shape.areaMm2,
    method: 'true-shape',
  });
  for (let left = n; left > 0; left -= m) {
    if (left >= m) {
      sheets.push(sheetOf(layout));
      continue;
    }
    const byRightEdge = [...layout].sort(
      (a, b) => a.tx + a.variant.ubounds.maxX - (b.tx + b.variant.ubounds.maxX),
    );
    const prefix = sheetOf(byRightEdge.slice(0, left));
    const variants = shape.rotationsDeg.map((d) => cache.variant(shape.index, d));
    sheets.push(shorterLastSheet(cache, frame, group, prefix, variants));
  }
  return { sheets, method: `true-shape (overlap search, ${m} per sheet)` };
}

/**
 * A plan for a group of several shapes with one sheet fewer than `best`: the pieces of its last sheet are
 * shared out over the other sheets (largest first, each to the sheet with the most area left) and every
 * receiving sheet is laid out again by the overlap search, its own pieces free to move and the new ones
 * added. Only for sheets of at most DENSE_MAX_PER_SHEET pieces; null when any receiving sheet fails.
 */
function emptiedLastSheetPlan(
  cache: GeometryCache,
  frame: SheetFrame,
  best: GroupPlan,
  partsByIndex: ReadonlyMap<number, PreparedPart>,
): GroupPlan | null {
  const count = best.sheets.length;
  if (count < 2 || best.sheets.some((s) => s.items.length > DENSE_MAX_PER_SHEET)) return null;
  const usable = usableAreaMm2(frame);
  const kept = best.sheets.slice(0, -1);
  const last = best.sheets[count - 1]!;
  const left = kept.map((s) => usable - s.usedAreaMm2);
  const given: PlacedItem[][] = kept.map(() => []);
  for (const it of [...last.items].sort((a, b) => b.variant.areaMm2 - a.variant.areaMm2)) {
    let to = -1;
    for (let i = 0; i < kept.length; i++)
      if (left[i]! >= it.variant.areaMm2 && (to < 0 || left[i]! > left[to]!)) to = i;
    if (to < 0) return null;
    left[to] = left[to]! - it.variant.areaMm2;
    given[to]!.push(it);
  }
  // One shape per part: its allowed and pattern rotations, and any rotation an item already has.
  const shapeIndex = new Map<number, number>();
  const shapes: Variant[][] = [];
  const shapeOf = (it: PlacedItem): number | null => {
    const part = partsByIndex.get(it.variant.partIndex);
    if (!part) return null;
    let k = shapeIndex.get(part.index);
    if (k === undefined) {
      const degs = [...new Set([...part.rotationsDeg, ...part.patternRotationsDeg])];
      shapes.push(degs.map((d) => cache.variant(part.index, d)));
      shapeIndex.set(part.index, (k = shapes.length - 1));
    }
    if (!shapes[k]!.some((v) => v.key === it.variant.key)) shapes[k]!.push(it.variant);
    return k;
  };
  const receiving = given.filter((g) => g.length > 0).length;
  const sheets: SheetState[] = [];
  for (let i = 0; i < kept.length; i++) {
    const sheet = kept[i]!;
    if (given[i]!.length === 0) {
      sheets.push(sheet);
      continue;
    }
    const start: ShapedItem[] = [];
    for (const item of sheet.items) {
      const shape = shapeOf(item);
      if (shape === null) return null;
      start.push({ shape, item });
    }
    const add: number[] = [];
    for (const it of given[i]!) {
      const shape = shapeOf(it);
      if (shape === null) return null;
      add.push(shape);
    }
    const items = overlapLayout(cache, frame, shapes, start, add, {
      workLimit: Math.ceil(DENSE_WORK / receiving),
    });
    if (!items) return null;
    sheets.push({
      group: sheet.group,
      items,
      usedAreaMm2: items.reduce((a, it) => a + it.variant.areaMm2, 0),
      method: 'true-shape',
    });
  }
  return { sheets, method: `${best.method}, last sheet shared out by the overlap search` };
}

/**
 * A part that is a rectangle at one of its allowed rotations is also laid in a plain grid, computed in whole
 * units from its outline's extent: an exact fit (six 100 mm squares across a 600 mm sheet with no gap) then
 * holds. Bottom-left fill and the lattices cannot see it: their no-fit polygons keep a safety margin, and
 * positions in exact contact form feasible regions of no width. Full sheets are filled column by column, so
 * the last sheet keeps its offcut at the right.
 */
function rectangleGridPlan(
  cache: GeometryCache,
  frame: SheetFrame,
  group: string,
  part: PreparedPart,
): GroupPlan | null {
  const S = SCALE_PER_MM;
  let best: GroupPlan | null = null;
  for (const deg of part.rotationsDeg) {
    const v = cache.variant(part.index, deg);
    const b = v.bounds;
    // A rectangle: it fills its extent (up to the rounding of a turned outline to whole units).
    const box = boxOfPaths([v.poly]);
    const w = box.maxX - box.minX;
    const h = box.maxY - box.minY;
    if (!(Math.abs(areaUnits(v.poly)) >= w * h - 2 * (w + h))) continue;
    // Whole-unit pitches from the exact outline's extent, rounded up: every copy is the same outline moved by
    // whole units, so neighbours keep at least the gap (no gap: they touch at most) exactly, not to within a
    // unit. With no gap the rounded outlines must not overlap either, so the pitch covers their extent too.
    // (With no gap, a size that is no whole number of µm loses its exact fit by a µm: 18 squares of 100/3 mm
    // need 600.012.)
    //
    // With a gap, the pitch and the room for it are taken to the nanometre, the precision placements are
    // printed with, so a size given to the half-micrometre (inch fractions: 5 11/16 in = 144.4625 mm) keeps its
    // exact fit: the copies' outlines are then exactly the gap apart, and the direct check (clearOfItems) allows
    // the outlines as rounded to whole units a unit's slack.
    const gap = cache.gapMm * S;
    /** Units down to whole nanometres, with a femtometre's tolerance for the floating point's error. */
    const floorNm = (units: number) => Math.floor(units * 1000 + 1e-3) / 1000;
    const pitchX =
      gap > 0
        ? Math.ceil(((b.maxX - b.minX) * S + gap) * 1000 - 1e-3) / 1000
        : Math.ceil(Math.max((b.maxX - b.minX) * S, w) - 1e-6);
    const pitchY =
      gap > 0
        ? Math.ceil(((b.maxY - b.minY) * S + gap) * 1000 - 1e-3) / 1000
        : Math.ceil(Math.max((b.maxY - b.minY) * S, h) - 1e-6);
    // Positions are kept inside the sheet less its margin, as every placement is (innerFit).
    const fit = innerFit(frame, v);
    if (!fit) continue;
    const x0 = Math.max(Math.round((frame.marginMm - b.minX) * S), fit.x0);
    const y0 = Math.max(Math.round((frame.marginMm - b.minY) * S), fit.y0);
    if (x0 > fit.x1 || y0 > fit.y1) continue;
    const x1 = gap > 0 ? Math.max(fit.x1, floorNm((frame.widthMm - frame.marginMm - b.maxX) * S)) : fit.x1;
    const y1 = gap > 0 ? Math.max(fit.y1, floorNm((frame.heightMm - frame.marginMm - b.maxY) * S)) : fit.y1;
    const cols = Math.floor((x1 - x0) / pitchX + 1e-9) + 1;
    const rows = Math.floor((y1 - y0) / pitchY + 1e-9) + 1;
    const sheets: SheetState[] = [];
    for (let k = 0; k < part.quantity; k++) {
      const slot = k % (cols * rows);
      if (slot === 0) sheets.push({ group, items: [], usedAreaMm2: 0, method: 'pattern' });
      const sheet = sheets[sheets.length - 1]!;
      const c = Math.floor(slot / rows);
      const r = slot % rows;
      sheet.items.push({
        variant: v,
        tx: x0 + Math.round(c * pitchX * 1000) / 1000,
        ty: y0 + Math.round(r * pitchY * 1000) / 1000,
      });
      sheet.usedAreaMm2 += part.areaMm2;
    }
    const plan = { sheets, method: `pattern (${part.id}: grid of ${cols} × ${rows} at ${deg}°)` };
    if (betterPlan(plan, best, cache.gapMm)) best = plan;
  }
  return best;
}

/**
 * A question nestGroup may answer instead of laying the group out: does its plan use at most `cap` sheets?
 * `last`: the group is the last one asked about, so a plan within the cap settles the answer (an earlier
 * group's exact count is still needed, for the groups after it).
 */
interface GroupLimit {
  cap: number;
  last: boolean;
}

/**
 * The group's plan (methods tried in turn, the better plan kept: see betterPlan). With a limit, the methods
 * run in the same order on the same data, but the search stops as soon as the plan's sheet count against the
 * cap is certain: 'within' once the last group has a clear plan of every copy within the cap (the plan kept
 * could only get better), 'over' when neither the plan nor what the overlap search or the emptied last sheet
 * could still save brings it within the cap (their searches, the costliest step, are then skipped). Otherwise
 * the plan itself, the very one the unlimited call returns.
 */
function nestGroup(
  cache: GeometryCache,
  frame: SheetFrame,
  group: string,
  parts: readonly PreparedPart[],
  method: NonNullable<NestInput['method']>,
  envelopes: readonly EnvelopeClass[] = [],
  dense: DenseLayouts = new Map(),
  limit?: GroupLimit,
): GroupPlan | null | 'within' | 'over' {
  let best: GroupPlan | null = null;
  const wanted = parts.reduce((a, p) => a + p.quantity, 0);
  const within = () =>
    limit?.last === true &&
    best !== null &&
    best.sheets.length <= limit.cap &&
    best.sheets.reduce((a, sh) => a + sh.items.length, 0) === wanted &&
    planIsClear(best, cache.gapMm);
  // Hundreds of copies of one shape to a sheet: the lattice is as good as a fill, and bottom-left fill,
  // searching every copy, would take most of a minute (left to the fallback below when no lattice is found).
  const crowded =
    method === 'best' &&
    parts.length === 1 &&
    parts[0]!.quantity >= MIN_PATTERN_COPIES &&
    usableAreaMm2(frame) / parts[0]!.areaMm2 > CROWDED_PER_SHEET;
  if (method !== 'pattern' && !crowded) {
    for (const rule of ['left', 'right'] as const) {
      const r = bottomLeftFill(cache, frame, group, copiesOf(cache, parts), [], rule);
      const plan = { sheets: r.sheets, method: `true-shape (bottom-left fill, ${rule} edge first)` };
      if (r.failed === null && betterPlan(plan, best, cache.gapMm)) best = plan;
      if (within()) return 'within';
    }
  }
  if (method !== 'true-shape') {
    const usable = usableAreaMm2(frame);
    const enough = (p: PreparedPart) =>
      p.quantity >= MIN_PATTERN_COPIES && p.areaMm2 * p.quantity >= MIN_PATTERN_SHEET_SHARE * usable;
    // Classes with envelopes are patterned as copies of their envelope, all classes of one envelope together,
    // in place of their own outlines: a lattice of envelopes is a valid one for the parts inside, the parts'
    // slots and notches (narrower than twice the gap) admit nothing anyway, and the envelope keeps the
    // symmetry that the notches break (a lattice search per notch pattern found fewer, at several times the cost).
    const covers = new Map<PreparedPart, PreparedPart[]>();
    for (const e of envelopes)
      if (enough(e.part))
        covers.set(
          e.part,
          e.covers.map((c) => c.cls),
        );
    const covered = new Set([...covers.values()].flat());
    const repeated = [...covers.keys(), ...parts.filter((p) => !covered.has(p) && enough(p))].sort(
      (a, b) => b.areaMm2 * b.quantity - a.areaMm2 * a.quantity,
    );
    const options: PreparedPart[][] = [];
    if (repeated.length > 0) options.push([repeated[0]!]);
    if (repeated.length > 1) options.push(repeated);
    for (const opt of options) {
      const plan = patternPlan(cache, frame, group, parts, opt, covers);
      if (plan && betterPlan(plan, best, cache.gapMm)) best = plan;
      if (within()) return 'within';
    }
    if (parts.length === 1) {
      const grid = rectangleGridPlan(cache, frame, group, parts[0]!);
      if (grid && betterPlan(grid, best, cache.gapMm)) best = grid;
      if (within()) return 'within';
    }
    if (!best) {
      const r = bottomLeftFill(cache, frame, group, copiesOf(cache, parts), []);
      best = { sheets: r.sheets, method: 'true-shape (bottom-left fill)' };
    }
  }
  if (method === 'best' && best) {
    // One shape only: a class alone, or an envelope that covers every class of the group.
    const whole = envelopes.find((e) => e.covers.length === parts.length);
    const shape = parts.length === 1 ? parts[0]! : whole?.part;
    if (limit) {
      // What the steps below can still save: the overlap search down to its floor, the emptied last sheet one.
      const floor = shape ? denserFloor(frame, shape, best, dense) : best.sheets.length - 1;
      if (Math.min(best.sheets.length, floor) > limit.cap) return 'over';
    }
    const plan = shape ? denserPlan(cache, frame, group, shape, best, dense) : null;
    if (plan && betterPlan(plan, best, cache.gapMm)) best = plan;
    if (!shape) {
      // Several shapes: try to share the last sheet's pieces out over the others.
      const partsByIndex = new Map([...parts, ...envelopes.map((e) => e.part)].map((p) => [p.index, p]));
      const fewer = emptiedLastSheetPlan(cache, frame, best, partsByIndex);
      if (fewer && betterPlan(fewer, best, cache.gapMm)) best = fewer;
    }
  }
  return best;
}

/** Items handed out in order, each as many times as its count says (counts may run to many thousands). */
class Queue<T> {
  private at = 0;
  private left: number;
  constructor(private readonly runs: readonly (readonly [T, number])[]) {
    this.left = runs[0]?.[1] ?? 0;
  }
  next(): T | undefined {
    while (this.at < this.runs.length && this.left <= 0) this.left = this.runs[++this.at]?.[1] ?? 0;
    if (this.at >= this.runs.length) return undefined;
    this.left--;
    return this.runs[this.at]![0];
  }
}

function round(v: number, digits = 6): number {
  const f = 10 ** digits;
  return Math.round(v * f) / f;
}

/**
 * A freely turning part that fits the usable sheet at none of its automatic rotations, but at some other
 * angle (a piece sized to just fit the bed, at the angle that fit found), is also allowed that angle and its
 * half-turn partner (bestFitRatio: the turn whose bounding box fits the usable rectangle best).
 */
function addFittingTurns(parts: PreparedPart[], usableW: number, usableH: number): void {
  if (!(usableW > 0 && usableH > 0)) return;
  for (const p of parts) {
    if (!p.freeRotation || p.quantity === 0) continue;
    const fits = p.rotationsDeg.some((d) => {
      const b = boundsOf(rotatePolygon(p.outline, d));
      return b.maxX - b.minX <= usableW + 1e-6 && b.maxY - b.minY <= usableH + 1e-6;
    });
    if (fits) continue;
    const best = bestFitRatio(p.outline, usableW, usableH);
    if (best.ratio > 1 + 1e-9) continue;
    const turns = [best.angleDeg, best.angleDeg + 180].map((d) => normaliseAngle(d));
    p.rotationsDeg = [...new Set([...p.rotationsDeg, ...turns])];
    p.patternRotationsDeg = [...new Set([...p.patternRotationsDeg, ...turns])];
  }
}

/**
 * Whether nestParts(input) lays the parts out on at most maxSheets sheets (false also when it returns an
 * error), with the same answer and less work: first a lower bound on each group's sheets found without any
 * layout (sheetsLowerBound: a bin-packing bound on the parts' gap-grown areas), then the groups in nestParts'
 * order, each stopping as soon as its count against what the others leave it is certain (see nestGroup). For
 * searches that lay the same parts out at many sizes and need only the answer (fit to sheets).
 */
export function nestFits(input: NestInput, maxSheets: number): boolean {
  const setup = setUp(input);
  if ('ok' in setup) return false;
  const { frame, cache, groups, groupParts, groupEnvelopes } = setup;
  const usableW = input.sheet.widthMm - 2 * input.marginMm;
  const usableH = input.sheet.heightMm - 2 * input.marginMm;
  const bounds = groups.map((g) => sheetsLowerBound(groupParts(g), usableW, usableH, input.gapMm));
  let floorAfter = bounds.reduce((a, b) => a + b, 0);
  if (floorAfter > maxSheets) return false;
  let used = 0;
  const dense: DenseLayouts = new Map();
  for (const [k, group] of groups.entries()) {
    floorAfter -= bounds[k]!;
    const parts = groupParts(group);
    const limit = { cap: maxSheets - used - floorAfter, last: k === groups.length - 1 };
    const method = input.method ?? 'best';
    const found = nestGroup(cache, frame, group, parts, method, groupEnvelopes(group), dense, limit);
    if (found === 'within') return true;
    if (found === 'over' || found === null) return false;
    // Every copy placed, as nestParts requires.
    const placed = found.sheets.reduce((a, sh) => a + sh.items.length, 0);
    if (placed !== parts.reduce((a, p) => a + p.quantity, 0)) return false;
    used += found.sheets.length;
    if (used + floorAfter > maxSheets) return false;
  }
  return used <= maxSheets;
}

interface NestSetup {
  prepared: PreparedPart[];
  frame: SheetFrame;
  members: Map<string, ClassMember[]>;
  cache: GeometryCache;
  /** Groups in the order they are nested. */
  groups: string[];
  /** The classes of a group to nest (mergeCongruent), with copies. */
  groupParts: (group: string) => PreparedPart[];
  /** The envelope classes of a group that fit the sheet. */
  groupEnvelopes: (group: string) => EnvelopeClass[];
}

/** Checks the input and prepares what nesting it needs: parts, classes, envelopes, the geometry cache. */
function setUp(input: NestInput): NestSetup | Extract<NestResult, { ok: false }> {
  const { sheet, marginMm, gapMm } = input;
  if (!(sheet.widthMm > 0 && sheet.heightMm > 0)) return fail('INVALID_INPUT', 'sheet size must be positive');
  if (!(marginMm >= 0) || !(gapMm >= 0)) return fail('INVALID_INPUT', 'margin and gap must be ≥ 0');
  if (sheet.widthMm > NEST_LIMITS.sheetMm || sheet.heightMm > NEST_LIMITS.sheetMm)
    return fail(
      'INVALID_INPUT',
      `sheet sides must be at most ${NEST_LIMITS.sheetMm.toLocaleString('en')} mm`,
    );
  if (marginMm > NEST_LIMITS.spacingMm || gapMm > NEST_LIMITS.spacingMm)
    return fail(
      'INVALID_INPUT',
      `margin and gap must be at most ${NEST_LIMITS.spacingMm.toLocaleString('en')} mm`,
    );
  let copies = 0;
  for (const p of input.parts) {
    if (!Number.isInteger(p.quantity) || p.quantity < 0)
      return fail('INVALID_INPUT', `part "${p.id}" quantity must be a whole number ≥ 0`, [p.id]);
    copies += p.quantity;
    const far = [...p.outline, ...(p.envelope ?? [])].some(
      (q) => Math.abs(q[0]) > NEST_LIMITS.coordinateMm || Math.abs(q[1]) > NEST_LIMITS.coordinateMm,
    );
    if (far)
      return fail(
        'INVALID_INPUT',
        `part "${p.id}" has points more than ${NEST_LIMITS.coordinateMm.toLocaleString('en')} mm from its origin: ` +
          'give the outline in millimetres near its own origin',
        [p.id],
      );
  }
  if (copies > NEST_LIMITS.copies)
    return fail(
      'INVALID_INPUT',
      `at most ${NEST_LIMITS.copies.toLocaleString('en')} copies can be nested in one run; this asks for ` +
        `${copies.toLocaleString('en')}: split the job`,
    );
  const prepared = prepare(input);
  if (!Array.isArray(prepared)) return prepared;
  addFittingTurns(prepared, sheet.widthMm - 2 * marginMm, sheet.heightMm - 2 * marginMm);
  const frame: SheetFrame = { widthMm: sheet.widthMm, heightMm: sheet.heightMm, marginMm };
  const { nesting, members } = mergeCongruent(prepared);
  const envelopes = envelopeClasses(nesting, prepared, prepared.length);
  const cache = new GeometryCache([...prepared, ...envelopes.shapes], gapMm);
  // The same test the placement uses (innerFit), so a part said to fit is never left out.
  const fitsEmptySheet = (part: PreparedPart) =>
    part.rotationsDeg.some((d) => innerFit(frame, cache.variant(part.index, d)) !== null);

  const tooBig: string[] = [];
  for (const part of prepared) if (part.quantity > 0 && !fitsEmptySheet(part)) tooBig.push(part.id);
  if (tooBig.length > 0)
    return fail(
      'PART_DOES_NOT_FIT',
      `part${tooBig.length > 1 ? 's' : ''} ${tooBig.map((id) => `"${id}"`).join(', ')} cannot fit on an empty ` +
        `${lengthText(sheet.widthMm)} × ${lengthText(sheet.heightMm)} mm sheet with a ${lengthText(marginMm)} mm margin at any allowed rotation`,
      tooBig,
    );

  // An envelope too large for the sheet cannot be laid out; its classes are nested on their own.
  const usableEnvelopes = new Set(envelopes.shapes.filter(fitsEmptySheet).map((e) => e.index));
  const groups: string[] = [];
  for (const p of nesting) if (p.quantity > 0 && !groups.includes(p.group)) groups.push(p.group);
  return {
    prepared,
    frame,
    members,
    cache,
    groups,
    groupParts: (group) => nesting.filter((p) => p.group === group && p.quantity > 0),
    groupEnvelopes: (group) =>
      (envelopes.byGroup.get(group) ?? []).filter((e) => usableEnvelopes.has(e.part.index)),
  };
}

/**
 * Nests parts onto sheets: true shape, per-part rotations, each group on its own sheets. Returns an error
 * result naming any part that cannot fit on an empty sheet at any allowed rotation.
 */
export function nestParts(input: NestInput): NestResult {
  const setup = setUp(input);
  if ('ok' in setup) return setup;
  const { sheet, marginMm } = input;
  const { prepared, frame, members, cache, groups, groupParts, groupEnvelopes: envelopesOf } = setup;
  const sheetArea = sheet.widthMm * sheet.heightMm;
  const sheets: NestSheetResult[] = [];
  const groupTotals: NestTotals['groups'] = [];
  // No prototype: a group may be called anything, "__proto__" included.
  const sheetsByGroup: Record<string, number> = Object.create(null) as Record<string, number>;
  const dense: DenseLayouts = new Map();
  for (const group of groups) {
    const parts = groupParts(group);
    const groupEnvelopes = envelopesOf(group);
    const found = nestGroup(cache, frame, group, parts, input.method ?? 'best', groupEnvelopes, dense);
    const plan = typeof found === 'string' ? null : found;
    // Every copy placed, or an error: never a layout that silently leaves parts out.
    const placed = plan ? plan.sheets.reduce((a, s) => a + s.items.length, 0) : 0;
    const wanted = parts.reduce((a, p) => a + p.quantity, 0);
    if (!plan || placed !== wanted) {
      const ids = parts.map((p) => p.id);
      return fail(
        'PART_DOES_NOT_FIT',
        `not every copy in group "${group}" could be placed on a ${lengthText(sheet.widthMm)} × ${lengthText(sheet.heightMm)} mm ` +
          `sheet with a ${lengthText(marginMm)} mm margin`,
        ids,
      );
    }
    // Copies of a congruent class go to its members in turn, in placement order.
    const queues = new Map<number, Queue<ClassMember>>();
    const nextMember = (shape: number): ClassMember => {
      const all = members.get(`${group}|${shape}`)!;
      let queue = queues.get(shape);
      if (!queue) queues.set(shape, (queue = new Queue(all.map((m) => [m, m.quantity]))));
      return queue.next() ?? all[0]!;
    };
    // Copies of an envelope go to the classes it covers in turn, then to those classes' members.
    const envelopeQueues = new Map<number, Queue<EnvelopeClass['covers'][number]>>();
    const nextCovered = (index: number): EnvelopeClass['covers'][number] => {
      let queue = envelopeQueues.get(index);
      if (!queue) {
        const e = groupEnvelopes.find((x) => x.part.index === index)!;
        queue = new Queue(e.covers.map((c) => [c, c.cls.quantity]));
        envelopeQueues.set(index, queue);
      }
      return queue.next()!;
    };
    let lastUsedUnits = 0;
    for (const s of plan.sheets) {
      const items = [...s.items].sort((a, b) => a.tx - b.tx || a.ty - b.ty);
      let usedUnits = 0;
      let area = 0;
      const placements = items.map((it) => {
        let at = {
          rotationDeg: it.variant.rotationDeg,
          x: round(it.tx / SCALE_PER_MM),
          y: round(it.ty / SCALE_PER_MM),
        };
        let shape = it.variant.partIndex;
        if (shape >= prepared.length) {
          // An envelope's copy: first the covered class's shape inside it, then the member.
          const c = nextCovered(shape);
          at = memberPlacement(
            { partIndex: c.cls.index, quantity: 1, ...c.map },
            at.rotationDeg,
            at.x,
            at.y,
            prepared[c.cls.index]!.outline[0]!,
          );
          shape = c.cls.index;
        }
        const m = nextMember(shape);
        const placement = memberPlacement(m, at.rotationDeg, at.x, at.y, prepared[m.partIndex]!.outline[0]!);
        // Length and area of the part itself (an envelope's copy is larger than the part inside it).
        const own = shape === it.variant.partIndex ? it : null;
        const maxX = own
          ? own.tx + own.variant.ubounds.maxX
          : Math.round(placement.x * SCALE_PER_MM) +
            cache.variant(m.partIndex, placement.rotationDeg).ubounds.maxX;
        usedUnits = Math.max(usedUnits, maxX);
        area += own ? own.variant.areaMm2 : prepared[m.partIndex]!.areaMm2;
        return { part: prepared[m.partIndex]!.id, ...placement };
      });
      lastUsedUnits = usedUnits;
      sheets.push({
        group,
        placements,
        utilisation: round(area / sheetArea),
        usedLengthMm: round(usedUnits / SCALE_PER_MM, 3),
        partIds: placements.map((p) => p.part),
        method: s.method,
      });
    }
    sheetsByGroup[group] = plan.sheets.length;
    groupTotals.push({
      group,
      sheets: plan.sheets.length,
      lastOffcutLengthMm: round(sheet.widthMm - lastUsedUnits / SCALE_PER_MM, 3),
      method: plan.method,
    });
  }
  const partArea = prepared.reduce((a, p) => a + p.areaMm2 * p.quantity, 0);
  const pieceCount = sheets.reduce((a, s) => a + s.placements.length, 0);
  return {
    ok: true,
    sheets,
    totals: {
      sheetCount: sheets.length,
      pieceCount,
      partAreaMm2: round(partArea, 3),
      sheetAreaMm2: sheets.length * sheetArea,
      utilisation: sheets.length > 0 ? round(partArea / (sheets.length * sheetArea)) : 0,
      sheetsByGroup,
      groups: groupTotals,
    },
  };
}
