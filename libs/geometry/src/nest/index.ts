/** Public API of true-shape nesting. Lengths in mm, angles in degrees counter-clockwise. */
export {
  nestParts,
  nestFits,
  type NestInput,
  type NestPartInput,
  type NestPlacement,
  type NestResult,
  type NestSheetResult,
  type NestSheetSize,
  type NestTotals,
  type NestErrorCode,
} from './nest';
export { runNestCommand, type NestOutput } from './nest-command';
export { autoRotations } from './variants';
