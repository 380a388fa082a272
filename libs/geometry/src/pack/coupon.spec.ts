import * as polygonClipping from 'polygon-clipping';
import type { DesignSpec } from '@kerfwright/contracts';
import { buildModel } from '../build';
import { design } from '../test-support/designs';
import { createCoupon, createCutPack } from './pack';
import { packInputFrom } from './cli-commands';
import { type P, disc, outsideArea, polyArea, readDxf, readSvg, scaleBars } from './read-back.test';

/** Rhombic triacontahedron planes with triangles: 30 pieces crossing at 36° and 60° (our own design). */
const triacontaTriangles = (extra: Partial<DesignSpec> = {}): DesignSpec =>
  design({
    solid: 'rhombic-triacontahedron',
    piece: { sides: 3, step: 1, rotationDeg: 0, size: 0.6 },
    scale: { by: 'diameter', mm: 300 },
    ...extra,
  });

/** Widths of the gaps (slots) a horizontal line at y crosses in a contour, left to right (polygon-clipping). */
function gapsAt(contour: P[], y: number): number[] {
  const xs = contour.map((p) => p[0]);
  const band: P[] = [
    [Math.min(...xs) - 1, y - 0.005],
    [Math.max(...xs) + 1, y - 0.005],
    [Math.max(...xs) + 1, y + 0.005],
    [Math.min(...xs) - 1, y + 0.005],
  ];
  const parts = (polygonClipping.intersection([contour], [band]) as P[][][])
    .map((poly) => poly[0]!.map((p) => p[0]))
    .map((r) => [Math.min(...r), Math.max(...r)] as const)
    .sort((a, b) => a[0] - b[0]);
  return parts.slice(1).map((p, i) => p[0] - parts[i]![1]);
}

const nominal = (t: number, angleDeg: number) => t / Math.tan((angleDeg * Math.PI) / 360);

