import {
  type DesignSpec,
  type DesignSpecInput,
  type JobPreparation,
  type JobView,
  type MachineSpec,
  type MachineProfileSummaryView,
  type MaterialView,
  pricedSheet,
} from '@kerfwright/contracts';
import { buildModel, layoutModel } from '@kerfwright/geometry';
import { type LayoutEstimateView } from '../../layout/components/sheet-layout-view';
import { estimateSheets } from '../../layout/lib/estimate-sheets';
import { type SheetView, sheetViews } from '../../layout/lib/sheet-views';

/** The API's defaults for layout settings a preparation leaves out (apps/api jobs: DEFAULT_MARGIN_MM/GAP_MM). */
const DEFAULT_MARGIN_MM = 5;
const DEFAULT_GAP_MM = 3;

export interface JobLayout {
  sheets: SheetView[];
  /** Time and cost from the job's machine profile version and the stock's price, when both are known. */
  estimate: LayoutEstimateView | null;
  /** Set when the sheets drawn here differ from the stored preparation (e.g. the design changed since). */
  mismatch: string | null;
}

/**
 * The prepared spec of a job, rebuilt from its design and the figures its preparation stored: the stock
 * thickness and machine compensation used, and the size found (as a fixed diameter). The job's API response
 * does not carry the prepared spec or the sheets' placements, so the browser lays the model out again with
 * the same settings through the geometry library (nesting is deterministic).
 */
export function preparedSpec(design: DesignSpecInput, prep: JobPreparation, flexible: boolean): DesignSpec {
  const { colours: _colours, ...rest } = design;
  return {
    ...rest,
    scale: { by: 'diameter', mm: prep.diameterMm },
    stock: { thicknessMm: prep.thicknessMm, flexible },
    machine: preparedMachine(prep),
  };
}

/** The machine compensation a job's preparation used. */
function preparedMachine(prep: JobPreparation): MachineSpec {
  return prep.machineKind === 'laser'
    ? { kind: 'laser', kerfMm: prep.kerfMm ?? 0 }
    : { kind: 'router', toolDiameterMm: prep.toolDiameterMm ?? 0 };
}

/** The estimate with the job's own profile version and the price of its stock sheet, when both are known. */
export function jobEstimate(
  sheets: readonly SheetView[],
  job: JobView,
  material: MaterialView | undefined,
  profiles: readonly MachineProfileSummaryView[],
): LayoutEstimateView | null {
  const prep = job.preparation;
  const version = profiles
    .flatMap((p) => [p.currentApproved, p.latest])
    .find((v) => v && v.id === job.profileVersionId);
  const setting = version?.settings.find((st) => st.materialId === job.materialId);
  if (!version || !setting || !prep) return null;
  // The price kept at preparation (the cut pack's); for a job prepared before it was kept, today's list, priced
  // as preparation prices (either way round, in the machine's currency).
  const price =
    prep.pricePerSheet !== undefined
      ? prep.pricePerSheet
      : material
        ? pricedSheet(material, prep.sheet, version.currency)
        : null;
  return estimateSheets(sheets, version, setting, price, preparedMachine(prep));
}

/**
 * A prepared job's sheets, laid out again from its design and preparation, with their estimate and a note
 * when they differ from what the preparation counted. Plain data in and out: it runs in the layout worker.
 */
export function layOutJob(
  job: JobView,
  design: DesignSpecInput,
  material: MaterialView | undefined,
  profiles: readonly MachineProfileSummaryView[],
): JobLayout {
  const flexible = material?.flexible ?? false;
  const prep = job.preparation as JobPreparation;
  const model = buildModel(preparedSpec(design, prep, flexible));
  const marginMm = prep.marginMm ?? DEFAULT_MARGIN_MM;
  const layout = layoutModel(model, {
    sheet: prep.sheet,
    marginMm,
    gapMm: prep.gapMm ?? DEFAULT_GAP_MM,
    colours: {
      count: Math.max(1, job.colours.length),
      ...(prep.colourRule ? { rule: prep.colourRule } : {}),
    },
    quantity: job.quantity,
  });
  if (!layout.ok) throw new Error(layout.message);
  const sheets = sheetViews(model, layout, prep.sheet, job.colours);
  const mismatch =
    sheets.length !== prep.sheetCount || model.pieces.length * job.quantity !== prep.pieceCount
      ? `Laid out again here, the design gives ${sheets.length} sheets and ${model.pieces.length * job.quantity} pieces; ` +
        `the preparation counted ${prep.sheetCount} sheets and ${prep.pieceCount} pieces (has the design changed since?).`
      : null;
  const estimate = prep.estimate ? { ...prep.estimate } : jobEstimate(sheets, job, material, profiles);
  return { sheets, mismatch, estimate };
}
