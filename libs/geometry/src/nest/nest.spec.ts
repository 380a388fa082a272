import * as polygonClipping from 'polygon-clipping';
import { mergeCongruent, nestParts, type NestInput, type NestResult } from './nest';
import { runNestCommand } from './nest-command';
import { GeometryCache } from './variants';
import { area, box, boundaryDistance, mpArea, type P, placed, regular, star } from '../test-support/polygons';

// ---------- Shapes built here ----------

/** A finely sampled wavy closed curve: radius R·(1 + a·sin(lobes·θ)), n vertices (half of them reflex). */
function wavy(n: number, R: number, a: number, lobes: number): P[] {
  return Array.from({ length: n }, (_, i) => {
    const t = (2 * Math.PI * i) / n;
    const r = R * (1 + a * Math.sin(lobes * t));
    return [r * Math.cos(t), r * Math.sin(t)] as P;
  });
}

/** Cuts a slot of width w and depth d from tip vertex i of a CCW star outline toward the centre. */
function withSlot(outline: P[], tip: number, w: number, d: number): P[] {
  const n = outline.length;
  const t = outline[tip]!;
  const prev = outline[(tip - 1 + n) % n]!;
  const next = outline[(tip + 1) % n]!;
  const r = Math.hypot(t[0], t[1]);
  const u: P = [-t[0] / r, -t[1] / r]; // toward the centre
  const side: P = [-u[1], u[0]];
  const unit = (p: P): P => {
    const l = Math.hypot(p[0] - t[0], p[1] - t[1]);
    return [(p[0] - t[0]) / l, (p[1] - t[1]) / l];
  };
  const up = unit(prev);
  const un = unit(next);
  const sinHalf = Math.abs(up[0] * u[1] - up[1] * u[0]); // sine of half the tip angle
  const along = w / 2 / sinHalf;
  const onPrev: P = [t[0] + up[0] * along, t[1] + up[1] * along];
  const onNext: P = [t[0] + un[0] * along, t[1] + un[1] * along];
  const sgn = up[0] * side[0] + up[1] * side[1] > 0 ? 1 : -1;
  const deep = (s: number): P => [
    t[0] + u[0] * d + side[0] * s * (w / 2),
    t[1] + u[1] * d + side[1] * s * (w / 2),
  ];
  return [...outline.slice(0, tip), onPrev, deep(sgn), deep(-sgn), onNext, ...outline.slice(tip + 1)];
}

/** Cuts a rectangular notch w wide and d deep into the middle of edge i (CCW outline), square to the edge. */
function withEdgeNotch(outline: P[], i: number, w: number, d: number): P[] {
  const a = outline[i]!;
  const b = outline[(i + 1) % outline.length]!;
  const l = Math.hypot(b[0] - a[0], b[1] - a[1]);
  const e: P = [(b[0] - a[0]) / l, (b[1] - a[1]) / l];
  const n: P = [-e[1], e[0]]; // inward for a CCW outline
  const m: P = [(a[0] + b[0]) / 2, (a[1] + b[1]) / 2];
  const at = (s: number, depth: number): P => [
    m[0] + e[0] * s * (w / 2) + n[0] * depth,
    m[1] + e[1] * s * (w / 2) + n[1] * depth,
  ];
  return [...outline.slice(0, i + 1), at(-1, 0), at(-1, d), at(1, d), at(1, 0), ...outline.slice(i + 1)];
}

/** The outline turned by deg about the origin and shifted by (dx, dy), as a model's pieces arrive. */
function moved(outline: P[], deg: number, dx: number, dy: number): P[] {
  const t = (deg * Math.PI) / 180;
  return outline.map(([x, y]) => [
    x * Math.cos(t) - y * Math.sin(t) + dx,
    x * Math.sin(t) + y * Math.cos(t) + dy,
  ]);
}

/** Checks every sheet: inside the sheet less margin, no overlap, pairwise distance ≥ gap (tolerance 2 µm). */
function checkLayout(input: NestInput, result: NestResult): void {
  if (!result.ok) throw new Error(result.error.message);
  const outlines = new Map(input.parts.map((p) => [p.id, p.outline as P[]]));
  const m = input.marginMm;
  const { widthMm: W, heightMm: H } = input.sheet;
  const usable: P[] = [
    [m, m],
    [W - m, m],
    [W - m, H - m],
    [m, H - m],
  ];
  const counts = new Map<string, number>();
  for (const sheet of result.sheets) {
    const polys = sheet.placements.map((pl) => placed(outlines.get(pl.part)!, pl.x, pl.y, pl.rotationDeg));
    sheet.placements.forEach((pl) => counts.set(pl.part, (counts.get(pl.part) ?? 0) + 1));
    for (const p of polys) {
      const outside = mpArea(polygonClipping.difference([p], [usable]));
      expect(outside).toBeLessThan(1e-3);
      const b = box(p);
      expect(b.minX).toBeGreaterThanOrEqual(m - 2e-3);
      expect(b.maxX).toBeLessThanOrEqual(W - m + 2e-3);
    }
    const boxes = polys.map(box);
    for (let i = 0; i < polys.length; i++)
      for (let j = i + 1; j < polys.length; j++) {
        const a = boxes[i]!;
        const b = boxes[j]!;
        const g = input.gapMm;
        if (a.maxX + g < b.minX || b.maxX + g < a.minX || a.maxY + g < b.minY || b.maxY + g < a.minY)
          continue;
        const overlap = mpArea(polygonClipping.intersection([polys[i]!], [polys[j]!]));
        expect(overlap).toBeLessThan(1e-6);
        if (g > 0) expect(boundaryDistance(polys[i]!, polys[j]!)).toBeGreaterThanOrEqual(g - 2e-3);
      }
    // Reported utilisation is the pieces' area over the sheet area.
    const a = polys.reduce((s, p) => s + area(p), 0);
    expect(sheet.utilisation).toBeCloseTo(a / (W * H), 4);
  }
  for (const p of input.parts) expect(counts.get(p.id) ?? 0).toBe(p.quantity);
}

/** An axis-aligned rectangle, counter-clockwise. */
function box4(x: number, y: number, w: number, h: number): P[] {
  return [
    [x, y],
    [x + w, y],
    [x + w, y + h],
    [x, y + h],
  ];
}

function firstSheetCount(r: NestResult): number {
  return r.ok ? (r.sheets[0]?.placements.length ?? 0) : -1;
}

