import { buildModel } from '../build';
import { design, cubeStars83, octahedronHexagons } from '../test-support/designs';
import { layoutModel } from '../layout/plan-layout';
import { assemblyOrder } from './assembly';
import { packInputFrom } from './cli-commands';
import { createCutPack } from './pack';

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
