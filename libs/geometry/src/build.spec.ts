import * as fs from 'node:fs';
import * as path from 'node:path';
import { buildModel } from './build';
import { listSolids, getSolid } from './solids/catalogue';
import { suggestSizes } from './pieces/place';
import { signedArea } from './math/polygon';
import { design, octahedronHexagons } from './test-support/designs';
import { SpecValidationError } from './spec/validate-spec';
import { assertDesignWork, DESIGN_WORK_LIMIT, DesignTooHeavyError } from './spec/workload';

describe('buildModel scaling', () => {
  it('planeDistance sets the nearest plane distance; other planes keep their proportion', () => {
    // A 2 × 4 × 6 box of our own as OFF text: plane distances 1, 2, 3.
    const off = `OFF\n8 0 0\n${[-1, 1]
      .flatMap((x) => [-2, 2].flatMap((y) => [-3, 3].map((z) => `${x} ${y} ${z}`)))
      .join('\n')}\n`;
    const r = buildModel(
      design({
        solid: { format: 'off', text: off },
        piece: { sides: 4, rotationDeg: 45, size: 1 },
        scale: { by: 'planeDistance', mm: 50 },
      }),
    ).report;
    expect(r.planeDistanceMm).toBeCloseTo(50, 9);
    const dists = r.pieces.map((p) => Math.hypot(...p.centreMm)).sort((a, b) => a - b);
    expect(dists.map((d) => Math.round(d))).toEqual([50, 50, 100, 100, 150, 150]);
    expect(r.solid.faceCount).toBe(6);
  });

  it('diameter is twice the farthest piece vertex; pieceCircumradius sets the piece circumradius', () => {
    const byDiameter = buildModel(octahedronHexagons({ scale: { by: 'diameter', mm: 300 } })).report;
    expect(byDiameter.diameterMm).toBeCloseTo(300, 6);
    // Derived: a tip lies at √(d² + R²) = d·√(1 + size²) from the centre.
    expect(byDiameter.planeDistanceMm).toBeCloseTo(150 / Math.sqrt(1 + 1.3 ** 2), 6);
    const byRadius = buildModel(octahedronHexagons({ scale: { by: 'pieceCircumradius', mm: 90 } }));
    for (const p of byRadius.pieces) expect(p.circumradiusMm).toBeCloseTo(90, 9);
  });
});

describe('buildModel with a work limit', () => {
  const heavy = design({
    solid: 'disdyakis-triacontahedron',
    piece: { sides: 60, step: 29, rotationDeg: 0, size: 1.2 },
  });

  it('refuses a design over the limit before building it, as assertDesignWork says it', () => {
    // 120 pieces × 119 × 60 sides = 856,800: built, it would take 10 s or more (see designWork).
    let said: unknown;
    try {
      assertDesignWork(60, 120);
    } catch (error) {
      said = error;
    }
    expect(said).toBeInstanceOf(DesignTooHeavyError);
    expect(() => buildModel(heavy, { workLimit: DESIGN_WORK_LIMIT })).toThrow(
      new DesignTooHeavyError(856_800, DESIGN_WORK_LIMIT, (said as Error).message),
    );
  });

  it('counts the faces of an uploaded solid (its hull) as the pieces', () => {
    // A 2 × 4 × 6 box of our own as OFF text: 6 faces, so 6 × 5 × 8 sides = 240.
    const box = `OFF\n8 0 0\n${[-1, 1]
      .flatMap((x) => [-2, 2].flatMap((y) => [-3, 3].map((z) => `${x} ${y} ${z}`)))
      .join('\n')}\n`;
    const spec = design({
      solid: { format: 'off', text: box },
      piece: { sides: 8, step: 3, rotationDeg: 0, size: 1.6 },
    });
    expect(() => buildModel(spec, { workLimit: 239 })).toThrow(DesignTooHeavyError);
    expect(buildModel(spec, { workLimit: 240 }).pieces).toHaveLength(6);
  });

  it('builds a design at the limit, and any design when no limit is given', () => {
    // A cube of squares: 6 × 5 × 4 = 120.
    const cube = design({ solid: 'cube', piece: { sides: 4, rotationDeg: 45, size: 1.5 } });
    expect(() => buildModel(cube, { workLimit: 119 })).toThrow(/6 pieces of 4 sides/);
    expect(buildModel(cube, { workLimit: 120 }).pieces).toHaveLength(6);
    expect(buildModel(cube).pieces).toHaveLength(6);
  });

  it('says what is wrong with a spec that does not validate before weighing it', () => {
    expect(() => buildModel({ ...heavy, stock: { thicknessMm: -1 } }, { workLimit: 1 })).toThrow(
      SpecValidationError,
    );
  });
});

