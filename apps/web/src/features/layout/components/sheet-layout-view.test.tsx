import { buildModel, layoutModel } from '@kerfwright/geometry';
import { render, screen } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { placePoint, sheetViews } from '../lib/sheet-views';
import { PIECE_COLOURS, stockColour } from './piece-colours';
import { SheetLayoutView } from './sheet-layout-view';

const SHEET = { widthMm: 300, heightMm: 200, marginMm: 5 };

function laidOut() {
  const model = buildModel({
    solid: 'octahedron',
    piece: { sides: 6, step: 1, rotationDeg: 0, size: 1.3 },
    scale: { by: 'diameter', mm: 240 },
    stock: { thicknessMm: 3 },
    machine: { kind: 'laser', kerfMm: 0.15 },
  });
  const layout = layoutModel(model, {
    sheet: { widthMm: SHEET.widthMm, heightMm: SHEET.heightMm },
    marginMm: SHEET.marginMm,
    gapMm: 3,
    colours: { count: 2, rule: 'neighbour-distinct' },
  });
  if (!layout.ok) throw new Error(layout.message);
  return { model, layout, sheets: sheetViews(model, layout, SHEET, ['clear', 'cobalt blue']) };
}

describe('sheet views of a layout', () => {
  it('places a point as the nesting defines it: rotate about the origin, then translate', () => {
    const [x, y] = placePoint([10, 0], 90, 5, 5);
    expect(x).toBeCloseTo(5, 9);
    expect(y).toBeCloseTo(15, 9);
  });

  it('keeps every placed piece on its sheet, inside the margin, and one colour per sheet', () => {
    const { model, layout, sheets } = laidOut();
    expect(sheets).toHaveLength(layout.totals.sheetCount);
    expect(sheets.flatMap((s) => s.pieces)).toHaveLength(model.pieces.length);
    for (const sheet of sheets) {
      expect(sheet.colourName).toBe(['clear', 'cobalt blue'][sheet.colourIndex]);
      for (const piece of sheet.pieces) {
        expect(layout.pieceColour[piece.id]).toBe(sheet.colourIndex);
        for (const [x, y] of piece.outline) {
          // The nesting's contract (libs/geometry nest.ts): inside every margin, up to 1 µm of rounding.
          expect(x).toBeGreaterThanOrEqual(SHEET.marginMm - 1e-3);
          expect(x).toBeLessThanOrEqual(SHEET.widthMm - SHEET.marginMm + 1e-3);
          expect(y).toBeGreaterThanOrEqual(SHEET.marginMm - 1e-3);
          expect(y).toBeLessThanOrEqual(SHEET.heightMm - SHEET.marginMm + 1e-3);
        }
      }
    }
  });
});

describe('the sheet layout view', () => {
  it('draws each sheet with its pieces, labels and utilisation, and the estimates', () => {
    const { sheets } = laidOut();
    render(
      <SheetLayoutView
        sheets={sheets}
        unit="mm"
        estimate={{
          cutLengthMm: 4321,
          pierces: 8,
          minutes: 12.34,
          machineCost: 9.5,
          materialCost: 14,
          currency: 'EUR',
        }}
      />,
    );
    const figures = screen.getAllByTestId('layout-sheet');
    expect(figures).toHaveLength(sheets.length);
    expect(screen.getByText(`Sheet 1 of ${sheets.length}`, { exact: false })).toBeInTheDocument();
    for (const id of sheets.flatMap((s) => s.pieces.map((p) => p.id))) {
      expect(screen.getByText(id, { selector: 'text' })).toBeInTheDocument();
    }
    const facts = screen.getByTestId('layout-facts');
    expect(facts).toHaveTextContent('Sheet size300 × 200 mm');
    expect(facts).toHaveTextContent('Machine time12.3 min');
    expect(facts).toHaveTextContent('Cost23.50 EUR');
    expect(facts).toHaveTextContent('Cut length4,321.0 mm');
  });

  it('shows every length in inches when asked (25.4 mm to the inch, exact by definition)', () => {
    const { sheets } = laidOut();
    render(<SheetLayoutView sheets={sheets} unit="in" />);
    // 300 mm = 11.811 in and 200 mm = 7.874 in (÷ 25.4, the international inch of 1959).
    expect(screen.getByTestId('layout-facts')).toHaveTextContent('Sheet size11.811 × 7.874 in');
    expect(screen.getAllByRole('img')[0]).toHaveAccessibleName(/11\.811 in by 7\.874 in/);
  });
});

describe('stock colours on the sheets', () => {
  it('draws the pieces of a sheet in the colour its name says (CSS named colours)', () => {
    const { model, layout } = laidOut();
    const sheets = sheetViews(model, layout, SHEET, ['teal', 'slate grey']);
    render(<SheetLayoutView sheets={sheets} unit="mm" />);
    const drawings = screen.getAllByTestId('layout-sheet');
    sheets.forEach((sheet, i) => {
      const fills = [...drawings[i]!.querySelectorAll('path')].map((p) => p.getAttribute('fill'));
      expect(fills.length).toBeGreaterThan(0);
      // teal and slategrey are CSS named colours (CSS Color Module Level 4); "slate grey" is written apart.
      expect(new Set(fills)).toEqual(new Set([sheet.colourIndex === 0 ? 'teal' : 'slategrey']));
    });
  });

  it('reads a name by its last word, and falls back to our palette for names CSS has no colour for', () => {
    expect(stockColour('Teal', 3)).toBe('teal');
    expect(stockColour('cobalt blue', 0)).toBe('#0047ab');
    expect(stockColour('Charcoal', 0)).toBe('#36454f');
    expect(stockColour('moss green', 0)).toBe('#8a9a5b');
    expect(stockColour('opal-white', 0)).toBe('white');
    // "clear" acrylic and "natural" plywood have no CSS colour: the palette by colour index, distinct per sheet.
    expect(stockColour('clear', 0)).toBe(PIECE_COLOURS[0]);
    expect(stockColour('opal', 1)).toBe(PIECE_COLOURS[1]);
    expect(stockColour(null, 2)).toBe(PIECE_COLOURS[2]);
  });
});
