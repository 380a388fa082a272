import * as polygonClipping from 'polygon-clipping';
import { buildModel } from '../build';
import { cubeSquares45, cubeStars83, design, octahedronHexagons } from '../test-support/designs';
import { dirToFrame, toFrame } from '../pieces/place';
import { getSolid } from '../solids/catalogue';
import { computeCrossings, computePairIntervals, END_ON_EDGE_MM } from './crossings';

/** A catalogue solid written out as OFF text with `decimals` decimals, as a modelling program exports it. */
const offText = (id: string, decimals: number): string => {
  const s = getSolid(id);
  return [
    'OFF',
    `${s.vertices.length} ${s.faces.length} 0`,
    ...s.vertices.map((v) => v.map((x) => x.toFixed(decimals)).join(' ')),
    ...s.faces.map((f) => `${f.vertices.length} ${f.vertices.join(' ')}`),
  ].join('\n');
};

describe('crossings', () => {
  it.each([1.2, 1.5, 2])(
    'cube with squares turned 45°, size %p: one crossing per edge, 2a(s − 1) long, at 90°',
    (s) => {
      // Derived: the top square is |x| + |y| ≤ s·a; on the edge line x = a it spans |y| ≤ a(s − 1).
      const m = buildModel(cubeSquares45(s));
      expect(m.report.crossings).toHaveLength(12);
      for (const c of m.report.crossings) {
        expect(c.angleDeg).toBeCloseTo(90, 9);
        expect(c.lengthMm).toBeCloseTo(2 * 80 * (s - 1), 5);
      }
    },
  );

  it('octahedron with hexagons: crossings at the acute plane angle 180° − 109.4712°', () => {
    // Handbook dihedral angle of the octahedron (REFERENCES.md, from memory).
    const m = buildModel(octahedronHexagons());
    expect(m.report.crossings.length).toBeGreaterThan(0);
    for (const c of m.report.crossings) expect(c.angleDeg).toBeCloseTo(180 - 109.4712, 3);
  });

  it('star pieces meet a neighbour plane in several crossings', () => {
    const m = buildModel(cubeStars83());
    const perPair = new Map<string, number>();
    for (const c of m.report.crossings) perPair.set(`${c.a}-${c.b}`, (perPair.get(`${c.a}-${c.b}`) ?? 0) + 1);
    expect(Math.max(...perPair.values())).toBeGreaterThan(1);
  });

  it("each piece's intervals on a plane line match an independent polygon library", () => {
    // polygon-clipping (an independent general-purpose library): the area of the piece inside a thin
    // band along the line, divided by the band's width, is the total length of the piece's intervals.
    const m = buildModel(cubeStars83());
    const placed = m.pieces.map((p) => ({ frame: p.frame, outline: p.shape }));
    const pairs = computePairIntervals(placed);
    expect(pairs.length).toBeGreaterThan(0);
    const h = 1e-3;
    for (const pair of pairs.slice(0, 6)) {
      for (const [which, ivs] of [
        [pair.a, pair.intervalsA],
        [pair.b, pair.intervalsB],
      ] as const) {
        const fr = placed[which]!.frame;
        const p = toFrame(fr, pair.point);
        const d = dirToFrame(fr, pair.dir);
        const n = [-d[1], d[0]];
        const L = 1e4;
        const band: [number, number][] = [
          [p[0] - L * d[0] - h * n[0]!, p[1] - L * d[1] - h * n[1]!],
          [p[0] + L * d[0] - h * n[0]!, p[1] + L * d[1] - h * n[1]!],
          [p[0] + L * d[0] + h * n[0]!, p[1] + L * d[1] + h * n[1]!],
          [p[0] - L * d[0] + h * n[0]!, p[1] - L * d[1] + h * n[1]!],
        ];
        const shape = placed[which]!.outline.map((q) => [q[0], q[1]] as [number, number]);
        const inter = polygonClipping.intersection([shape], [band]);
        let area = 0;
        for (const poly of inter) {
          for (const [k, ring] of poly.entries()) {
            let a = 0;
            for (let i = 0; i + 1 < ring.length; i++)
              a += ring[i]![0] * ring[i + 1]![1] - ring[i + 1]![0] * ring[i]![1];
            area += (k === 0 ? 1 : -1) * Math.abs(a / 2);
          }
        }
        const total = ivs.reduce((s, [lo, hi]) => s + hi - lo, 0);
        expect(area / (2 * h)).toBeCloseTo(total, 2);
      }
    }
  });

  it("a crossing end within a hundredth of a millimetre of both pieces' edges lies on both", () => {
    // Two unit squares of 40 mm crossing at 90° whose chords on the common line differ by 2 µm at each end.
    const frame = (
      normal: [number, number, number],
      x: [number, number, number],
      y: [number, number, number],
    ) => ({
      face: 0,
      normal,
      distance: 0,
      centre: [0, 0, 0] as [number, number, number],
      x,
      y,
    });
    const square = (half: number): [number, number][] => [
      [-half, -half],
      [half, -half],
      [half, half],
      [-half, half],
    ];
    const [c] = computeCrossings([
      { frame: frame([0, 0, 1], [1, 0, 0], [0, 1, 0]), outline: square(20) },
      { frame: frame([0, 1, 0], [1, 0, 0], [0, 0, 1]), outline: square(20 + 0.002) },
    ]);
    expect(END_ON_EDGE_MM).toBeGreaterThan(0.002);
    expect(c!.endOnA).toEqual([true, true]);
    expect(c!.endOnB).toEqual([true, true]);
  });

  it('counts an overlap as a crossing only past 1 µm: pieces that barely touch hold nothing', () => {
    // A 40 mm square in the plane z = 0, centred on the origin, and one in the plane x = 0 centred at
    // y = 40 − overlap: their chords on the common line (the y axis) overlap by `overlap`, from 20 − overlap
    // to 20. 0.5 µm is no crossing, 2 µm is one.
    const square: [number, number][] = [
      [-20, -20],
      [20, -20],
      [20, 20],
      [-20, 20],
    ];
    const crossingsAt = (overlapMm: number) =>
      computeCrossings([
        {
          frame: { face: 0, normal: [0, 0, 1], distance: 0, centre: [0, 0, 0], x: [1, 0, 0], y: [0, 1, 0] },
          outline: square,
        },
        {
          frame: {
            face: 1,
            normal: [1, 0, 0],
            distance: 0,
            centre: [0, 40 - overlapMm, 0],
            x: [0, 1, 0],
            y: [0, 0, 1],
          },
          outline: square,
        },
      ]);
    expect(crossingsAt(0.0005)).toEqual([]);
    const [c] = crossingsAt(0.002);
    expect(c!.length).toBeCloseTo(0.002, 9);
  });

  it.each([
    // Designs where crossing ends of the exact solid coincide; before the edge tolerance, rounding the
    // solid to 6 decimals turned some of them into "cannot be slid together" errors (found by a seeded
    // comparison of 300 random designs, catalogue against uploaded copy).
    ['antiprism-9', { sides: 3, step: 1, rotationDeg: 40, size: 0.626 }],
    ['icosidodecahedron', { sides: 6, step: 1, rotationDeg: 90, size: 1.006 }],
    ['icosahedron', { sides: 4, step: 1, rotationDeg: 330, size: 0.741 }],
  ] as const)('%s uploaded as OFF with 6 decimals gives the report of the catalogue solid', (id, piece) => {
    const common = { piece, scale: { by: 'diameter' as const, mm: 300 } };
    const exact = buildModel(design({ ...common, solid: id }));
    const uploaded = buildModel(design({ ...common, solid: { format: 'off', text: offText(id, 6) } }));
    const codes = (m: typeof exact) => m.report.errors.map((e) => e.code).sort();
    expect(codes(uploaded)).toEqual(codes(exact));
    expect(uploaded.crossings.length).toBe(exact.crossings.length);
    const slots = (m: typeof exact) => m.pieces.reduce((n, p) => n + p.slots.length, 0);
    expect(slots(uploaded)).toBe(slots(exact));
  });
});
