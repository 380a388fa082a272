import * as polygonClipping from 'polygon-clipping';
import { type Vec2 } from '../math/vec';
import { estimateJob, estimateSheet, sequenceSheet, toolPathLength } from './estimate';
import { nestingDepths, orderContours } from './cut-order';

const square = (x: number, y: number, side: number, ccw = true): Vec2[] => {
  const pts: Vec2[] = [
    [x, y],
    [x + side, y],
    [x + side, y + side],
    [x, y + side],
  ];
  return ccw ? pts : pts.reverse();
};
const machine = { cutSpeedMmS: 10, markSpeedMmS: 50, pierceTimeS: 0.5, rapidSpeedMmS: 100, hourlyRate: 36 };
const area = (g: polygonClipping.Geom) =>
  (g as [number, number][][][]).reduce(
    (s, poly) =>
      s +
      poly.reduce((t, ring, k) => {
        let a = 0;
        for (let i = 0; i < ring.length - 1; i++)
          a += ring[i]![0] * ring[i + 1]![1] - ring[i + 1]![0] * ring[i]![1];
        return t + (k === 0 ? 1 : -1) * Math.abs(a / 2);
      }, 0),
    0,
  );

describe('estimateSheet', () => {
  it('matches the hand-worked square of side 100 mm', () => {
    // Hand-worked (REFERENCES "Stock and machines": time = length ÷ speed + pierces × pierce time + travel ÷
    // rapid speed): a 100 mm square at (50, 50) has a 400 mm cut and one pierce; the head travels from the
    // origin to the nearest corner, √(50² + 50²) = 70.711 mm. At 10 mm/s, 0.5 s per pierce and 100 mm/s
    // rapid: 40 + 0.5 + 0.70711 = 41.20711 s.
    const e = estimateSheet({ cut: [square(50, 50, 100)], mark: [] }, machine);
    expect(e.cutLengthMm).toBeCloseTo(400, 9);
    expect(e.pierces).toBe(1);
    expect(e.travelMm).toBeCloseTo(Math.hypot(50, 50), 9);
    expect(e.seconds).toBeCloseTo(40 + 0.5 + Math.hypot(50, 50) / 100, 9);
  });

  it('multiplies cutting and piercing by the passes, and adds mark length ÷ mark speed', () => {
    // Derived from the same model: two passes cut 400 mm twice and pierce twice; a 50 mm mark line at
    // 50 mm/s adds 1 s; the head goes origin → mark start (0, 10) = 10 mm, mark end (50, 10) → square
    // corner (50, 50) = 40 mm.
    const e = estimateSheet(
      {
        cut: [square(50, 50, 100)],
        mark: [
          [
            [0, 10],
            [50, 10],
          ],
        ],
      },
      { ...machine, passes: 2 },
    );
    expect(e.markLengthMm).toBeCloseTo(50, 9);
    expect(e.travelMm).toBeCloseTo(50, 9);
    expect(e.seconds).toBeCloseTo(80 + 1 + 1 + 0.5, 9);
  });
});

describe('toolPathLength (router bit centre)', () => {
  it("adds 2πr round a convex outline (Steiner's formula for the parallel body of a convex set)", () => {
    // Steiner's formula: the boundary of a convex set grown by r is P + 2πr long. Bit 6 mm, r 3 mm. The arcs
    // are drawn as chords within 0.002 mm, a little shorter: within 0.05 mm here and below.
    expect(toolPathLength(square(0, 0, 100), 6)).toBeCloseTo(400 + 2 * Math.PI * 3, 1);
    // A beam's files already carry its path: the outline itself.
    expect(toolPathLength(square(0, 0, 100))).toBeCloseTo(400, 9);
  });

  it('runs inside a clockwise hole, and a hole narrower than the bit leaves no path', () => {
    // Hand-worked: a 100 mm square hole, bit centre 3 mm inside each wall: 4 × 94 mm.
    expect(toolPathLength(square(0, 0, 100, false), 6)).toBeCloseTo(376, 6);
    expect(toolPathLength(square(0, 0, 5, false), 6)).toBe(0);
  });

  it('follows a slot notch: round at its mouth, short of the square corners at its bottom', () => {
    // Hand-worked (tool radius compensation, common practice): a 100 mm square with a notch 10 mm wide and
    // 30 mm deep from the top edge, bit r = 3 mm. The six convex corners (four outer, two at the notch's
    // mouth) each add a quarter circle, 6 × 3π/2 = 9π; straight runs keep their length except where they meet
    // the notch's two reflex bottom corners, each of which shortens both its edges by r: walls 30 − 3, bottom
    // 10 − 6. Total 400 + 60 − 12 + 9π mm; the drawn outline is 460 mm.
    const notched: Vec2[] = [
      [0, 0],
      [100, 0],
      [100, 100],
      [50, 100],
      [50, 70],
      [40, 70],
      [40, 100],
      [0, 100],
    ];
    expect(toolPathLength(notched, 6)).toBeCloseTo(448 + 9 * Math.PI, 1);
  });

  it('makes a router sheet take longer than the drawn outline says', () => {
    const laser = estimateSheet({ cut: [square(50, 50, 100)], mark: [] }, machine);
    const router = estimateSheet({ cut: [square(50, 50, 100)], mark: [] }, { ...machine, toolDiameterMm: 6 });
    expect(router.cutLengthMm - laser.cutLengthMm).toBeCloseTo(6 * Math.PI, 1);
    expect(router.seconds - laser.seconds).toBeCloseTo((6 * Math.PI) / machine.cutSpeedMmS, 2);
  });
});

