import {
  areaUnits,
  differenceComponents,
  differenceNear,
  differencePaths,
  SCALE_PER_MM,
  type IntPath,
} from './clipper-adapter';
import { bottomLeftFill, findPosition, slabRange, type SheetState } from './bottom-left';
import { GeometryCache, type PreparedPart } from './variants';
import { area, type P } from '../test-support/polygons';

const U = SCALE_PER_MM;
const rect = (x0: number, y0: number, x1: number, y1: number): IntPath => [
  { X: x0 * U, Y: y0 * U },
  { X: x1 * U, Y: y0 * U },
  { X: x1 * U, Y: y1 * U },
  { X: x0 * U, Y: y1 * U },
];

describe('free-space components', () => {
  it('splits a rectangle cut by a bar into two, with their bounds and areas (worked by hand)', () => {
    const parts = differenceComponents([rect(0, 0, 100, 50)], [rect(40, -1, 45, 51)]);
    const boxes = parts
      .map((c) => [c.minX / U, c.maxX / U, c.minY / U, c.maxY / U, c.area / (U * U)])
      .sort((a, b) => a[0]! - b[0]!);
    expect(boxes).toEqual([
      [0, 40, 0, 50, 2000],
      [45, 100, 0, 50, 2750],
    ]);
  });

  it('keeps a ring as one component whose area is the outer less the hole, and an island as another', () => {
    // 100 × 100 less a 60 × 60 frame of width 10 (outer 20–80): the ring outside it and the 40 × 40 island.
    const frame = [rect(20, 20, 80, 80), rect(30, 30, 70, 70).reverse()];
    const parts = differenceComponents([rect(0, 0, 100, 100)], frame).sort((a, b) => a.minX - b.minX);
    expect(parts).toHaveLength(2);
    expect(parts[0]!.area / (U * U)).toBeCloseTo(100 * 100 - 60 * 60, 6);
    expect(parts[0]!.paths).toHaveLength(2);
    expect(parts[1]!.area / (U * U)).toBeCloseTo(40 * 40, 6);
    expect([parts[1]!.minX, parts[1]!.maxX].map((x) => x / U)).toEqual([30, 70]);
  });
});

describe('a kept region less new no-fit polygons', () => {
  it('equals the full difference when only the paths near the clips go through Clipper (areas worked by hand)', () => {
    // 100 × 100 less two squares and a square frame: two holes, and an island inside a third, as Clipper
    // gives such a region.
    const region = differencePaths(
      [rect(0, 0, 100, 100)],
      [rect(10, 10, 20, 20), rect(40, 10, 50, 20), rect(60, 60, 80, 80), rect(65, 65, 75, 75).reverse()],
    );
    expect(region).toHaveLength(5);
    const regionArea = 100 * 100 - 100 - 100 - 400 + 100;
    const total = (paths: IntPath[]) => paths.reduce((a, p) => a + areaUnits(p), 0) / (U * U);
    // Signed areas: holes count negative, so the sum is the region's area.
    expect(total(region)).toBeCloseTo(regionArea, 6);
    for (const [clip, removed] of [
      // Over the first hole's edge only: 5 × 10 of new area gone.
      [rect(15, 5, 25, 15), 10 * 10 - 5 * 5],
      // Through the island: the island's part is gone.
      [rect(64, 64, 70, 70), 5 * 5],
      // Far from every hole, inside the outer square.
      [rect(85, 40, 95, 50), 100],
    ] as const) {
      const near = differenceNear(region, [clip]);
      const full = differencePaths(region, [clip]);
      expect(total(near)).toBeCloseTo(regionArea - removed, 6);
      expect(total(full)).toBeCloseTo(regionArea - removed, 6);
    }
    // No clip: the region as it was.
    expect(differenceNear(region, [])).toBe(region);
  });
});

describe('the y-range of a region in a vertical slab', () => {
  // A diamond with corners (5, 0), (10, 5), (5, 10), (0, 5) (worked by hand): between x = 1 and x = 2 its lower
  // edge y = 5 − x runs from 4 down to 3 and its upper edge y = 5 + x from 6 up to 7.
  const diamond = [
    [
      { X: 5, Y: 0 },
      { X: 10, Y: 5 },
      { X: 5, Y: 10 },
      { X: 0, Y: 5 },
    ],
  ];
  it('is the range of its edges clipped to the slab', () => {
    expect(slabRange(diamond, 1, 2)).toEqual({ y0: 3, y1: 7 });
    expect(slabRange(diamond, 4, 6)).toEqual({ y0: 0, y1: 10 });
  });
  it('is null when the slab misses the region', () => {
    expect(slabRange(diamond, 11, 20)).toBeNull();
    expect(slabRange(diamond, -9, -1)).toBeNull();
  });
});

