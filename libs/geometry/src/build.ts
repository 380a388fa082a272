import type {
  BedSpec,
  DesignIssue,
  DesignReport,
  MachineSpec,
  ReportCrossing,
  ReportColourPlan,
  ReportPiece,
  ReportScale,
} from '@kerfwright/contracts';
import { type ColourPlan, solveColourPlan } from './colour';
import { bestFitRatio } from './scale/fit-ratio';
import { type Vec2, type Vec3, at, scale3 } from './math/vec';
import { type Polygon, signedArea } from './math/polygon';
import { type Solid } from './solids/polyhedron';
import { getSolid } from './solids/catalogue';
import { parseSolidText } from './solids/parse';
import { type PieceFrame, fromFrame, pieceFrames, suggestSizes, type SuggestedSizes } from './pieces/place';
import { starOutline } from './pieces/shape';
import { type Crossing, computeCrossings, crossingPoint } from './crossings/crossings';
import { MIN_DRAWN_SLOT_MM, type Slot, nominalSlotWidth, planSlots, slotCuttable } from './slots/slots';
import { compensateKerf, dogBoneCentre, notchOutline } from './compensation/compensate';
import { slotInnerCorners } from './slots/slots';
import { MAX_SCALE_MM, type ResolvedSpec, SpecValidationError, validateSpec } from './spec/validate-spec';
import { IssueList, fitsBed, slotGap, slotWeb } from './validity/validity';
import { cutterMarginMm } from './layout/plan-layout';
import { CLASH_TOLERANCE_MM, thicknessClashes } from './validity/thickness-clash';
import { lengthText } from './math/length-text';
import { assertDesignWork } from './spec/workload';

/** A slot as built into one piece (piece frame, mm). */
export interface BuiltSlot {
  crossing: number;
  /** Id of the piece this slot receives. */
  partner: string;
  /** Opening on the piece's edge, and the unit direction into the piece. */
  end: Vec2;
  axis: Vec2;
  depthMm: number;
  widthMm: number;
  drawnWidthMm: number;
}

/** One piece of the built model. All 2D geometry is in the piece's own frame (see PieceFrame), mm. */
export interface BuiltPiece {
  id: string;
  face: number;
  frame: PieceFrame;
  circumradiusMm: number;
  /** The piece shape before slotting, counter-clockwise. */
  shape: Vec2[];
  /** Nominal outline with slot notches (and router reliefs), counter-clockwise. */
  nominalOutline: Vec2[];
  /** Outline to cut after machine compensation, counter-clockwise. */
  outline: Vec2[];
  slots: BuiltSlot[];
  /** Dog-bone relief circles (router only). */
  reliefs: { centre: Vec2; radiusMm: number }[];
}

export interface BuiltModel {
  spec: ResolvedSpec;
  solid: Solid;
  mmPerUnit: number;
  pieces: BuiltPiece[];
  crossings: Crossing[];
  /** Whether the default slot-end rule made slots collide and the 2-SAT search chose the ends. */
  slotSearchUsed: boolean;
  report: DesignReport;
}

/** Groups of pieces joined by crossings (connected components), each listed by piece index. */
export function connectedGroups(count: number, links: readonly { a: number; b: number }[]): number[][] {
  const parent = Array.from({ length: count }, (_, i) => i);
  const find = (i: number): number => {
    let r = i;
    while (parent[r] !== r) r = parent[r] as number;
    while (parent[i] !== r) [i, parent[i]] = [parent[i] as number, r];
    return r;
  };
  for (const l of links) parent[find(l.a)] = find(l.b);
  const groups = new Map<number, number[]>();
  for (let i = 0; i < count; i++) groups.set(find(i), [...(groups.get(find(i)) ?? []), i]);
  return [...groups.values()];
}

let uploadCache: { key: string; solid: Solid } | null = null;

/** The base solid a spec names (catalogue id or uploaded text; the last upload is cached). */
export function resolveSolid(spec: ResolvedSpec): Solid {
  if (typeof spec.solid === 'string') return getSolid(spec.solid);
  const key = `${spec.solid.format}\u0000${spec.solid.name ?? ''}\u0000${spec.solid.text}`;
  if (uploadCache?.key === key) return uploadCache.solid;
  const solid = parseSolidText(spec.solid.format, spec.solid.text, spec.solid.name);
  uploadCache = { key, solid };
  return solid;
}

/**
 * Millimetres per model unit for a fixed scale (see ScaleSpec in the contracts). The fit scales
 * (fitSheets, fitBed) are searches: see sizeWithoutLayout and buildWithLayout.
 */
