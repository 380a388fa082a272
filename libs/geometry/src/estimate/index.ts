/** Public API of cut order and job estimates (browser-safe, pure). Lengths in mm, speeds in mm/s. */
export { orderContours, nestingDepths, rotateContour, type OrderedContours } from './cut-order';
export {
  estimateJob,
  estimateSheet,
  sequenceSheet,
  sheetTravel,
  toolPathLength,
  withCutter,
  type SheetSequence,
  type EstimateMachine,
  type JobEstimate,
  type SheetEstimate,
  type SheetWork,
} from './estimate';
