import * as polygonClipping from 'polygon-clipping';
import { reflexCorners, simplifyContaining, SCALE_PER_MM, type IntPath } from './clipper-adapter';
import { convexPieces } from './convex-decomposition';
import {
  clearOfItems,
  GeometryCache,
  NFP_MAX_REFLEX,
  NfpLru,
  nfpOutline,
  PlacedIndex,
  piecesOrNull,
} from './variants';
import { area, mpArea, type P, regular } from '../test-support/polygons';

const toMm = (p: IntPath): P[] => p.map((q) => [q.X / SCALE_PER_MM, q.Y / SCALE_PER_MM]);
const toInt = (p: P[]): IntPath =>
  p.map(([x, y]) => ({ X: Math.round(x * SCALE_PER_MM), Y: Math.round(y * SCALE_PER_MM) }));

/** A finely sampled wavy closed curve: radius R·(1 + a·sin(lobes·θ)), n vertices. */
function wavy(n: number, R: number, a: number, lobes: number): P[] {
  return Array.from({ length: n }, (_, i) => {
    const t = (2 * Math.PI * i) / n;
    const r = R * (1 + a * Math.sin(lobes * t));
    return [r * Math.cos(t), r * Math.sin(t)] as P;
  });
}

/** Convex hull (monotone chain), written here so the check does not use the library's own. */
function hull(points: P[]): P[] {
  const pts = [...points].sort((p, q) => p[0] - q[0] || p[1] - q[1]);
  const cross = (o: P, a: P, b: P) => (a[0] - o[0]) * (b[1] - o[1]) - (a[1] - o[1]) * (b[0] - o[0]);
  const half = (list: P[]) => {
    const h: P[] = [];
    for (const p of list) {
      while (h.length >= 2 && cross(h[h.length - 2]!, h[h.length - 1]!, p) <= 0) h.pop();
      h.push(p);
    }
    h.pop();
    return h;
  };
  return [...half(pts), ...half([...pts].reverse())];
}

/** A geometry cache of one copy of each outline, never turned, in one group. */
const unturnedCache = (outlines: P[][], gapMm: number) =>
  new GeometryCache(
    outlines.map((outline, index) => ({
      index,
      id: `p${index}`,
      group: 'g',
      quantity: 1,
      outline,
      areaMm2: area(outline),
      rotationsDeg: [0],
      patternRotationsDeg: [0],
    })),
    gapMm,
  );

/** Area of `inner` left outside `outer`, by polygon-clipping (an independent polygon library). */
const leftOutside = (inner: P[], outer: P[]) => mpArea(polygonClipping.difference([inner], [outer]));

describe('outlines for no-fit polygons', () => {
  it('bounds the reflex corners of a finely sampled wavy outline, still containing it and tighter than its hull', () => {
    const outline = wavy(384, 60, 0.15, 12);
    expect(reflexCorners(toInt(outline))).toBeGreaterThan(100);
    const nfp = toMm(nfpOutline(outline, 3));
    expect(reflexCorners(toInt(nfp))).toBeLessThanOrEqual(NFP_MAX_REFLEX);
    expect(leftOutside(outline, nfp)).toBeLessThan(1e-6 * area(outline));
    expect(area(nfp)).toBeLessThan(area(hull(outline)) * 0.98);
  });

  it('leaves an outline within the budget unsimplified: a {5/2} star keeps its area to 0.05 %', () => {
    const inner = (60 * Math.cos((2 * Math.PI) / 5)) / Math.cos(Math.PI / 5);
    const star: P[] = Array.from({ length: 10 }, (_, i) => {
      const r = i % 2 === 0 ? 60 : inner;
      const t = Math.PI / 2 + (Math.PI * i) / 5;
      return [r * Math.cos(t), r * Math.sin(t)];
    });
    const nfp = toMm(nfpOutline(star, 1));
    // Closing the inner corners by the gap adds a few µm² there; a simplification grown by its tolerance
    // (0.05 mm at least) would add about perimeter × 0.05 ≈ 20 mm² (0.5 %).
    expect(reflexCorners(toInt(nfp))).toBeGreaterThanOrEqual(5);
    expect(Math.abs(area(nfp) - area(star))).toBeLessThan(5e-4 * area(star));
  });

  it('simplifies a 720-gon circle to a containing polygon within a tolerance band', () => {
    const circle = regular(720, 50, 0);
    const tolMm = 0.2;
    const simpler = simplifyContaining(toInt(circle), tolMm);
    expect(simpler).not.toBeNull();
    const s = toMm(simpler!);
    expect(s.length).toBeLessThan(100);
    expect(leftOutside(circle, s)).toBeLessThan(1e-6);
    // Douglas–Peucker keeps every point within the tolerance; the mitred growth adds at most about as much again.
    const radii = s.map(([x, y]) => Math.hypot(x, y));
    expect(Math.max(...radii)).toBeLessThan(50 + 3 * tolMm);
    expect(area(s)).toBeLessThan(Math.PI * (50 + 2 * tolMm) ** 2);
  });
});

