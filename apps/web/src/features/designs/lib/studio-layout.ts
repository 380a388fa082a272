import { type DesignSpecInput } from '@kerfwright/contracts';
import {
  buildModel,
  buildWithLayout,
  type ColourPlan,
  type ColourRule,
  layoutModel,
} from '@kerfwright/geometry';
import { type SheetView, sheetViews } from '../../layout/lib/sheet-views';

export interface StudioSheets {
  sheets: SheetView[];
  diameterMm: number;
  /** fitSheets: the sheets asked for; otherwise null. */
  sheetsAsked: number | null;
  failure: string | null;
}

/**
 * Lays the studio's model out on its stock sheet. A fixed or bed-fitted size is built and laid out as it is
 * (reusing the preview's colour plan when given); "fit to sheets" runs the library's search for the largest
 * size on N sheets (buildWithLayout), so its diameter is the one found. Plain data in and out: it runs in the
 * layout worker (layout-tasks.ts).
 */
export function layOutStudio(
  spec: DesignSpecInput,
  colourCount: number,
  colourRule: ColourRule,
  colourPlan: ColourPlan | null,
): StudioSheets {
  const sheet = spec.stock.sheet as { widthMm: number; heightMm: number };
  const marginMm = spec.stock.marginMm ?? 0;
  const gapMm = spec.stock.gapMm ?? 0;
  if (spec.scale.by === 'fitSheets') {
    const colours = colourCount > 1 ? { colours: { count: colourCount, rule: colourRule } } : {};
    const { model, layout } = buildWithLayout({ ...spec, ...colours });
    // When no size fits, the search says why in one sentence (SCALE.NO_FIT): that, before any single error;
    // with no colour plan no search ran (COLOUR.NO_PLAN), whatever else the upper bound's model has.
    const errors = model.report.errors;
    const failure =
      (
        errors.find((e) => e.code === 'SCALE.NO_FIT') ??
        errors.find((e) => e.code === 'COLOUR.NO_PLAN') ??
        errors[0]
      )?.message ?? (layout && !layout.ok ? layout.message : null);
    return {
      sheets: layout?.ok ? sheetViews(model, layout, sheet) : [],
      diameterMm: model.report.diameterMm,
      sheetsAsked: spec.scale.sheets,
      failure,
    };
  }
  const model = buildModel(spec);
  const layout = layoutModel(model, {
    sheet,
    marginMm,
    gapMm,
    colours: { count: colourCount, rule: colourRule },
    ...(colourPlan ? { colourPlan } : {}),
  });
  return {
    sheets: layout.ok ? sheetViews(model, layout, sheet) : [],
    diameterMm: model.report.diameterMm,
    sheetsAsked: null,
    failure: layout.ok ? null : layout.message,
  };
}
