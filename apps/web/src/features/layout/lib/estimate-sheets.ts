import {
  type MachineProfileVersionView,
  type MachineSpec,
  type ProfileSetting,
  toEstimateMachine,
} from '@kerfwright/contracts';
import { estimateJob, withCutter } from '@kerfwright/geometry';
import { type LayoutEstimateView } from '../components/sheet-layout-view';
import { type SheetView } from './sheet-views';

/**
 * The geometry library's estimate for the sheets drawn: cut length, pierces and travel at the speeds a
 * machine profile version gives for the material, priced at its hourly rate and (when known) the stock
 * sheet's price. Label marking is not in it (the cut pack's setup sheet has the full figure). `drawnFor` is the
 * machine the pieces' outlines were drawn for: for a router, the cut length is that of the bit centre's path.
 */
export function estimateSheets(
  sheets: readonly SheetView[],
  version: Pick<MachineProfileVersionView, 'rapidSpeedMmS' | 'hourlyRate' | 'currency'>,
  setting: Pick<ProfileSetting, 'cutSpeedMmS' | 'markSpeedMmS' | 'pierceTimeS' | 'passes'>,
  pricePerSheet: number | null,
  drawnFor: MachineSpec,
): LayoutEstimateView {
  const e = estimateJob(
    sheets.map((sh) => ({ cut: sh.pieces.map((p) => p.outline), mark: [] })),
    withCutter(toEstimateMachine(version, setting), drawnFor),
    pricePerSheet ?? 0,
  );
  return {
    cutLengthMm: e.cutLengthMm,
    pierces: e.pierces,
    minutes: e.minutes,
    machineCost: e.machineCost,
    materialCost: pricePerSheet === null ? null : e.materialCost,
    currency: version.currency,
  };
}
