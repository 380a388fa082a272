import type { DesignSpec } from '@kerfwright/contracts';
import {
  type BuiltModel,
  attachColourPlan,
  buildAtScale,
  fitSheetsUpperBound,
  resolveSolid,
  scaleSummary,
  solveModelColourPlan,
  buildModel,
  noFitReason,
  scaleFactor,
} from '../build';
import type { Solid } from '../solids/polyhedron';
import { type ColourPlan } from '../colour';
import { SpecValidationError, validateSpec, type ResolvedSpec } from '../spec/validate-spec';
import { layoutFits, layoutModel, type LayoutOptions, type ModelLayout } from './plan-layout';
import { lengthText } from '../math/length-text';

/** fitSheets stops when the largest fitting size and the smallest failing size differ by this fraction. */
export const FIT_SHEETS_TOLERANCE = 0.005;
/** Most layouts one fitSheets search runs. */
export const FIT_SHEETS_MAX_LAYOUTS = 16;

export interface LayoutBuild {
  model: BuiltModel;
  /** The layout on `stock.sheet`; null without a sheet or when the design has errors. */
  layout: ModelLayout | null;
  /** The spec at the size built, with a fixed `diameter` scale (what to store to reproduce it). */
  resolvedSpec: DesignSpec;
}

/**
 * Builds a spec and lays it out on `stock.sheet` when the spec gives one: the report gains `sheetCount`
 * (or an error LAYOUT.PIECE_TOO_LARGE / LAYOUT.INVALID when the layout fails), and a `fitSheets` scale is
 * searched (see fitSheetsSearch). For the CLI, the API and workers; the browser's per-keystroke preview
 * uses buildModel, which runs no layout. Throws what buildModel throws.
 */
export function buildWithLayout(input: unknown): LayoutBuild {
  const v = validateSpec(input);
  if (!v.ok) throw new SpecValidationError(v.errors);
  const spec = v.spec;
  if (spec.scale.by === 'fitSheets') return fitSheetsSearch(spec, input as DesignSpec);
  const model = buildModel(input);
  const layout = spec.sheet && model.report.errors.length === 0 ? layOut(model, spec) : null;
  if (layout) noteLayout(model, layout);
  return { model, layout, resolvedSpec: resolvedSpecOf(input as DesignSpec, model) };
}

/**
 * Sheets of `stock.sheet` the spec's model needs as given (its own scale; a fitSheets scale is searched
 * first). Null when the design has errors or a piece does not fit the sheet. Throws SpecValidationError
 * for an invalid spec or one without `stock.sheet`.
 */
export function sheetsNeeded(input: unknown): number | null {
  const v = validateSpec(input);
  if (!v.ok) throw new SpecValidationError(v.errors);
  if (!v.spec.sheet) {
    throw new SpecValidationError([
      { field: 'stock.sheet', messages: ['stock.sheet is required to count sheets'] },
    ]);
  }
  const { model, layout } = buildWithLayout(input);
  return model.report.errors.length === 0 && layout?.ok ? layout.totals.sheetCount : null;
}

function layOut(model: BuiltModel, spec: ResolvedSpec, colourPlan?: ColourPlan): ModelLayout {
  return layoutModel(model, layoutOptionsOf(spec, colourPlan));
}

function layoutOptionsOf(spec: ResolvedSpec, colourPlan?: ColourPlan): LayoutOptions {
  const sheet = spec.sheet as NonNullable<ResolvedSpec['sheet']>;
  return {
    sheet: { widthMm: sheet.widthMm, heightMm: sheet.heightMm },
    marginMm: sheet.marginMm,
    gapMm: sheet.gapMm,
    colours: { count: spec.colours?.count ?? 1, rule: spec.colours?.rule ?? 'neighbour-distinct' },
    ...(colourPlan ? { colourPlan } : {}),
  };
}

function noteLayout(model: BuiltModel, layout: ModelLayout): void {
  if (layout.ok) model.report.sheetCount = layout.totals.sheetCount;
  else if (layout.code !== 'LAYOUT.NO_COLOUR_PLAN') {
    // No colour plan is already the error COLOUR.NO_PLAN.
    model.report.errors.push({ code: layout.code, message: layout.message, pieces: layout.pieces });
  }
}

function resolvedSpecOf(input: DesignSpec, model: BuiltModel): DesignSpec {
  return { ...input, scale: { by: 'diameter', mm: model.report.diameterMm } };
}