describe('fit-test coupon', () => {
  it('grades slot widths around t·cot(θ/2) at the steepest and shallowest crossing angles', async () => {
    const spec = triacontaTriangles({ machine: { kind: 'laser', kerfMm: 0.2 } });
    const model = buildModel(spec);
    const angles = model.report.crossings.map((c) => c.angleDeg);
    const steep = Math.max(...angles);
    const shallow = Math.min(...angles);
    // REFERENCES "Geometry": footprint t·cot(θ/2) is 1.732 t at 60° and 3.078 t at 36°.
    expect(nominal(3, steep)).toBeCloseTo(1.732 * 3, 2);
    expect(nominal(3, shallow)).toBeCloseTo(3.078 * 3, 2);
    const r = await createCoupon({ ...packInputFrom(spec), archive: false });
    expect(r.files.map((f) => f.name)).toEqual(['coupon.dxf', 'coupon.svg', 'manifest.json']);
    const d = readDxf(r.files[0]!.data);
    expect(d.insUnits).toBe(4);
    expect(d.cut).toHaveLength(2);
    // Strips from bottom to top: C1 (steepest) lies below C2 (shallowest).
    const strips = [...d.cut].sort(
      (a, b) => Math.min(...a.map((p) => p[1])) - Math.min(...b.map((p) => p[1])),
    );
    const offsets = [-0.15, -0.1, -0.05, 0, 0.05, 0.1, 0.15];
    [steep, shallow].forEach((angle, i) => {
      const c = strips[i]!;
      const ys = c.map((p) => p[1]);
      const top = Math.max(...ys);
      const bottom = Math.min(...ys);
      const depth = (top - bottom) / 2;
      // Drawn widths at mid-depth of the graded slots: nominal + offset, narrowed by the kerf.
      const expected = offsets.map((o) => Math.round((nominal(3, angle) + o) * 100) / 100 - 0.2);
      const measured = gapsAt(c, top - depth / 2);
      expect(measured).toHaveLength(7);
      measured.forEach((w, k) => expect(w).toBeCloseTo(expected[k]!, 3));
      // The key slot from the bottom edge: the other strip's computed width.
      const other = i === 0 ? shallow : steep;
      const key = gapsAt(c, bottom + depth / 2);
      expect(key).toHaveLength(1);
      expect(key[0]).toBeCloseTo(Math.round(nominal(3, other) * 100) / 100 - 0.2, 3);
    });
    // Engraved widths and ids stay inside the strips, 1 mm clear (0.8 + kerf/2) of every cut line; the
    // rest of the mark layer is the 50 mm or larger scale bar.
    for (const s of d.mark)
      for (const p of s) {
        const inPiece = strips.some((c) => outsideArea(disc(p, 0.9 - 1e-3), c) < 1e-9);
        if (!inPiece) for (const c of strips) expect(outsideArea(disc(p, 1.9), c)).toBeGreaterThan(0);
      }
    expect(scaleBars(d.mark)[0]).toBeGreaterThanOrEqual(50);
    // Engraved labels: one per graded slot and the key, plus the strip's own: 9 labels × 2 strips of
    // strokes exist (each label at least one stroke).
    expect(d.mark.length).toBeGreaterThan(18);
    const svg = readSvg(r.files[1]!.data);
    expect(svg.unit).toBe('mm');
    expect(svg.cut).toHaveLength(2);
  });

  /** A router-cut cube of squares at 45° (our own design): its coupon, the lower strip's contour, top and depth. */
  async function routerCoupon(thicknessMm: number, toolDiameterMm: number, fitMm: number) {
    const spec: DesignSpec = {
      solid: 'cube',
      piece: { sides: 4, rotationDeg: 45, size: 1.5 },
      scale: { by: 'diameter', mm: 300 },
      stock: { thicknessMm },
      machine: { kind: 'router', toolDiameterMm },
      fitMm,
    };
    const r = await createCoupon({ ...packInputFrom(spec), archive: false });
    const d = readDxf(r.files[0]!.data);
    const c = [...d.cut].sort(
      (a, b) => Math.min(...a.map((p) => p[1])) - Math.min(...b.map((p) => p[1])),
    )[0]!;
    const ys = c.map((p) => p[1]);
    const top = Math.max(...ys);
    return { r, c, top, depth: (top - Math.min(...ys)) / 2 };
  }

  it('gives a router coupon plain widths (no kerf) with dog-bone reliefs below mid-depth', async () => {
    const { c, top, depth } = await routerCoupon(6, 3.175, 0.1);
    // Cube planes cross at 90°: w = t + fit = 6.1 mm (REFERENCES: cot 45° = 1).
    const measured = gapsAt(c, top - depth / 2);
    expect(measured.map((w) => Math.round(w * 1000) / 1000)).toEqual([5.95, 6, 6.05, 6.1, 6.15, 6.2, 6.25]);
    // Dog-bones: just above the slot bottom the cut-outs are wider than the slots.
    // (The key slot's reliefs from the bottom edge reach this height too, at the right end: skip them.)
    const nearBottom = gapsAt(c, top - depth + 0.3).slice(0, 7);
    expect(nearBottom).toHaveLength(7);
    nearBottom.forEach((w, k) => expect(w).toBeGreaterThan(measured[k]! + 0.05));
  });

  it('keeps a router coupon as a sheet keeps its pieces: strips a bit diameter and 1 mm apart, off the edges and the scale mark', async () => {
    // A 10 mm bit in 12 mm stock (cube planes cross at 90°: w = 12 + 0.2 = 12.2 mm, every graded slot wider than
    // the bit). The files carry the nominal outline and the bit runs outside it, removing a band one diameter wide
    // (derived): the layout's rule (libs/geometry README, "Stock sheet") keeps neighbours a diameter and 1 mm apart
    // and a diameter from the stock's edges. Strips 6 mm apart would have each strip's cut run 4 mm into the other.
    const toolMm = 10;
    const { r } = await routerCoupon(12, toolMm, 0.2);
    const d = readDxf(r.files[0]!.data);
    const svg = readSvg(r.files[1]!.data);
    const [lower, upper] = [...d.cut].sort(
      (a, b) => Math.min(...a.map((p) => p[1])) - Math.min(...b.map((p) => p[1])),
    ) as [P[], P[]];
    const ys = (c: P[]) => c.map((p) => p[1]);
    const xs = (c: P[]) => c.map((p) => p[0]);
    // The strips are rectangles notched from their top and bottom edges: their gap is the space between them.
    expect(Math.min(...ys(upper)) - Math.max(...ys(lower))).toBeGreaterThanOrEqual(toolMm + 1 - 1e-9);
    // Coupon sheet edges (the SVG page, mm; nothing lies off the sheet): one bit diameter at least.
    for (const c of [lower, upper]) {
      expect(Math.min(...xs(c))).toBeGreaterThanOrEqual(toolMm - 1e-9);
      expect(Math.min(...ys(c))).toBeGreaterThanOrEqual(toolMm - 1e-9);
      expect(svg.width - Math.max(...xs(c))).toBeGreaterThanOrEqual(toolMm - 1e-9);
      expect(svg.height - Math.max(...ys(c))).toBeGreaterThanOrEqual(toolMm - 1e-9);
    }
    // The scale mark (bar, ticks and label) stays out of the band the bit removes round each strip: its ink is
    // more than a diameter from every strip (polygon-clipping: a disc of that radius round each point misses them).
    const strips = [lower, upper];
    const markPoints = d.mark.flat().filter((p) => !strips.some((c) => outsideArea(disc(p, 0.01), c) < 1e-9));
    expect(markPoints.length).toBeGreaterThan(0);
    for (const p of markPoints)
      for (const c of strips)
        expect(outsideArea(disc(p, toolMm), c)).toBeCloseTo(polyArea(disc(p, toolMm)), 6);
    expect((r.manifest.warnings ?? []).filter((w) => w.includes('scale mark'))).toEqual([]);
  });

  it('leaves out graded slots narrower than the router bit, and says which', async () => {
    // 3 mm stock crossing at 90° with 0.05 mm clearance: w = 3 + 0.05 = 3.05 mm (cot 45° = 1); with a 3 mm
    // bit the −0.15 and −0.10 slots (2.90, 2.95) cannot be cut.
    const { r, c, top, depth } = await routerCoupon(3, 3, 0.05);
    const measured = gapsAt(c, top - depth / 2);
    expect(measured.map((w) => Math.round(w * 1000) / 1000)).toEqual([3, 3.05, 3.1, 3.15, 3.2]);
    expect(r.manifest.warnings).toContainEqual(
      'coupon C1: slots narrower than the 3 mm bit are left out (2.90, 2.95 mm)',
    );
  });

  it('leaves out graded slots no wider than the laser kerf, and says which', async () => {
    // 0.3 mm card crossing at 90° with no clearance: w = 0.3 mm (cot 45° = 1); with a 0.25 mm kerf the
    // −0.15 … −0.05 slots (0.15, 0.20, 0.25 mm) leave nothing to draw between their edges.
    const spec: DesignSpec = {
      solid: 'cube',
      piece: { sides: 4, rotationDeg: 45, size: 1.5 },
      scale: { by: 'diameter', mm: 300 },
      stock: { thicknessMm: 0.3, flexible: true },
      machine: { kind: 'laser', kerfMm: 0.25 },
      fitMm: 0,
    };
    const r = await createCoupon({ ...packInputFrom(spec), archive: false });
    expect(r.manifest.warnings).toContainEqual(
      'coupon C1: slots not wider than the 0.25 mm kerf by 0.01 mm are left out (0.15, 0.20, 0.25 mm)',
    );
  });

  it('fits the machine bed: leaves out the outermost graded slots when the whole series would not, and says so', async () => {
    // Icosahedron planes cross at 180° − 138.19° = 41.81° (dihedral arccos(−√5/3), handbook value), so a slot in
    // 12 mm stock is t·cot(20.905°) = φ²·t = 31.42 mm wide (cot(θ/2) = (3 + √5)/2, derived). Seven graded slots of
    // that width make a coupon about 400 mm long, more than a 300 × 250 mm bed takes either way round.
    const spec: DesignSpec = {
      solid: 'icosahedron',
      piece: { sides: 4, step: 1, rotationDeg: 0, size: 0.52 },
      scale: { by: 'diameter', mm: 1000 },
      stock: { thicknessMm: 12, flexible: false },
      machine: { kind: 'router', toolDiameterMm: 6.35 },
      fitMm: 0,
    };
    const onBed = (bedWidthMm: number, bedHeightMm: number) =>
      createCoupon({ ...packInputFrom(spec, { machine: { bedWidthMm, bedHeightMm } }), archive: false });
    const fits = (w: number, h: number, bw: number, bh: number) =>
      (w <= bw && h <= bh) || (h <= bw && w <= bh);
    const phi2 = (3 + Math.sqrt(5)) / 2;
    const computed = Math.round(12 * phi2 * 100) / 100;
    expect(computed).toBeCloseTo(31.42, 2);

    // A large bed takes the whole series.
    const large = await onBed(1200, 800);
    const largeSvg = readSvg(large.files[1]!.data);
    expect(fits(largeSvg.width, largeSvg.height, 300, 250)).toBe(false);
    const gradedOf = (r: typeof large) => {
      const [c1] = [...readDxf(r.files[0]!.data).cut].sort(
        (a, b) => Math.min(...a.map((p) => p[1])) - Math.min(...b.map((p) => p[1])),
      ) as [P[]];
      const ys = c1.map((p) => p[1]);
      const top = Math.max(...ys);
      return gapsAt(c1, top - (top - Math.min(...ys)) / 4).map((w) => Math.round(w * 100) / 100);
    };
    expect(gradedOf(large)).toHaveLength(7);
    expect(large.manifest.warnings).toEqual([]);

    // A 300 × 250 mm bed: the coupon drawn fits it (the SVG page is the coupon's extent), keeps the computed
    // width and its nearest neighbours, and names the offsets left out.
    const small = await onBed(300, 250);
    const smallSvg = readSvg(small.files[1]!.data);
    expect(fits(smallSvg.width, smallSvg.height, 300, 250)).toBe(true);
    const kept = gradedOf(small);
    expect(kept.length).toBeGreaterThanOrEqual(1);
    expect(kept.length).toBeLessThan(7);
    expect(kept).toContain(computed);
    const offsetsKept = kept.map((w) => Math.round((w - computed) * 100) / 100);
    const left = [-0.15, -0.1, -0.05, 0, 0.05, 0.1, 0.15].filter((o) => !offsetsKept.includes(o));
    // Those left out lie farther from the computed width than every one kept.
    expect(Math.min(...left.map(Math.abs))).toBeGreaterThanOrEqual(Math.max(...offsetsKept.map(Math.abs)));
    expect((small.manifest.warnings ?? []).filter((w) => w.includes('bed'))).toEqual([
      `coupon: the graded slots at ${left.map((o) => `${o > 0 ? '+' : ''}${o.toFixed(2)}`).join(', ')} mm ` +
        "from the computed width are left out so that the coupon fits the machine's 300 × 250 mm bed",
    ]);

    // A bed smaller than a single slot's strip: the coupon cannot fit, and the warning says so.
    const tiny = await onBed(200, 150);
    const tinySvg = readSvg(tiny.files[1]!.data);
    expect(fits(tinySvg.width, tinySvg.height, 200, 150)).toBe(false);
    expect((tiny.manifest.warnings ?? []).join(' ')).toContain("larger than the machine's 200 × 150 mm bed");
    expect(gradedOf(tiny)).toHaveLength(7);
  });

  it('is part of every cut pack, in the pack units', async () => {
    const spec = design({ solid: 'octahedron', piece: { sides: 6, step: 1, rotationDeg: 0, size: 1.3 } });
    const r = await createCutPack({ ...packInputFrom(spec, { units: 'in' }), archive: false });
    const coupon = r.files.find((f) => f.role === 'coupon-dxf')!;
    expect(readDxf(coupon.data).insUnits).toBe(1);
    expect(r.manifest.files.map((f) => f.role)).toEqual(expect.arrayContaining(['coupon-dxf', 'coupon-svg']));
  });
});
