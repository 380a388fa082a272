import type { DesignSpec, DesignSpecInput } from '@kerfwright/contracts';
import { cubeSquares45, cubeStars83, octahedronHexagons } from '../test-support/designs';
import { buildWithLayout } from './build-with-layout';
import * as planLayout from './plan-layout';

/**
 * The fit-to-sheets search asks each size only whether its layout fits (layoutFits). The reference answers
 * the same question the way the search did before: lay the model out in full and count the sheets. Both
 * searches must try the same sizes and end on the same size, layout and sheet count.
 */
jest.mock('./plan-layout', () => {
  const actual = jest.requireActual<typeof planLayout>('./plan-layout');
  return { ...actual, layoutFits: jest.fn(actual.layoutFits) };
});

const fits = planLayout.layoutFits as jest.MockedFunction<typeof planLayout.layoutFits>;
const actual = jest.requireActual<typeof planLayout>('./plan-layout');

function byFullLayout(...args: Parameters<typeof planLayout.layoutFits>): boolean {
  const [model, options, maxSheets] = args;
  const layout = actual.layoutModel(model, options);
  return layout.ok && layout.totals.sheetCount <= maxSheets;
}

const sheet = { widthMm: 600, heightMm: 400 };
const fitOn = (spec: DesignSpec, sheets: number, extra: Partial<DesignSpecInput> = {}): DesignSpecInput => ({
  ...spec,
  stock: { ...spec.stock, sheet, marginMm: 5, gapMm: 3 },
  scale: { by: 'fitSheets', sheets },
  ...extra,
});

function search(spec: DesignSpecInput, reference: boolean) {
  fits.mockClear();
  if (reference) fits.mockImplementation(byFullLayout);
  else fits.mockImplementation(actual.layoutFits);
  const r = buildWithLayout(spec);
  const asked = fits.mock.calls.map((c) => [c[0].mmPerUnit, c[2]]);
  const answers = fits.mock.results.map((x) => x.value as boolean);
  return {
    mmPerUnit: r.model.mmPerUnit,
    diameterMm: r.model.report.diameterMm,
    sheetCount: r.layout?.ok ? r.layout.totals.sheetCount : null,
    placements: r.layout?.ok ? r.layout.sheets.map((s) => s.placements) : null,
    errors: r.model.report.errors.map((e) => e.code),
    asked,
    answers,
  };
}

describe('fitSheets search against full layouts', () => {
  it.each([
    ['cube, squares at 45°, 1 sheet', fitOn(cubeSquares45(1.5), 1)],
    ['cube, {8/3} stars, 2 sheets', fitOn(cubeStars83(), 2)],
    [
      'octahedron, hexagons, 2 colours, 3 sheets',
      fitOn(octahedronHexagons(), 3, { colours: { count: 2, rule: 'neighbour-distinct' } }),
    ],
  ])('%s: the same sizes tried, the same answers, the same result', (_name, spec) => {
    const quick = search(spec, false);
    const reference = search(spec, true);
    expect(quick.asked.length).toBeGreaterThan(0);
    expect(quick).toEqual(reference);
    expect(quick.sheetCount).not.toBeNull();
    expect(quick.sheetCount!).toBeLessThanOrEqual(spec.scale.by === 'fitSheets' ? spec.scale.sheets : 0);
  });
});
