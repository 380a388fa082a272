import * as polygonClipping from 'polygon-clipping';
import { buildModel } from '../build';
import { design, cubeSquares45, cubeStars83, octahedronHexagons } from '../test-support/designs';
import { perimeter, pointSegmentDistance, signedArea } from '../math/polygon';
import { nominalSlotWidth, slotRectangle } from './slots';
import { lit, solveTwoSat } from './two-sat';

/** Width across sheet A of sheet B's footprint, measured with polygon-clipping (independent library). */
function footprintWidth(t: number, thetaDeg: number): number {
  // Cross-section perpendicular to the crossing line: sheet A is the strip |y| ≤ t/2, sheet B the same
  // strip turned by θ. A square-cut slot in A must clear B over A's whole thickness.
  const L = 1000;
  const th = (thetaDeg * Math.PI) / 180;
  const strip = (a: number): [number, number][] =>
    (
      [
        [-L, -t / 2],
        [L, -t / 2],
        [L, t / 2],
        [-L, t / 2],
      ] as const
    ).map(([x, y]) => [x * Math.cos(a) - y * Math.sin(a), x * Math.sin(a) + y * Math.cos(a)]);
  const inter = polygonClipping.intersection([strip(0)], [strip(th)]);
  const xs = inter.flatMap((poly) => poly.flatMap((ring) => ring.map((p) => p[0])));
  return Math.max(...xs) - Math.min(...xs);
}

describe('slot width', () => {
  it.each([90, 70.5288, 60, 36, 20])('t·cot(θ/2) matches the cross-section strips at θ = %p°', (theta) => {
    for (const t of [0.5, 3, 6])
      expect(nominalSlotWidth(t, theta, false)).toBeCloseTo(footprintWidth(t, theta), 9);
  });

  it('REFERENCES check values: t at 90°, 1.732 t at 60°, 3.078 t at 36° (derived)', () => {
    expect(nominalSlotWidth(1, 90, false)).toBeCloseTo(1, 12);
    expect(nominalSlotWidth(1, 60, false)).toBeCloseTo(1.732, 3);
    expect(nominalSlotWidth(1, 36, false)).toBeCloseTo(3.078, 3);
  });

  it('reports nominal width + fit for rigid stock and thickness + fit for flexible stock', () => {
    const rigid = buildModel(octahedronHexagons({ fitMm: -0.05 })).report;
    for (const c of rigid.crossings) {
      expect(c.slotWidthMm).toBeCloseTo(footprintWidth(3, c.angleDeg) - 0.05, 5);
      expect(c.drawnSlotWidthMm).toBeCloseTo(c.slotWidthMm - 0.15, 5);
    }
    const card = buildModel(
      octahedronHexagons({ fitMm: 0.05, stock: { thicknessMm: 0.4, flexible: true } }),
    ).report;
    for (const c of card.crossings) expect(c.slotWidthMm).toBeCloseTo(0.45, 9);
  });
});