describe('an uploaded solid that is not convex', () => {
  it('is built on its convex hull with the warning SOLID.NOT_CONVEX; a convex one gets none', () => {
    // A 2 × 4 × 6 box of our own with one extra point: on a face (convex) or 0.5 inside it (a dent).
    const box = (extra: string) =>
      `OFF\n9 0 0\n${[-1, 1]
        .flatMap((x) => [-2, 2].flatMap((y) => [-3, 3].map((z) => `${x} ${y} ${z}`)))
        .join('\n')}\n${extra}\n`;
    const build = (extra: string) =>
      buildModel(
        design({
          solid: { format: 'off', text: box(extra) },
          piece: { sides: 4, rotationDeg: 45, size: 1 },
          scale: { by: 'planeDistance', mm: 50 },
        }),
      ).report;
    const convex = build('0 0 3');
    expect(convex.warnings.map((w) => w.code)).not.toContain('SOLID.NOT_CONVEX');
    const dented = build('0 0 2.5');
    expect(dented.solid.faceCount).toBe(6);
    const w = dented.warnings.find((x) => x.code === 'SOLID.NOT_CONVEX');
    expect(w?.message).toMatch(/^1 of the uploaded solid's points lies inside its convex hull/);
    // The same pieces either way: the hull is the same box.
    expect(dented.pieces.map((p) => p.areaMm2)).toEqual(convex.pieces.map((p) => p.areaMm2));
  });
});

describe('report', () => {
  it('lists each dihedral angle of an upload once, though its rounded coordinates split it by a hair', () => {
    // samples/specs/pentagonal-spindle.json: a bipyramid over a regular pentagon has two kinds of edge (to
    // the apexes, around the equator), so two dihedral angles (derived); its 6-decimal coordinates gave
    // 118.8158 and 118.8159 for one of them.
    const spec = JSON.parse(
      fs.readFileSync(path.join(__dirname, '../../../samples/specs/pentagonal-spindle.json'), 'utf8'),
    ) as unknown;
    expect(buildModel(spec).report.solid.dihedralAnglesDeg).toHaveLength(2);
  });

  it('has unit outward normals, counter-clockwise outlines with their areas, and slot counts that add up', () => {
    const r = buildModel(octahedronHexagons()).report;
    expect(r.solid).toMatchObject({ name: 'octahedron', faceCount: 8 });
    expect(r.solid.dihedralAnglesDeg).toEqual([109.4712]);
    for (const p of r.pieces) {
      expect(Math.hypot(...p.normal)).toBeCloseTo(1, 5);
      const c = p.centreMm;
      expect(p.normal[0] * c[0] + p.normal[1] * c[1] + p.normal[2] * c[2]).toBeGreaterThan(0);
      expect(signedArea(p.outline)).toBeGreaterThan(0);
      expect(p.areaMm2).toBeCloseTo(signedArea(p.outline), 2);
      expect(p.areaMm2).toBeGreaterThan(p.nominalAreaMm2);
    }
    expect(r.pieces.reduce((s, p) => s + p.slotCount, 0)).toBe(2 * r.crossings.length);
  });
});

describe('every catalogue solid', () => {
  const shapes = [
    { sides: 4, step: 1, rotationDeg: 45 },
    { sides: 6, step: 1, rotationDeg: 0 },
    { sides: 5, step: 2, rotationDeg: 0 },
    { sides: 8, step: 3, rotationDeg: 10 },
  ];
  it.each(listSolids().map((s) => s.id))(
    '%s builds with several shapes, rigid and flexible, laser and router',
    (id) => {
      for (const shape of shapes) {
        const overlap = suggestSizes(getSolid(id), shape).overlap;
        expect(overlap).not.toBeNull();
        const size = (overlap ?? 1) * 1.4;
        for (const [stock, machine] of [
          [{ thicknessMm: 3 }, { kind: 'laser', kerfMm: 0.15 }],
          [
            { thicknessMm: 0.4, flexible: true },
            { kind: 'router', toolDiameterMm: 0.3 },
          ],
        ] as const) {
          const m = buildModel(design({ solid: id, piece: { ...shape, size }, stock, machine }));
          expect(m.report.crossings.length).toBeGreaterThan(0);
          for (const p of m.pieces) {
            if (p.outline.length) expect(signedArea(p.outline)).toBeGreaterThan(0);
          }
        }
      }
    },
  );
});