export function scaleFactor(solid: Solid, spec: ResolvedSpec): number {
  const ds = solid.faces.map((f) => f.distance);
  const dMin = Math.min(...ds);
  const dMax = Math.max(...ds);
  const sc = spec.scale;
  if (sc.by === 'fitSheets' || sc.by === 'fitBed') {
    throw new Error(`scale.by "${sc.by}" is a search, not a fixed scale: use buildModel or buildWithLayout`);
  }
  switch (sc.by) {
    case 'planeDistance':
      return sc.mm / dMin;
    case 'diameter':
      return sc.mm / (2 * dMax * Math.sqrt(1 + spec.piece.size ** 2));
    case 'pieceCircumradius':
      return sc.mm / (spec.piece.size * dMax);
  }
}

const round = (x: number, digits = 6): number => {
  const k = 10 ** digits;
  return Math.round(x * k) / k;
};
const r3 = (v: Vec3, digits = 6): [number, number, number] => [
  round(v[0], digits),
  round(v[1], digits),
  round(v[2], digits),
];
/**
 * Digits of a unit vector in the report: a plane's normal to 1e-6 moves a crossing of nearly parallel planes
 * by up to 0.01 mm in a check that works from the report alone; to 1e-12, by far less than a micrometre.
 */
const UNIT_DIGITS = 12;

const suggestionCache = new WeakMap<Solid, Map<string, SuggestedSizes>>();
/** Size suggestions depend on the solid and the shape, not on the size: cache them per solid object. */
function cachedSuggestions(solid: Solid, spec: ResolvedSpec): SuggestedSizes {
  let perSolid = suggestionCache.get(solid);
  if (!perSolid) {
    perSolid = new Map();
    suggestionCache.set(solid, perSolid);
  }
  const key = `${spec.piece.sides}/${spec.piece.step}@${spec.piece.rotationDeg}`;
  let hit = perSolid.get(key);
  if (!hit) {
    hit = suggestSizes(solid, spec.piece);
    if (perSolid.size > 100) perSolid.clear();
    perSolid.set(key, hit);
  }
  return hit;
}

/** How buildModel goes about a build. */
export interface BuildOptions {
  /**
   * Refuse a design whose work (designWork: pieces × (pieces − 1) × sides) exceeds this, with
   * DesignTooHeavyError (see assertDesignWork), once the spec is validated and its solid resolved and before
   * anything is built: the check costs no second validation or hull. No limit when absent.
   */
  workLimit?: number;
}

/**
 * Builds a design: pieces, crossings, slot pairs, compensated outlines, the validity report and (when the
 * spec gives `colours`) a colour plan. `input` is any JSON value; invalid specs throw SpecValidationError,
 * bad uploads throw SolidError. Runs no layout, so it stays fast enough for every keystroke: a `fitSheets`
 * scale is built at its upper bound (report.scale.resolved = false, warning SCALE.UPPER_BOUND); use
 * buildWithLayout for the searched size and the sheet count.
 */
export function buildModel(input: unknown, options: BuildOptions = {}): BuiltModel {
  const v = validateSpec(input);
  if (!v.ok) throw new SpecValidationError(v.errors);
  const spec = v.spec;
  const solid = resolveSolid(spec);
  if (options.workLimit !== undefined)
    assertDesignWork(spec.piece.sides, solid.faces.length, options.workLimit);
  const sized = sizeWithoutLayout(spec, solid);
  const model = sized.model;
  if (spec.scale.by === 'fitSheets') {
    model.report.warnings.push({
      code: 'SCALE.UPPER_BOUND',
      message:
        `the size that fits ${spec.scale.sheets} sheet${spec.scale.sheets === 1 ? '' : 's'} is found by ` +
        'laying the pieces out; this is an upper bound (build with layout for the size itself)',
      pieces: [],
    });
  }
  model.report.scale = scaleSummary(model, {
    ...(spec.scale.by === 'fitSheets' ? { sheets: spec.scale.sheets, resolved: false } : {}),
    ...(sized.evaluations > 1 ? { evaluations: sized.evaluations } : {}),
  });
  attachColourPlan(model);
  return model;
}

/** The report's scale summary for a built model. */
export function scaleSummary(model: BuiltModel, extra: Partial<ReportScale> = {}): ReportScale {
  return {
    method: model.spec.scale.by,
    diameterMm: model.report.diameterMm,
    mmPerUnit: model.report.mmPerUnit,
    ...extra,
  };
}

/** Plans cap the count of distinct colour plans in the report (counting is a search per plan). */
export const REPORT_COLOUR_PLAN_CAP = 12;

