import * as polygonClipping from 'polygon-clipping';
import { convexHullInt, convexMinkowskiSum, convexPieces, type IntPath } from './convex-decomposition';
import {
  convexInside,
  noFitPolygon,
  noFitPolygonByConvolution,
  noFitPolygonFromPieces,
  pointInPath,
  SCALE_PER_MM,
} from './clipper-adapter';

import { type P, star } from '../test-support/polygons';

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

/**
 * Referee for a no-fit polygon of `moving` around `fixed` (mm outlines): at random translations, one where
 * the two overlap by more than 0.5 mm² (polygon-clipping) must lie inside it, and one where they stay apart
 * even shifted 0.05 mm every way must lie outside. Returns how many of each were checked.
 */
function refereeNfp(nfp: IntPath[], fixed: P[], moving: P[], seed: number, tries: number) {
  const rand = () => ((seed = (seed * 1103515245 + 12345) % 2147483648) / 2147483648) * 160 - 80;
  let inside = 0;
  let outside = 0;
  for (let n = 0; n < tries; n++) {
    const tx = rand();
    const ty = rand();
    const overlapAt = (dx: number, dy: number) =>
      mpArea(polygonClipping.intersection([fixed], [moving.map(([x, y]) => [x + dx, y + dy] as P)]));
    const X = Math.round(tx * SCALE_PER_MM);
    const Y = Math.round(ty * SCALE_PER_MM);
    const marked = nfp.some((p) => pointInPath(X, Y, p) === 1);
    if (overlapAt(tx, ty) > 0.5) {
      expect(marked).toBe(true);
      inside++;
    } else if ([-0.05, 0.05].every((d) => [-0.05, 0.05].every((e) => overlapAt(tx + d, ty + e) === 0))) {
      expect(marked).toBe(false);
      outside++;
    }
  }
  return { inside, outside };
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
  it('equals the convex hull of all vertex sums, for random convex polygons (the definition)', () => {
    let seed = 99;
    const rnd = () => (seed = (seed * 1103515245 + 12345) % 2147483648) / 2147483648;
    const randomConvex = (): IntPath => {
      const k = 3 + Math.floor(rnd() * 12);
      const cx = Math.round((rnd() - 0.5) * 1e6);
      const cy = Math.round((rnd() - 0.5) * 1e6);
      const pts = Array.from({ length: k }, () => ({
        X: cx + Math.round((rnd() - 0.5) * 1e5),
        Y: cy + Math.round((rnd() - 0.5) * (rnd() < 0.2 ? 10 : 1e5)),
      }));
      return convexHullInt(pts);
    };
    const key = (p: IntPath) => {
      const hull = convexHullInt(p);
      return JSON.stringify(hull.map((q) => [q.X, q.Y]).sort((u, v) => u[0]! - v[0]! || u[1]! - v[1]!));
    };
    for (let n = 0; n < 400; n++) {
      const a = randomConvex();
      const b = randomConvex();
      if (a.length < 3 || b.length < 3) continue;
      const sum = convexMinkowskiSum(a, b);
      const all = convexHullInt(a.flatMap((p) => b.map((q) => ({ X: p.X + q.X, Y: p.Y + q.Y }))));
      // Same corners, and the merged outline is itself convex and counter-clockwise (its hull is itself).
      expect(key(sum)).toBe(key(all));
      expect(sum.length).toBeLessThanOrEqual(a.length + b.length);
      expect(convexHullInt(sum)).toHaveLength(sum.length);
    }
  });

  it('falls back to the hull of the vertex sums for an outline that is not convex', () => {
    const tri: IntPath = [
      { X: 0, Y: 0 },
      { X: 10, Y: 0 },
      { X: 0, Y: 10 },
    ];
    const notch: IntPath = [
      { X: 0, Y: 0 },
      { X: 10, Y: 0 },
      { X: 5, Y: 2 },
      { X: 10, Y: 10 },
      { X: 0, Y: 10 },
    ];
    // Derived: the hull of the notched square is the square, so the sum is the triangle plus the square.
    const sum = convexMinkowskiSum(tri, notch);
    expect(area(toMm(sum)) * SCALE_PER_MM * SCALE_PER_MM).toBeCloseTo(10 * 10 + 2 * 10 * 10 + 50, 6);
  });
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

describe('no-fit polygon of two outlines of many convex pieces', () => {
  // Two wavy discs: r = R(1 + a·sin(kθ)), sampled finely, so each is cut into many convex pieces and the
  // union starts from a core of the largest sums.
  const wavy = (R: number, a: number, k: number, n: number, phase: number): P[] =>
    Array.from({ length: n }, (_, i) => {
      const t = (2 * Math.PI * i) / n;
      const r = R * (1 + a * Math.sin(k * t + phase));
      return [r * Math.cos(t), r * Math.sin(t)] as P;
    });
  const fixed = wavy(40, 0.18, 7, 84, 0);
  const moving = wavy(30, 0.22, 5, 60, 0.4);

  it('has more sums than the core, and marks exactly the overlapping translations (polygon-clipping as referee)', () => {
    const A = toInt(fixed);
    const negB = toInt(moving).map((q) => ({ X: -q.X, Y: -q.Y }));
    const pa = convexPieces(A);
    const pb = convexPieces(negB);
    expect(pa.length * pb.length).toBeGreaterThan(48);
    const nfp = noFitPolygonFromPieces(pa, pb);
    const { inside, outside } = refereeNfp(nfp, fixed, moving, 11, 400);
    expect(inside).toBeGreaterThan(50);
    expect(outside).toBeGreaterThan(50);
  });
});

describe('a convex polygon inside a simple one', () => {
  const sq = (x0: number, y0: number, s: number): IntPath => [
    { X: x0, Y: y0 },
    { X: x0 + s, Y: y0 },
    { X: x0 + s, Y: y0 + s },
    { X: x0, Y: y0 + s },
  ];
  it('is inside when well within, and not when it pokes out or lies outside', () => {
    const outer = sq(0, 0, 100);
    expect(convexInside(sq(10, 10, 20), outer)).toBe(true);
    expect(convexInside(sq(0, 0, 100), outer)).toBe(true);
    expect(convexInside(sq(90, 10, 20), outer)).toBe(false);
    expect(convexInside(sq(200, 10, 20), outer)).toBe(false);
  });
  it('is not inside when a slit of the outer polygon crosses it with no vertex inside it', () => {
    // A 100 × 100 square with a slit 2 wide from its right edge to x = 5: every corner of the square
    // (20, 20)–(60, 60) lies inside the outline, and no vertex of the outline lies inside the square, but the
    // slit (y from 29 to 31) runs straight through it, below its centre (40, 40) (worked by hand).
    const slit: IntPath = [
      { X: 0, Y: 0 },
      { X: 100, Y: 0 },
      { X: 100, Y: 29 },
      { X: 5, Y: 29 },
      { X: 5, Y: 31 },
      { X: 100, Y: 31 },
      { X: 100, Y: 100 },
      { X: 0, Y: 100 },
    ];
    expect(convexInside(sq(20, 20, 40), slit)).toBe(false);
    expect(convexInside(sq(20, 50, 30), slit)).toBe(true);
  });
});

describe('no-fit polygon by the convolution method', () => {
  const negated = (p: IntPath) => p.map((q) => ({ X: -q.X, Y: -q.Y }));
  const sq = (s: number): IntPath =>
    toInt([
      [0, 0],
      [s, 0],
      [s, s],
      [0, s],
    ]);
  const areaOf = (paths: IntPath[]) => paths.reduce((s, p) => s + area(toMm(p)), 0);

  it('sums two axis-aligned squares into the square of the summed sides (derived; every edge has a parallel)', () => {
    const nfp = noFitPolygonByConvolution(sq(10), negated(sq(4)))!;
    expect(nfp).toHaveLength(1);
    expect(areaOf(nfp)).toBeCloseTo(14 * 14, 6);
    const xs = nfp[0]!.map((q) => q.X / SCALE_PER_MM);
    expect([Math.min(...xs), Math.max(...xs)]).toEqual([-4, 10]);
  });

  it.each([
    ['a {5/2} star around a comb with notches', star(5, 2, 40), comb],
    ['a comb around a {8/3} star', comb, star(8, 3, 30)],
    ['a comb around a comb', comb, comb.map(([x, y]) => [y, -x] as P)],
  ] as const)(
    'marks exactly the translations where %s overlap (polygon-clipping as referee)',
    (_name, fixed, moving) => {
      const nfp = noFitPolygonByConvolution(toInt([...fixed]), negated(toInt([...moving])));
      expect(nfp).not.toBeNull();
      const { inside, outside } = refereeNfp(nfp!, [...fixed], [...moving], 5, 300);
      expect(inside).toBeGreaterThan(30);
      expect(outside).toBeGreaterThan(30);
    },
  );

  it('agrees with Clipper’s own Minkowski sum for a star whose rounded tips zigzag by a micrometre', () => {
    // A hexagon grown by the gap and a star whose tips rotating and rounding left as 1 µm zigzags, from a nest of
    // random parts: each zigzag turns the tracing a whole extra turn, and the convolution of the outline as it
    // was covered only 47 % of the sum. Cleaned, it must match Clipper's MinkowskiSum (edge-pair parallelograms).
    const fixed: IntPath = (
      [
        [35637, -9822],
        [25777, 25307],
        [-8678, 34750],
        [-45444, 12632],
        [-24704, -24411],
        [9945, -38934],
      ] as [number, number][]
    ).map(([X, Y]) => ({ X, Y }));
    const movingNegated: IntPath = (
      [
        [13464, -1721],
        [27483, 11507],
        [27482, 11508],
        [27483, 11508],
        [8223, 10801],
        [3776, 29555],
        [-5242, 12520],
        [-23707, 18048],
        [-13464, 1721],
        [-27483, -11507],
        [-27482, -11508],
        [-27483, -11508],
        [-8223, -10801],
        [-3776, -29555],
        [5242, -12520],
        [23707, -18048],
      ] as [number, number][]
    ).map(([X, Y]) => ({ X, Y }));
    const nfp = noFitPolygonByConvolution(fixed, movingNegated)!;
    const reference = noFitPolygon([fixed], negated(movingNegated));
    expect(nfp).not.toBeNull();
    const xor = mpArea(
      polygonClipping.xor(
        nfp.map((p) => [toMm(p)]),
        reference.map((p) => [toMm(p)]),
      ),
    );
    expect(xor).toBeLessThan(1e-4 * areaOf(reference));
  });
});