describe('slot pairs', () => {
  it('cuts each crossing half-way from opposite ends, each slot opening on its own piece edge', () => {
    for (const spec of [octahedronHexagons(), cubeSquares45(), cubeStars83({ depthClearanceMm: 0.5 })]) {
      const m = buildModel(spec);
      expect(m.report.errors).toEqual([]);
      for (const c of m.report.crossings) {
        expect(c.slotDepthMm).toBeCloseTo(c.lengthMm / 2 + (spec.depthClearanceMm ?? 0), 5);
        const [ea, eb] = [c.slotEndA!, c.slotEndB!];
        expect(Math.hypot(ea[0] - eb[0], ea[1] - eb[1], ea[2] - eb[2])).toBeCloseTo(c.lengthMm, 4);
      }
      for (const p of m.pieces) {
        for (const s of p.slots) {
          let d = Infinity;
          p.shape.forEach((q, i) => {
            d = Math.min(d, pointSegmentDistance(s.end, q, p.shape[(i + 1) % p.shape.length]!));
          });
          expect(d).toBeLessThan(1e-7);
        }
      }
    }
  });

  it('where either end would do, each piece takes the half ahead of it with its own centre on its left', () => {
    // Checked from the report alone: for piece a, walking from b's opening toward a's opening must keep
    // a's centre on the left seen from outside (normal up), and likewise for b the other way.
    const r = buildModel(cubeSquares45()).report;
    const byId = new Map(r.pieces.map((p) => [p.id, p]));
    const cross = (u: number[], v: number[]) => [
      u[1]! * v[2]! - u[2]! * v[1]!,
      u[2]! * v[0]! - u[0]! * v[2]!,
      u[0]! * v[1]! - u[1]! * v[0]!,
    ];
    const dot = (u: number[], v: number[]) => u.reduce((s, x, i) => s + x * v[i]!, 0);
    for (const c of r.crossings) {
      for (const [id, from, to] of [
        [c.a, c.slotEndB!, c.slotEndA!],
        [c.b, c.slotEndA!, c.slotEndB!],
      ] as const) {
        const p = byId.get(id)!;
        const walk = to.map((x, i) => x - from[i]!);
        const mid = to.map((x, i) => (x + from[i]!) / 2);
        const toCentre = p.centreMm.map((x, i) => x - mid[i]!);
        expect(dot(cross(p.normal, walk), toCentre)).toBeGreaterThan(0);
      }
    }
  });

  it.each([
    ['octahedron with hexagons', octahedronHexagons()],
    ['cube with squares turned 45°', cubeSquares45()],
    ['cube with {8/3} stars', cubeStars83()],
    [
      'icosahedron with triangles',
      design({ solid: 'icosahedron', piece: { sides: 3, rotationDeg: 60, size: 1.2 } }),
    ],
  ])('symmetric design (%s) gives identical pieces', (_name, spec) => {
    const m = buildModel(spec);
    const signature = (poly: readonly (readonly [number, number])[]) => ({
      area: signedArea(poly).toFixed(3),
      perimeter: perimeter(poly).toFixed(3),
      radii: poly
        .map((q) => Math.hypot(q[0], q[1]).toFixed(3))
        .sort()
        .join(','),
    });
    const first = signature(m.pieces[0]!.outline);
    for (const p of m.pieces) expect(signature(p.outline)).toEqual(first);
  });

  it('a pentagonal antiprism lamp with {5/2} stars (catalogue or uploaded) gives identical pieces per face kind', () => {
    const spec = design({
      solid: 'antiprism-5',
      piece: { sides: 5, step: 2, rotationDeg: 18, size: 0.9 },
      stock: { thicknessMm: 0.5, flexible: true },
    });
    const signature = (poly: readonly (readonly [number, number])[]) =>
      `${signedArea(poly).toFixed(2)}|${perimeter(poly).toFixed(2)}`;
    const byKind = (m: ReturnType<typeof buildModel>) => {
      const kinds = new Map<number, Set<string>>();
      for (const p of m.pieces) {
        const n = m.solid.faces[p.face]!.vertices.length;
        kinds.set(n, (kinds.get(n) ?? new Set()).add(signature(p.outline)));
      }
      return kinds;
    };
    const m = buildModel(spec);
    // The top and bottom stars touch no other piece: they have no slot and would fall out (an error),
    // which does not change the other pieces.
    expect(m.report.errors.map((e) => [e.code, e.pieces])).toEqual([
      ['PIECE.NO_SLOT', ['P1']],
      ['PIECE.NO_SLOT', ['P12']],
    ]);
    for (const set of byKind(m).values()) expect(set.size).toBe(1);
    // The same solid uploaded as OBJ text (scaled, shifted, rounded to 6 decimals) builds the same pieces.
    const obj = m.solid.vertices
      .map((v) => `v ${v.map((c, i) => (c * 37 + i).toFixed(6)).join(' ')}`)
      .join('\n');
    const up = buildModel({ ...spec, solid: { format: 'obj', text: obj } });
    expect([...byKind(up).values()].map((s) => [...s])).toEqual([...byKind(m).values()].map((s) => [...s]));
    expect(up.report.crossings.map((c) => c.lengthMm.toFixed(3)).sort()).toEqual(
      m.report.crossings.map((c) => c.lengthMm.toFixed(3)).sort(),
    );
  });

  it('searches the slot-end choices when the default rule makes slots collide', () => {
    // A pentagonal antiprism with triangles (our own design) where the default rule collides.
    const m = buildModel(
      design({
        solid: 'antiprism-5',
        piece: { sides: 3, rotationDeg: 0, size: 1.2222912360003857 },
        stock: { thicknessMm: 1 },
      }),
    );
    expect(m.slotSearchUsed).toBe(true);
    expect(m.report.errors.filter((e) => e.code === 'SLOT.COLLISION')).toEqual([]);
    // Independent check with polygon-clipping: no two slot rectangles of a piece overlap.
    for (const p of m.pieces) {
      const rects = p.slots.map((s) => [
        slotRectangle({ end: s.end, axis: s.axis, depth: s.depthMm, width: s.widthMm, lead: 0 }, false).map(
          (q) => [q[0], q[1]] as [number, number],
        ),
      ]);
      for (let i = 0; i < rects.length; i++) {
        for (let j = i + 1; j < rects.length; j++) {
          const inter = polygonClipping.intersection(rects[i]!, rects[j]!);
          const area = inter.reduce((s, poly) => s + Math.abs(signedArea(poly[0]!)), 0);
          expect(area).toBeLessThan(1e-6);
        }
      }
    }
  });
});

