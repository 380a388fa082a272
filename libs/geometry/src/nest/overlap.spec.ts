import * as polygonClipping from 'polygon-clipping';
import { denserSheet } from './overlap';
import { GeometryCache, patternRotations, type PreparedPart } from './variants';
import { SCALE_PER_MM } from './clipper-adapter';
import { boundaryDistance, mpArea, type P, placed, regular, star } from '../test-support/polygons';
import { signedArea, type Point } from './polygon';

function setUp(outline: P[], gapMm: number) {
  const rotationsDeg = patternRotations(outline as Point[]);
  const part: PreparedPart = {
    index: 0,
    id: 'p',
    group: 'g',
    quantity: 1,
    outline: outline as Point[],
    areaMm2: signedArea(outline as Point[]),
    rotationsDeg,
    patternRotationsDeg: rotationsDeg,
    freeRotation: true,
  };
  const cache = new GeometryCache([part], gapMm);
  return { cache, variants: rotationsDeg.map((d) => cache.variant(0, d)) };
}

const frame = { widthMm: 600, heightMm: 400, marginMm: 5 };

describe('denserSheet (overlap search)', () => {
  it('finds seven 190 mm {8/3} stars on 600 × 400 less 5 mm margins with 3 mm gaps, checked with polygon-clipping', () => {
    const outline = star(8, 3, 95);
    const { cache, variants } = setUp(outline, 3);
    const items = denserSheet(cache, frame, variants, [], { targetCount: 7 })!;
    expect(items).toHaveLength(7);
    // The same search gives the same layout (seeded, counted work: never the machine's speed).
    const again = setUp(outline, 3);
    const second = denserSheet(again.cache, frame, again.variants, [], { targetCount: 7 })!;
    expect(second.map((it) => [it.tx, it.ty, it.variant.rotationDeg])).toEqual(
      items.map((it) => [it.tx, it.ty, it.variant.rotationDeg]),
    );
    const polys = items.map((it) =>
      placed(outline, it.tx / SCALE_PER_MM, it.ty / SCALE_PER_MM, it.variant.rotationDeg),
    );
    const usable: P[] = [
      [5, 5],
      [595, 5],
      [595, 395],
      [5, 395],
    ];
    for (const p of polys) expect(mpArea(polygonClipping.difference([p], [usable]))).toBeLessThan(1e-6);
    for (let i = 0; i < polys.length; i++)
      for (let j = i + 1; j < polys.length; j++) {
        expect(mpArea(polygonClipping.intersection([polys[i]!], [polys[j]!]))).toBe(0);
        expect(boundaryDistance(polys[i]!, polys[j]!)).toBeGreaterThanOrEqual(3 - 2e-3);
      }
  });

  it('builds on a given layout and gives up within its work limit when no more copies fit', () => {
    // Squares of side 190: six fill 590 × 390 in a 3 × 2 grid, and seven cover more than its area (arithmetic).
    const square = regular(4, 95 * Math.SQRT2, 45);
    const { cache, variants } = setUp(square, 3);
    const six = denserSheet(cache, frame, variants, [], { targetCount: 6 })!;
    expect(six).toHaveLength(6);
    expect(denserSheet(cache, frame, variants, six, { targetCount: 7, workLimit: 20_000 })).toBeNull();
  });
});