/** Most models one fitSheets search builds (a model with design errors is built but not laid out). */
export const FIT_SHEETS_MAX_BUILDS = 32;

/** Sizes tried above a fitSheets result, as factors of it (see fitSheetsSearch, step 4). */
const FIT_SHEETS_PROBES = [1.01, 1.02] as const;

/**
 * The scale at or just below `mmPerUnit` that a fitSheets result rebuilds at exactly. A result is stored and
 * built again as `{ by: 'diameter', mm: report.diameterMm }`, the diameter rounded to 1e-6 mm; nesting is
 * chaotic in the size (a model 1e-6 mm larger may need another sheet), so the search judges only sizes whose
 * diameter already has that rounding: what it saw fit is then what the stored spec lays out.
 */
export function reproducibleScale(spec: ResolvedSpec, solid: Solid, mmPerUnit: number): number {
  const perMm = scaleFactor(solid, { ...spec, scale: { by: 'diameter', mm: 1 } });
  const diameterMm = Math.floor((mmPerUnit / perMm) * 1e6) / 1e6;
  return scaleFactor(solid, { ...spec, scale: { by: 'diameter', mm: diameterMm } });
}

/**
 * The largest model whose layout uses at most `scale.sheets` sheets, with no design errors. A size can fail
 * two ways: too large (its layout needs more sheets, or a piece does not fit the sheet), or too small for
 * the stock (design errors: at a fixed thickness the slots take more of a smaller piece, until they cut it
 * apart or run into each other). Nesting is a heuristic, so "fits in N sheets" is not strictly monotone in
 * the size; the search treats both failures as monotone and keeps the largest size it saw fit:
 * 1. the upper bound (fitSheetsUpperBound: the largest piece fits the sheet, total area ≤ N sheets);
 *    if it fits, done;
 * 2. otherwise step down by factors of 0.85 while sizes are too large (at most 8 steps); a size too small
 *    for the stock ends the steps, and the window between it and the smallest size too large is bisected
 *    (the sizes that fit may lie only there: a 0.85 step can jump over them);
 * 3. bisect (geometric mean) between the largest fitting and the smallest failing size until they differ
 *    by FIT_SHEETS_TOLERANCE (0.5 %), or FIT_SHEETS_MAX_LAYOUTS layouts (FIT_SHEETS_MAX_BUILDS models) ran;
 * 4. probe 1 % and 2 % above the result (nesting is not monotone, so a slightly larger size may fit again);
 *    the largest probe that fits is taken, and the window up to the next size that failed is bisected.
 * Every size tried is one the resolved spec rebuilds at exactly (reproducibleScale), so the stored diameter lays
 * out on the sheets the search counted. When no size fits, the report has error SCALE.NO_FIT (with the last model tried), saying which way the
 * sizes failed. The colour plan is solved once (it does not depend on the size); without one
 * (COLOUR.NO_PLAN) no search runs.
 */
