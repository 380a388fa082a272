import makerjs from 'makerjs';
import { type Vec2 } from '../math/vec';
import { MIN_LABEL_HEIGHT_MM, labelHeight, labelPoint } from './label';

/** What the writers need of a piece: its id and its outline (mm, piece frame, counter-clockwise). */
export interface PieceDrawing {
  id: string;
  outline: readonly Vec2[];
  /** Text for the mark layer; defaults to the id. Empty string: no mark. */
  label?: string;
}

export interface WriterOptions {
  /** Include the mark layer (the piece label). Defaults to true. */
  marks?: boolean;
}

/**
 * A piece as a makerjs model: layer "cut" holds the outline as one closed chain of lines, layer "mark"
 * the label as a caption. Units mm; y up.
 */
export function pieceToModel(piece: PieceDrawing, options: WriterOptions = {}): makerjs.IModel {
  const cut: makerjs.IModel = new makerjs.models.ConnectTheDots(
    true,
    piece.outline.map((p) => [p[0], p[1]]),
  );
  cut.layer = 'cut';
  const model: makerjs.IModel = { models: { cut }, units: makerjs.unitType.Millimeter };
  const text = piece.label ?? piece.id;
  if (options.marks !== false && text) {
    const { point, clearance } = labelPoint(piece.outline);
    const h = labelHeight(clearance, text);
    if (h === null) return model;
    const mark: makerjs.IModel = {
      layer: 'mark',
      caption: { text, anchor: new makerjs.paths.Line([point[0] - h, point[1]], [point[0] + h, point[1]]) },
    };
    if (model.models) model.models.mark = mark;
  }
  return model;
}

/** Label height used in a drawing, mm (the SVG font size); null when the piece has no room for a label. */
export function markHeight(piece: PieceDrawing): number | null {
  const text = piece.label ?? piece.id;
  return labelHeight(labelPoint(piece.outline).clearance, text);
}

/**
 * SVG of one piece at true scale: width/height in mm and a viewBox in mm (W3C SVG units), hairline
 * strokes (0.01 mm, non-scaling), the cut outline black, the mark label blue. Written by makerjs.
 */
export function pieceToSvg(piece: PieceDrawing, options: WriterOptions = {}): string {
  const model = pieceToModel(piece, options);
  return makerjs.exporter.toSVG(model, {
    units: makerjs.unitType.Millimeter,
    strokeWidth: '0.01mm',
    fontSize: `${(markHeight(piece) ?? MIN_LABEL_HEIGHT_MM).toFixed(2)}`,
    useSvgPathOnly: true,
    accuracy: 0.0001,
    layerOptions: { cut: { stroke: '#000000' }, mark: { stroke: 'none', fill: '#0000ff' } },
  });
}
