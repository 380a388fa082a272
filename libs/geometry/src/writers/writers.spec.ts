import DxfParser from 'dxf-parser';
import { makeAbsolute, parseSVG } from 'svg-path-parser';
import { buildModel } from '../build';
import { cubeStars83, octahedronHexagons } from '../test-support/designs';
import { type Segment, measureSlotWidth, segmentsOf } from '../test-support/measure';
import { type Vec2 } from '../math/vec';
import { signedArea } from '../math/polygon';
import { pieceToDxf } from './dxf';
import { pieceToSvg } from './svg';

describe('DXF writer', () => {
  it('writes mm units, one closed polyline on the cut layer and a label on the mark layer', () => {
    const m = buildModel(octahedronHexagons());
    const piece = m.pieces[0]!;
    // Read back with dxf-parser, an independent DXF reader from npm.
    const doc = new DxfParser().parseSync(pieceToDxf(piece));
    // $INSUNITS = 4 means millimetres (Autodesk DXF reference, from memory).
    expect(doc?.header.$INSUNITS).toBe(4);
    const polylines = (doc?.entities ?? []).filter((e) => e.type === 'LWPOLYLINE');
    expect(polylines).toHaveLength(1);
    const pl = polylines[0] as unknown as {
      layer: string;
      shape: boolean;
      vertices: { x: number; y: number }[];
    };
    expect(pl.layer).toBe('cut');
    expect(pl.shape).toBe(true); // closed flag (group 70 bit 1)
    expect(pl.vertices).toHaveLength(piece.outline.length);
    const texts = (doc?.entities ?? []).filter((e) => e.type === 'TEXT');
    expect(texts.map((t) => t.layer)).toEqual(['mark']);
    expect(Object.keys(doc?.tables.layer.layers ?? {})).toEqual(expect.arrayContaining(['cut', 'mark']));
  });

  it('sizes the label to the room inside the piece, and leaves it off a piece too small to hold it', () => {
    const square = (side: number): Vec2[] => [
      [0, 0],
      [side, 0],
      [side, side],
      [0, side],
    ];
    const texts = (side: number) =>
      (new DxfParser().parseSync(pieceToDxf({ id: 'P12', outline: square(side) }))?.entities ?? []).filter(
        (e) => e.type === 'TEXT',
      ) as unknown as { textHeight: number; startPoint: { x: number; y: number } }[];
    // A 40 mm square: room for the 6 mm cap. Its text box (about 0.6 × height per character wide, a common
    // proportion of engraving fonts, from memory) stays inside the inscribed circle of radius 20 mm.
    const [big] = texts(40);
    expect(big?.textHeight).toBe(6);
    expect(Math.hypot((0.6 * 6 * 3) / 2, 6 / 2)).toBeLessThan(20);
    // A 5 mm square has 2.5 mm of room: "P12" at the 1.5 mm least height would be 2.7 mm wide, so no label.
    expect(texts(5)).toEqual([]);
    expect(pieceToSvg({ id: 'P12', outline: square(5) })).not.toMatch(/<text/);
  });

  it('keeps the slot widths: measured from the parsed DXF they equal the drawn widths', () => {
    const m = buildModel(cubeStars83({ machine: { kind: 'laser', kerfMm: 0.1 } }));
    for (const piece of m.pieces.slice(0, 2)) {
      const doc = new DxfParser().parseSync(pieceToDxf(piece));
      const pl = doc?.entities.find((e) => e.type === 'LWPOLYLINE') as unknown as {
        vertices: { x: number; y: number }[];
      };
      const pts: Vec2[] = pl.vertices.map((v) => [v.x, v.y]);
      expect(signedArea(pts)).toBeCloseTo(signedArea(piece.outline), 3);
      for (const s of piece.slots) {
        expect(measureSlotWidth(segmentsOf(pts), s)).toBeCloseTo(s.drawnWidthMm, 3);
      }
    }
  });
});

describe('SVG writer', () => {
  const segmentsFromSvg = (
    svg: string,
  ): { segments: Segment[]; width: number; height: number; viewBox: number[] } => {
    const width = Number(/<svg[^>]* width="([\d.]+)mm"/.exec(svg)?.[1]);
    const height = Number(/<svg[^>]* height="([\d.]+)mm"/.exec(svg)?.[1]);
    const viewBox = (/viewBox="([^"]+)"/.exec(svg)?.[1] ?? '').split(/\s+/).map(Number);
    const d = /<path[^>]* d="([^"]+)"[^>]*id="cut"|<path[^>]*id="cut"[^>]* d="([^"]+)"/.exec(svg);
    const cmds = makeAbsolute(parseSVG(d?.[1] ?? d?.[2] ?? ''));
    const segments: Segment[] = [];
    for (const c of cmds) {
      const end: Vec2 = c.code === 'Z' ? (segments[0]?.[0] ?? [c.x0, c.y0]) : [c.x ?? 0, c.y ?? 0];
      const zeroLength = Math.hypot(end[0] - c.x0, end[1] - c.y0) < 1e-9;
      if ((c.code === 'L' || c.code === 'Z') && !zeroLength) segments.push([[c.x0, c.y0], end]);
    }
    return { segments, width, height, viewBox };
  };

  it('sets width/height in mm with a matching viewBox and hairline strokes', () => {
    const m = buildModel(octahedronHexagons());
    const piece = m.pieces[0]!;
    const svg = pieceToSvg(piece);
    const { width, height, viewBox } = segmentsFromSvg(svg);
    const xs = piece.outline.map((p) => p[0]);
    const ys = piece.outline.map((p) => p[1]);
    expect(width).toBeCloseTo(Math.max(...xs) - Math.min(...xs), 2);
    expect(height).toBeCloseTo(Math.max(...ys) - Math.min(...ys), 2);
    // W3C SVG: a viewBox of the same numbers as width/height in mm makes one user unit one millimetre.
    expect(viewBox).toEqual([0, 0, width, height]);
    expect(svg).toMatch(/stroke-width="0.01mm"/);
    expect(svg).toMatch(/>P1<\/text>/);
  });

  it('keeps the slot widths: measured from the parsed SVG path they equal the drawn widths', () => {
    const m = buildModel(cubeStars83({ machine: { kind: 'laser', kerfMm: 0.1 } }));
    for (const piece of m.pieces.slice(0, 2)) {
      const { segments } = segmentsFromSvg(pieceToSvg(piece));
      expect(segments).toHaveLength(piece.outline.length);
      // SVG's y axis points down and the drawing is moved to the origin: map each slot the same way.
      const minX = Math.min(...piece.outline.map((p) => p[0]));
      const maxY = Math.max(...piece.outline.map((p) => p[1]));
      for (const s of piece.slots) {
        const mapped = {
          ...s,
          end: [s.end[0] - minX, maxY - s.end[1]] as Vec2,
          axis: [s.axis[0], -s.axis[1]] as Vec2,
        };
        expect(measureSlotWidth(segments, mapped)).toBeCloseTo(s.drawnWidthMm, 3);
      }
    }
  });
});
