import { differenceComponents, SCALE_PER_MM, type IntPath } from './clipper-adapter';
import { bottomLeftFill, findPosition, type SheetState } from './bottom-left';
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
  const parts: PreparedPart[] = Array.from({ length: 70 }, (_, index) => {
    const outline = blob(12 + rnd() * 28);
    return {
      index,
      id: `p${index}`,
      group: 'a',
      quantity: 1,
      outline,
      areaMm2: area(outline),
      rotationsDeg: [0, 90, 180, 270],
      patternRotationsDeg: [0],
    };
  });
  const frame = { widthMm: 600, heightMm: 400, marginMm: 5 };

  it('finds the same position as a search of the whole sheet, for every part of a crowded sheet of different parts', () => {
    // The windows hold every feasible translation (the part lies in one free-space component), so the
    // bottom-left position must not change; only the work done to find it does.
    const gapMm = 2;
    const cache = new GeometryCache(parts, gapMm);
    const copies = parts.slice(0, 50).map((p) => p.rotationsDeg.map((d) => cache.variant(p.index, d)));
    const { sheets } = bottomLeftFill(cache, frame, 'a', copies, []);
    expect(sheets).toHaveLength(1);
    const base = sheets[0]!;
    for (const p of parts.slice(50)) {
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
    }
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
    expect(windowedNfps).toBeLessThan(0.6 * plain.nfpCount);
  });
});