describe('estimateJob', () => {
  it('sums sheets and prices hours and sheets', () => {
    const sheets = [
      { cut: [square(50, 50, 100)], mark: [] },
      { cut: [square(50, 50, 100)], mark: [] },
    ];
    const e = estimateJob(sheets, machine, 12.5);
    const perSheet = 40 + 0.5 + Math.hypot(50, 50) / 100;
    expect(e.cutLengthMm).toBeCloseTo(800, 9);
    expect(e.pierces).toBe(2);
    expect(e.minutes).toBeCloseTo((2 * perSheet) / 60, 9);
    // 36 per hour → 0.01 per second (hand-worked).
    expect(e.machineCost).toBeCloseTo(2 * perSheet * 0.01, 9);
    expect(e.materialCost).toBe(25);
  });
});

describe('orderContours', () => {
  // Outer 200 mm square at the origin with a 100 mm hole; an island inside the hole; a separate square.
  const outer = square(0, 0, 200);
  const hole = square(50, 50, 100, false);
  const island = square(80, 80, 40);
  const apart = square(300, 0, 50);

  it('cuts every contour before the contour enclosing it (checked with polygon-clipping)', () => {
    const contours = [outer, apart, hole, island];
    const { order } = orderContours(contours);
    expect([...order].sort()).toEqual([0, 1, 2, 3]);
    for (let i = 0; i < order.length; i++) {
      for (let j = i + 1; j < order.length; j++) {
        const a = contours[order[i]!]!;
        const b = contours[order[j]!]!;
        // polygon-clipping (independent library): a later contour may not lie inside an earlier one.
        const inter = area(
          polygonClipping.intersection(
            [a.map((p): [number, number] => [p[0], p[1]])],
            [b.map((p): [number, number] => [p[0], p[1]])],
          ),
        );
        const bArea = area(polygonClipping.union([b.map((p): [number, number] => [p[0], p[1]])]));
        const aArea = area(polygonClipping.union([a.map((p): [number, number] => [p[0], p[1]])]));
        expect(inter > 0 && Math.abs(inter - bArea) < 1e-6 && bArea < aArea).toBe(false);
      }
    }
    expect(nestingDepths(contours)).toEqual([0, 0, 1, 2]);
  });

  it('visits free contours nearest first and sums the rapid travel', () => {
    // Hand-worked: from (0, 0) the nearest corner is (10, 0) of the first square; it ends where it started;
    // the next nearest corner is (100, 0) of the second: 90 mm (the third square's nearest corner is
    // (200, 0), 100 mm on). Total 10 + 90 + 100 = 200 mm.
    const r = orderContours([square(200, 0, 20), square(10, 0, 20), square(100, 0, 20)]);
    expect(r.order).toEqual([1, 2, 0]);
    expect(r.travelMm).toBeCloseTo(200, 9);
  });

  it('puts marks before cuts in the working order', () => {
    const seq = sequenceSheet({
      cut: [square(0, 0, 10)],
      mark: [
        [
          [5, 5],
          [6, 5],
        ],
      ],
    });
    expect(seq.marks).toEqual([{ index: 0, reversed: false }]);
    // Hand-worked: origin → mark start (5, 5) = √50; mark end (6, 5) → nearest corner, (10, 0) or (10, 10),
    // both √(4² + 5²) away.
    expect(seq.travelMm).toBeCloseTo(Math.hypot(5, 5) + Math.hypot(4, 5), 9);
  });
});
