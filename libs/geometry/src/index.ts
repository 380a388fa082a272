/**
 * @kerfwright/geometry — pure geometry for slotted sheet models. All lengths are millimetres, all angles
 * degrees counter-clockwise, unless a name says otherwise. Browser-safe: nothing here touches the file
 * system (the CLI lives in cli.ts, outside this entry).
 */
export const GEOMETRY_API_VERSION = 1;

export {
  buildModel,
  resolveSolid,
  scaleFactor,
  pieceOutline3d,
  connectedGroups,
  REPORT_COLOUR_PLAN_CAP,
} from './build';
export {
  buildWithLayout,
  sheetsNeeded,
  FIT_SHEETS_TOLERANCE,
  FIT_SHEETS_MAX_LAYOUTS,
} from './layout/build-with-layout';
export type { LayoutBuild } from './layout/build-with-layout';
export { bestFitRatio } from './scale/fit-ratio';
export { smallestSoundSize } from './scale/sound-size';
export type { SoundSize } from './scale/sound-size';
export type { BuildOptions, BuiltModel, BuiltPiece, BuiltSlot } from './build';
export {
  validateSpec,
  SpecValidationError,
  MAX_PIECE_SIZE,
  MAX_SCALE_MM,
  MAX_FIT_SHEETS,
  MAX_COLOURS,
  MAX_SHEET_MM,
  DEFAULT_SHEET_MARGIN_MM,
  DEFAULT_SHEET_GAP_MM,
} from './spec/validate-spec';
export type { ResolvedSpec, ResolvedScale, SpecValidation } from './spec/validate-spec';
export { assertDesignWork, designWork, DESIGN_WORK_LIMIT, DesignTooHeavyError } from './spec/workload';
export { getSolid, listSolids, isSolidId, MIN_PRISM_SIDES, MAX_PRISM_SIDES } from './solids/catalogue';
export type { SolidSummary } from './solids/catalogue';
export { solidFromPoints, SolidError, COPLANAR_TOLERANCE } from './solids/polyhedron';
export type { Solid, SolidFace, SolidEdge } from './solids/polyhedron';
export {
  parseSolidText,
  parseObjVertices,
  parseOffVertices,
  MAX_SOLID_TEXT_LENGTH,
  MAX_SOLID_VERTICES,
  MAX_SOLID_FACES,
} from './solids/parse';
export { checkPieceShape, starOutline, MAX_PIECE_SIDES } from './pieces/shape';
export type { PieceShape } from './pieces/shape';
export { pieceFrames, planeLine, suggestSizes, toFrame, fromFrame } from './pieces/place';
export type { PieceFrame, SuggestedSizes } from './pieces/place';
export { computeCrossings, computePairIntervals, defaultSlotOption } from './crossings/crossings';
export type { Crossing, PlacedPiece, PlanePairIntervals } from './crossings/crossings';
export { nominalSlotWidth, planSlots, slotRectangle, slotsOverlap } from './slots/slots';
export type { Slot, SlotPlan, SlotPlanInput } from './slots/slots';
export { solveTwoSat } from './slots/two-sat';
export { compensateKerf, notchOutline, dogBoneCentre, circlePolygon } from './compensation/compensate';
export { CLIPPER_SCALE, offsetPolygons, subtractPolygons } from './compensation/clipper-adapter';
export { pieceToSvg, pieceToModel } from './writers/svg';
export type { PieceDrawing, WriterOptions } from './writers/svg';
export { pieceToDxf, DXF_LAYERS } from './writers/dxf';
export { signedArea, perimeter, lineIntervals } from './math/polygon';
export type { Vec2, Vec3 } from './math/vec';
export * from './nest';
export * from './colour';
export { layoutModel } from './layout/plan-layout';
export type { LayoutOptions, ModelLayout } from './layout/plan-layout';
export { prepareCut } from './layout/prepare-cut';
export type { CutPreparation } from './layout/prepare-cut';
export { designPreview } from './layout/design-preview';

// Labels and estimates (browser-safe); the cut pack itself is Node-only: '@kerfwright/geometry/pack'.
export * from './labels';
export { assemblyOrder, assemblyStepsOfReport, STRAIGHT_DEG } from './pack/assembly';
export { clashingColourNames } from './pack/slug';
export type { AssemblyStep } from './pack/assembly';
export * from './estimate';
