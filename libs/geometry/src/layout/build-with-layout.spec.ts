import type { DesignReport, DesignSpec } from '@kerfwright/contracts';
import { buildModel } from '../build';
import { getSolid } from '../solids/catalogue';
import { cubeSquares45, octahedronHexagons } from '../test-support/designs';
import { buildWithLayout, sheetsNeeded } from './build-with-layout';

const sheet = { widthMm: 600, heightMm: 400 };
const withSheet = (spec: DesignSpec, extra: object = {}): DesignSpec => ({
  ...spec,
  stock: { ...spec.stock, sheet },
  ...extra,
});

/**
 * An independent colour-plan checker: adjacency from the solid's edge list (the two faces of each edge),
 * vertices from its vertex–face incidence, opposite faces from the report's piece normals (dot = −1).
 */
function ruleBroken(solidId: string, report: DesignReport): string[] {
  const plan = report.colourPlan;
  if (!plan) return ['no plan'];
  const solid = getSolid(solidId);
  const colour = (face: number) => plan.assignment[`P${face + 1}`];
  const broken: string[] = [];
  for (let f = 0; f < solid.faces.length; f++) {
    const c = colour(f);
    if (c === undefined || c < 0 || c >= plan.count || !Number.isInteger(c))
      broken.push(`P${f + 1} uncoloured`);
  }
  if (plan.rule === 'vertex-distinct') {
    solid.vertexFaces.forEach((faces, v) => {
      if (new Set(faces.map(colour)).size !== faces.length) broken.push(`vertex ${v}`);
    });
  } else {
    for (const e of solid.edges)
      if (colour(e.faces[0]) === colour(e.faces[1])) broken.push(`edge ${e.faces}`);
  }
  if (plan.rule === 'opposite-match') {
    report.pieces.forEach((a, i) =>
      report.pieces.forEach((b, j) => {
        const dot = a.normal[0] * b.normal[0] + a.normal[1] * b.normal[1] + a.normal[2] * b.normal[2];
        if (j > i && dot < -1 + 1e-6 && colour(i) !== colour(j)) broken.push(`opposite ${a.id} ${b.id}`);
      }),
    );
  }
  return broken;
}

describe('colour plan in the build report', () => {
  it.each([
    ['cube', cubeSquares45(1.5), 3, 'neighbour-distinct'],
    ['cube', cubeSquares45(1.5), 3, 'opposite-match'],
    ['octahedron', octahedronHexagons(), 4, 'vertex-distinct'],
    ['octahedron', octahedronHexagons(), 2, 'neighbour-distinct'],
  ] as const)('%s with %i colours, %s: the plan keeps the rule', (solid, spec, count, rule) => {
    const r = buildModel({ ...spec, colours: { count, rule } }).report;
    expect(r.colourPlan).toMatchObject({ rule, count, feasible: true });
    expect(ruleBroken(solid, r)).toEqual([]);
    expect(r.colourPlan?.colourCounts.reduce((a, b) => a + b, 0)).toBe(r.pieces.length);
    expect(r.colourPlan?.distinctPlans).toBeGreaterThanOrEqual(1);
    expect(r.errors).toEqual([]);
  });

  it('reports a rule with no plan as an error that blocks files', () => {
    // Derived: the three faces around a cube vertex touch pairwise, so neighbours-differ needs 3 colours;
    // each opposite pair touches both other pairs, so opposite-match needs 3 too. Four faces meet at each
    // octahedron vertex, so vertex-distinct needs 4.
    for (const [spec, count, rule] of [
      [cubeSquares45(1.5), 2, 'neighbour-distinct'],
      [cubeSquares45(1.5), 2, 'opposite-match'],
      [octahedronHexagons(), 3, 'vertex-distinct'],
    ] as const) {
      const r = buildModel({ ...spec, colours: { count, rule } }).report;
      expect(r.colourPlan).toMatchObject({ feasible: false, assignment: {} });
      expect(r.errors.map((e) => e.code)).toEqual(['COLOUR.NO_PLAN']);
      expect(r.errors[0]?.message).toMatch(/no plan exists/);
    }
  });

  it('leaves the report without a plan when no colours are given', () => {
    expect(buildModel(cubeSquares45(1.5)).report.colourPlan).toBeUndefined();
  });
});

