import { describe, expect, it } from 'vitest';
import { formatLength } from '../../../lib/units';
import {
  defaultEstimateChoice,
  failureSentence,
  materialThickness,
  namedStockOf,
  sheetsSummary,
} from './studio-sheets-panel';
import { materialFixture } from '../../../testing/fixtures';

const fmt = (mm: number) => formatLength(mm, 'mm');

describe('the sheets summary', () => {
  it('says a fitted size is a search to within 0.5 %, so one sheet more is not always larger', () => {
    // The figures of the audit: 325.3 mm on 2 sheets, 325.0 mm on 3 sheets (nesting is a heuristic).
    const fitted = { sheets: [], diameterMm: 325.0, sheetsAsked: 3, failure: null };
    const summary = sheetsSummary({ ...fitted, sheets: new Array(2).fill(null) }, fmt);
    expect(summary).toBe(
      'Largest size on 3 sheets: diameter 325.0 mm, using 2 sheets (found by a search to within 0.5 %: ' +
        'one sheet more can even come out slightly smaller).',
    );
  });

  it('says plainly that no size fits, and that the model shown is only the last size tried', () => {
    const summary = sheetsSummary(
      { sheets: [], diameterMm: 489.6, sheetsAsked: 1, failure: 'no size fits 1 sheet …' },
      fmt,
    );
    expect(summary).toBe('No size fits 1 sheet; the model shown is the last size tried, 489.6 mm across.');
  });

  it('names a colour rule the engine cannot meet as the form names it, and makes other reasons sentences', () => {
    expect(
      failureSentence(
        'no plan exists: rule "neighbour-distinct" cannot be met with 2 colours; it needs at least 4',
      ),
    ).toBe('“Neighbours differ” cannot be met with 2 colours: it needs at least 4.');
    expect(failureSentence('no size fits 1 sheet of 600 × 400 mm')).toBe(
      'No size fits 1 sheet of 600 × 400 mm.',
    );
  });

  it('claims no search for a size given as it is', () => {
    const summary = sheetsSummary(
      { sheets: new Array(2).fill(null), diameterMm: 240, sheetsAsked: null, failure: null },
      fmt,
    );
    expect(summary).toBe('At diameter 240.0 mm the pieces need 2 sheets.');
  });
});

describe('materials offered for the estimate', () => {
  const materials = [
    { id: 'card', nominalThicknessMm: 0.4, measuredThicknessMm: null },
    { id: 'acrylic', nominalThicknessMm: 3, measuredThicknessMm: 2.95 },
  ];

  it("takes a material's measured thickness, and matches the design's stock within 0.1 mm", () => {
    expect(materialThickness(materials, 'acrylic', 3)).toEqual({ thicknessMm: 2.95, matches: true });
    expect(materialThickness(materials, 'card', 3)).toEqual({ thicknessMm: 0.4, matches: false });
  });

  it('has nothing to warn of when the material or the design thickness is unknown', () => {
    expect(materialThickness(materials, 'gone', 3).matches).toBe(true);
    expect(materialThickness(materials, 'card', null).matches).toBe(true);
  });
});

describe('the machine the estimate takes at first', () => {
  // The audit's case: a router profile listed before the laser, both with stock of the design's thickness.
  const choices = [
    { key: 'router/pvc', profileKind: 'cnc-router', materialId: 'pvc' },
    { key: 'co2/card', profileKind: 'co2-laser', materialId: 'card' },
    { key: 'co2/acrylic', profileKind: 'co2-laser', materialId: 'acrylic' },
    { key: 'fibre/acrylic', profileKind: 'fibre-laser', materialId: 'acrylic' },
  ] as const;
  const threeMm = (materialId: string) => materialId !== 'card';

  it('takes the stock the design names (sheet and thickness) before other stock sold as its thickness', () => {
    // The audit's case: the fields name birch plywood; acrylic, listed first, is sold as 3 mm too.
    const listed = [
      { key: 'co2/acrylic', profileKind: 'co2-laser', materialId: 'acrylic' },
      { key: 'co2/birch', profileKind: 'co2-laser', materialId: 'birch' },
      { key: 'router/birch', profileKind: 'cnc-router', materialId: 'birch' },
    ] as const;
    const named = (materialId: string) => materialId === 'birch';
    expect(defaultEstimateChoice(listed, 'laser', () => true, named)?.key).toBe('co2/birch');
    expect(defaultEstimateChoice(listed, 'router', () => true, named)?.key).toBe('router/birch');
    expect(defaultEstimateChoice(listed, 'laser', () => true)?.key).toBe('co2/acrylic');
  });

  it('names the stock the picker shows, where several keep the same sheet at the thickness typed', () => {
    // The audit's case: acrylic and plywood are both sold as 3 mm in 600 × 400 sheets; the picker shows plywood.
    const acrylic = materialFixture({ id: 'acrylic', nominalThicknessMm: 3, measuredThicknessMm: 2.85 });
    const birch = materialFixture({ id: 'birch', nominalThicknessMm: 3, measuredThicknessMm: 2.9 });
    const fields = { sheetWidthMm: 600, sheetHeightMm: 400, thicknessMm: 3 };
    const shown = namedStockOf('birch', [acrylic, birch], fields);
    expect([shown('acrylic'), shown('birch')]).toEqual([false, true]);
    // With no stock shown, any that keeps the sheet at the thickness.
    const any = namedStockOf(null, [acrylic, birch], fields);
    expect([any('acrylic'), any('birch')]).toEqual([true, true]);
    expect(namedStockOf(null, [acrylic], { ...fields, sheetWidthMm: 610 })('acrylic')).toBe(false);
  });

  it("prefers a machine of the design's own kind with stock of its thickness", () => {
    expect(defaultEstimateChoice(choices, 'laser', threeMm)?.key).toBe('co2/acrylic');
    expect(defaultEstimateChoice(choices, 'router', threeMm)?.key).toBe('router/pvc');
  });

  it('takes a blade cutter for a laser design, as the geometry engine does', () => {
    const blade = [
      choices[0],
      { key: 'blade/acrylic', profileKind: 'blade-cutter', materialId: 'acrylic' },
    ] as const;
    expect(defaultEstimateChoice(blade, 'laser', threeMm)?.key).toBe('blade/acrylic');
  });

  it('falls back to the thickness match alone, and to no machine without one', () => {
    expect(defaultEstimateChoice(choices.slice(0, 2), 'laser', threeMm)?.key).toBe('router/pvc');
    expect(defaultEstimateChoice(choices, 'laser', () => false)).toBeUndefined();
  });
});
