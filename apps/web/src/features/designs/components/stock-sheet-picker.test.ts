import { describe, expect, it } from 'vitest';
import { materialFixture } from '../../../testing/fixtures';
import { isStockOf, keepsStock, stockOptions, stockThicknessText, stockToAdopt } from './stock-sheet-picker';

describe('workshop stock in the studio', () => {
  const birch = materialFixture({
    id: 'm-birch',
    name: 'Birch plywood 3 mm',
    nominalThicknessMm: 3,
    measuredThicknessMm: 2.9,
  });
  const pvc = materialFixture({
    id: 'm-pvc',
    name: 'PVC board 3 mm',
    laserAllowed: false,
    measuredThicknessMm: 3.05,
  });

  it('offers a laser design only what a laser may cut, and works slots for the measured thickness', () => {
    expect(stockOptions([birch, pvc], 'laser').map((o) => o.key)).toEqual(['m-birch:0']);
    const [b] = stockOptions([birch, pvc], 'router');
    expect(b).toMatchObject({ widthMm: 600, heightMm: 400, thicknessMm: 2.9, thicknessesMm: [3, 2.9] });
  });

  it('names stock only for the thickness it holds (nominal or measured), the sheet either way round', () => {
    const [b] = stockOptions([birch], 'laser');
    const at = (w: number, h: number, t: number) =>
      isStockOf(b!, { sheetWidthMm: w, sheetHeightMm: h, thicknessMm: t });
    expect(at(600, 400, 2.9)).toBe(true);
    expect(at(400, 600, 3)).toBe(true);
    // Another board's 3.05 mm is not this plywood, near as it is.
    expect(at(600, 400, 3.05)).toBe(false);
    expect(at(600, 410, 3)).toBe(false);
    // Typed back in inches as shown (four decimals): 23.622 × 15.748 in at 0.1142 in is this stock
    // (599.9988 × 399.9992 mm at 2.90068 mm; 1 in = 25.4 mm exactly).
    expect(at(599.9988, 399.9992, 2.90068)).toBe(true);
  });

  it('starts a new design from the stock its fields name, worked for the thickness the stock measures', () => {
    const options = stockOptions([birch], 'laser');
    const fields = (t: number, w = 600) => ({ sheetWidthMm: w, sheetHeightMm: 400, thicknessMm: t });
    // 600 × 400 at the nominal 3 mm is the birch: its slots are worked for the 2.9 mm it measures.
    expect(stockToAdopt(options, fields(3), true)?.thicknessMm).toBe(2.9);
    // Already at 2.9 mm, nothing to change; a sheet the workshop does not keep takes the first stock.
    expect(stockToAdopt(options, fields(2.9), true)).toBeNull();
    expect(stockToAdopt(options, fields(3, 610), true)?.key).toBe('m-birch:0');
    // Fields the reader changed are left alone.
    expect(stockToAdopt(options, fields(3), false)).toBeNull();
    expect(stockToAdopt([], fields(3, 610), true)).toBeNull();
  });

  it('says which thickness the slots follow when the fields hold the nominal one of stock measured otherwise', () => {
    const [b] = stockOptions([birch], 'laser');
    expect(stockThicknessText(b!, 2.9, 'mm')).toBe('2.9 mm thick as measured');
    expect(stockThicknessText(b!, 3, 'mm')).toBe(
      'sold as 3 mm and measured at 2.9 mm: the slots are worked for the 3 mm in the fields',
    );
  });

  it('tells whether a material keeps the sheet and thickness of the fields', () => {
    const at = (t: number) => keepsStock(birch, { sheetWidthMm: 400, sheetHeightMm: 600, thicknessMm: t });
    expect([at(3), at(2.9), at(2.85)]).toEqual([true, true, false]);
  });
});