describe('sheet count', () => {
  it('is in the report of a build with layout when the stock has a sheet, and matches sheetsNeeded', () => {
    const spec = withSheet(octahedronHexagons());
    const { model, layout } = buildWithLayout(spec);
    expect(layout?.ok).toBe(true);
    expect(model.report.sheetCount).toBe(layout?.ok ? layout.totals.sheetCount : -1);
    expect(sheetsNeeded(spec)).toBe(model.report.sheetCount);
    // Without a sheet there is no layout and no count; buildModel never lays out.
    expect(buildWithLayout(octahedronHexagons()).model.report.sheetCount).toBeUndefined();
    expect(buildModel(spec).report.sheetCount).toBeUndefined();
    expect(() => sheetsNeeded(octahedronHexagons())).toThrow(/stock\.sheet/);
  });

  it('counts more sheets for a larger model and reports a piece larger than the sheet', () => {
    // Derived bound: each sheet holds at most its own area of pieces.
    for (const mm of [80, 120]) {
      const spec = withSheet(octahedronHexagons({ scale: { by: 'planeDistance', mm } }));
      const { model } = buildWithLayout(spec);
      const area = model.report.pieces.reduce((s, p) => s + p.areaMm2, 0);
      expect(model.report.sheetCount).toBeGreaterThanOrEqual(Math.ceil(area / (600 * 400)));
    }
    const huge = withSheet(octahedronHexagons({ scale: { by: 'planeDistance', mm: 300 } }));
    const r = buildWithLayout(huge).model.report;
    expect(r.errors.map((e) => e.code)).toEqual(['LAYOUT.PIECE_TOO_LARGE']);
    // Said for the workshop, with what would help: all eight hexagons are too large, four named.
    expect(r.errors[0]!.message).toMatch(
      /^Pieces \S+, \S+, \S+, \S+ and 4 more do not fit a 600 × 400 mm sheet inside its \d+(\.\d+)? mm margins, however turned: make the model smaller, choose a larger sheet, or fit the size to the sheets$/,
    );
    expect(sheetsNeeded(huge)).toBeNull();
  });
});