/** Solves the spec's colour plan (when it gives colours) into the report; no plan is error COLOUR.NO_PLAN. */
export function attachColourPlan(model: BuiltModel, plan?: ColourPlan): ColourPlan | null {
  const colours = model.spec.colours;
  if (!colours) return null;
  const p = plan ?? solveModelColourPlan(model, REPORT_COLOUR_PLAN_CAP);
  const r: ReportColourPlan = {
    rule: p.rule,
    count: p.count,
    feasible: p.feasible,
    assignment: p.assignment,
    balanced: p.balanced,
    colourCounts: p.colourCounts,
  };
  if (p.distinctPlans !== undefined) r.distinctPlans = p.distinctPlans;
  if (p.distinctPlansCapped !== undefined) r.distinctPlansCapped = p.distinctPlansCapped;
  if (p.fewestColours !== undefined) r.fewestColours = p.fewestColours;
  if (p.message) r.message = p.message;
  model.report.colourPlan = r;
  if (!p.feasible) {
    model.report.errors.push({
      code: 'COLOUR.NO_PLAN',
      message: p.message ?? `no plan exists: rule "${p.rule}" cannot be met with ${p.count} colours`,
      pieces: [],
    });
  }
  return p;
}

/** The colour plan for a built model's faces under the spec's colours (count 1 when none). */
export function solveModelColourPlan(model: BuiltModel, countCap = 0): ColourPlan {
  const colours = model.spec.colours ?? { count: 1, rule: 'neighbour-distinct' as const };
  return solveColourPlan({
    faceCount: model.solid.faces.length,
    faceVertices: model.solid.faces.map((f) => f.vertices),
    normals: model.solid.faces.map((f) => f.normal),
    opposite: model.solid.oppositeFaces,
    rule: colours.rule,
    count: colours.count,
    pieceIds: model.pieces.map((p) => p.id),
    countCap,
  });
}

/**
 * Design errors no size removes (slot widths follow the stock and the fit alone, crossings the shape alone),
 * and the remedy that works for each.
 */
const SIZE_FREE_REMEDIES: ReadonlyMap<string, string> = new Map([
  ['SLOT.NARROWER_THAN_KERF', 'choose thicker stock, a larger fit allowance or a laser with a narrower kerf'],
  ['SLOT.NARROWER_THAN_TOOL', 'choose thicker stock, a larger fit allowance or a smaller bit'],
  ['SLOT.WIDTH_NOT_POSITIVE', 'choose a larger fit allowance'],
  ['DESIGN.NO_CROSSINGS', 'change the design'],
]);

/**
 * The end of a "no size fits" sentence, after "even the largest model … (D mm across)": why the largest size
 * that fits still fails, and what would help. Errors no size removes are named with their own message and
 * the remedy that works (a larger sheet or thinner stock would not, and thinner stock narrows a slot further);
 * the others come from the stock taking too much of pieces that small.
 */
export function noFitReason(
  errors: readonly { code: string; message: string }[],
  spec: ResolvedSpec,
  larger: string,
): string {
  for (const e of errors) {
    const remedy = SIZE_FREE_REMEDIES.get(e.code);
    if (remedy) return `has errors at every size (${e.message}); ${remedy}`;
  }
  return (
    `has design errors at ${spec.stock.thicknessMm} mm stock (the slots take too much of pieces that small); ` +
    `choose ${larger}, or thinner stock, or change the design`
  );
}

/**
 * The model at the spec's size, without layout: fixed scales directly; fitBed by searching the scale at
 * which the largest piece just fits the bed; fitSheets at its upper bound (see fitSheetsUpperBound).
 */
export function sizeWithoutLayout(
  spec: ResolvedSpec,
  solid: Solid,
): { model: BuiltModel; evaluations: number } {
  const sc = spec.scale;
  if (sc.by === 'fitBed') {
    const [w, h] = fitBedRectangle(spec.bed as BedSpec, spec.sheet, spec.machine);
    const fit = fitToRectangle(spec, solid, w, h);
    const { errors, diameterMm } = fit.model.report;
    // A smaller model would only make the fixed stock thickness take more of its pieces: no size fits. Said
    // in one sentence beside the errors of the largest, which alone would blame the design.
    if (errors.length > 0) {
      errors.push({
        code: 'SCALE.NO_FIT',
        message:
          `no size fits the bed${spec.sheet ? ' and the sheet' : ''}: even the largest model whose pieces fit ` +
          `(${round(diameterMm, 1)} mm across) ${noFitReason(errors, spec, 'a larger bed or sheet')}`,
        pieces: [],
      });
    }
    return fit;
  }
  if (sc.by === 'fitSheets') return fitSheetsUpperBound(spec, solid);
  return { model: buildAtScale(spec, solid, scaleFactor(solid, spec)), evaluations: 1 };
}

/**
 * How much wider (mm) the path the machine follows is than a piece's outline, across any direction: a router
 * follows the nominal outline offset by the bit's radius on each side (its tool offset), so one bit diameter;
 * a laser follows the compensated outline itself, so 0. A bed limits where that path can go.
 */