describe('convex pieces of a rounded outline', () => {
  // A seven-point star as rotating and rounding left it: its lower-left tip is two vertices 1 µm apart whose
  // edges cross (both corners turn right), a twist no triangulation can cut into convex pieces that add up.
  const twisted: IntPath = [
    [18542, 54749],
    [-3216, 26170],
    [-31244, 48632],
    [-22465, 13803],
    [-57502, 5894],
    [-24798, -8958],
    [-40459, -41281],
    [-40460, -41281],
    [-8458, -24973],
    [7049, -57372],
    [14251, -22184],
    [49250, -30260],
    [26229, -2689],
    [54365, 19639],
    [18455, 18831],
  ].map(([X, Y]) => ({ X: X!, Y: Y! }));
  const sum = (paths: IntPath[]) => paths.reduce((s, p) => s + area(toMm(p)), 0);

  it('are still found when the rounding twisted a tip, and cover the outline to within 2 µm of its edges', () => {
    // The plain decomposition misses area here, which used to send the pair to Clipper's far slower sums.
    expect(Math.abs(sum(convexPieces(twisted)) - area(toMm(twisted)))).toBeGreaterThan(0.01);
    const pieces = piecesOrNull(twisted);
    expect(pieces).not.toBeNull();
    for (const piece of pieces!) expect(reflexCorners(piece)).toBe(0);
    // Checked with an independent polygon library (polygon-clipping): the pieces' union differs from the
    // outline only in a band of at most 2 µm along its edges.
    const [first, ...rest] = pieces!.map((p) => [toMm(p)] as polygonClipping.Polygon);
    const union = polygonClipping.union(first!, ...rest);
    const diff = polygonClipping.xor(union, [toMm(twisted)]);
    const perimeter = toMm(twisted).reduce((s, [x, y], i, a) => {
      const [u, v] = a[(i + 1) % a.length]!;
      return s + Math.hypot(u - x, v - y);
    }, 0);
    expect(mpArea(diff)).toBeLessThanOrEqual(perimeter * 0.002);
  });
});

describe('the direct check of a position on the true outlines', () => {
  /** Distance from p to segment ab (mm), written here so the check does not use the library's own. */
  const pointSegment = (p: P, a: P, b: P) => {
    const [dx, dy] = [b[0] - a[0], b[1] - a[1]];
    const t = Math.max(0, Math.min(1, ((p[0] - a[0]) * dx + (p[1] - a[1]) * dy) / (dx * dx + dy * dy || 1)));
    return Math.hypot(p[0] - a[0] - t * dx, p[1] - a[1] - t * dy);
  };
  /** Least distance between two closed outlines' boundaries, every vertex against every edge (brute force). */
  const boundaryDistance = (a: P[], b: P[]) => {
    let best = Infinity;
    for (const [u, v] of [
      [a, b],
      [b, a],
    ] as const)
      for (const p of u)
        for (let j = 0; j < v.length; j++)
          best = Math.min(best, pointSegment(p, v[j]!, v[(j + 1) % v.length]!));
    return best;
  };

  it('refuses two bars crossing in an X, whose corners are all far from the other bar (derived)', () => {
    // Two 100 × 2 mm bars crossed at their centres: every corner lies 49 mm from the other bar's edges, so only
    // the crossing of their long edges tells that they overlap (by 4 mm², worked by hand).
    const bar: P[] = [
      [-50, -1],
      [50, -1],
      [50, 1],
      [-50, 1],
    ];
    const cache = new GeometryCache(
      [0, 1].map((index) => ({
        index,
        id: `bar${index}`,
        group: 'g',
        quantity: 1,
        outline: bar,
        areaMm2: area(bar),
        rotationsDeg: [0, 90],
        patternRotationsDeg: [0],
      })),
      1,
    );
    const across = { variant: cache.variant(0, 0), tx: 0, ty: 0 };
    expect(clearOfItems([across], cache.variant(1, 90), 0, 0, 1)).toBe(false);
    // Moved 60 mm up, the upright bar clears the other by 9 mm: clear.
    expect(clearOfItems([across], cache.variant(1, 90), 0, 60 * SCALE_PER_MM, 1)).toBe(true);
  });

  it('agrees with a brute-force distance for wavy outlines of 200 vertices, near and far', () => {
    // Two 200-vertex wavy parts; the moving one is put at positions from overlapping to well apart, and the
    // verdict must be the brute force's: clear when the boundaries are at least the gap apart and neither part
    // lies inside the other (these never nest: checked by a vertex inside the other's outline).
    const a = wavy(200, 40, 0.12, 7);
    const b = wavy(200, 30, 0.2, 5);
    const gapMm = 3;
    const cache = unturnedCache([a, b], gapMm);
    const fixed = { variant: cache.variant(0, 0), tx: 0, ty: 0 };
    const moving = cache.variant(1, 0);
    let clear = 0;
    let blocked = 0;
    for (let k = 0; k < 40; k++) {
      const t = (2 * Math.PI * k) / 40;
      const r = 62 + (k % 9) * 4; // 62–94 mm between centres: from overlapping to apart
      const [x, y] = [r * Math.cos(t), r * Math.sin(t)];
      const placed = b.map(([u, v]) => [u + x, v + y] as P);
      const d = boundaryDistance(a, placed);
      // Clear of the 1 µm either side of the gap that rounding to whole micrometres may take.
      if (Math.abs(d - gapMm) < 0.002) continue;
      const expected = d >= gapMm;
      const got = clearOfItems(
        [fixed],
        moving,
        Math.round(x * SCALE_PER_MM),
        Math.round(y * SCALE_PER_MM),
        gapMm,
      );
      expect(got).toBe(expected);
      if (got) clear++;
      else blocked++;
    }
    expect(clear).toBeGreaterThan(5);
    expect(blocked).toBeGreaterThan(5);
  });
});

