import Drawing from 'dxf-writer';
import { labelHeight, labelPoint } from './label';
import { type PieceDrawing, type WriterOptions } from './svg';

/** Layer names and colours (AutoCAD colour index) of our DXF files; names carry the meaning. */
export const DXF_LAYERS = { cut: { name: 'cut', colour: 7 }, mark: { name: 'mark', colour: 3 } } as const;

/**
 * DXF of one piece: $INSUNITS = 4 (millimetres), the outline as one closed LWPOLYLINE on layer "cut",
 * the label as TEXT on layer "mark". Written with dxf-writer.
 */
export function pieceToDxf(piece: PieceDrawing, options: WriterOptions = {}): string {
  const d = new Drawing();
  d.setUnits('Millimeters');
  d.addLayer(DXF_LAYERS.cut.name, DXF_LAYERS.cut.colour, 'CONTINUOUS');
  d.addLayer(DXF_LAYERS.mark.name, DXF_LAYERS.mark.colour, 'CONTINUOUS');
  d.setActiveLayer(DXF_LAYERS.cut.name);
  d.drawPolyline(
    piece.outline.map((p) => [p[0], p[1]] as [number, number]),
    true,
  );
  const text = piece.label ?? piece.id;
  if (options.marks !== false && text) {
    const { point, clearance } = labelPoint(piece.outline);
    const h = labelHeight(clearance, text);
    if (h !== null) {
      d.setActiveLayer(DXF_LAYERS.mark.name);
      d.drawText(point[0], point[1], h, 0, text, 'center', 'middle');
    }
  }
  return d.toDxfString();
}