export function toolPathExtraMm(machine: ResolvedSpec['machine']): number {
  return machine.kind === 'router' ? machine.toolDiameterMm : 0;
}

/**
 * The rectangle fitBed fits the largest piece's outline to: the bed less the tool path's extra width, and when
 * a stock sheet is given also the sheet less its margins (at least the cutter's, see cutterMarginMm; laid on
 * the bed long side along long side), so that the piece can be laid out on that sheet.
 */
export function fitBedRectangle(
  bed: BedSpec,
  sheet: ResolvedSpec['sheet'],
  machine: ResolvedSpec['machine'],
): [number, number] {
  const long = (a: number, b: number) => Math.max(a, b);
  const short = (a: number, b: number) => Math.min(a, b);
  const extra = toolPathExtraMm(machine);
  const bw = bed.widthMm - extra;
  const bh = bed.heightMm - extra;
  if (!sheet) return [bw, bh];
  const margin = Math.max(sheet.marginMm, cutterMarginMm(machine));
  const sw = sheet.widthMm - 2 * margin;
  const sh = sheet.heightMm - 2 * margin;
  return [Math.min(long(bw, bh), long(sw, sh)), Math.min(short(bw, bh), short(sw, sh))];
}

/** Largest piece fit ratio (see bestFitRatio) of a built model on a width × height rectangle. */
export function modelFitRatio(model: BuiltModel, widthMm: number, heightMm: number): number {
  let worst = 0;
  for (const p of model.pieces) {
    const outline = p.outline.length > 0 ? p.outline : p.shape;
    worst = Math.max(worst, bestFitRatio(outline, widthMm, heightMm).ratio);
  }
  return worst;
}

/**
 * The largest model whose every piece fits a width × height rectangle in some orientation. The fit ratio
 * r(m) (see bestFitRatio) of the compensated outlines is nearly affine in the scale m (the shapes scale,
 * slot widths and kerf do not), so a secant search on r(m) = 1 converges in a few builds; it stops when
 * 1 − 1e-7 < r ≤ 1 or after 12 builds, and returns the largest built model with r ≤ 1.
 */
export function fitToRectangle(
  spec: ResolvedSpec,
  solid: Solid,
  widthMm: number,
  heightMm: number,
): { model: BuiltModel; evaluations: number } {
  const fit = fitToRectangleUncapped(spec, solid, widthMm, heightMm);
  // A fit may not exceed the largest scale a spec may give (MAX_SCALE_MM across): the size found is saved and
  // rebuilt as {by: "diameter", mm: diameterMm}, which would then be refused.
  const dMax = Math.max(...solid.faces.map((f) => f.distance));
  const capM = (MAX_SCALE_MM * (1 - 1e-12)) / (2 * dMax * Math.sqrt(1 + spec.piece.size ** 2));
  if (fit.model.mmPerUnit <= capM) return fit;
  const model = buildAtScale(spec, solid, capM);
  model.report.warnings.push({
    code: 'SCALE.CAPPED',
    message:
      `the pieces would fit a ${round(widthMm, 1)} × ${round(heightMm, 1)} mm rectangle at ` +
      `${round(fit.model.report.diameterMm, 1)} mm across; the model is held at the ${MAX_SCALE_MM} mm limit`,
    pieces: [],
  });
  return { model, evaluations: fit.evaluations + 1 };
}

function fitToRectangleUncapped(
  spec: ResolvedSpec,
  solid: Solid,
  widthMm: number,
  heightMm: number,
): { model: BuiltModel; evaluations: number } {
  const dMax = Math.max(...solid.faces.map((f) => f.distance));
  let m0 = (0.5 * Math.min(widthMm, heightMm)) / (spec.piece.size * dMax);
  const model0 = buildAtScale(spec, solid, m0);
  let r0 = modelFitRatio(model0, widthMm, heightMm);
  let evaluations = 1;
  let best: { m: number; model: BuiltModel } | null = r0 <= 1 ? { m: m0, model: model0 } : null;
  let m1 = m0 / r0;
  while (evaluations < 12) {
    const model1 = buildAtScale(spec, solid, m1);
    const r1 = modelFitRatio(model1, widthMm, heightMm);
    evaluations++;
    if (r1 <= 1 && (!best || m1 > best.m)) best = { m: m1, model: model1 };
    if (r1 <= 1 && r1 > 1 - 1e-7) break;
    const slope = (r1 - r0) / (m1 - m0);
    let next = slope > 0 && Number.isFinite(slope) ? m1 + (1 - r1) / slope : m1 / r1;
    // Aim a hair inside the rectangle so the search ends on a fitting size.
    next *= 1 - 1e-8;
    [m0, r0] = [m1, r1];
    if (!(next > 0) || Math.abs(next - m1) <= 1e-12 * m1) break;
    m1 = next;
  }
  if (best) return { model: best.model, evaluations };
  // Not converged to a fitting size: scale down from the last size, backing off further each time.
  let m = m0 / r0;
  for (let k = 0; ; k++) {
    m *= 1 - 1e-6 * 2 ** k;
    const model = buildAtScale(spec, solid, m);
    evaluations++;
    const r = modelFitRatio(model, widthMm, heightMm);
    if (r <= 1 || evaluations > 40) return { model, evaluations };
    m /= r;
  }
}