describe('the index of placed parts', () => {
  it('answers clearOfItems as a scan of every part does, for parts of two sizes scattered on a sheet', () => {
    // Squares of 10 and 37 mm at 300 pseudo-random places (a fixed linear congruential sequence), then 400
    // probes: the index must find every neighbour the full scan finds (the verdicts must agree).
    const gapMm = 2;
    const cache = unturnedCache([regular(4, 10 / Math.SQRT2, 45), regular(4, 37 / Math.SQRT2, 45)], gapMm);
    let seed = 12345;
    const next = () => (seed = (seed * 1103515245 + 12345) % 2147483648) / 2147483648;
    const items = Array.from({ length: 300 }, (_, i) => ({
      variant: cache.variant(i % 7 === 0 ? 1 : 0, 0),
      tx: Math.round(next() * 800 * SCALE_PER_MM),
      ty: Math.round(next() * 500 * SCALE_PER_MM),
    }));
    const index = new PlacedIndex(PlacedIndex.cellFor(items.map((it) => it.variant)));
    for (const it of items) index.add(it);
    let blocked = 0;
    for (let k = 0; k < 400; k++) {
      const moving = cache.variant(k % 5 === 0 ? 1 : 0, 0);
      const tx = Math.round(next() * 800 * SCALE_PER_MM);
      const ty = Math.round(next() * 500 * SCALE_PER_MM);
      const scan = clearOfItems(items, moving, tx, ty, gapMm);
      expect(clearOfItems(index, moving, tx, ty, gapMm)).toBe(scan);
      if (!scan) blocked++;
    }
    expect(blocked).toBeGreaterThan(50);
    expect(blocked).toBeLessThan(400);
  });
});

describe('the bounded cache of no-fit polygons', () => {
  const entry = (vertices: number) => {
    const path: IntPath = Array.from({ length: vertices }, (_, i) => ({ X: i, Y: i * i }));
    return { paths: [path], box: { minX: 0, minY: 0, maxX: vertices, maxY: vertices * vertices } };
  };

  it('keeps at most its budget of vertices, dropping the least recently used first', () => {
    const lru = new NfpLru(100);
    const a = entry(40);
    lru.set('a', a);
    lru.set('b', entry(40));
    // 'a' used again: 'b' is now the least recently used.
    expect(lru.get('a')?.paths).toBe(a.paths);
    lru.set('c', entry(40));
    // 120 > 100: dropped down to 75 at most, least recently used first, never the one just set.
    expect(lru.get('b')).toBeUndefined();
    expect(lru.get('a')).toBeUndefined();
    expect(lru.get('c')?.paths[0]).toHaveLength(40);
  });

  it('keeps an entry larger than the budget until the next one comes', () => {
    const lru = new NfpLru(10);
    lru.set('big', entry(50));
    expect(lru.get('big')).toBeDefined();
    lru.set('next', entry(5));
    expect(lru.get('big')).toBeUndefined();
    expect(lru.get('next')).toBeDefined();
  });
});