export function fitSheetsSearch(spec: ResolvedSpec, input: DesignSpec): LayoutBuild {
  const sheets = spec.scale.by === 'fitSheets' ? spec.scale.sheets : 1;
  const solid = resolveSolid(spec);
  const upper = fitSheetsUpperBound(spec, solid);
  const plan = spec.colours ? solveModelColourPlan(upper.model, 12) : undefined;
  const summary = (model: BuiltModel, layouts: number, resolved: boolean) => {
    model.report.scale = scaleSummary(model, {
      sheets,
      resolved,
      evaluations: layouts,
      tolerance: FIT_SHEETS_TOLERANCE,
    });
    attachColourPlan(model, plan);
  };
  if (plan && !plan.feasible) {
    summary(upper.model, 0, false);
    return { model: upper.model, layout: null, resolvedSpec: resolvedSpecOf(input, upper.model) };
  }
  let layouts = 0;
  let builds = 0;
  // Each size asks only whether its layout fits (layoutFits: the same answer as laying it out and counting the
  // sheets, with a bound that needs no layout and nestings that stop once the answer is certain); the layout
  // itself is made once, at the size chosen. The search therefore tries the same sizes in the same order as
  // with full layouts, and ends on the same size and layout.
  const options = layoutOptionsOf(spec, plan);
  const evaluate = (model: BuiltModel) => {
    builds++;
    if (model.report.errors.length > 0) return { model, fits: false, tooSmall: true };
    layouts++;
    return { model, fits: layoutFits(model, options, sheets), tooSmall: false };
  };
  type Trial = ReturnType<typeof evaluate>;
  const layoutOf = (t: Trial): ModelLayout | null => (t.tooSmall ? null : layoutModel(t.model, options));
  const at = (mmPerUnit: number) =>
    evaluate(buildAtScale(spec, solid, reproducibleScale(spec, solid, mmPerUnit)));
  const budgetLeft = () => layouts < FIT_SHEETS_MAX_LAYOUTS && builds < FIT_SHEETS_MAX_BUILDS;
  const apart = (a: Trial, b: Trial) => a.model.mmPerUnit / b.model.mmPerUnit - 1 > FIT_SHEETS_TOLERANCE;
  const topScale = reproducibleScale(spec, solid, upper.model.mmPerUnit);
  const top: Trial = evaluate(
    topScale === upper.model.mmPerUnit ? upper.model : buildAtScale(spec, solid, topScale),
  );
  let hi: Trial = top;
  let lo: Trial | null = hi.fits ? hi : null;
  /** The largest size found too small for the stock, below every size found too large. */
  let small: Trial | null = null;
  // Down from the upper bound while sizes are too large. Design errors at the upper bound are not searched
  // below: a smaller model only makes the fixed stock thickness take more of its pieces.
  for (let step = 0; !lo && !small && !hi.tooSmall && step < 8 && budgetLeft(); step++) {
    const t = at(hi.model.mmPerUnit * 0.85);
    if (t.fits) lo = t;
    else if (t.tooSmall) small = t;
    else hi = t;
  }
  // Between too small and too large: the sizes that fit, if any, lie here.
  while (!lo && small && apart(hi, small) && budgetLeft()) {
    const t = at(Math.sqrt(small.model.mmPerUnit * hi.model.mmPerUnit));
    if (t.fits) lo = t;
    else if (t.tooSmall) small = t;
    else hi = t;
  }
  if (!lo) {
    const model = hi.model;
    summary(model, layouts, false);
    const sheetText = `${sheets} sheet${sheets === 1 ? '' : 's'} of ${lengthText(spec.sheet?.widthMm ?? 0)} × ${lengthText(spec.sheet?.heightMm ?? 0)} mm`;
    const stock = `${spec.stock.thicknessMm} mm stock`;
    model.report.errors.push({
      code: 'SCALE.NO_FIT',
      message: hi.tooSmall
        ? `no size fits ${sheetText}: even the largest model that fits ${sheets === 1 ? 'it' : 'them'} ` +
          `(${lengthText(Math.round(model.report.diameterMm * 10) / 10)} mm across) ` +
          noFitReason(model.report.errors, spec, 'larger sheets')
        : small
          ? `no size fits ${sheetText}: the sizes small enough to fit have design errors at ${stock} (the ` +
            'slots take too much of the pieces); allow more sheets, choose larger sheets or thinner stock'
          : `no size tried fits ${sheetText} without errors`,
      pieces: [],
    });
    const layout = layoutOf(hi);
    if (layout) noteLayout(model, layout);
    return { model, layout, resolvedSpec: resolvedSpecOf(input, model) };
  }
  const bisect = () => {
    while (lo && lo !== hi && apart(hi, lo) && budgetLeft()) {
      const t = at(Math.sqrt(lo.model.mmPerUnit * hi.model.mmPerUnit));
      if (t.fits) lo = t;
      else hi = t;
    }
  };
  bisect();
  // Nesting is not monotone in the size: a size just above the smallest one found failing may fit again
  // (a layout's luck changes with the pieces' size). Probes 1 % and 2 % above the result, below the upper
  // bound, catch the common case; the largest that fits becomes the result, and the window up to the next
  // size that failed (a probe, or the upper bound) is bisected.
  if (lo !== hi) {
    const base = lo.model.mmPerUnit;
    const failed: Trial[] = [top];
    for (const f of FIT_SHEETS_PROBES) {
      if (base * f >= upper.model.mmPerUnit || !budgetLeft()) break;
      const t = at(base * f);
      if (t.fits) lo = t;
      else failed.push(t);
    }
    const size = (t: Trial) => t.model.mmPerUnit;
    const above = failed.filter((t) => size(t) > size(lo!)).sort((a, b) => size(a) - size(b))[0];
    // Bisected again between the result and the next failure above it, past the failure found before.
    if (above) {
      hi = above;
      bisect();
    }
  }
  const model = lo.model;
  summary(model, layouts, true);
  const layout = layoutOf(lo);
  if (layout) noteLayout(model, layout);
  return { model, layout, resolvedSpec: resolvedSpecOf(input, model) };
}
