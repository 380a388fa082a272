import polygonClipping from 'polygon-clipping';
import { buildModel } from '../build';
import { cubeSquares45, octahedronHexagons } from '../test-support/designs';
import { boundaryDistance, placed } from '../test-support/polygons';
import { cutterClearanceMm, gapRaisedNote, layoutModel, marginRaisedNote } from './plan-layout';

type P = [number, number];

/** Smallest boundary distance between any two pieces on one sheet, and whether any two overlap. */
function spacing(
  model: ReturnType<typeof buildModel>,
  layout: Extract<ReturnType<typeof layoutModel>, { ok: true }>,
) {
  const outline = new Map(model.pieces.map((p) => [p.id, p.outline as P[]]));
  let min = Infinity;
  let overlaps = 0;
  for (const s of layout.sheets) {
    const polys = s.placements.map((pl) => placed(outline.get(pl.part)!, pl.x, pl.y, pl.rotationDeg));
    for (let i = 0; i < polys.length; i++)
      for (let j = i + 1; j < polys.length; j++) {
        min = Math.min(min, boundaryDistance(polys[i]!, polys[j]!));
        // polygon-clipping (an independent library) for overlaps.
        if (polygonClipping.intersection([polys[i]!], [polys[j]!]).length > 0) overlaps++;
      }
  }
  return { min, overlaps };
}

/** Squares on the cube's planes in 6 mm stock, cut with a 3.175 mm router bit (a design without errors). */
function routerSquares() {
  const model = buildModel(
    cubeSquares45(1.5, {
      scale: { by: 'diameter', mm: 300 },
      stock: { thicknessMm: 6, flexible: false },
      machine: { kind: 'router', toolDiameterMm: 3.175 },
      fitMm: 0.1,
    }),
  );
  expect(model.report.errors).toEqual([]);
  return model;
}

describe('layoutModel: room for the cutter between pieces', () => {
  // Common practice: a router's tool offset puts the bit's whole diameter outside the nominal outline the
  // files carry, so two pieces closer than the diameter lose material to each other's cut; at exactly one
  // diameter the two tool paths coincide (a path cut twice), so they are kept 1 mm apart (our choice).
  it('lays router pieces at least a bit diameter and 1 mm apart when the gap asked for is smaller', () => {
    const model = routerSquares();
    const layout = layoutModel(model, {
      sheet: { widthMm: 600, heightMm: 400 },
      marginMm: 5,
      gapMm: 1,
      colours: { count: 1 },
      quantity: 2,
    });
    if (!layout.ok) throw new Error(layout.message);
    expect(layout.gapMm).toBe(4.175);
    const { min, overlaps } = spacing(model, layout);
    expect(overlaps).toBe(0);
    expect(min).toBeGreaterThanOrEqual(4.175 - 1e-3);
    expect(gapRaisedNote(model.spec.machine, 1, layout.gapMm)).toMatch(
      /4\.175 mm apart, not 1 mm: the 3\.175 mm bit, passing outside both neighbours on separate paths,/,
    );
  });

  it('keeps router pieces a bit diameter from the sheet edges when the margin asked for is smaller', () => {
    // Common practice: the bit runs outside the nominal outline, so a piece closer to the edge than one bit
    // diameter has its cut run off the stock (and the bit's centre off a bed no larger than the sheet).
    const model = routerSquares();
    const sheet = { widthMm: 600, heightMm: 400 };
    const layout = layoutModel(model, { sheet, marginMm: 0, gapMm: 8, colours: { count: 1 }, quantity: 2 });
    if (!layout.ok) throw new Error(layout.message);
    expect(layout.marginMm).toBe(3.175);
    const outline = new Map(model.pieces.map((p) => [p.id, p.outline as P[]]));
    let nearest = Infinity;
    for (const s of layout.sheets)
      for (const pl of s.placements)
        for (const [x, y] of placed(outline.get(pl.part)!, pl.x, pl.y, pl.rotationDeg))
          nearest = Math.min(nearest, x, y, sheet.widthMm - x, sheet.heightMm - y);
    expect(nearest).toBeGreaterThanOrEqual(3.175 - 1e-3);
    expect(marginRaisedNote(model.spec.machine, 0, layout.marginMm)).toMatch(
      /3\.175 mm from the sheet's edges, not 0 mm: the 3\.175 mm bit/,
    );
    // A wider margin asked for is kept, and a laser's is never raised.
    const wide = layoutModel(model, { sheet, marginMm: 10, gapMm: 8, colours: { count: 1 } });
    expect(wide.ok && wide.marginMm).toBe(10);
    expect(marginRaisedNote(model.spec.machine, 10, 10)).toBeNull();
    const laser = layoutModel(buildModel(octahedronHexagons()), {
      sheet,
      marginMm: 0,
      gapMm: 3,
      colours: { count: 1 },
    });
    expect(laser.ok && laser.marginMm).toBe(0);
  });

  it('keeps a wider gap as asked, and lays laser pieces at least a kerf apart', () => {
    const model = buildModel(octahedronHexagons());
    const wide = layoutModel(model, {
      sheet: { widthMm: 600, heightMm: 400 },
      marginMm: 5,
      gapMm: 4,
      colours: { count: 1 },
    });
    if (!wide.ok) throw new Error(wide.message);
    expect(wide.gapMm).toBe(4);
    expect(gapRaisedNote(model.spec.machine, 4, wide.gapMm)).toBeNull();
    const tight = layoutModel(model, {
      sheet: { widthMm: 600, heightMm: 400 },
      marginMm: 5,
      gapMm: 0,
      colours: { count: 1 },
    });
    if (!tight.ok) throw new Error(tight.message);
    expect(cutterClearanceMm(model.spec.machine)).toBe(0.15);
    expect(tight.gapMm).toBe(0.15);
    expect(spacing(model, tight).min).toBeGreaterThanOrEqual(0.15 - 1e-3);
  });
});
