/**
 * DXF and SVG of one sheet (or the coupon). Units: millimetres by default ($INSUNITS 4; SVG width/height in
 * mm), or inches on request — a true conversion (every coordinate ÷ 25.4, $INSUNITS 1, SVG width/height in
 * "in"). Layers: the cut contours on DXF_LAYERS.cut (closed LWPOLYLINEs, written in cut order: inner contours
 * before the contour enclosing them), the labels and the scale mark on DXF_LAYERS.mark (open LWPOLYLINEs).
 */
import Drawing from 'dxf-writer';
import Handle from 'dxf-writer/src/Handle';
import { type Vec2 } from '../math/vec';
import { DXF_LAYERS } from '../writers/dxf';
import { MM_PER_INCH, type SheetDrawing, type Units } from './sheet-drawing';

/** Stroke colours of the SVG layers (our own choice). */
export const SVG_LAYER_COLOURS = { cut: '#000000', mark: '#1f5fbf' } as const;

const fmt = (x: number): string => {
  const r = Math.round(x * 1e6) / 1e6;
  return Object.is(r, -0) ? '0' : String(r);
};

const unitScale = (units: Units): number => (units === 'in' ? 1 / MM_PER_INCH : 1);

/** The sheet as DXF text. */
export function sheetToDxf(sheet: SheetDrawing, units: Units): string {
  const k = unitScale(units);
  // dxf-writer numbers entity handles from one counter shared by every drawing: restart it so the same
  // sheet always gives the same bytes (and checksum).
  Handle.seed = 0;
  const d = new Drawing();
  d.setUnits(units === 'in' ? 'Inches' : 'Millimeters');
  // dxf-writer writes entities layer by layer in the order the layers were added: marks first, then cuts.
  d.addLayer(DXF_LAYERS.mark.name, DXF_LAYERS.mark.colour, 'CONTINUOUS');
  d.addLayer(DXF_LAYERS.cut.name, DXF_LAYERS.cut.colour, 'CONTINUOUS');
  const pts = (s: readonly Vec2[]) => s.map((p) => [p[0] * k, p[1] * k] as [number, number]);
  d.setActiveLayer(DXF_LAYERS.mark.name);
  for (const s of sheet.mark) d.drawPolyline(pts(s), false);
  d.setActiveLayer(DXF_LAYERS.cut.name);
  for (const c of sheet.cut) d.drawPolyline(pts(c), true);
  return d.toDxfString();
}

/**
 * The sheet as SVG text: the viewBox spans the sheet in the file's units, y flipped to point down, with the
 * sheet's lower-left corner at (0, height) as in the DXF. The page is the sheet, grown (with 1 mm to spare) only
 * where something is drawn past its edges: the scale mark when the sheet had no room for it, which lies below
 * the sheet and may be longer than the sheet is wide.
 */
export function sheetToSvg(sheet: SheetDrawing, units: Units): string {
  const k = unitScale(units);
  let [minX, minY, maxX, maxY] = [0, 0, sheet.widthMm, sheet.heightMm];
  for (const s of [...sheet.mark, ...sheet.cut])
    for (const p of s) {
      minX = Math.min(minX, p[0]);
      minY = Math.min(minY, p[1]);
      maxX = Math.max(maxX, p[0]);
      maxY = Math.max(maxY, p[1]);
    }
  const grow = (past: number, edge: number, dir: 1 | -1) => (dir * (past - edge) > 1e-9 ? past + dir : edge);
  const left = grow(minX, 0, -1);
  const right = grow(maxX, sheet.widthMm, 1);
  const bottom = grow(minY, 0, -1);
  const top = grow(maxY, sheet.heightMm, 1);
  const w = right - left;
  const h = top - bottom;
  const xy = (p: Vec2) => `${fmt(p[0] * k)} ${fmt((sheet.heightMm - p[1]) * k)}`;
  const path = (s: readonly Vec2[], closed: boolean) =>
    `<path d="M ${s.map(xy).join(' L ')}${closed ? ' Z' : ''}"/>`;
  const hairline = fmt(0.05 * k);
  return [
    '<?xml version="1.0" encoding="UTF-8"?>',
    `<svg xmlns="http://www.w3.org/2000/svg" width="${fmt(w * k)}${units}" height="${fmt(h * k)}${units}" ` +
      `viewBox="${fmt(left * k)} ${fmt((sheet.heightMm - top) * k)} ${fmt(w * k)} ${fmt(h * k)}">`,
    `<title>${escapeXml(sheet.title)}</title>`,
    `<g id="${DXF_LAYERS.mark.name}" fill="none" stroke="${SVG_LAYER_COLOURS.mark}" stroke-width="${hairline}">`,
    ...sheet.mark.map((s) => path(s, false)),
    '</g>',
    `<g id="${DXF_LAYERS.cut.name}" fill="none" stroke="${SVG_LAYER_COLOURS.cut}" stroke-width="${hairline}">`,
    ...sheet.cut.map((c) => path(c, true)),
    '</g>',
    '</svg>',
    '',
  ].join('\n');
}

function escapeXml(s: string): string {
  return s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;');
}