/**
 * An upper bound on the fitSheets size, without layout: the smaller of the size at which the largest
 * piece just fits the sheet inside its margins (and the bed, when given, less a router's path; see
 * fitBedRectangle) and the size at which the pieces' total area equals `sheets` × the usable sheet area
 * (area grows as the square of the scale).
 */
export function fitSheetsUpperBound(
  spec: ResolvedSpec,
  solid: Solid,
): { model: BuiltModel; evaluations: number } {
  const sheet = spec.sheet as NonNullable<ResolvedSpec['sheet']>;
  const sheets = spec.scale.by === 'fitSheets' ? spec.scale.sheets : 1;
  // The margin and bed the layout and the validity check hold the pieces to: a router's margin is at least
  // its bit, and its path runs a bit's width outside each piece, which the bed must take too.
  const margin = Math.max(sheet.marginMm, cutterMarginMm(spec.machine));
  const w = sheet.widthMm - 2 * margin;
  const h = sheet.heightMm - 2 * margin;
  let fit = fitToRectangle(spec, solid, w, h);
  let evaluations = fit.evaluations;
  if (spec.bed) {
    const extra = toolPathExtraMm(spec.machine);
    const onBed = fitToRectangle(spec, solid, spec.bed.widthMm - extra, spec.bed.heightMm - extra);
    evaluations += onBed.evaluations;
    if (onBed.model.mmPerUnit < fit.model.mmPerUnit) fit = onBed;
  }
  const area = fit.model.pieces.reduce((sum, p) => sum + Math.abs(signedArea(p.outline)), 0);
  const usable = sheets * w * h;
  if (area > usable) {
    const m = fit.model.mmPerUnit * Math.sqrt(usable / area);
    evaluations++;
    return { model: buildAtScale(spec, solid, m), evaluations };
  }
  return { model: fit.model, evaluations };
}

