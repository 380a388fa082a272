import { buildModel } from '../build';
import { design, cubeSquares45, cubeStars83, octahedronHexagons } from '../test-support/designs';
import { layoutModel } from '../layout/plan-layout';
import { assemblyOrder, assemblyStepsOfReport, STRAIGHT_DEG } from './assembly';
import { packInputFrom } from './cli-commands';
import { createCutPack } from './pack';
import { joinPhrases } from './documents';
import { readPdf } from './read-back.test';

describe('assemblyOrder', () => {
  it('starts from the most-crossed piece and adds each piece onto at least one placed piece', () => {
    // A small graph of our own: A–B, A–C, A–D, B–C, D–E. A has most crossings (3); then B/C/D each join A
    // once; B (index 1) wins the tie on total crossings (2, like C) by its lower number; then C joins A and
    // B; then D; then E joins D.
    const ids = ['A', 'B', 'C', 'D', 'E'];
    const crossings = [
      { a: 'A', b: 'B' },
      { a: 'A', b: 'C' },
      { a: 'A', b: 'D' },
      { a: 'B', b: 'C' },
      { a: 'D', b: 'E' },
    ];
    const steps = assemblyOrder(ids, crossings);
    expect(steps.map((s) => s.piece)).toEqual(['A', 'B', 'C', 'D', 'E']);
    expect(steps[2]!.joins.map((j) => j.piece)).toEqual(['A', 'B']);
    expect(steps[4]!.joins).toEqual([{ piece: 'D', crossing: 4 }]);
  });

  it.each([
    ['octahedron hexagons', octahedronHexagons()],
    ['cube {8/3} stars', cubeStars83()],
  ])('orders every piece of %s, each later piece joined to a placed one by a real crossing', (_, spec) => {
    const model = buildModel(spec);
    const steps = assemblyOrder(
      model.pieces.map((p) => p.id),
      model.report.crossings,
    );
    expect(steps.map((s) => s.piece).sort()).toEqual(model.pieces.map((p) => p.id).sort());
    const placed = new Set<string>();
    for (const s of steps) {
      if (placed.size) expect(s.joins.length).toBeGreaterThan(0);
      for (const j of s.joins) {
        expect(placed.has(j.piece)).toBe(true);
        const c = model.report.crossings[j.crossing]!;
        expect([c.a, c.b].sort()).toEqual([s.piece, j.piece].sort());
      }
      placed.add(s.piece);
    }
  });
});

describe('joinPhrases', () => {
  it('names each partner once, and says when a pair slides together on two pairs of slots', () => {
    expect(joinPhrases('P4', ['P1', 'P2', 'P1'])).toEqual([
      "its 2 slots for P1 onto P1's 2 slots for P4, together",
      "its slot for P2 onto P2's slot for P4",
    ]);
  });
});