describe('bottom-left fill in free-space windows', () => {
  // A small linear congruential generator (constants of Numerical Recipes), so every run sees the same parts.
  let seed = 4711;
  const rnd = () => (seed = (seed * 1664525 + 1013904223) % 4294967296) / 4294967296;
  const blob = (R: number): P[] => {
    const n = 5 + Math.floor(rnd() * 8);
    return Array.from({ length: n }, (_, i) => {
      const t = (2 * Math.PI * i) / n;
      const r = R * (0.5 + 0.5 * rnd());
      return [r * Math.cos(t), r * Math.sin(t)] as P;
    });
  };
  /** One copy of an outline, free to turn by quarter turns. */
  const prepared = (index: number, id: string, outline: P[]): PreparedPart => ({
    index,
    id,
    group: 'a',
    quantity: 1,
    outline,
    areaMm2: area(outline),
    rotationsDeg: [0, 90, 180, 270],
    patternRotationsDeg: [0],
  });
  const parts: PreparedPart[] = Array.from({ length: 70 }, (_, index) =>
    prepared(index, `p${index}`, blob(12 + rnd() * 28)),
  );
  const frame = { widthMm: 600, heightMm: 400, marginMm: 5 };

  /** The position found in free-space windows is the one a search of the whole sheet finds. */
  const expectWindowsAgree = (cache: GeometryCache, base: SheetState, p: PreparedPart) => {
    const variants = p.rotationsDeg.map((d) => cache.variant(p.index, d));
    const fresh = (): SheetState => ({
      ...base,
      items: [...base.items],
      regions: undefined,
      free: undefined,
    });
    const inWindows = fresh();
    const windowed = findPosition(cache, frame, inWindows, variants);
    expect(inWindows.free).toBeDefined();
    const whole = findPosition(cache, frame, fresh(), variants, 'right', false);
    expect(windowed && [windowed.variant.key, windowed.tx, windowed.ty]).toEqual(
      whole && [whole.variant.key, whole.tx, whole.ty],
    );
  };

  it('finds the same position as a search of the whole sheet, for every part of a crowded sheet of different parts', () => {
    // The windows hold every feasible translation (the part lies in one free-space component), so the
    // bottom-left position must not change; only the work done to find it does.
    const gapMm = 2;
    const cache = new GeometryCache(parts, gapMm);
    const copies = parts.slice(0, 50).map((p) => p.rotationsDeg.map((d) => cache.variant(p.index, d)));
    const { sheets } = bottomLeftFill(cache, frame, 'a', copies, []);
    expect(sheets).toHaveLength(1);
    const base = sheets[0]!;
    for (const p of parts.slice(50)) expectWindowsAgree(cache, base, p);
  });

  it('finds the same position as a search of the whole sheet on a crowded sheet of a few parts in quantity', () => {
    // 6 parts × 10 copies: not mostly different, but crowded enough that a first search uses windows.
    const gapMm = 3;
    const cache = new GeometryCache(parts, gapMm);
    const copies = parts
      .slice(0, 6)
      .flatMap((p) => Array.from({ length: 10 }, () => p.rotationsDeg.map((d) => cache.variant(p.index, d))));
    const { sheets } = bottomLeftFill(cache, frame, 'a', copies, []);
    expect(sheets).toHaveLength(1);
    const base = sheets[0]!;
    expect(base.items.length).toBe(60);
    for (const p of parts.slice(6, 26)) expectWindowsAgree(cache, base, p);
  });

  it('finds the same position as a search of the whole sheet for awkward outlines, by either fill rule', () => {
    // L-shapes, combs, thin bars, a thin L and stars: their inscribed discs are small against their bounds, and a comb
    // eroded by ε can come apart; the position must still be the one the whole search finds.
    const shapes: ((s: number) => P[])[] = [
      (s) => [
        [0, 0],
        [s, 0],
        [s, 0.3 * s],
        [0.3 * s, 0.3 * s],
        [0.3 * s, s],
        [0, s],
      ],
      (s) => {
        const pts: P[] = [
          [0, 0],
          [s, 0],
        ];
        for (let i = 4; i > 0; i--)
          pts.push(
            [(i * s) / 4, s],
            [(i * s) / 4 - s / 8, s],
            [(i * s) / 4 - s / 8, 0.3 * s],
            [((i - 1) * s) / 4, 0.3 * s],
          );
        return pts;
      },
      (s) => [
        [0, 0],
        [2.5 * s, 0],
        [2.5 * s, 4],
        [0, 4],
      ],
      // An L of 2 mm stock: its inscribed disc is too small for the disc test, so only its bounds prune.
      (s) => [
        [0, 0],
        [s, 0],
        [s, 2],
        [2, 2],
        [2, s],
        [0, s],
      ],
      (s) =>
        Array.from({ length: 10 }, (_, i) => {
          const t = (Math.PI * i) / 5;
          const r = i % 2 ? 0.4 * s : s;
          return [r * Math.cos(t), r * Math.sin(t)] as P;
        }),
      (s) => blob(s),
    ];
    const awkward: PreparedPart[] = Array.from({ length: 60 }, (_, index) => {
      // Outlines are drawn far from their origins, as imported drawings often are.
      const ox = (rnd() - 0.5) * 400;
      const oy = (rnd() - 0.5) * 400;
      const outline = shapes[index % shapes.length]!(15 + rnd() * 35).map(([x, y]) => [x + ox, y + oy] as P);
      return prepared(index, `w${index}`, outline);
    });
    for (const rule of ['left', 'right'] as const) {
      const gapMm = rule === 'left' ? 1.5 : 4;
      const cache = new GeometryCache(awkward, gapMm);
      const variantsOf = (p: PreparedPart) => p.rotationsDeg.map((d) => cache.variant(p.index, d));
      const { sheets } = bottomLeftFill(cache, frame, 'a', awkward.slice(0, 40).map(variantsOf), [], rule);
      const base = sheets[0]!;
      expect(base.items.length).toBeGreaterThanOrEqual(8);
      for (const p of awkward.slice(40)) {
        const fresh = (): SheetState => ({
          ...base,
          items: [...base.items],
          regions: undefined,
          free: undefined,
        });
        const windowed = findPosition(cache, frame, fresh(), variantsOf(p), rule);
        const whole = findPosition(cache, frame, fresh(), variantsOf(p), rule, false);
        expect(windowed && [windowed.variant.key, windowed.tx, windowed.ty]).toEqual(
          whole && [whole.variant.key, whole.tx, whole.ty],
        );
      }
    }
  });

  it('turns a part away from a full sheet in its windows, without searching the whole sheet again', () => {
    // Parts that went on to a second sheet do not fit on the first: the windows, which hold every feasible
    // translation, come out empty, and that is the answer (the same as the whole search's, for less work).
    // Stars: their inscribed discs are small against their areas, so a window often opens where they cannot go.
    let starSeed = 2027;
    const rnd = () => (starSeed = (starSeed * 1664525 + 1013904223) % 4294967296) / 4294967296;
    const stars: PreparedPart[] = Array.from({ length: 45 }, (_, index) => {
      const k = 5 + Math.floor(rnd() * 5);
      const R = 15 + rnd() * 30;
      const inner = 0.35 + rnd() * 0.4;
      const outline = Array.from({ length: 2 * k }, (_, i) => {
        const t = (Math.PI * i) / k;
        const r = i % 2 ? inner * R : R;
        return [r * Math.cos(t), r * Math.sin(t)] as P;
      });
      return prepared(index, `s${index}`, outline);
    });
    const gapMm = 2;
    const small = { widthMm: 300, heightMm: 200, marginMm: 5 };
    const fill = new GeometryCache(stars, gapMm);
    const copies = stars.map((p) => p.rotationsDeg.map((d) => fill.variant(p.index, d)));
    const { sheets } = bottomLeftFill(fill, small, 'a', copies, []);
    expect(sheets.length).toBeGreaterThan(1);
    const first = sheets[0]!;
    const later = sheets.slice(1).flatMap((s) => s.items.map((it) => stars[it.variant.partIndex]!));
    let turnedAway = 0;
    for (const p of later) {
      // Fresh caches: each count is this part's own no-fit polygons.
      const windowed = new GeometryCache(stars, gapMm);
      const whole = new GeometryCache(stars, gapMm);
      const fresh = (): SheetState => ({
        ...first,
        items: [...first.items],
        regions: undefined,
        free: undefined,
        // As on the part's first try here.
        windowed: undefined,
      });
      const inWindows = findPosition(
        windowed,
        small,
        fresh(),
        p.rotationsDeg.map((d) => windowed.variant(p.index, d)),
      );
      const inWhole = findPosition(
        whole,
        small,
        fresh(),
        p.rotationsDeg.map((d) => whole.variant(p.index, d)),
        'right',
        false,
      );
      expect(inWindows && [inWindows.variant.key, inWindows.tx, inWindows.ty]).toEqual(
        inWhole && [inWhole.variant.key, inWhole.tx, inWhole.ty],
      );
      if (inWhole) continue;
      turnedAway++;
      // Derived: only the no-fit polygons near the windows' strips are built, never the whole sheet's.
      expect(windowed.nfpCount).toBeLessThan(whole.nfpCount);
    }
    expect(turnedAway).toBeGreaterThan(10);
  });

  it('subtracts fewer no-fit polygons than there are placed parts', () => {
    const gapMm = 3;
    const counting = new GeometryCache(parts, gapMm);
    const copies = parts.map((p) => p.rotationsDeg.map((d) => counting.variant(p.index, d)));
    bottomLeftFill(counting, frame, 'a', copies, []);
    const windowedNfps = counting.nfpCount;
    const plain = new GeometryCache(parts, gapMm);
    const sheet: SheetState = { group: 'a', items: [], usedAreaMm2: 0, method: 'true-shape' };
    for (const p of parts) {
      const variants = p.rotationsDeg.map((d) => plain.variant(p.index, d));
      const c = findPosition(plain, frame, sheet, variants, 'right', false);
      if (c) sheet.items.push({ variant: c.variant, tx: c.tx, ty: c.ty });
    }
    expect(sheet.items).toHaveLength(parts.length);
    // Derived: a part's no-fit polygons are needed only against its neighbours near the fill front.
    expect(windowedNfps).toBeLessThan(0.4 * plain.nfpCount);
  });
});
