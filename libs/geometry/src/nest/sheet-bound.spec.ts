import { binPackingBound, sheetsLowerBound } from './sheet-bound';
import { nestFits, nestParts, type NestInput } from './nest';
import { regular, star } from '../test-support/polygons';

/** The fewest bins of capacity c that hold the sizes, by trying every assignment (small cases only). */
function optimalBins(sizes: readonly number[], c: number): number {
  const sorted = [...sizes].sort((a, b) => b - a);
  let best = sorted.length;
  const loads: number[] = [];
  const place = (i: number) => {
    if (loads.length >= best) return;
    if (i === sorted.length) {
      best = loads.length;
      return;
    }
    const w = sorted[i]!;
    for (let b = 0; b < loads.length; b++) {
      if (loads[b]! + w > c) continue;
      loads[b] = loads[b]! + w;
      place(i + 1);
      loads[b] = loads[b]! - w;
    }
    loads.push(w);
    place(i + 1);
    loads.pop();
  };
  place(0);
  return best;
}

describe('binPackingBound (Martello & Toth L2)', () => {
  it('never exceeds the optimum found by trying every assignment, and is never below the area bound', () => {
    let seed = 11;
    const rnd = () => (seed = (seed * 1664525 + 1013904223) % 4294967296) / 4294967296;
    let tighter = 0;
    for (let trial = 0; trial < 300; trial++) {
      const n = 2 + Math.floor(rnd() * 8);
      const sizes = Array.from({ length: n }, () => 1 + Math.floor(rnd() * 99));
      const items = sizes.map((size) => ({ size, count: 1 }));
      const bound = binPackingBound(items, 100);
      const area = Math.ceil(sizes.reduce((a, b) => a + b, 0) / 100);
      expect(bound).toBeLessThanOrEqual(optimalBins(sizes, 100));
      expect(bound).toBeGreaterThanOrEqual(area);
      if (bound > area) tighter++;
    }
    // The point of L2: items just over half a bin cannot share one, whatever their total.
    expect(tighter).toBeGreaterThan(0);
  });

  it('counts items over half the capacity one bin each: three of 51 in bins of 100 need 3 (arithmetic)', () => {
    expect(binPackingBound([{ size: 51, count: 3 }], 100)).toBe(3);
    expect(binPackingBound([{ size: 50, count: 4 }], 100)).toBe(2);
    expect(binPackingBound([{ size: 101, count: 1 }], 100)).toBe(Infinity);
    expect(binPackingBound([], 100)).toBe(0);
  });
});

const SHEET = { widthMm: 600, heightMm: 400 };

describe('sheetsLowerBound', () => {
  it('is at most the sheets nestParts uses, over pieces of several sizes and gaps', () => {
    const cases: NestInput[] = [
      { sheet: SHEET, marginMm: 5, gapMm: 3, parts: [{ id: 'h', outline: regular(6, 110, 0), quantity: 7 }] },
      { sheet: SHEET, marginMm: 5, gapMm: 0, parts: [{ id: 't', outline: regular(3, 80), quantity: 30 }] },
      {
        sheet: SHEET,
        marginMm: 10,
        gapMm: 6,
        parts: [
          { id: 's', outline: star(8, 3, 95), quantity: 9 },
          { id: 'p', outline: regular(5, 40), quantity: 10 },
        ],
      },
    ];
    for (const input of cases) {
      const r = nestParts(input);
      if (!r.ok) throw new Error(r.error.message);
      const bound = sheetsLowerBound(
        input.parts.map((p) => ({ outline: p.outline, quantity: p.quantity })),
        SHEET.widthMm - 2 * input.marginMm,
        SHEET.heightMm - 2 * input.marginMm,
        input.gapMm,
      );
      expect(bound).toBeGreaterThanOrEqual(1);
      expect(bound).toBeLessThanOrEqual(r.totals.sheetCount);
    }
  });

  it('counts the gap: six squares of side 195 fit 590 × 390 by area, but not 3 mm apart (arithmetic)', () => {
    // Bare: 6 × 195² = 228,150 ≤ 590 × 390 = 230,100, one sheet by area. Grown by 1.45 mm (half the gap less
    // the slack): 6 × (197.9² − (4 − π) × 1.45²) ≈ 234,976 > 592.9 × 392.9 ≈ 232,950, two sheets; and indeed
    // 3 × 195 + 2 × 3 = 591 > 590, so no 3 × 2 grid fits.
    const square = regular(4, (195 / 2) * Math.SQRT2, 45);
    expect(sheetsLowerBound([{ outline: square, quantity: 6 }], 590, 390, 0)).toBe(1);
    expect(sheetsLowerBound([{ outline: square, quantity: 6 }], 590, 390, 3)).toBe(2);
    expect(sheetsLowerBound([{ outline: square, quantity: 5 }], 590, 390, 3)).toBe(1);
  });
});

describe('nestFits', () => {
  it('answers as nestParts does whether the layout needs at most N sheets, for every N around its count', () => {
    const slotted = star(5, 2, 60);
    const cases: NestInput[] = [
      { sheet: SHEET, marginMm: 5, gapMm: 3, parts: [{ id: 'h', outline: regular(6, 45, 0), quantity: 40 }] },
      { sheet: SHEET, marginMm: 5, gapMm: 3, parts: [{ id: 's', outline: star(8, 3, 95), quantity: 14 }] },
      {
        sheet: SHEET,
        marginMm: 5,
        gapMm: 3,
        parts: [
          { id: 'a', outline: slotted, quantity: 12, group: 'red' },
          { id: 'b', outline: slotted, quantity: 9, group: 'blue' },
          { id: 'c', outline: regular(3, 70), quantity: 5, group: 'blue' },
        ],
      },
      {
        sheet: SHEET,
        marginMm: 5,
        gapMm: 3,
        parts: [
          { id: 't', outline: regular(3, 70), quantity: 8 },
          { id: 'p', outline: regular(5, 28), quantity: 1 },
        ],
      },
    ];
    for (const input of cases) {
      const r = nestParts(input);
      if (!r.ok) throw new Error(r.error.message);
      const n = r.totals.sheetCount;
      for (const max of [n - 2, n - 1, n, n + 1].filter((k) => k >= 1))
        expect([input.parts.map((p) => p.id).join(), max, nestFits(input, max)]).toEqual([
          input.parts.map((p) => p.id).join(),
          max,
          n <= max,
        ]);
    }
  });

  it('says no, as nestParts errs, when a part fits no sheet', () => {
    const input: NestInput = {
      sheet: SHEET,
      marginMm: 5,
      gapMm: 3,
      parts: [{ id: 'big', outline: regular(6, 400, 0), quantity: 1 }],
    };
    expect(nestParts(input).ok).toBe(false);
    expect(nestFits(input, 10)).toBe(false);
  });
});