// ---------- Tests ----------
describe('nestParts — true shape', () => {
  it('puts at least 40 equilateral triangles (side 100) on a 600 × 400 sheet with a 3 mm gap (REFERENCES: rows of alternating triangles give 40, bounding boxes 20)', () => {
    const input: NestInput = {
      sheet: { widthMm: 600, heightMm: 400 },
      marginMm: 0,
      gapMm: 3,
      parts: [{ id: 'tri', outline: regular(3, 100 / Math.sqrt(3)), quantity: 40 }],
    };
    const r = nestParts(input);
    checkLayout(input, r);
    expect(r.ok && r.totals.sheetCount).toBe(1); // all 40 on one sheet
    expect(firstSheetCount(r)).toBe(40);
  });

  it('puts 15 decagons (circumradius 60) on a 600 × 400 sheet with a 3 mm gap (REFERENCES: 15 whichever way)', () => {
    const input: NestInput = {
      sheet: { widthMm: 600, heightMm: 400 },
      marginMm: 0,
      gapMm: 3,
      parts: [{ id: 'dec', outline: regular(10, 60), quantity: 15 }],
    };
    const r = nestParts(input);
    checkLayout(input, r);
    expect(r.ok && r.totals.sheetCount).toBe(1);
    expect(firstSheetCount(r)).toBe(15);
  });

  it.each([0, 27])(
    'puts 16 decagons on that sheet whichever way the outline is drawn (first vertex at %p°)',
    (startDeg) => {
      // Rows of 4 staggered by half a period fit 4 rows when the period is stretched to the sheet (pattern.ts,
      // stretchedLattices); before, the count depended on how the outline happened to be drawn (15 or 16).
      const outline = regular(10, 60, startDeg);
      const input: NestInput = {
        sheet: { widthMm: 600, heightMm: 400 },
        marginMm: 0,
        gapMm: 3,
        parts: [{ id: 'dec', outline, quantity: 30 }],
      };
      const r = nestParts(input);
      checkLayout(input, r);
      expect(firstSheetCount(r)).toBe(16);
    },
  );

  it('nests slotted {8/3} and {5/2} stars given clockwise, with a margin, without overlap', () => {
    const s83 = withSlot(withSlot(star(8, 3, 70), 4, 3, 20), 0, 3, 20);
    const s52 = withSlot(withSlot(star(5, 2, 50), 4, 3, 12), 0, 3, 12).reverse(); // clockwise
    const input: NestInput = {
      sheet: { widthMm: 600, heightMm: 400 },
      marginMm: 8,
      gapMm: 2,
      parts: [
        { id: 'star83', outline: s83, quantity: 7 },
        { id: 'star52', outline: s52, quantity: 9 },
      ],
    };
    const r = nestParts(input);
    checkLayout(input, r);
    // Bounding boxes alone: 140×140 and 95×90 boxes → at most 4×2 + … fewer pieces per sheet than true shape.
    expect(r.ok && r.totals.sheetCount).toBeLessThanOrEqual(2);
  });

  it('keeps each colour group on its own sheets and honours fixed rotations', () => {
    const sq = regular(4, 30, 45);
    const input: NestInput = {
      sheet: { widthMm: 300, heightMm: 200 },
      marginMm: 5,
      gapMm: 1,
      rotationsDeg: [0],
      parts: [
        { id: 'red-tri', outline: regular(3, 40), quantity: 5, group: 'red' },
        { id: 'blue-sq', outline: sq, quantity: 6, group: 'blue' },
      ],
    };
    const r = nestParts(input);
    checkLayout(input, r);
    if (!r.ok) return;
    for (const s of r.sheets) {
      expect(new Set(s.partIds).size).toBe(1);
      expect(s.partIds[0]!.startsWith(s.group)).toBe(true);
      for (const p of s.placements) expect(p.rotationDeg).toBe(0);
    }
    expect(r.totals.sheetsByGroup).toEqual({ red: 1, blue: 1 });
  });

  it('pairs a star with its turned copy when the list gives that copy as a congruent rotation', () => {
    // A {5/2} star turned 60° is the star turned 24° + 180° (its symmetry is 72°): with rotations [24, 60] the
    // pattern pass must still try the point-symmetric pair, drawn at the allowed 60°. Before, it looked for
    // 204° literally and left the pair out.
    const run = (rotationsDeg: number[]) => {
      const input: NestInput = {
        sheet: { widthMm: 600, heightMm: 400 },
        marginMm: 0,
        gapMm: 3,
        parts: [{ id: 's', outline: star(5, 2, 60), quantity: 60, rotationsDeg }],
      };
      const r = nestParts(input);
      checkLayout(input, r);
      return r;
    };
    const paired = run([24, 60]);
    if (!paired.ok) throw new Error('no layout');
    expect(paired.totals.groups[0]!.method).toMatch(/double lattice (24°\/60°|60°\/24°)/);
    for (const sheet of paired.sheets)
      for (const p of sheet.placements) expect([24, 60]).toContain(p.rotationDeg);
    // More on a sheet than either rotation alone.
    expect(firstSheetCount(paired)).toBeGreaterThan(
      Math.max(firstSheetCount(run([24])), firstSheetCount(run([60]))),
    );
  });

  it('gives congruent pieces of three colours the same lattice, each placement under its own part', () => {
    // One slotted {7/2} star shape in three colour groups: the pattern is searched once and reused, so every
    // colour's first sheet holds as many as a single colour laid out alone.
    const s72 = withSlot(withSlot(star(7, 2, 45), 6, 3, 12), 0, 3, 12);
    const sheet = { widthMm: 400, heightMm: 300 };
    const alone = nestParts({
      sheet,
      marginMm: 0,
      gapMm: 3,
      parts: [{ id: 'x', outline: s72, quantity: 24 }],
    });
    const input: NestInput = {
      sheet,
      marginMm: 0,
      gapMm: 3,
      parts: ['red', 'green', 'blue'].map((g) => ({ id: `${g}-star`, outline: s72, quantity: 24, group: g })),
    };
    const r = nestParts(input);
    checkLayout(input, r);
    if (!r.ok || !alone.ok) throw new Error('layout failed');
    for (const g of ['red', 'green', 'blue']) {
      const first = r.sheets.find((s) => s.group === g)!;
      expect(first.placements.every((p) => p.part === `${g}-star`)).toBe(true);
      expect(first.placements.length).toBe(firstSheetCount(alone));
    }
  });

  it('lays out one copy each of 24 congruent notched triangles given turned and shifted, two colours', () => {
    // Equilateral triangles of side 100 with 9 mm × 25 mm notches on different edges: one NFP shape (the hull)
    // is shared by all of them; the placements are still checked against the true notched outlines.
    const tri = regular(3, 100 / Math.sqrt(3));
    const parts = Array.from({ length: 24 }, (_, k) => {
      let o = tri;
      for (let e = 2; e >= 0; e--) if ((k >> e) & 1 || e === k % 3) o = withEdgeNotch(o, e, 9, 25);
      return { id: `t${k}`, outline: moved(o, 17 * k, 5 * k, -3 * k), quantity: 1, group: `c${k % 2}` };
    });
    const input: NestInput = { sheet: { widthMm: 600, heightMm: 400 }, marginMm: 5, gapMm: 3, parts };
    const r = nestParts(input);
    checkLayout(input, r);
    // 12 triangles per colour: far below the 35 per sheet of REFERENCES' simple true-shape placer.
    expect(r.ok && r.totals.sheetsByGroup).toEqual({ c0: 1, c1: 1 });
    const cache = new GeometryCache(
      parts.map((p, index) => ({
        index,
        id: p.id,
        group: p.group,
        quantity: 1,
        outline: p.outline,
        areaMm2: area(p.outline),
        rotationsDeg: [0],
        patternRotationsDeg: [0],
      })),
      3,
    );
    expect(cache.shapeCount).toBe(1);
  });

  it("nests a model's congruent pieces, one copy each, like copies of one part", () => {
    // A built model gives each piece as its own part, turned and shifted into its face's frame. Counted
    // together they must lay out as well as one part with that quantity (the pattern pass needs copies).
    const hex = [4, 2, 0].reduce((o, e) => withEdgeNotch(o, e, 3.2, 40), regular(6, 60));
    const s52 = withSlot(withSlot(star(5, 2, 50), 4, 3, 15), 0, 3, 15);
    const tri = withEdgeNotch(regular(3, 100 / Math.sqrt(3)), 1, 9, 25);
    for (const [outline, n] of [
      [hex, 24],
      [s52, 30],
      [tri, 45],
    ] as const) {
      const sheet = { widthMm: 600, heightMm: 400 };
      const together = nestParts({
        sheet,
        marginMm: 5,
        gapMm: 3,
        parts: [{ id: 'x', outline, quantity: n }],
      });
      const parts = Array.from({ length: n }, (_, k) => ({
        id: `p${k}`,
        outline: moved(outline, (k * 137) % 360, 40 * k - 300, 17 - 9 * k),
        quantity: 1,
      }));
      const input: NestInput = { sheet, marginMm: 5, gapMm: 3, parts };
      const apart = nestParts(input);
      checkLayout(input, apart);
      if (!apart.ok || !together.ok) throw new Error('layout failed');
      expect(apart.totals.sheetCount).toBe(together.totals.sheetCount);
      expect(firstSheetCount(apart)).toBe(firstSheetCount(together));
    }
  });

  it('puts four slotted hexagons on the sheet whose 2 × 2 grid of their bounding boxes fits', () => {
    // Hexagons of circumradius 103.92 turned to stand on a vertex are 180 × 207.85 mm: on 500 × 450 with a
    // 8 mm margin and a 4 mm gap, 2 × 180 + 4 ≤ 484 and 2 × 207.85 + 4 ≤ 434 (arithmetic), so a bounding-box
    // packer holds all four. Greedy bottom-left fill tucked the third into the first two and left 122 mm.
    const hex = [4, 2, 0].reduce((o, e) => withEdgeNotch(o, e, 3.2, 60), regular(6, 103.92, 0));
    const parts = [0, 1, 2, 3].map((k) => ({
      id: `P${k + 1}`,
      outline: moved(hex, 60 * k + 15, 10 * k, -20 * k),
      quantity: 1,
    }));
    const input: NestInput = { sheet: { widthMm: 500, heightMm: 450 }, marginMm: 8, gapMm: 4, parts };
    const r = nestParts(input);
    checkLayout(input, r);
    expect(r.ok && r.totals.sheetCount).toBe(1);
  });

  it('puts seven 190 mm {8/3} stars on a 600 × 400 sheet, where grids and lattices hold six, saving a sheet of twenty', () => {
    // Stars of circumradius 95: their 3 × 2 grid of bounding boxes fills 590 × 390 (arithmetic: a fourth
    // column needs 4 × 190 + 3 × 3 > 590, a third row 3 × 190 + 2 × 3 > 390), and the lattice and bottom-left
    // fill also put six on a sheet: twenty need four sheets. Interlocked near the edges, seven fit (found by
    // the overlap search; checked here with polygon-clipping): three sheets.
    const input: NestInput = {
      sheet: { widthMm: 600, heightMm: 400 },
      marginMm: 5,
      gapMm: 3,
      parts: [{ id: 's83', outline: star(8, 3, 95), quantity: 20 }],
    };
    const r = nestParts(input);
    checkLayout(input, r);
    expect(r.ok && r.totals.sheetCount).toBe(3);
    expect(firstSheetCount(r)).toBe(7);
    expect(r.ok && r.totals.groups[0]!.method).toMatch(/overlap search/);
  });

  it('lays slotted stars that differ in their slots seven to a sheet on their common envelope, in two colours', () => {
    const base = star(8, 3, 96);
    const parts = Array.from({ length: 28 }, (_, k) => ({
      id: `S${k + 1}`,
      outline: moved(withSlot(base, 2 * (k % 8), 3.2, 30), 45 * k + 10, 5 * k, -3 * k),
      envelope: moved(base, 45 * k + 10, 5 * k, -3 * k),
      quantity: 1,
      group: k % 2 === 0 ? 'red' : 'blue',
    }));
    const input: NestInput = { sheet: { widthMm: 600, heightMm: 400 }, marginMm: 5, gapMm: 3, parts };
    const r = nestParts(input);
    checkLayout(input, r);
    // 14 per colour: two sheets each at seven a sheet (three at six).
    expect(r.ok && r.totals.sheetsByGroup).toEqual({ red: 2, blue: 2 });
    expect(r.ok && r.totals.groups.map((g) => g.method)).toEqual([
      expect.stringMatching(/overlap search, 7 per sheet/),
      expect.stringMatching(/overlap search, 7 per sheet/),
    ]);
  });

  it('shares a last sheet out over the others for a group of two shapes: eight triangles and a pentagon on one sheet', () => {
    // Triangles of circumradius 150 and a pentagon of circumradius 100 on 444 × 881 with a 3 mm gap: their
    // lattice and bottom-left fill leave the pentagon alone on a second sheet; the overlap search makes room
    // for it among the triangles (checked here with polygon-clipping).
    const input: NestInput = {
      sheet: { widthMm: 444, heightMm: 881 },
      marginMm: 0,
      gapMm: 3,
      parts: [
        { id: 'tri', outline: regular(3, 150), quantity: 8 },
        { id: 'pent', outline: regular(5, 100), quantity: 1 },
      ],
    };
    const r = nestParts(input);
    checkLayout(input, r);
    expect(r.ok && r.totals.sheetCount).toBe(1);
    expect(r.ok && r.totals.groups[0]!.method).toMatch(/last sheet shared out by the overlap search/);
  });

  it('lays pieces that differ only in their notches on one lattice of their common envelope', () => {
    // Equilateral triangles of side 100 (our own test shape) with 3.2 mm notches on one, two or three of their
    // edges, as a model's pieces differ by where their slots are: 14 copies of each of the three, given
    // turned and shifted. With the unnotched triangle as envelope the 42 share the triangle's double lattice
    // (44 fit, see the first test) on one sheet, each placement under its own part; without, they take two.
    const tri = regular(3, 100 / Math.sqrt(3));
    const notched = [[0], [1, 0], [2, 1, 0]].map((edges) =>
      edges.reduce((o, e) => withEdgeNotch(o, e, 3.2, 10), tri),
    );
    const parts = notched.flatMap((o, k) =>
      Array.from({ length: 14 }, (_, c) => ({
        id: `N${k}-${c}`,
        outline: moved(o, 40 * c + 7 * k, 3 * c, -5 * k),
        envelope: moved(tri, 40 * c + 7 * k, 3 * c, -5 * k),
        quantity: 1,
      })),
    );
    const input: NestInput = { sheet: { widthMm: 600, heightMm: 400 }, marginMm: 0, gapMm: 3, parts };
    const r = nestParts(input);
    checkLayout(input, r);
    expect(r.ok && r.sheets.map((x) => x.placements.length)).toEqual([42]);
    expect(r.ok && r.totals.groups[0]!.method).toMatch(/^pattern \(N0-0: double lattice/);
    const alone = nestParts({ ...input, parts: parts.map(({ envelope: _e, ...p }) => p) });
    checkLayout(input, alone);
    // Without envelopes (measured): 41 + 1 on two sheets.
    expect(alone.ok && alone.totals.sheetCount).toBe(2);
  });

  it('ignores an envelope that does not contain its outline', () => {
    const square: P[] = [
      [0, 0],
      [60, 0],
      [60, 60],
      [0, 60],
    ];
    const input: NestInput = {
      sheet: { widthMm: 300, heightMm: 200 },
      marginMm: 5,
      gapMm: 3,
      parts: [{ id: 'sq', outline: square, quantity: 12 }],
    };
    const plain = nestParts(input);
    const smaller = nestParts({
      ...input,
      parts: [{ ...input.parts[0]!, envelope: square.map(([x, y]) => [x * 0.9, y * 0.9] as P) }],
    });
    checkLayout(input, smaller);
    expect(smaller).toEqual(plain);
  });

  it('counts turned copies of a part together, but not its mirror image, whatever the order', () => {
    // A chiral outline (a flag: pole and pennant) and its mirror image have the same area and vertex count.
    const flag: P[] = [
      [0, 0],
      [10, 0],
      [10, 60],
      [40, 75],
      [10, 90],
      [0, 90],
    ];
    const mirror = flag.map(([x, y]) => [-x, y] as P).reverse();
    const prepared = [
      mirror,
      flag,
      moved(flag, 130, 7, 9),
      moved(mirror, 250, -4, 3),
      moved(flag, 300, 1, 1),
    ].map((outline, index) => ({
      index,
      id: `f${index}`,
      group: 'g',
      quantity: 1,
      outline,
      areaMm2: area(outline),
      rotationsDeg: [0],
      patternRotationsDeg: [0],
      freeRotation: true,
    }));
    const { nesting, members } = mergeCongruent(prepared);
    expect(nesting.map((p) => [p.index, p.quantity])).toEqual([
      [0, 2],
      [1, 3],
    ]);
    expect(members.get('g|0')!.map((m) => m.partIndex)).toEqual([0, 3]);
    expect(members.get('g|1')!.map((m) => m.partIndex)).toEqual([1, 2, 4]);
    // Each member is its class's first outline turned by θ and shifted by o (the turns given above).
    const turn = (deg: number) => ((deg % 360) + 360) % 360;
    expect(turn(members.get('g|1')![1]!.thetaDeg)).toBeCloseTo(130, 6);
    expect(turn(members.get('g|0')![1]!.thetaDeg)).toBeCloseTo(250, 6);
    // In another colour group the same shape is nested under the first part's index and outline.
    const other = mergeCongruent([
      ...prepared,
      { ...prepared[1]!, index: 5, id: 'f5', group: 'h', outline: moved(flag, 45, 0, 0) },
    ]);
    expect(other.nesting.map((p) => [p.group, p.index, p.quantity])).toEqual([
      ['g', 0, 2],
      ['g', 1, 3],
      ['h', 1, 1],
    ]);
    expect(turn(other.members.get('h|1')![0]!.thetaDeg)).toBeCloseTo(45, 6);
  });

  it('keeps congruent parts apart when fixed rotation lists would turn them differently', () => {
    // With fixed lists the angles are in each part's own frame: a copy drawn turned by 90° may not be laid
    // at the first part's angles, so it is nested as its own part.
    const rect: P[] = [
      [0, 0],
      [200, 0],
      [200, 50],
      [0, 50],
    ];
    const input: NestInput = {
      sheet: { widthMm: 600, heightMm: 400 },
      marginMm: 0,
      gapMm: 2,
      rotationsDeg: [0],
      parts: [
        { id: 'flat', outline: rect, quantity: 3 },
        { id: 'upright', outline: moved(rect, 90, 0, 0), quantity: 3 },
        { id: 'flat-too', outline: moved(rect, 0, 30, 40), quantity: 2 },
      ],
    };
    const r = nestParts(input);
    checkLayout(input, r);
    if (!r.ok) throw new Error(r.error.message);
    for (const s of r.sheets) for (const pl of s.placements) expect(pl.rotationDeg).toBe(0);
  });

  it('places a congruent part exactly where its class was laid, when the class outline lies far from its origin', () => {
    // The reported angle is rounded to 1e-6°; a shift worked out about the part's own origin then misses by
    // that angle times the distance to the origin: up to 999 km · √2 · 5e-7° ≈ 12 µm (arithmetic). Two
    // 100 × 50 mm rectangles exactly fill a 200 × 50 mm sheet with no margin or gap, so any miss leaves the
    // sheet or overlaps. What remains is the rounding times the part's own size (111 mm · 8.7e-9 ≈ 1 nm).
    const rect = box4(0, 0, 100, 50);
    const input: NestInput = {
      sheet: { widthMm: 200, heightMm: 50 },
      marginMm: 0,
      gapMm: 0,
      parts: [
        { id: 'far', outline: box4(999000, 999000, 100, 50), quantity: 1 },
        { id: 'turned', outline: moved(rect, 33.3333333, 0, 0), quantity: 1 },
      ],
    };
    const r = nestParts(input);
    if (!r.ok) throw new Error(r.error.message);
    const polys = r.sheets[0]!.placements.map((pl) =>
      placed(input.parts.find((p) => p.id === pl.part)!.outline as P[], pl.x, pl.y, pl.rotationDeg),
    );
    expect(polys).toHaveLength(2);
    for (const p of polys) {
      const b = box(p);
      expect(b.minX).toBeGreaterThanOrEqual(-1e-5);
      expect(b.minY).toBeGreaterThanOrEqual(-1e-5);
      expect(b.maxX).toBeLessThanOrEqual(200 + 1e-5);
      expect(b.maxY).toBeLessThanOrEqual(50 + 1e-5);
    }
    // polygon-clipping: a 1 nm sliver along the 50 mm edge is 5e-5 mm².
    expect(mpArea(polygonClipping.intersection([polys[0]!], [polys[1]!]))).toBeLessThan(1e-4);
  });

  it('closes a slot narrower than twice the gap but still fits a part into a wide pocket', () => {
    // A U of 200 × 100 with a 60 × 80 pocket and a 2 mm slot in its base: two 30 mm squares fit only in the
    // pocket on a 206 × 106 sheet (derived: 60 − 2·3 = 54 ≥ 30 across, 80 − 3 = 77 ≥ 2·30 + 3 deep).
    const u: P[] = [
      [0, 0],
      [90, 0],
      [90, 15],
      [92, 15],
      [92, 0],
      [200, 0],
      [200, 100],
      [130, 100],
      [130, 20],
      [70, 20],
      [70, 100],
      [0, 100],
    ];
    const sq: P[] = [
      [0, 0],
      [30, 0],
      [30, 30],
      [0, 30],
    ];
    const input: NestInput = {
      sheet: { widthMm: 206, heightMm: 106 },
      marginMm: 0,
      gapMm: 3,
      rotationsDeg: [0],
      parts: [
        { id: 'u', outline: u, quantity: 1 },
        { id: 'sq', outline: sq, quantity: 2 },
      ],
    };
    const r = nestParts(input);
    checkLayout(input, r);
    expect(r.ok && r.totals.sheetCount).toBe(1);
  });

  it('nests a finely sampled wavy outline (384 vertices, 192 reflex corners) with its copies and a square', () => {
    const input: NestInput = {
      sheet: { widthMm: 500, heightMm: 300 },
      marginMm: 5,
      gapMm: 3,
      parts: [
        { id: 'wavy', outline: moved(wavy(384, 60, 0.15, 12), 10, 400, -250), quantity: 6 },
        { id: 'square', outline: regular(4, 40, 45), quantity: 2 },
      ],
    };
    const r = nestParts(input);
    checkLayout(input, r);
    // Area bound: 6 × 11,670 mm² + 2 × 3,200 mm² fits one 150,000 mm² sheet (not a density bound).
    expect(r.ok && r.totals.sheetCount).toBeLessThanOrEqual(2);
  });

  it('lays out seeded random mixes of awkward outlines validly: curves, slivers, combs, collinear points, far origins', () => {
    // A small linear congruential generator (constants of Numerical Recipes), so every run sees the same cases.
    let seed = 20261202;
    const rnd = () => (seed = (seed * 1664525 + 1013904223) % 4294967296) / 4294967296;
    const kinds: ((R: number) => P[])[] = [
      (R) => wavy(200 + Math.floor(rnd() * 200), R, 0.1 + 0.1 * rnd(), 5 + Math.floor(rnd() * 10)),
      (R) => {
        const n = 5 + Math.floor(rnd() * 30);
        return Array.from({ length: n }, (_, i) => {
          const t = (2 * Math.PI * i) / n;
          const r = R * (0.35 + 0.65 * rnd());
          return [r * Math.cos(t), r * Math.sin(t)] as P;
        });
      },
      (R) => [
        [0, 0],
        [3 * R, 0],
        [3 * R, 2 + 2 * rnd()],
        [0, 2 + 2 * rnd()],
      ],
      (R) => {
        const teeth = 2 + Math.floor(rnd() * 5);
        const w = R / teeth;
        const pts: P[] = [
          [0, 0],
          [R, 0],
        ];
        for (let i = teeth; i > 0; i--)
          pts.push([i * w, R], [i * w - w / 2, R], [i * w - w / 2, 0.3 * R], [(i - 1) * w, 0.3 * R]);
        return pts;
      },
      (R) => [
        [0, 0],
        [R / 2, 0],
        [R, 0],
        [R, R / 3],
        [R, R],
        [R, R],
        [0, R],
      ],
    ];
    for (let c = 0; c < kinds.length; c++) {
      const parts = Array.from({ length: 2 + Math.floor(rnd() * 3) }, (_, i) => {
        // Every kind comes up: case c starts at kind c.
        let outline = kinds[(c + i) % kinds.length]!(15 + rnd() * 45);
        if (rnd() < 0.5) outline = [...outline].reverse();
        return {
          id: `c${c}p${i}`,
          outline: moved(outline, rnd() * 360, (rnd() - 0.5) * 600, (rnd() - 0.5) * 600),
          quantity: 1 + Math.floor(rnd() * 14),
        };
      });
      const input: NestInput = {
        sheet: { widthMm: 300 + rnd() * 500, heightMm: 300 + rnd() * 500 },
        marginMm: rnd() * 10,
        gapMm: 0.5 + rnd() * 5,
        parts,
      };
      checkLayout(input, nestParts(input));
    }
  });

  it('fits squares and rectangles exactly: 24 squares of 100 mm on 600 × 400 with no gap, 12 of 50 × 30 on 219 × 106 with margin 5 and gap 3 (arithmetic)', () => {
    const square: P[] = [
      [0, 0],
      [100, 0],
      [100, 100],
      [0, 100],
    ];
    const exact: NestInput = {
      sheet: { widthMm: 600, heightMm: 400 },
      marginMm: 0,
      gapMm: 0,
      parts: [{ id: 'sq', outline: square, quantity: 30 }],
    };
    const r = nestParts(exact);
    checkLayout(exact, r);
    expect(firstSheetCount(r)).toBe(24);
    // 4 × 50 + 3 × 3 = 209 = 219 − 2 × 5 and 3 × 30 + 2 × 3 = 96 = 106 − 2 × 5: one sheet, no slack.
    const rect: P[] = [
      [0, 0],
      [50, 0],
      [50, 30],
      [0, 30],
    ];
    const snug: NestInput = {
      sheet: { widthMm: 219, heightMm: 106 },
      marginMm: 5,
      gapMm: 3,
      parts: [{ id: 'r', outline: moved(rect, 0, 7, -2), quantity: 12 }],
    };
    const s = nestParts(snug);
    checkLayout(snug, s);
    expect(s.ok && s.totals.sheetCount).toBe(1);
  });

  it('keeps exact fits of sizes in inch fractions: eight 5 11/16 × 5 5/8 in on 24 × 12 in with a ¼ in margin and gap (arithmetic)', () => {
    // 4 × 144.4625 + 3 × 6.35 = 596.9 = 609.6 − 2 × 6.35 and 2 × 142.875 + 6.35 = 292.1 = 304.8 − 2 × 6.35
    // (1 in = 25.4 mm exactly, NIST SP 811): no slack either way. A pitch rounded up to whole micrometres
    // (150.8125 → 150.813 mm) used to lose the fourth column and take a second sheet.
    const inch: NestInput = {
      sheet: { widthMm: 24 * 25.4, heightMm: 12 * 25.4 },
      marginMm: 6.35,
      gapMm: 6.35,
      parts: [{ id: 'tile', outline: box4(0, 0, 144.4625, 142.875), quantity: 8 }],
    };
    const r = nestParts(inch);
    checkLayout(inch, r);
    expect(r.ok && r.totals.sheetCount).toBe(1);
    if (!r.ok) return;
    // Exactly the gap apart, not a hair less, as an independent reader of the placements measures it.
    const polys = r.sheets[0]!.placements.map((pl) =>
      placed(inch.parts[0]!.outline as P[], pl.x, pl.y, pl.rotationDeg),
    );
    let closest = Infinity;
    for (let i = 0; i < polys.length; i++)
      for (let j = i + 1; j < polys.length; j++)
        closest = Math.min(closest, boundaryDistance(polys[i]!, polys[j]!));
    expect(closest).toBeGreaterThanOrEqual(6.35 - 1e-9);
    for (const p of polys) {
      const b = box(p);
      expect(b.minX).toBeGreaterThanOrEqual(6.35 - 1e-9);
      expect(b.maxX).toBeLessThanOrEqual(609.6 - 6.35 + 1e-9);
      expect(b.minY).toBeGreaterThanOrEqual(6.35 - 1e-9);
      expect(b.maxY).toBeLessThanOrEqual(304.8 - 6.35 + 1e-9);
    }
  });

  it('keeps grid-laid rectangles apart exactly, not to within a micrometre: a 10.0004 mm width, a turned rectangle far from its origin', () => {
    const thin: NestInput = {
      sheet: { widthMm: 100, heightMm: 10 },
      marginMm: 0,
      gapMm: 0,
      parts: [{ id: 'r', outline: box4(0, 0, 10.0004, 10), quantity: 3 }],
    };
    const r1 = nestParts(thin);
    checkLayout(thin, r1);
    const xs = r1.ok ? r1.sheets[0]!.placements.map((p) => p.x).sort((a, b) => a - b) : [];
    for (let i = 1; i < xs.length; i++) expect(xs[i]! - xs[i - 1]!).toBeGreaterThanOrEqual(10.0004);
    // A 15 × 4.5 mm rectangle turned about 39° and given 460 mm from its origin, gap 1 mm.
    const turned: NestInput = {
      sheet: { widthMm: 1000, heightMm: 600 },
      marginMm: 1,
      gapMm: 1,
      parts: [
        {
          id: 'rect0',
          outline: [
            [-435.771107673645, 190.83809852600098],
            [-445.12374556808334, 202.32494940034047],
            [-448.57468991953584, 199.51517731693227],
            [-439.2220520250975, 188.02832644259277],
          ],
          quantity: 40,
        },
      ],
    };
    const r2 = nestParts(turned);
    checkLayout(turned, r2);
    if (!r2.ok) throw new Error(r2.error.message);
    const polys = r2.sheets[0]!.placements.map((pl) =>
      placed(turned.parts[0]!.outline as P[], pl.x, pl.y, pl.rotationDeg),
    );
    let min = Infinity;
    for (let i = 0; i < polys.length; i++)
      for (let j = i + 1; j < polys.length; j++) min = Math.min(min, boundaryDistance(polys[i]!, polys[j]!));
    expect(min).toBeGreaterThanOrEqual(1 - 1e-6);
  });

  it('places every copy of a part that fits the usable sheet to within a micrometre, or names it', () => {
    // A pentagon of circumradius 100 is 190.2 mm across at 90°: usable height 190.9017 − 2 × 5 − 0.0007 mm.
    const pent = regular(5, 100, 0);
    const input: NestInput = {
      sheet: { widthMm: 400, heightMm: 190.901699 },
      marginMm: 5,
      gapMm: 3,
      parts: [{ id: 'P', outline: pent, quantity: 2 }],
    };
    const r = nestParts(input);
    if (r.ok) checkLayout(input, r);
    else expect(r.error.code).toBe('PART_DOES_NOT_FIT');
    const roomier = nestParts({ ...input, sheet: { widthMm: 400, heightMm: 191 } });
    checkLayout({ ...input, sheet: { widthMm: 400, heightMm: 191 } }, roomier);
  });

  it('turns a part that fits only at an odd angle to that angle: a 650 × 10 bar across a 600 × 400 sheet', () => {
    // At 0° or 90° the bar is longer than the sheet; turned by about 25°–35° its box fits (arithmetic:
    // 650·cos 30° + 10·sin 30° ≈ 568 ≤ 600 and 650·sin 30° + 10·cos 30° ≈ 334 ≤ 400).
    const bar: P[] = [
      [0, 0],
      [650, 0],
      [650, 10],
      [0, 10],
    ];
    const input: NestInput = {
      sheet: { widthMm: 600, heightMm: 400 },
      marginMm: 0,
      gapMm: 3,
      parts: [{ id: 'bar', outline: bar, quantity: 2 }],
    };
    const r = nestParts(input);
    checkLayout(input, r);
    expect(r.ok && r.totals.sheetCount).toBeLessThanOrEqual(2);
  });

  it('names a part that cannot fit on an empty sheet at any rotation', () => {
    const r = nestParts({
      sheet: { widthMm: 200, heightMm: 100 },
      marginMm: 5,
      gapMm: 1,
      parts: [
        { id: 'ok', outline: regular(4, 20), quantity: 1 },
        { id: 'huge', outline: regular(6, 120), quantity: 1 },
      ],
    });
    expect(r.ok).toBe(false);
    if (!r.ok) {
      expect(r.error.code).toBe('PART_DOES_NOT_FIT');
      expect(r.error.partIds).toEqual(['huge']);
      expect(r.error.message).toContain('huge');
    }
  });

  it('takes an outline whose every vertex is written twice, 1 nm to 0.4 µm apart in any direction (export noise), as the outline itself', () => {
    const u: P[] = [
      [0, 0],
      [200, 0],
      [200, 150],
      [160, 150],
      [160, 40],
      [40, 40],
      [40, 150],
      [0, 150],
    ];
    for (const eps of [1e-6, 1e-4, 4e-4]) {
      // The copy of vertex i sits eps away at angle 2.4·i rad: some copies lie outside a corner, so the raw
      // outline crosses itself by a fraction of a micrometre (it was refused as self-intersecting).
      const noisy = u.flatMap((p, i): P[] => [
        p,
        [p[0] + eps * Math.cos(2.4 * i), p[1] + eps * Math.sin(2.4 * i)],
      ]);
      const input: NestInput = {
        sheet: { widthMm: 1000, heightMm: 600 },
        marginMm: 10,
        gapMm: 5,
        parts: [{ id: 'u', outline: noisy, quantity: 6 }],
      };
      const r = nestParts(input);
      // Checked with polygon-clipping on the clean outline (it fails on the noisy one's sub-micrometre loops);
      // the noise is well inside checkLayout's 2 µm tolerance.
      checkLayout({ ...input, parts: [{ id: 'u', outline: u, quantity: 6 }] }, r);
    }
  });
});

describe('nestParts — large quantities', () => {
  it('lays 120 seeded random parts along a 10 m roll, 600 mm wide, without overlap, gap or margin faults (checked with polygon-clipping)', () => {
    // The roll's regions are clipped across its short side (differenceAcross): their intersection points may
    // round to the other neighbouring micrometre, which the layout must absorb.
    let seed = 21;
    const rnd = () => (seed = (seed * 1664525 + 1013904223) % 4294967296) / 4294967296;
    const parts = Array.from({ length: 30 }, (_, k) => {
      const n = 5 + Math.floor(rnd() * 8);
      const R = 20 + rnd() * 50;
      const outline = Array.from({ length: n }, (_, i) => {
        const t = (2 * Math.PI * i) / n;
        const r = R * (0.6 + 0.4 * rnd());
        return [r * Math.cos(t), r * Math.sin(t)] as P;
      });
      return { id: `k${k}`, outline, quantity: 4 };
    });
    const input: NestInput = {
      sheet: { widthMm: 10_000, heightMm: 600 },
      marginMm: 5,
      gapMm: 3,
      parts,
      method: 'true-shape',
    };
    const r = nestParts(input);
    checkLayout(input, r);
    expect(r.ok && r.totals.sheetCount).toBe(1);
  });

  /** Placements of a sheet as comparable text (order-independent). */
  const key = (sheet: { placements: { part: string; x: number; y: number; rotationDeg: number }[] }) =>
    sheet.placements
      .map((p) => `${p.part} ${p.x.toFixed(4)} ${p.y.toFixed(4)} ${p.rotationDeg}`)
      .sort()
      .join('|');

  it.each(['true-shape', 'pattern'] as const)(
    '%s: 12,000 copies all placed once; the full sheets repeat the first, and a short job lays out as its first sheets',
    (method) => {
      const outline = regular(5, 30);
      const input = (quantity: number): NestInput => ({
        sheet: { widthMm: 600, heightMm: 400 },
        marginMm: 5,
        gapMm: 2,
        parts: [{ id: 'pent', outline, quantity }],
        method,
      });
      const big = nestParts(input(12_000));
      if (!big.ok) throw new Error(big.error.message);
      const perSheet = big.sheets[0]!.placements.length;
      expect(big.sheets.reduce((s, sh) => s + sh.placements.length, 0)).toBe(12_000);
      expect(big.totals.sheetCount).toBe(Math.ceil(12_000 / perSheet));
      const first = key(big.sheets[0]!);
      for (const sh of big.sheets.slice(0, -1)) expect(key(sh)).toBe(first);
      // Three sheets' worth, searched in full, checked with polygon-clipping: the same first sheets.
      const small = nestParts(input(3 * perSheet));
      checkLayout(input(3 * perSheet), small);
      expect(small.ok && small.sheets.map(key)).toEqual(big.sheets.slice(0, 3).map(key));
    },
  );

  it('lays hundreds of small copies to a sheet by lattice alone, all placed and clear (polygon-clipping)', () => {
    const input: NestInput = {
      sheet: { widthMm: 300, heightMm: 200 },
      marginMm: 2,
      gapMm: 1,
      parts: [{ id: 'tri', outline: regular(3, 6), quantity: 1500 }],
    };
    const r = nestParts(input);
    checkLayout(input, r);
    expect(r.ok && r.totals.groups[0]!.method).toMatch(/^pattern/);
    // Derived: side 6√3 ≈ 10.39 mm, area 46.77 mm²; grown by half the 1 mm gap (mitred, Steiner) about
    // 46.77 + 31.18 × 0.5 + 0.25 × 3√3 = 63.66 mm², and those lie in the usable 296 × 196 mm grown by the
    // same half gap, 297 × 197: at most 919 (tiling density 1). The lattice comes within a few per cent.
    const count = firstSheetCount(r);
    expect(count).toBeGreaterThan(0.92 * 919);
    expect(count).toBeLessThanOrEqual(919);
  });
});

describe('nestParts — outside density checks', () => {
  // Derived: squares, equilateral triangles and regular hexagons tile the plane (density 1); with a gap g each
  // piece grown by g/2 with mitred corners still tiles, so at most W·H / A(grown) pieces fit, and at least
  // those whose tile lies wholly inside the sheet less a border one piece diameter d wide: (W − d)(H − d) / A(grown).
  const W = 1000;
  const H = 700;
  const gap = 2;
  const cases: [string, P[], number][] = [
    ['square side 60', regular(4, 60 / Math.SQRT2, 45), 4],
    ['triangle side 90', regular(3, 90 / Math.sqrt(3)), 3],
    ['hexagon circumradius 40', regular(6, 40, 0), 6],
  ];
  it.each(cases)('%s approaches the tiling density less computed edge losses', (_name, outline, n) => {
    const a = area(outline);
    const perimeter = n * Math.hypot(outline[1]![0] - outline[0]![0], outline[1]![1] - outline[0]![1]);
    const exterior = (2 * Math.PI) / n;
    const d = gap / 2;
    const grown = a + perimeter * d + d * d * n * Math.tan(exterior / 2); // REFERENCES: Steiner, mitred joins
    const diameter = 2 * Math.max(...outline.map((p) => Math.hypot(p[0], p[1]))) + gap;
    const upper = Math.floor((W * H) / grown);
    const lower = Math.floor(((W - diameter) * (H - diameter)) / grown);
    const input: NestInput = {
      sheet: { widthMm: W, heightMm: H },
      marginMm: 0,
      gapMm: gap,
      parts: [{ id: 'p', outline, quantity: upper }],
    };
    const r = nestParts({ ...input, method: 'pattern' });
    checkLayout(input, r);
    const count = firstSheetCount(r);
    expect(count).toBeGreaterThanOrEqual(lower);
    expect(count).toBeLessThanOrEqual(upper);
    expect(r.ok && r.sheets[0]!.utilisation).toBeGreaterThanOrEqual((lower * a) / (W * H));
  });

  it('regular pentagons never beat the densest pentagon packing (5 − √5)/3 ≈ 0.9213 (Kuperberg & Kuperberg 1990; Hales & Kusner 2016) and come within 15 % of it (edge losses included)', () => {
    const outline = regular(5, 35);
    const input: NestInput = {
      sheet: { widthMm: W, heightMm: H },
      marginMm: 0,
      gapMm: 0,
      parts: [{ id: 'pent', outline, quantity: 400 }],
    };
    const r = nestParts({ ...input, method: 'pattern' });
    checkLayout(input, r);
    if (!r.ok) return;
    const u = r.sheets[0]!.utilisation;
    const bound = (5 - Math.sqrt(5)) / 3;
    // Edge effects can only lower a finite sheet's density; pieces sticking past the edges are not allowed.
    expect(u).toBeLessThanOrEqual(bound);
    expect(u).toBeGreaterThan(bound * 0.85);
  });
});

describe('runNestCommand', () => {
  it("passes each part's envelope on to the nesting (and ignores none that contains its outline)", () => {
    const tri = regular(3, 100 / Math.sqrt(3));
    const notched = [0, 1, 2].map((i) => withEdgeNotch(tri, i, 3.2, 10));
    const json = {
      sheet: { widthMm: 600, heightMm: 400 },
      gapMm: 3,
      parts: notched.map((o, k) => ({ id: `N${k}`, outline: o, envelope: tri, quantity: 14 })),
    };
    const out = runNestCommand(JSON.parse(JSON.stringify(json)));
    expect(out.error).toBeUndefined();
    expect(out.sheets!.map((x) => x.placements.length)).toEqual([42]);
    const bad = runNestCommand({ ...json, parts: [{ ...json.parts[0], envelope: [[0, 0]] }] });
    expect(bad.error?.message).toMatch(/parts\[0\]\.envelope/);
  });

  it('returns sheets with placements that put each outline where it says (rotate about own origin, then translate)', () => {
    const outline: P[] = [
      [0, 0],
      [50, 0],
      [50, 10],
      [10, 10],
      [10, 40],
      [0, 40],
    ]; // an L, non-convex
    const json = {
      sheet: { widthMm: 200, heightMm: 120 },
      marginMm: 4,
      gapMm: 2,
      parts: [{ id: 'L', outline, quantity: 9 }],
    };
    const out = runNestCommand(JSON.parse(JSON.stringify(json)));
    expect(out.error).toBeUndefined();
    const sheets = out.sheets!;
    expect(sheets.length).toBeGreaterThan(0);
    for (const s of sheets) {
      expect(typeof s.utilisation).toBe('number');
      for (const p of s.placements) expect(Object.keys(p).sort()).toEqual(['part', 'rotationDeg', 'x', 'y']);
    }
    checkLayout(json, {
      ok: true,
      sheets: sheets.map((s) => ({ ...s, partIds: [], method: 'true-shape' })),
      totals: out.totals!,
    });
  });

  it('rejects malformed input with a message for each problem', () => {
    const out = runNestCommand({
      sheet: { widthMm: -1 },
      gapMm: 'x',
      parts: [{ id: '', outline: [[0, 0]] }],
    });
    expect(out.error?.code).toBe('INVALID_INPUT');
    expect(out.error?.message).toMatch(/sheet/);
    expect(out.error?.message).toMatch(/gapMm/);
    expect(out.error?.message).toMatch(/parts\[0\]\.id/);
    expect(out.error?.message).toMatch(/parts\[0\]\.outline/);
    expect(runNestCommand(null).error?.code).toBe('INVALID_INPUT');
    // Each side named, and a number written as text (JSON "300") said to be one; 1e999 parses as Infinity.
    const text = runNestCommand({ sheet: { widthMm: '300', heightMm: Number.POSITIVE_INFINITY }, parts: [] });
    expect(text.error?.message).toContain(
      'sheet.widthMm must be a finite number > 0, in millimetres (got the text "300": write the number without quotes)',
    );
    expect(text.error?.message).toContain('sheet.heightMm must be a finite number > 0, in millimetres');
  });

  it('names unknown fields (a typo would silently leave the gap at 0) and refuses null for a number', () => {
    const sq = [
      [0, 0],
      [10, 0],
      [10, 10],
      [0, 10],
    ];
    const typo = runNestCommand({
      sheet: { widthMm: 100, heightMm: 100, depthMm: 3 },
      gapMM: 3,
      parts: [{ id: 'a', outline: sq, qty: 2 }],
    });
    expect(typo.error?.message).toMatch(/gapMM is not a known field \(did you mean gapMm\?\)/);
    expect(typo.error?.message).toMatch(/sheet\.depthMm is not a known field/);
    expect(typo.error?.message).toMatch(/parts\[0\]\.qty is not a known field/);
    const nulls = runNestCommand({
      sheet: { widthMm: 100, heightMm: 100 },
      marginMm: null,
      parts: [{ id: 'a', outline: sq, quantity: null }],
    });
    expect(nulls.error?.message).toMatch(/marginMm must be a number/);
    expect(nulls.error?.message).toMatch(/quantity must be a whole number/);
  });

  it('refuses runs past its limits in one line: copies, far-off points, huge sheets and gaps', () => {
    const sq = (o: number) => [
      [o, o],
      [o + 10, o],
      [o + 10, o + 10],
      [o, o + 10],
    ];
    const sheet = { widthMm: 600, heightMm: 400 };
    const many = runNestCommand({ sheet, parts: [{ id: 'a', outline: sq(0), quantity: 1e15 }] });
    expect(many.error?.message).toMatch(
      /at most 100,000 copies can be nested in one run; this asks for 1,000,000,000,000,000/,
    );
    expect(runNestCommand({ sheet, parts: [{ id: 'a', outline: sq(1e10) }] }).error?.message).toMatch(
      /more than 1,000,000 mm from its origin/,
    );
    expect(
      runNestCommand({ sheet, gapMm: 1e13, parts: [{ id: 'a', outline: sq(0) }] }).error?.message,
    ).toMatch(/at most 10,000 mm/);
    expect(
      runNestCommand({ sheet: { widthMm: 1e13, heightMm: 400 }, parts: [{ id: 'a', outline: sq(0) }] }).error
        ?.message,
    ).toMatch(/at most 10,000 mm/);
    // Within the limits, far from the origin, areas stay exact.
    const far = runNestCommand({ sheet, parts: [{ id: 'a', outline: sq(9e5), quantity: 2 }] });
    expect(far.totals?.partAreaMm2).toBeCloseTo(200, 9);
  });

  it('reports a group whatever its name, "__proto__" included', () => {
    const out = runNestCommand({
      sheet: { widthMm: 300, heightMm: 200 },
      parts: [{ id: 'a', outline: regular(4, 10), group: '__proto__' }],
    });
    expect(JSON.parse(JSON.stringify(out.totals)).sheetsByGroup).toEqual(JSON.parse('{"__proto__":1}'));
  });

  it('rejects a self-intersecting outline', () => {
    const bowtie: P[] = [
      [0, 0],
      [20, 10],
      [20, 0],
      [0, 20],
    ];
    const out = runNestCommand({
      sheet: { widthMm: 100, heightMm: 100 },
      marginMm: 0,
      gapMm: 0,
      parts: [{ id: 'bow', outline: bowtie, quantity: 1 }],
    });
    expect(out.error?.message).toMatch(/self-intersecting/);
    // A symmetric bow tie, whose lobes cancel to no signed area, is still named as self-intersecting.
    const even = runNestCommand({
      sheet: { widthMm: 100, heightMm: 100 },
      parts: [
        {
          id: 'even',
          outline: [
            [0, 0],
            [10, 10],
            [10, 0],
            [0, 10],
          ],
        },
      ],
    });
    expect(even.error?.message).toMatch(/self-intersecting/);
  });
});
