/** Public API of assembly labels (browser-safe, pure). Lengths in mm, angles in degrees counter-clockwise. */
export {
  labelPiece,
  uprightStrokes,
  type LabelOptions,
  type LabelPieceInput,
  type PieceLabels,
  type PlacedLabel,
} from './labels';
export { strokeText, strokeBounds, strokeLength, type StrokeText } from './stroke-font';
export { boxCorners, boxClearOf, boxFitsInside, boxesOverlap, type LabelBox } from './fit';
