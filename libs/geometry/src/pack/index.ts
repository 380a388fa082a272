/**
 * `@kerfwright/geometry/pack` — the cut pack and the fit-test coupon (Node only: uses node:crypto, pdfkit
 * and jszip). Lengths in mm; files in mm or inches as asked. See README.md beside this file.
 */
export { createCutPack, createCoupon, CutPackError, type CouponInput } from './pack';
export { clashingColourNames, slug } from './slug';
export { preparationEstimate, type PreparationEstimateOptions } from './pack-sheets';
export {
  runPackCommand,
  runCouponCommand,
  resolveSpecForPack,
  packInputFrom,
  splitSpec,
  CLI_DEFAULT_MACHINE,
  CLI_DEFAULT_ROUTER,
  type PackCommandOptions,
} from './cli-commands';
export { buildCoupon, DEFAULT_COUPON_OFFSETS, type Coupon, type CouponStrip } from './coupon';
export { assemblyOrder, type AssemblyStep } from './assembly';
export { sheetToDxf, sheetToSvg, SVG_LAYER_COLOURS } from './sheet-files';
export {
  drawSheet,
  placeScaleMark,
  scaleMarkStrokes,
  type SheetDrawing,
  type ScaleMark,
} from './sheet-drawing';
export { SAFETY_DEFERRAL } from './documents';