describe('slide directions (rigid stock)', () => {
  it('reports the widest angle between the directions a piece slides onto its placed partners', () => {
    // A of our own: A–B slides along x, C–A along z, B–C along y. C joins A and B last: relative to A it
    // moves +z (it is piece a of crossing 1), relative to B it moves −y (piece b of crossing 2): 90° apart.
    const steps = assemblyOrder(
      ['A', 'B', 'C'],
      [
        { a: 'A', b: 'B', slide: [1, 0, 0] },
        { a: 'C', b: 'A', slide: [0, 0, 1] },
        { a: 'B', b: 'C', slide: [0, 1, 0] },
      ],
    );
    expect(steps.map((s) => s.piece)).toEqual(['A', 'B', 'C']);
    expect(steps.map((s) => s.spreadDeg)).toEqual([0, 0, 90]);
  });

  it('between equally linked pieces, prefers the one whose slots run the same way', () => {
    // After A, both B and C join A and D... D first (most crossings), then A; B's two slides agree, C's do not.
    const steps = assemblyOrder(
      ['D', 'A', 'C', 'B'],
      [
        { a: 'D', b: 'A', slide: [1, 0, 0] },
        { a: 'C', b: 'A', slide: [0, 1, 0] },
        { a: 'C', b: 'D', slide: [1, 0, 0] },
        { a: 'B', b: 'A', slide: [0, 1, 0] },
        { a: 'B', b: 'D', slide: [0, 1, 0] },
      ],
    );
    expect(steps.map((s) => s.piece)).toEqual(['D', 'A', 'B', 'C']);
    expect(steps[2]!.spreadDeg).toBeCloseTo(0, 9);
    expect(steps[3]!.spreadDeg).toBeCloseTo(90, 9);
  });

  it('on a cube of squares the two slots of a crossing open from opposite ends, along the crossing line', () => {
    const model = buildModel(cubeSquares45(1.5));
    for (const c of model.crossings) {
      const axis3 = (piece: number) => {
        const p = model.pieces[piece]!;
        const s = p.slots.find((x) => x.crossing === c.index)!;
        return [0, 1, 2].map((k) => p.frame.x[k]! * s.axis[0] + p.frame.y[k]! * s.axis[1]);
      };
      const [a, b] = [axis3(c.a), axis3(c.b)];
      // Derived: each slot runs along the crossing line, into its own piece, so the pair point opposite ways.
      expect(Math.abs(a[0]! * c.dir[0] + a[1]! * c.dir[1] + a[2]! * c.dir[2])).toBeCloseTo(1, 9);
      expect(a[0]! * b[0]! + a[1]! * b[1]! + a[2]! * b[2]!).toBeCloseTo(-1, 9);
    }
  });

  it('works from the design report alone; rigid stock puts the straight steps first', () => {
    // Derived: cube edges are parallel or perpendicular, so every spread is 0, 90 or 180°; and the top, a
    // side and then the bottom (which crosses only that side so far) each go in with one slide.
    const report = buildModel(cubeSquares45(1.5)).report;
    const steps = assemblyStepsOfReport(report);
    expect(steps).toHaveLength(6);
    for (const s of steps) expect([0, 90, 180]).toContain(Math.round(s.spreadDeg));
    expect(steps.slice(0, 3).map((s) => s.joins.length)).toEqual([0, 1, 1]);
    // The same crossings in flexible stock keep the most-links-first order, which needs flex more often.
    const crooked = (r: typeof report) =>
      assemblyStepsOfReport(r).filter((s) => s.spreadDeg > STRAIGHT_DEG).length;
    const flexible = { ...report, stock: { ...report.stock, flexible: true } };
    expect(crooked(report)).toBeLessThan(crooked(flexible));
    const stars = buildModel(
      design({
        solid: 'dodecahedron',
        piece: { sides: 5, step: 2, size: 1.3 },
        scale: { by: 'diameter', mm: 300 },
      }),
    ).report;
    expect(crooked(stars)).toBeLessThan(crooked({ ...stars, stock: { ...stars.stock, flexible: true } }));
  });

  it('the assembly guide (pdf-parse) tells rigid builders which steps need flex, and flexible ones nothing', async () => {
    const guide = async (flexible: boolean) => {
      const spec = cubeSquares45(1.5, { stock: { thicknessMm: flexible ? 0.5 : 3, flexible } });
      const pack = await createCutPack(packInputFrom(spec, { sheet: { widthMm: 600, heightMm: 400 } }));
      return readPdf(pack.files.find((f) => f.name === 'assembly-guide.pdf')!.data).text;
    };
    // Derived: cube edges meet at right angles, so a square joining two placed neighbours slides along two
    // perpendicular edges.
    const rigid = await guide(false);
    expect(rigid).toMatch(/Rigid stock moves one way at a time: in \d+ of the 6 steps/);
    expect(rigid).toMatch(/\(these slots run up to (90|180)° apart\)/);
    const flexible = await guide(true);
    expect(flexible).not.toContain('Rigid stock');
    expect(flexible).not.toContain('apart)');
  });
});

describe('pack performance', () => {
  it('adds under 3 s to building and laying out a 30-piece model', async () => {
    // Rhombic triacontahedron planes with squares: 30 pieces (our own design).
    const spec = design({
      solid: 'rhombic-triacontahedron',
      piece: { sides: 4, step: 1, rotationDeg: 0, size: 0.5 },
      scale: { by: 'diameter', mm: 300 },
    });
    const input = { ...packInputFrom(spec, { sheet: { widthMm: 1000, heightMm: 600 } }), archive: true };
    // Process CPU time, not wall clock: the budget is our work, not other jobs on a loaded machine.
    const cpuMs = () => {
      const u = process.cpuUsage();
      return (u.user + u.system) / 1000;
    };
    const t0 = cpuMs();
    const model = buildModel(spec);
    layoutModel(model, {
      sheet: input.sheet,
      marginMm: input.marginMm,
      gapMm: input.gapMm,
      colours: { count: 1 },
    });
    const layoutMs = cpuMs() - t0;
    const t1 = cpuMs();
    const r = await createCutPack(input);
    const packMs = cpuMs() - t1;
    expect(r.files.filter((f) => f.role === 'sheet-dxf').length).toBe(r.manifest.sheetCount);
    expect(packMs - layoutMs).toBeLessThan(3000);
  }, 60_000);
});