/** Builds a validated spec at a given scale (mm per model unit), without colour plan or scale summary. */
export function buildAtScale(spec: ResolvedSpec, solid: Solid, mmPerUnit: number): BuiltModel {
  const frames = pieceFrames(solid, mmPerUnit);
  const { sides, step, rotationDeg, size } = spec.piece;
  const ids = frames.map((_, i) => `P${i + 1}`);
  const shapes = frames.map((f) => starOutline(sides, step, size * f.distance, rotationDeg));
  const crossings = computeCrossings(frames.map((frame, i) => ({ frame, outline: at(shapes, i) })));
  const t = spec.stock.thicknessMm;
  const widths = crossings.map((c) => nominalSlotWidth(t, c.angleDeg, spec.stock.flexible) + spec.fitMm);
  const issues = new IssueList();
  if (solid.interiorPointCount) {
    const n = solid.interiorPointCount;
    issues.warn(
      'SOLID.NOT_CONVEX',
      `${n} of the uploaded solid's points ${n === 1 ? 'lies' : 'lie'} inside its convex hull (a dent or a hollow): the pieces are ` +
        'laid on the faces of the hull, the convex solid around it; check that this is the model intended',
    );
  }
  const machine: MachineSpec = spec.machine;
  const removed = machine.kind === 'laser' ? machine.kerfMm : 0;

  // Slots can only be planned with positive widths.
  const safeWidths = widths.map((w) => Math.max(w, 1e-3));
  const plan = planSlots({
    frames,
    outlines: shapes,
    crossings,
    widths: safeWidths,
    depthClearanceMm: spec.depthClearanceMm,
  });

  for (const c of crossings) {
    if (at(plan.options, c.index) === null) {
      const [a, b] = [at(ids, c.a), at(ids, c.b)];
      const inner = c.endOnA[0] && c.endOnA[1] ? b : a;
      issues.error(
        'CROSSING.NOT_ASSEMBLABLE',
        `${a} and ${b} cannot be slid together: both ends of their ${round(c.length, 2)} mm crossing lie on ` +
          `${inner === a ? b : a}'s edge, so ${inner} would need a closed hole`,
        [a, b],
      );
    }
  }
  // A pair crossing several times along its line whose slots must face opposite ways: the two pieces would
  // have to slide both ways at once. Rigid stock cannot do that (an error); card can be bent past (a warning).
  for (const group of plan.opposed) {
    const c = at(crossings, at(group, 0));
    const [a, b] = [at(ids, c.a), at(ids, c.b)];
    const says =
      `${a} and ${b} cross ${group.length} times along one line, and their slots there cannot all open the same ` +
      'way (each must open on its own edge): the pieces would have to slide both ways at once';
    if (spec.stock.flexible) {
      issues.warn('CROSSING.OPPOSED_SLOTS', `${says}; bend one of them to pass`, [a, b]);
    } else issues.error('CROSSING.OPPOSED_SLOTS', `${says}, which rigid stock cannot do`, [a, b]);
  }
  for (const k of plan.collisions) {
    const [ci, cj] = k.crossings.map((i) => at(crossings, i));
    const other = (c: Crossing) => at(ids, c.a === k.piece ? c.b : c.a);
    issues.error(
      'SLOT.COLLISION',
      `in ${at(ids, k.piece)} the slots for ${other(ci as Crossing)} and ${other(cj as Crossing)} overlap, ` +
        'whichever ends the slots open from',
      [at(ids, k.piece), other(ci as Crossing), other(cj as Crossing)],
    );
  }
  if (crossings.length === 0) {
    issues.error('DESIGN.NO_CROSSINGS', 'no two pieces touch: make the pieces larger or turn them', []);
  } else {
    // A piece with no slot is held by nothing: it would fall out (an error, named per piece).
    const slotless = frames.map((_, i) => i).filter((i) => at(plan.slots, i).length === 0);
    for (const i of slotless) {
      issues.error(
        'PIECE.NO_SLOT',
        `${at(ids, i)} has no slot: no other piece holds it, so it would fall out of the model`,
        [at(ids, i)],
      );
    }
    // Groups that do not hold each other come apart: the model cannot be assembled as one (an error).
    const held = new Set(frames.map((_, i) => i).filter((i) => !slotless.includes(i)));
    const groups = connectedGroups(
      frames.length,
      crossings.filter((c) => at(plan.options, c.index) !== null),
    ).filter((g) => g.some((i) => held.has(i)));
    if (groups.length > 1) {
      const [main, ...rest] = [...groups].sort((x, y) => y.length - x.length);
      const loose = rest.flat().map((i) => at(ids, i));
      issues.error(
        'DESIGN.NOT_CONNECTED',
        `the pieces fall into ${groups.length} groups that do not hold each other: ` +
          `${loose.join(', ')} ${loose.length === 1 ? 'is' : 'are'} not held by the other ${main?.length ?? 0}`,
        loose,
      );
    }
  }
  crossings.forEach((c, i) => {
    const w = at(widths, i);
    const pair = [at(ids, c.a), at(ids, c.b)];
    // 1e-9 mm absorbs rounding: t·cot 45° − t is 4e-16, not 0.
    if (!(w > 1e-9)) {
      issues.error(
        'SLOT.WIDTH_NOT_POSITIVE',
        `the fit allowance leaves the slot between ${pair.join(' and ')} no width`,
        pair,
      );
    } else if (machine.kind === 'laser' && !slotCuttable(w, machine)) {
      issues.error(
        'SLOT.NARROWER_THAN_KERF',
        `the ${round(w, 3)} mm slot between ${pair.join(' and ')} is not wider than the ${lengthText(machine.kerfMm)} mm kerf ` +
          `by ${MIN_DRAWN_SLOT_MM} mm at least: the cuts of its two walls would merge and leave no slot`,
        pair,
      );
    } else if (machine.kind === 'router' && !slotCuttable(w, machine)) {
      issues.error(
        'SLOT.NARROWER_THAN_TOOL',
        `the ${round(w, 3)} mm slot between ${pair.join(' and ')} is narrower than the ${lengthText(machine.toolDiameterMm)} mm tool`,
        pair,
      );
    }
    if (c.length < w) {
      issues.warn(
        'CROSSING.SHORTER_THAN_SLOT',
        `the crossing of ${pair.join(' and ')} is ${round(c.length, 3)} mm long, shorter than its ${round(w, 3)} mm ` +
          'slot is wide: the slot would break through a tip',
        pair,
      );
    }
  });

  const reliefR = machine.kind === 'router' ? machine.toolDiameterMm / 2 : 0;
  const pieces: BuiltPiece[] = frames.map((frame, i) => {
    const shape = at(shapes, i);
    const slots: Slot[] = at(plan.slots, i);
    const notched = notchOutline(shape, slots, reliefR);
    const id = at(ids, i);
    if (notched.parts > 1 || notched.holes > 0 || notched.outline.length === 0) {
      issues.error('PIECE.CUT_APART', `the slots cut ${id} into ${notched.parts} parts`, [id]);
    }
    const comp = machine.kind === 'laser' ? compensateKerf(notched.outline, machine.kerfMm) : notched;
    for (const s of slots) {
      const web = slotWeb(shape, s, spec.minWebMm);
      if (web < spec.minWebMm) {
        const partner = at(ids, s.partner);
        issues.warn(
          'SLOT.THIN_WEB',
          `the slot in ${id} for ${partner} leaves ${round(web, 2)} mm of material to the edge ` +
            `(minimum ${round(spec.minWebMm, 2)} mm)`,
          [id, partner],
        );
      }
    }
    for (let a = 0; a < slots.length; a++) {
      for (let b = a + 1; b < slots.length; b++) {
        const sa = slots[a] as Slot;
        const sb = slots[b] as Slot;
        const gap = slotGap(sa, sb, spec.minWebMm);
        if (gap > 1e-6 && gap < spec.minWebMm) {
          const [pa, pb] = [at(ids, sa.partner), at(ids, sb.partner)];
          const which = pa === pb ? `two slots for ${pa}` : `the slots for ${pa} and ${pb}`;
          issues.warn(
            'SLOT.THIN_WEB',
            `in ${id} ${which} leave ${round(gap, 2)} mm of material between them ` +
              `(minimum ${round(spec.minWebMm, 2)} mm)`,
            [...new Set([id, pa, pb])],
          );
        }
      }
    }
    const extra = toolPathExtraMm(machine);
    if (
      spec.bed &&
      comp.outline.length &&
      !fitsBed(comp.outline, spec.bed.widthMm - extra, spec.bed.heightMm - extra)
    ) {
      const path = extra > 0 ? ` with the ${lengthText(extra)} mm bit passing outside it` : '';
      issues.error(
        'PIECE.LARGER_THAN_BED',
        `${id} does not fit the ${lengthText(spec.bed.widthMm)} × ${lengthText(spec.bed.heightMm)} mm bed in any orientation${path}`,
        [id],
      );
    }
    return {
      id,
      face: frame.face,
      frame,
      circumradiusMm: size * frame.distance,
      shape,
      nominalOutline: notched.outline,
      outline: comp.outline,
      slots: slots.map((s) => ({
        crossing: s.crossing,
        partner: at(ids, s.partner),
        end: s.end,
        axis: s.axis,
        depthMm: s.depth,
        widthMm: s.width,
        drawnWidthMm: s.width - removed,
      })),
      reliefs:
        reliefR > 0
          ? slots.flatMap((s) =>
              slotInnerCorners(s).map((k) => ({
                centre: dogBoneCentre(k.corner, k.walls, reliefR),
                radiusMm: reliefR,
              })),
            )
          : [],
    };
  });

  // Only for designs without errors: those are fixed first, and a design full of them (pieces far too large,
  // crossing everything) would take the longest to check for the least use.
  if (!spec.stock.flexible && issues.errors.length === 0)
    noteThicknessClashes(pieces, crossings, spec, issues);

  const report = makeReport(spec, solid, mmPerUnit, pieces, crossings, plan.options, widths, removed, issues);
  report.slotEndsSearched = plan.searched;
  return { spec, solid, mmPerUnit, pieces, crossings, slotSearchUsed: plan.searched, report };
}

