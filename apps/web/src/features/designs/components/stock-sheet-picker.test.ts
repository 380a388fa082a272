import { describe, expect, it } from 'vitest';
import { materialFixture } from '../../../testing/fixtures';
import { isStockOf, stockOptions } from './stock-sheet-picker';

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
  });
});
