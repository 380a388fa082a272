import { buildModel } from '../build';
import { design, cubeSquares45, cubeStars83 } from '../test-support/designs';

const codes = (list: { code: string }[]) => [...new Set(list.map((e) => e.code))].sort();

describe('validity report', () => {
  it('a valid design has no errors', () => {
    expect(buildModel(cubeSquares45()).report.errors).toEqual([]);
  });

  it('names both pieces when a crossing lies wholly inside one of them (they cannot be slid together)', () => {
    // A hexagonal prism with squares (our own design): the small end squares' crossings with the sides
    // lie inside the side squares, so the side pieces would need closed holes.
    const r = buildModel(design({ solid: 'prism-6', piece: { sides: 4, size: 2 } })).report;
    const e = r.errors.filter((x) => x.code === 'CROSSING.NOT_ASSEMBLABLE');
    expect(e.length).toBeGreaterThan(0);
    for (const x of e) {
      expect(x.pieces).toHaveLength(2);
      for (const id of x.pieces) expect(x.message).toContain(id);
    }
  });

  it('reports slots of one piece that overlap whichever ends they open from', () => {
    // Rhombic triacontahedron with small {5/2} stars: three tips meet near each 5-fold corner.
    const r = buildModel(
      design({
        solid: 'rhombic-triacontahedron',
        piece: { sides: 5, step: 2, size: 0.4 },
        stock: { thicknessMm: 0.3 },
      }),
    ).report;
    expect(codes(r.errors)).toContain('SLOT.COLLISION');
    expect(r.errors.find((e) => e.code === 'SLOT.COLLISION')?.pieces).toHaveLength(3);
  });

  it('warns about thin webs using the minimum web (default 2 × thickness)', () => {
    const thick = buildModel(cubeStars83({ stock: { thicknessMm: 3 } })).report;
    expect(codes(thick.warnings)).toContain('SLOT.THIN_WEB');
    expect(thick.errors).toEqual([]);
    const relaxed = buildModel(cubeStars83({ stock: { thicknessMm: 3 }, minWebMm: 0.1 })).report;
    expect(codes(relaxed.warnings)).not.toContain('SLOT.THIN_WEB');
  });

  it('refuses pieces larger than the bed, in any orientation', () => {
    // Derived: a square of circumradius 120 mm has sides of 169.7 mm; no turn fits it in 150 × 150.
    const small = buildModel(cubeSquares45(1.5, { bed: { widthMm: 150, heightMm: 150 } })).report;
    expect(codes(small.errors)).toEqual(['PIECE.LARGER_THAN_BED']);
    const large = buildModel(cubeSquares45(1.5, { bed: { widthMm: 175, heightMm: 175 } })).report;
    expect(large.errors).toEqual([]);
  });

  it('refuses slots narrower than the kerf or the router tool', () => {
    const laser = buildModel(
      cubeSquares45(1.5, {
        stock: { thicknessMm: 0.3, flexible: true },
        machine: { kind: 'laser', kerfMm: 0.5 },
      }),
    ).report;
    expect(codes(laser.errors)).toEqual(['SLOT.NARROWER_THAN_KERF']);
    const router = buildModel(cubeSquares45(1.5, { machine: { kind: 'router', toolDiameterMm: 6 } })).report;
    expect(codes(router.errors)).toEqual(['SLOT.NARROWER_THAN_TOOL']);
    const tooTight = buildModel(cubeSquares45(1.5, { fitMm: -3.5 })).report;
    expect(codes(tooTight.errors)).toEqual(['SLOT.WIDTH_NOT_POSITIVE']);
  });

  it('refuses a slot exactly as wide as the kerf, and a width that is zero but for rounding', () => {
    // A cube's faces cross at 90°: w = t·cot 45° + fit = 3 − 2.9 = 0.1 mm, the kerf itself; the cuts of the two
    // walls coincide and no slot is left to draw (derived).
    const atKerf = buildModel(
      cubeSquares45(1.5, { stock: { thicknessMm: 3 }, fitMm: -2.9, machine: { kind: 'laser', kerfMm: 0.1 } }),
    ).report;
    expect(codes(atKerf.errors)).toEqual(['SLOT.NARROWER_THAN_KERF']);
    expect(atKerf.errors[0]!.message).toMatch(/is not wider than the 0\.1 mm kerf by 0\.01 mm at least/);
    // 3·cot 45° − 3 is 4.4e-16 in floating point (tan 45° = 0.9999999999999999): no width, with or without a kerf.
    for (const kerfMm of [0, 0.15]) {
      const zero = buildModel(
        cubeSquares45(1.5, { stock: { thicknessMm: 3 }, fitMm: -3, machine: { kind: 'laser', kerfMm } }),
      ).report;
      expect(codes(zero.errors)).toEqual(['SLOT.WIDTH_NOT_POSITIVE']);
    }
    // 0.01 mm left between the walls is still a slot.
    const justWider = buildModel(
      cubeSquares45(1.5, {
        stock: { thicknessMm: 3 },
        fitMm: -2.89,
        machine: { kind: 'laser', kerfMm: 0.1 },
      }),
    ).report;
    expect(codes(justWider.errors)).toEqual([]);
  });

  it('reports a design whose pieces do not touch', () => {
    const r = buildModel(design({ solid: 'cube', piece: { sides: 4, size: 0.9 } })).report;
    expect(r.crossings).toEqual([]);
    expect(codes(r.errors)).toEqual(['DESIGN.NO_CROSSINGS']);
  });

  it('reports pieces with no slot as errors: nothing holds them', () => {
    // A pentagonal antiprism with {5/2} stars at size 0.9 (our own lamp design): the side stars hold
    // each other, the top and bottom stars touch nothing, so they would fall out.
    const r = buildModel(
      design({
        solid: 'antiprism-5',
        piece: { sides: 5, step: 2, rotationDeg: 18, size: 0.9 },
        stock: { thicknessMm: 0.5, flexible: true },
      }),
    ).report;
    expect(r.errors.map((e) => [e.code, e.pieces])).toEqual([
      ['PIECE.NO_SLOT', ['P1']],
      ['PIECE.NO_SLOT', ['P12']],
    ]);
    expect(r.pieces.filter((p) => p.slotCount === 0).map((p) => p.id)).toEqual(['P1', 'P12']);
    // The other ten hold each other: no separate-groups error on top.
    expect(codes(r.errors)).not.toContain('DESIGN.NOT_CONNECTED');
  });

  it('reports a model that comes apart in groups as an error', () => {
    // Cube planes with triangles at rotation 0, size 1.5 (our own design): every piece has slots, but the
    // crossings join the pieces in two groups of three.
    const r = buildModel(design({ solid: 'cube', piece: { sides: 3, size: 1.5 } })).report;
    expect(r.pieces.every((p) => p.slotCount > 0)).toBe(true);
    // Independent grouping from the report's crossings (breadth-first search over a–b links).
    const links = new Map<string, string[]>();
    for (const c of r.crossings) {
      links.set(c.a, [...(links.get(c.a) ?? []), c.b]);
      links.set(c.b, [...(links.get(c.b) ?? []), c.a]);
    }
    const seen = new Set<string>();
    const groups: string[][] = [];
    for (const p of r.pieces) {
      if (seen.has(p.id)) continue;
      const group: string[] = [];
      const queue = [p.id];
      seen.add(p.id);
      while (queue.length) {
        const id = queue.shift() as string;
        group.push(id);
        for (const n of links.get(id) ?? []) {
          if (seen.has(n)) continue;
          seen.add(n);
          queue.push(n);
        }
      }
      groups.push(group.sort());
    }
    expect(groups.length).toBe(2);
    expect(codes(r.errors)).toEqual(['DESIGN.NOT_CONNECTED']);
    const loose = r.errors[0]?.pieces.sort();
    expect(groups.map((g) => g.join())).toContain(loose?.join());
  });

  it('warns when a crossing is shorter than its slot is wide', () => {
    // Derived: at size 1.02 the squares cross 2 × 80 × 0.02 = 3.2 mm, less than 6 mm stock.
    const r = buildModel(cubeSquares45(1.02, { stock: { thicknessMm: 6 } })).report;
    expect(codes(r.warnings)).toContain('CROSSING.SHORTER_THAN_SLOT');
    expect(r.crossings[0]?.lengthMm).toBeCloseTo(3.2, 6);
  });
});