/**
 * Rigid stock, designs without errors: warns where two pieces run into each other through the stock's
 * thickness although their mid-planes do not cross there (validity/thickness-clash.ts), one warning per pair
 * of pieces, ahead of the other warnings. A press fit (negative fit allowance) is allowed its interference.
 */
function noteThicknessClashes(
  pieces: readonly BuiltPiece[],
  crossings: readonly Crossing[],
  spec: ResolvedSpec,
  issues: IssueList,
): void {
  const t = spec.stock.thicknessMm;
  const clashes = thicknessClashes(
    pieces.map((p) => ({ frame: p.frame, outline: p.nominalOutline })),
    t,
    CLASH_TOLERANCE_MM + Math.max(0, -spec.fitMm),
    crossings,
  );
  const byPair = new Map<string, { a: number; b: number; length: number }>();
  for (const c of clashes) {
    const key = `${c.a}-${c.b}`;
    const e = byPair.get(key) ?? { a: c.a, b: c.b, length: 0 };
    e.length += c.to - c.from;
    byPair.set(key, e);
  }
  // Collisions lead the warnings: they stop the assembly, where the others only weaken it.
  const found: DesignIssue[] = [];
  for (const { a, b, length } of byPair.values()) {
    const pair = [at(pieces, a).id, at(pieces, b).id];
    found.push({
      code: 'PIECE.THICKNESS_CLASH',
      message:
        `${pair.join(' and ')} run into each other through the ${round(t, 2)} mm stock for about ${round(length, 1)} mm ` +
        'along the line where their planes meet, where they do not cross and no slot makes room: change the piece ' +
        'size or turn so they cross fully or clear each other',
      pieces: pair,
    });
  }
  issues.warnings.unshift(...found);
}