describe('2-SAT', () => {
  // Reference: exhaustive enumeration of all assignments.
  const brute = (n: number, clauses: [number, number][]) => {
    for (let m = 0; m < 1 << n; m++) {
      const val = (l: number) => (((m >> (l >> 1)) & 1) === 1) === ((l & 1) === 0);
      if (clauses.every(([a, b]) => val(a) || val(b))) return true;
    }
    return false;
  };
  it('agrees with exhaustive search on random formulas, and its assignments satisfy every clause', () => {
    let seed = 12345;
    const rand = (k: number) => {
      seed = (seed * 1103515245 + 12345) % 2147483648;
      return seed % k;
    };
    for (let trial = 0; trial < 300; trial++) {
      const n = 1 + rand(6);
      const clauses: [number, number][] = Array.from({ length: rand(3 * n) }, () => [
        lit(rand(n), rand(2) === 0),
        lit(rand(n), rand(2) === 0),
      ]);
      const sol = solveTwoSat(n, clauses);
      expect(sol !== null).toBe(brute(n, clauses));
      if (sol) {
        const val = (l: number) => sol[l >> 1] === ((l & 1) === 0);
        expect(clauses.every(([a, b]) => val(a) || val(b))).toBe(true);
      }
    }
  });
});

describe('several crossings of one pair along one line', () => {
  // Half-lap (egg-crate) joints go together by sliding the two pieces along their common line (common
  // practice), one way only: where a pair crosses several times along that line, every slot of one piece must
  // face the same way, or the partner would have to move both ways at once.
  /** Piece a's slot directions (3D, unit) per pair with more than one crossing. */
  function slideDirections(spec: ReturnType<typeof design>): number[][][] {
    const model = buildModel(spec);
    const byPair = new Map<string, number[][]>();
    for (const piece of model.pieces) {
      for (const s of piece.slots) {
        const c = model.crossings[s.crossing];
        if (!c || model.pieces[c.a] !== piece) continue;
        const f = piece.frame;
        const d = [0, 1, 2].map((k) => s.axis[0] * (f.x[k] ?? 0) + s.axis[1] * (f.y[k] ?? 0));
        const key = `${c.a}-${c.b}`;
        byPair.set(key, [...(byPair.get(key) ?? []), d]);
      }
    }
    return [...byPair.values()].filter((l) => l.length > 1);
  }
  const cubeStars125 = (rotationDeg: number, size: number) =>
    design({
      solid: 'cube',
      piece: { sides: 12, step: 5, rotationDeg, size },
      scale: { by: 'planeDistance', mm: 60 },
      stock: { thicknessMm: 3, flexible: false },
      machine: { kind: 'laser', kerfMm: 0 },
    });

  it('refuses a pair whose crossings force slots facing opposite ways', () => {
    // {12/5} stars turned 6° on a cube: along each edge line a piece's chord meets two chords of its
    // neighbour, one at each of its ends, so one slot must open at each end of the chord.
    const { report } = buildModel(cubeStars125(6, 1.720166));
    const opposed = report.errors.filter((e) => e.code === 'CROSSING.OPPOSED_SLOTS');
    expect(opposed.length).toBe(12);
    expect(opposed[0]?.pieces).toHaveLength(2);
    // Card can be bent past the second joint: the same design in flexible stock only warns.
    const card = buildModel({
      ...cubeStars125(6, 1.720166),
      stock: { thicknessMm: 0.5, flexible: true },
    }).report;
    expect(card.errors).toEqual([]);
    expect(card.warnings.filter((w) => w.code === 'CROSSING.OPPOSED_SLOTS')).toHaveLength(12);
  });

  it.each([
    [1.5, 1.817698],
    [3, 1.977709],
    [0, 1.242331],
  ])('gives every crossing of a pair the same slide direction (turn %p°, size %p)', (rot, size) => {
    const spec = cubeStars125(rot, size);
    expect(buildModel(spec).report.errors).toEqual([]);
    const pairs = slideDirections(spec);
    expect(pairs.length).toBeGreaterThan(0);
    for (const dirs of pairs) {
      const d0 = dirs[0] as number[];
      for (const d of dirs) expect(d.reduce((sum, x, k) => sum + x * (d0[k] ?? 0), 0)).toBeGreaterThan(0.999);
    }
  });
});