describe('fitSheets scale', () => {
  /** A tetrahedron of {5/2} stars fitted to one 600 × 400 sheet (5 mm margin, 3 mm gap), in stock this thick. */
  const tetrahedronStars = (thicknessMm: number) =>
    ({
      solid: 'tetrahedron',
      piece: { sides: 5, step: 2, size: 1.85 },
      scale: { by: 'fitSheets', sheets: 1 },
      stock: { thicknessMm, sheet, marginMm: 5, gapMm: 3 },
      machine: { kind: 'laser', kerfMm: 0.15 },
    }) as unknown as DesignSpec;
  const spec = (sheets: number) =>
    withSheet(cubeSquares45(1.5), { scale: { by: 'fitSheets', sheets } }) as unknown as DesignSpec;

  it('finds a model that fits N sheets while 1 % larger needs more', () => {
    const { model, layout, resolvedSpec } = buildWithLayout(spec(2));
    const r = model.report;
    expect(r.errors).toEqual([]);
    expect(r.scale).toMatchObject({ method: 'fitSheets', sheets: 2, resolved: true, tolerance: 0.005 });
    expect(r.scale?.evaluations).toBeLessThanOrEqual(16);
    expect(r.sheetCount).toBeLessThanOrEqual(2);
    expect(layout?.ok && layout.totals.sheetCount).toBe(r.sheetCount);
    expect(resolvedSpec.scale).toEqual({ by: 'diameter', mm: r.diameterMm });
    // The resolved size, rebuilt as a fixed diameter, lays out the same; 1 % larger needs a third sheet.
    expect(sheetsNeeded(resolvedSpec)).toBe(r.sheetCount);
    const larger = sheetsNeeded({ ...resolvedSpec, scale: { by: 'diameter', mm: r.diameterMm * 1.01 } });
    expect(larger === null || larger > 2).toBe(true);
  });

  it('looks past a size that fails where a slightly larger one fits again (nesting is not monotone)', () => {
    // Our own: a triakis tetrahedron of {7/2} stars on one 300 × 300 sheet. Bisection alone stopped at
    // 136.9 mm across, just below a size that needs two sheets, while 1 % larger (138.3 mm) fits one again.
    const tt = {
      solid: 'triakis-tetrahedron',
      piece: { sides: 7, step: 2, size: 0.81 },
      scale: { by: 'fitSheets', sheets: 1 },
      stock: {
        thicknessMm: 3,
        flexible: false,
        sheet: { widthMm: 300, heightMm: 300 },
        marginMm: 5,
        gapMm: 3,
      },
      machine: { kind: 'laser', kerfMm: 0.15 },
      fitMm: 0,
    } as unknown as DesignSpec;
    const { model, resolvedSpec } = buildWithLayout(tt);
    const r = model.report;
    expect(r.errors).toEqual([]);
    expect(r.sheetCount).toBe(1);
    expect(r.diameterMm).toBeGreaterThan(138);
    // Checked by builds of their own: the size found fits one sheet, 1 % and 2 % larger do not.
    expect(sheetsNeeded(resolvedSpec)).toBe(1);
    for (const f of [1.01, 1.02]) {
      const n = sheetsNeeded({ ...resolvedSpec, scale: { by: 'diameter', mm: r.diameterMm * f } });
      expect(n === null || n > 1).toBe(true);
    }
  });

  it('gives an upper bound without layout in buildModel, and never a smaller model from the search', () => {
    const bound = buildModel(spec(2)).report;
    expect(bound.scale).toMatchObject({ method: 'fitSheets', resolved: false });
    expect(bound.warnings.map((w) => w.code)).toContain('SCALE.UPPER_BOUND');
    const searched = buildWithLayout(spec(2)).model.report;
    expect(searched.diameterMm).toBeLessThanOrEqual(bound.diameterMm + 1e-6);
    // Derived: the pieces' total area can be at most the sheets' usable area (600 − 10) × (400 − 10).
    const area = bound.pieces.reduce((s, p) => s + p.areaMm2, 0);
    expect(area).toBeLessThanOrEqual(2 * 590 * 390 * (1 + 1e-6));
  });

  it('finds the sizes that fit between too small for the stock and too large for the sheet', () => {
    // A tetrahedron of {5/2} stars in 3 mm stock on one 600 × 400 sheet: at the area bound and a step of 15 %
    // below it the stars need two sheets, two steps below the slots cut the thin points off. The sizes
    // that fit lie in the narrow window between, which the search must bisect rather than step over.
    const { model, resolvedSpec } = buildWithLayout(tetrahedronStars(3));
    const r = model.report;
    expect(r.errors).toEqual([]);
    expect(r.scale).toMatchObject({ method: 'fitSheets', resolved: true });
    expect(r.sheetCount).toBe(1);
    const at = (mm: number) => sheetsNeeded({ ...resolvedSpec, scale: { by: 'diameter', mm } });
    expect(at(r.diameterMm)).toBe(1);
    // 1 % larger needs a second sheet; 15 % smaller is no longer a sound design (null: errors).
    expect(at(r.diameterMm * 1.01)).not.toBe(1);
    expect(at(r.diameterMm * 0.85)).toBeNull();
  });

  it('says why no size fits when even the largest model for the sheets has design errors', () => {
    const star = tetrahedronStars(10);
    const r = buildWithLayout(star).model.report;
    // The model reported is the largest (the upper bound, its diameter rounded down to the report's 1e-6 mm so
    // that it rebuilds exactly), not one stepped down into worse errors.
    const bound = buildModel(star).report.diameterMm;
    expect(r.diameterMm).toBeLessThanOrEqual(bound);
    expect(r.diameterMm).toBeGreaterThanOrEqual(bound - 2e-6);
    expect(r.scale).toMatchObject({ resolved: false });
    expect(r.errors.find((e) => e.code === 'SCALE.NO_FIT')?.message).toMatch(
      /^no size fits 1 sheet of 600 × 400 mm: even the largest model that fits it \(\d+(\.\d)? mm across\) has design errors at 10 mm stock/,
    );
  });

  it('names the error no size removes, and a remedy that works, when the slots cannot be cut at any size', () => {
    // Cube planes cross at 90°: the slot is t·cot 45° = t = 1 mm wide at every size (REFERENCES.md), not
    // wider than a 1.2 mm kerf. Thinner stock or larger sheets cannot help; thicker stock or a narrower kerf can.
    const fitTwo = (extra: object) =>
      ({ ...cubeSquares45(1.5), scale: { by: 'fitSheets', sheets: 2 }, ...extra }) as unknown as DesignSpec;
    const laser = fitTwo({
      stock: { thicknessMm: 1, flexible: false, sheet: { widthMm: 600, heightMm: 400 } },
      machine: { kind: 'laser', kerfMm: 1.2 },
    });
    const r = buildWithLayout(laser).model.report;
    expect(r.errors.map((e) => e.code)).toContain('SLOT.NARROWER_THAN_KERF');
    const said = r.errors.find((e) => e.code === 'SCALE.NO_FIT')?.message ?? '';
    expect(said).toMatch(/has errors at every size \(the 1 mm slot between .* 1\.2 mm kerf/);
    expect(said).toMatch(/choose thicker stock, a larger fit allowance or a laser with a narrower kerf$/);
    expect(said).not.toMatch(/thinner|larger sheets/);
    // A 6 mm slot for a 6.35 mm (1/4 in) bit: the remedy is a smaller bit.
    const router = fitTwo({
      stock: { thicknessMm: 6, flexible: false, sheet: { widthMm: 1220, heightMm: 610 } },
      machine: { kind: 'router', toolDiameterMm: 6.35 },
    });
    expect(
      buildWithLayout(router).model.report.errors.find((e) => e.code === 'SCALE.NO_FIT')?.message,
    ).toMatch(
      /has errors at every size \(.*6\.35 mm tool\); choose thicker stock, a larger fit allowance or a smaller bit$/,
    );
  });

  it('lays out the stored diameter on the sheets it counted (the search judges only sizes that rebuild exactly)', () => {
    // Our own: a dodecahedron of {5/2} stars on one 800 × 400 sheet, cut with a 2 mm bit. The layout of this
    // design flips between one and two sheets with changes of 1e-5 in the size, and the search once reported
    // one sheet at a size whose diameter, rounded to 1e-6 mm in the report and rebuilt from the stored spec,
    // needed two.
    const dodecahedronStars = {
      solid: 'dodecahedron',
      piece: { sides: 5, step: 2, rotationDeg: 36, size: 0.803 },
      scale: { by: 'fitSheets', sheets: 1 },
      stock: { thicknessMm: 3, sheet: { widthMm: 800, heightMm: 400 }, marginMm: 5, gapMm: 3 },
      machine: { kind: 'router', toolDiameterMm: 2 },
      fitMm: 0,
      bed: { widthMm: 600, heightMm: 700 },
    } as unknown as DesignSpec;
    for (const [design, sheets] of [
      [dodecahedronStars, 1],
      [spec(2), 2],
    ] as const) {
      const { model, resolvedSpec } = buildWithLayout(design);
      const r = model.report;
      expect(r.errors).toEqual([]);
      // Rebuilt from what is stored, independently of the search: the same scale to the last bit, and a
      // layout of its own on no more sheets than asked, as many as the report says.
      const rebuilt = buildWithLayout(resolvedSpec);
      expect(rebuilt.model.mmPerUnit).toBe(model.mmPerUnit);
      expect(rebuilt.layout?.ok && rebuilt.layout.totals.sheetCount).toBe(r.sheetCount);
      expect(r.sheetCount).toBeLessThanOrEqual(sheets);
    }
  });

  it('holds the pieces of a router to the bed less the bit, as fitBed and the validity check do', () => {
    // Our own: a cube of squares cut with a 3 mm bit on a 300 × 250 mm bed, six 1000 × 800 sheets (one per
    // piece), so the bed alone limits the size. The bit's path runs half a diameter outside each outline on
    // every side (common practice: the router's tool offset), so the outline must fit the bed less 3 mm.
    // The search's upper bound once fitted the outline to the whole bed: every size it tried had
    // PIECE.LARGER_THAN_BED, and it answered SCALE.NO_FIT.
    const routed = (scale: object) =>
      withSheet(cubeSquares45(1.5), {
        stock: { thicknessMm: 4, sheet: { widthMm: 1000, heightMm: 800 }, marginMm: 5, gapMm: 3 },
        machine: { kind: 'router', toolDiameterMm: 3 },
        bed: { widthMm: 300, heightMm: 250 },
        scale,
      }) as unknown as DesignSpec;
    const r = buildWithLayout(routed({ by: 'fitSheets', sheets: 6 })).model.report;
    expect(r.errors).toEqual([]);
    expect(r.scale).toMatchObject({ resolved: true });
    // The largest size whose pieces fit the bed, found by fitBed; 0.5 % larger no longer fits it.
    const bed = buildWithLayout(routed({ by: 'fitBed' })).model.report;
    expect(r.diameterMm).toBeLessThanOrEqual(bed.diameterMm);
    expect(r.diameterMm).toBeGreaterThan(bed.diameterMm / 1.005);
    const larger = buildModel(routed({ by: 'diameter', mm: r.diameterMm * 1.005 })).report;
    expect(larger.errors.map((e) => e.code)).toContain('PIECE.LARGER_THAN_BED');
  });

  it('does not search when the colour rule has no plan', () => {
    const r = buildWithLayout({ ...spec(3), colours: { count: 2, rule: 'neighbour-distinct' } }).model.report;
    expect(r.errors.map((e) => e.code)).toEqual(['COLOUR.NO_PLAN']);
    expect(r.scale?.resolved).toBe(false);
  });
});