function makeReport(
  spec: ResolvedSpec,
  solid: Solid,
  mmPerUnit: number,
  pieces: BuiltPiece[],
  crossings: Crossing[],
  options: readonly (0 | 1 | null)[],
  widths: readonly number[],
  removed: number,
  issues: IssueList,
): DesignReport {
  // The distinct dihedral angles: within 0.001° of the last one kept counts as the same (an upload's rounded
  // coordinates give 118.8158 and 118.8159 for one angle).
  const dihedrals: number[] = [];
  for (const a of solid.edges.map((e) => e.dihedralDeg).sort((x, y) => x - y)) {
    const last = dihedrals[dihedrals.length - 1];
    if (last === undefined || a - last > 1e-3) dihedrals.push(round(a, 4));
  }
  const planeDistanceMm = Math.min(...pieces.map((p) => p.frame.distance));
  const diameterMm = 2 * Math.max(...pieces.map((p) => Math.hypot(p.frame.distance, p.circumradiusMm)));
  const pieceReports: ReportPiece[] = pieces.map((p) => ({
    id: p.id,
    face: p.face,
    normal: r3(p.frame.normal, UNIT_DIGITS),
    centreMm: r3(p.frame.centre),
    frameX: r3(p.frame.x, UNIT_DIGITS),
    frameY: r3(p.frame.y, UNIT_DIGITS),
    firstVertexMm: r3(scale3(at(solid.vertices, at(at(solid.faces, p.face).vertices, 0)), mmPerUnit)),
    areaMm2: round(signedArea(p.outline), 4),
    nominalAreaMm2: round(signedArea(p.nominalOutline), 4),
    outline: p.outline.map((q) => [round(q[0]), round(q[1])] as [number, number]),
    slotCount: p.slots.length,
    slots: p.slots.map((s) => ({
      partner: s.partner,
      crossing: s.crossing,
      openingMm: [round(s.end[0]), round(s.end[1])] as [number, number],
      direction: [round(s.axis[0], 9), round(s.axis[1], 9)] as [number, number],
      depthMm: round(s.depthMm),
      widthMm: round(s.widthMm),
      drawnWidthMm: round(s.drawnWidthMm),
    })),
  }));
  const crossingReports: ReportCrossing[] = crossings.map((c, i) => {
    const o = at(options, i);
    const w = at(widths, i);
    const r: ReportCrossing = {
      a: at(pieces, c.a).id,
      b: at(pieces, c.b).id,
      angleDeg: round(c.angleDeg, 6),
      lengthMm: round(c.length),
      slotWidthMm: round(w),
      drawnSlotWidthMm: round(w - removed),
      slotDepthMm: round(c.length / 2 + spec.depthClearanceMm),
    };
    if (o !== null) {
      r.slotEndA = r3(crossingPoint(c, o === 1 ? c.t1 : c.t0));
      r.slotEndB = r3(crossingPoint(c, o === 1 ? c.t0 : c.t1));
    }
    return r;
  });
  const sugg = cachedSuggestions(solid, spec);
  const dedupe = (list: DesignIssue[]) => {
    const seen = new Set<string>();
    return list.filter((x) => {
      const k = `${x.code}|${x.message}`;
      if (seen.has(k)) return false;
      seen.add(k);
      return true;
    });
  };
  return {
    solid: {
      name: typeof spec.solid === 'string' ? solid.id : solid.name,
      faceCount: solid.faces.length,
      vertexCount: solid.vertices.length,
      edgeCount: solid.edges.length,
      dihedralAnglesDeg: dihedrals,
    },
    piece: { ...spec.piece },
    mmPerUnit: round(mmPerUnit, 9),
    planeDistanceMm: round(planeDistanceMm),
    diameterMm: round(diameterMm),
    suggestedSizes: {
      touch: sugg.touch === null ? null : round(sugg.touch, 6),
      overlap: sugg.overlap === null ? null : round(sugg.overlap, 6),
    },
    machine: spec.machine,
    stock: { ...spec.stock },
    pieces: pieceReports,
    crossings: crossingReports,
    errors: dedupe(issues.errors),
    warnings: dedupe(issues.warnings),
  };
}

/** A piece's outline as 3D points in model space, mm (for previews). */
export function pieceOutline3d(
  piece: BuiltPiece,
  which: 'outline' | 'nominalOutline' | 'shape' = 'outline',
): Vec3[] {
  return (piece[which] as Polygon).map((p) => fromFrame(piece.frame, p));
}
