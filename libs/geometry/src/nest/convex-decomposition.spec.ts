import * as polygonClipping from 'polygon-clipping';
import { convexMinkowskiSum, convexPieces, type IntPath } from './convex-decomposition';
import { noFitPolygon, noFitPolygonFromPieces, pointInPath, SCALE_PER_MM } from './clipper-adapter';

type P = [number, number];

function star(n: number, k: number, R: number): P[] {
  const inner = (R * Math.cos((Math.PI * k) / n)) / Math.cos((Math.PI * (k - 1)) / n);
  return Array.from({ length: 2 * n }, (_, i) => {
    const r = i % 2 === 0 ? R : inner;
    const a = Math.PI / 2 + (Math.PI * i) / n;
    return [r * Math.cos(a), r * Math.sin(a)] as P;
  });
}

// A comb: non-convex with deep rectangular notches (like slots).
const comb: P[] = [
  [0, 0],
  [60, 0],
  [60, 30],
  [50, 30],
  [50, 10],
  [40, 10],
  [40, 30],
  [30, 30],
  [30, 10],
  [20, 10],
  [20, 30],
  [0, 30],
];

const toInt = (p: P[]): IntPath =>
  p.map(([x, y]) => ({ X: Math.round(x * SCALE_PER_MM), Y: Math.round(y * SCALE_PER_MM) }));
const toMm = (p: IntPath): P[] => p.map((q) => [q.X / SCALE_PER_MM, q.Y / SCALE_PER_MM]);

function area(p: P[]): number {
  let s = 0;
  for (let i = 0; i < p.length; i++) {
    const a = p[i]!;
    const b = p[(i + 1) % p.length]!;
    s += a[0] * b[1] - b[0] * a[1];
  }
  return s / 2;
}

function mpArea(mp: polygonClipping.MultiPolygon): number {
  let s = 0;
  for (const poly of mp) poly.forEach((ring, i) => (s += (i === 0 ? 1 : -1) * Math.abs(area(ring as P[]))));
  return s;
}

describe('convexPieces (ear clipping + Hertel–Mehlhorn merging)', () => {
  it.each([
    ['{8/3} star', star(8, 3, 70)],
    ['{5/2} star', star(5, 2, 50)],
    ['comb with notches', comb],
  ] as const)(
    'cuts a %s into convex pieces that tile it exactly (checked with polygon-clipping)',
    (_n, poly) => {
      const rounded = toMm(toInt([...poly])); // the polygon as cut, after rounding to whole µm
      const pieces = convexPieces(toInt([...poly])).map(toMm);
      for (const piece of pieces)
        for (let i = 0; i < piece.length; i++) {
          const a = piece[i]!;
          const b = piece[(i + 1) % piece.length]!;
          const c = piece[(i + 2) % piece.length]!;
          expect((b[0] - a[0]) * (c[1] - a[1]) - (b[1] - a[1]) * (c[0] - a[0])).toBeGreaterThanOrEqual(-1e-9);
        }
      const total = pieces.reduce((s, p) => s + area(p), 0);
      expect(total).toBeCloseTo(area(rounded), 3);
      // Derived: pieces that sum to the area and whose union is the polygon do not overlap.
      const union = polygonClipping.union([pieces[0]!], ...pieces.slice(1).map((p) => [p]));
      expect(mpArea(union)).toBeCloseTo(area(rounded), 3);
      expect(mpArea(polygonClipping.xor(union, [rounded]))).toBeLessThan(1e-3);
    },
  );
});

describe('convexMinkowskiSum', () => {
  it('sums two axis-aligned squares into a square of the summed sides (derived)', () => {
    const sq = (s: number): IntPath =>
      toInt([
        [0, 0],
        [s, 0],
        [s, s],
        [0, s],
      ]);
    const sum = toMm(convexMinkowskiSum(sq(10), sq(4)));
    expect(area(sum)).toBeCloseTo(196, 6);
  });
});

describe('no-fit polygon from convex pieces', () => {
  it('marks exactly the translations where two non-convex parts overlap (polygon-clipping as referee)', () => {
    const A = toInt(star(5, 2, 40));
    const B = toInt(comb);
    const negB = B.map((q) => ({ X: -q.X, Y: -q.Y }));
    const nfp = noFitPolygonFromPieces(convexPieces(A), convexPieces(negB));
    const clipperNfp = noFitPolygon([A], B);
    let seed = 7;
    const rand = () => ((seed = (seed * 1103515245 + 12345) % 2147483648) / 2147483648) * 160 - 80;
    let checked = 0;
    for (let n = 0; n < 300; n++) {
      const tx = rand();
      const ty = rand();
      const moved = comb.map(([x, y]) => [x + tx, y + ty] as P);
      const overlap = mpArea(polygonClipping.intersection([star(5, 2, 40)], [moved]));
      const X = Math.round(tx * SCALE_PER_MM);
      const Y = Math.round(ty * SCALE_PER_MM);
      const inside = nfp.some((p) => pointInPath(X, Y, p) === 1);
      const insideClipper = clipperNfp.some((p) => pointInPath(X, Y, p) === 1);
      if (overlap > 0.5) {
        expect(inside).toBe(true);
        expect(insideClipper).toBe(true);
        checked++;
      } else if (overlap === 0) {
        // Shift by 0.05 mm in each direction: still no overlap → clearly outside.
        const near = [-0.05, 0.05].every((d) =>
          [-0.05, 0.05].every(
            (e) =>
              mpArea(
                polygonClipping.intersection(
                  [star(5, 2, 40)],
                  [comb.map(([x, y]) => [x + tx + d, y + ty + e] as P)],
                ),
              ) === 0,
          ),
        );
        if (near) {
          expect(inside).toBe(false);
          checked++;
        }
      }
    }
    expect(checked).toBeGreaterThan(200);
  });
});
