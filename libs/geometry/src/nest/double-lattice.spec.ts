import * as polygonClipping from 'polygon-clipping';
import { densestDoubleLattice, sheetLattices, type LatticeSpec, type SheetLattice } from './double-lattice';
import { nestParts, type NestInput } from './nest';
import { circumscribedConvex, convexHull } from './polygon';
import { area, box, boundaryDistance, mpArea, type P, placed, regular } from '../test-support/polygons';

/**
 * Independent check of a lattice claimed by the search: the pieces of the cells around the origin (piece at
 * θ on Λ, turned copy at Λ + t) are intersected pairwise with polygon-clipping; no overlap of positive area.
 * Pieces are shrunk by one part in a million about their centre (the outlines here are centred on the origin)
 * so that tiles sharing whole edges do not hit polygon-clipping's degenerate cases; an overlap deeper than
 * that (under 0.1 µm here) still shows.
 */
function expectLatticeClear(full: P[], lat: LatticeSpec): void {
  const outline = full.map(([x, y]) => [x * (1 - 1e-6), y * (1 - 1e-6)] as P);
  const pieces: P[][] = [];
  for (let i = -2; i <= 2; i++)
    for (let j = -2; j <= 2; j++) {
      const x = i * lat.ax + j * lat.bx;
      const y = j * lat.by;
      pieces.push(placed(outline, x, y, lat.thetaDeg));
      if (lat.partner) pieces.push(placed(outline, x + lat.t[0], y + lat.t[1], lat.thetaDeg + 180));
    }
  const a = area(outline);
  for (let i = 0; i < pieces.length; i++)
    for (let j = i + 1; j < pieces.length; j++) {
      const overlap = mpArea(polygonClipping.intersection([pieces[i]!], [pieces[j]!]));
      expect(overlap).toBeLessThan(1e-6 * a);
    }
}

/** Placements of a sheet arrangement: inside the sheet less margin, no overlap, at least the gap apart. */
function expectSheetClear(outline: P[], arr: SheetLattice, W: number, H: number, m: number, gap: number) {
  const polys = arr.placements.map((pl) => placed(outline, pl.x, pl.y, pl.rotationDeg));
  const boxes = polys.map(box);
  for (const b of boxes) {
    expect(b.minX).toBeGreaterThanOrEqual(m - 1e-6);
    expect(b.minY).toBeGreaterThanOrEqual(m - 1e-6);
    expect(b.maxX).toBeLessThanOrEqual(W - m + 1e-6);
    expect(b.maxY).toBeLessThanOrEqual(H - m + 1e-6);
  }
  for (let i = 0; i < polys.length; i++)
    for (let j = i + 1; j < polys.length; j++) {
      const a = boxes[i]!;
      const b = boxes[j]!;
      if (a.maxX + gap < b.minX || b.maxX + gap < a.minX || a.maxY + gap < b.minY || b.maxY + gap < a.minY)
        continue;
      expect(mpArea(polygonClipping.intersection([polys[i]!], [polys[j]!]))).toBeLessThan(1e-6);
      if (gap > 0) expect(boundaryDistance(polys[i]!, polys[j]!)).toBeGreaterThanOrEqual(gap - 1e-6);
    }
}

/**
 * Derived lower bound for a lattice with a horizontal row vector a = (ax, 0) and row height by, clipped to a
 * W × H sheet less margin m, whatever its origin: a piece w × h may sit with its reference point anywhere in an
 * interval of W − 2m − w across and H − 2m − h up; rows are by apart, so at least ⌊(H − 2m − h)/by⌋ rows fall
 * in the interval, and each row has at least ⌊(W − 2m − w)/ax⌋ points in it. Summed over the piece and its
 * turned copy. So the edge loss is at most one period plus one piece size along each axis.
 */
function clippedLatticeLowerBound(outline: P[], arr: SheetLattice, W: number, H: number, m: number): number {
  const lat = arr.lattice;
  const [w, h] = arr.columns ? [H, W] : [W, H];
  const members = [placed(outline, 0, 0, lat.thetaDeg)];
  if (lat.partner) members.push(placed(outline, 0, 0, lat.thetaDeg + 180));
  let n = 0;
  for (const piece of members) {
    const b = box(piece);
    // The search keeps 1 µm inside each edge for rounding.
    const lx = w - 2 * m - (b.maxX - b.minX) - 0.002;
    const ly = h - 2 * m - (b.maxY - b.minY) - 0.002;
    n += Math.max(0, Math.floor(lx / lat.ax)) * Math.max(0, Math.floor(ly / lat.by));
  }
  return n;
}

describe('densest double lattice on the plane (outside reference values)', () => {
  // The search is numerical; it refines the rotation, the turned copy's touching position and the second
  // vector until steps fall below 1e-7, so it lands on the optimum to far better than 1e-4 (measured: 1e-15 for
  // the pentagon). The upper side needs no slack beyond rounding: a valid packing cannot beat the optimum, and
  // each claimed lattice is checked for overlaps independently with polygon-clipping.
  it('regular pentagon: (5 − √5)/3 ≈ 0.9213 (densest double lattice, Kuperberg & Kuperberg, Discrete Comput. Geom. 5, 1990, from memory of the venue; optimal among all packings, Hales & Kusner, arXiv:1602.07220)', () => {
    const outline = regular(5, 50);
    const lat = densestDoubleLattice(outline, 0, 72)!;
    const bound = (5 - Math.sqrt(5)) / 3;
    expect(lat.partner).toBe(true);
    expect(lat.density).toBeLessThanOrEqual(bound + 1e-9);
    expect(lat.density).toBeGreaterThan(bound - 1e-4);
    expect(lat.density).toBeCloseTo((2 * area(outline)) / (lat.ax * lat.by), 12);
    expectLatticeClear(outline, lat);
  });

  it('regular hexagon: 1, it tiles the plane (REFERENCES "Packing")', () => {
    const outline = regular(6, 40, 0);
    const lat = densestDoubleLattice(outline, 0, 60)!;
    expect(lat.density).toBeLessThanOrEqual(1 + 1e-9);
    expect(lat.density).toBeGreaterThan(1 - 1e-6);
    expectLatticeClear(outline, lat);
  });

  it('regular octagon: (4 + 4√2)/(5 + 4√2) ≈ 0.9062 (centrally symmetric, so a lattice is densest: Fejes Tóth; REFERENCES "Packing", from memory)', () => {
    const outline = regular(8, 40);
    const lat = densestDoubleLattice(outline, 0, 45)!;
    const bound = (4 + 4 * Math.SQRT2) / (5 + 4 * Math.SQRT2);
    expect(lat.density).toBeLessThanOrEqual(bound + 1e-9);
    expect(lat.density).toBeGreaterThan(bound - 1e-4);
    expectLatticeClear(outline, lat);
  });

  it('regular heptagon: best known double lattice ≈ 0.8927 (REFERENCES "Packing", from memory: ±0.0005)', () => {
    const outline = regular(7, 40);
    const lat = densestDoubleLattice(outline, 0, 360 / 7)!;
    expect(Math.abs(lat.density - 0.8927)).toBeLessThan(5e-4);
    expectLatticeClear(outline, lat);
  });
});

describe('double lattice clipped to a sheet', () => {
  // Finite sheet: utilisation can only lose to the edges, by at most one lattice period plus one piece size
  // along each axis (clippedLatticeLowerBound, derived), so it must lie between that bound for the densest
  // double lattice and the published density; every placement is checked with polygon-clipping.
  const sheetCases: [string, P[], number, number][] = [
    [
      'regular pentagon, (5 − √5)/3 (Kuperberg & Kuperberg 1990; Hales & Kusner 2016)',
      regular(5, 30),
      72,
      (5 - Math.sqrt(5)) / 3,
    ],
    ['regular hexagon, 1 (it tiles; REFERENCES "Packing")', regular(6, 30, 0), 60, 1],
  ];
  it.each(sheetCases)(
    '%s: a large sheet comes within the derived edge loss of the density',
    (_n, outline, period, bound) => {
      const W = 1500;
      const H = 1000;
      const found = sheetLattices(
        outline,
        { widthMm: W, heightMm: H, marginMm: 0, gapMm: 0 },
        {
          anglesDeg: Array.from({ length: 24 }, (_, i) => (i * period) / 24),
          free: true,
          partnerAllowed: () => true,
        },
      );
      expect(found.length).toBeGreaterThan(0);
      const best = found[0]!;
      const a = area(outline);
      const u = (best.placements.length * a) / (W * H);
      expect(u).toBeLessThanOrEqual(bound + 1e-9);
      // The fullest arrangement holds at least what the densest double lattice is guaranteed to hold.
      const densest = densestDoubleLattice(outline, 0, period)!;
      expect(densest.density).toBeGreaterThan(bound - 1e-4);
      const floor = clippedLatticeLowerBound(
        outline,
        { lattice: densest, columns: false, placements: [], description: '' },
        W,
        H,
        0,
      );
      expect(best.placements.length).toBeGreaterThanOrEqual(floor);
      expect(best.placements.length).toBeGreaterThanOrEqual(clippedLatticeLowerBound(outline, best, W, H, 0));
      expectSheetClear(outline, best, W, H, 0, 0);
    },
  );

  it('honours margin and gap: hexagons with a 3 mm gap and a 10 mm margin stay inside and apart (polygon-clipping and plain distances)', () => {
    const outline = regular(6, 45, 0);
    const W = 600;
    const H = 400;
    const found = sheetLattices(
      outline,
      { widthMm: W, heightMm: H, marginMm: 10, gapMm: 3 },
      {
        anglesDeg: Array.from({ length: 24 }, (_, i) => i * 2.5),
        free: true,
        partnerAllowed: () => true,
      },
    );
    for (const arr of found) expectSheetClear(outline, arr, W, H, 10, 3);
  });

  it('fits 35 hexagons of circumradius 45 on 600 × 400 with a 3 mm gap (derived; a bounding-box packer gets 28 in the bench)', () => {
    // Derived: point-up hexagons are 77.94 mm across the flats, so a row of 7 with 3 mm gaps is 563.59 mm long,
    // leaving 36.41 mm to shift every other row. Nested rows need a shift of (77.94 + 3)/2 = 40.47 mm and a row
    // pitch of 1.5 × (45 + 1.5/cos 30°) = 70.10 mm; each millimetre of shift short of that lifts the row by
    // tan 30°, so the pitch becomes 70.10 + 4.06 × 0.577 = 72.44 mm, and five rows need 4 × 72.44 + 90 = 379.8 mm.
    const outline = regular(6, 45, 0);
    const W = 600;
    const H = 400;
    const input: NestInput = {
      sheet: { widthMm: W, heightMm: H },
      marginMm: 0,
      gapMm: 3,
      parts: [{ id: 'hex', outline, quantity: 35 }],
    };
    const r = nestParts(input);
    expect(r.ok && r.totals.sheetCount).toBe(1);
    if (!r.ok) return;
    const arr: SheetLattice = {
      lattice: { thetaDeg: 0, partner: false, t: [0, 0], ax: 1, bx: 0, by: 1, density: 0 },
      columns: false,
      placements: r.sheets[0]!.placements.map((p) => ({ rotationDeg: p.rotationDeg, x: p.x, y: p.y })),
      description: '',
    };
    expect(arr.placements.length).toBe(35);
    expectSheetClear(outline, arr, W + 1e-3, H + 1e-3, -1e-3, 3 - 2e-3);
  });

  it('nestParts keeps the double lattice correct on full sheets and bottom-left fill on the last one', () => {
    const outline = regular(5, 50);
    const input: NestInput = {
      sheet: { widthMm: 600, heightMm: 400 },
      marginMm: 5,
      gapMm: 3,
      parts: [{ id: 'pent', outline, quantity: 40 }],
    };
    const r = nestParts({ ...input, method: 'pattern' });
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.sheets.reduce((s, sh) => s + sh.placements.length, 0)).toBe(40);
    const m = input.marginMm;
    for (const sheet of r.sheets) {
      const arr: SheetLattice = {
        lattice: { thetaDeg: 0, partner: false, t: [0, 0], ax: 1, bx: 0, by: 1, density: 0 },
        columns: false,
        placements: sheet.placements.map((p) => ({ rotationDeg: p.rotationDeg, x: p.x, y: p.y })),
        description: '',
      };
      // 1 µm of slack: placements are reported in whole micrometres.
      expectSheetClear(outline, arr, 600, 400, m - 1e-3, 3 - 2e-3);
    }
  });
});

describe('a coarse hull for finely drawn outlines', () => {
  const circle = (n: number, r: number): P[] =>
    Array.from({ length: n }, (_, i) => [
      r * Math.cos((2 * Math.PI * i) / n),
      r * Math.sin((2 * Math.PI * i) / n),
    ]);

  it('contains the hull with at most the vertices asked for, adding little area (polygon-clipping)', () => {
    for (const [outline, max] of [
      [circle(1000, 100), 64],
      [circle(997, 40), 12],
      // A rounded rectangle: four flat sides and fine corners.
      [
        convexHull([...circle(400, 10).map(([x, y]) => [x + (x > 0 ? 80 : 0), y + (y > 0 ? 30 : 0)] as P)]),
        24,
      ],
    ] as const) {
      const hull = convexHull(outline).map(([x, y]): P => [x, y]);
      const coarse = circumscribedConvex(hull, max).map(([x, y]): P => [x, y]);
      expect(coarse.length).toBeLessThanOrEqual(max);
      // Nothing of the hull is outside the coarse polygon: their difference has no area.
      expect(mpArea(polygonClipping.difference([hull], [coarse]))).toBeLessThan(1e-6 * area(hull));
      // A regular circumscribed m-gon of a circle has m·tan(π/m)/π times its area (elementary geometry); the
      // greedy polygon stays within 1 % of that (a rounded rectangle's corners are a circle cut in four).
      const regularRatio = (max * Math.tan(Math.PI / max)) / Math.PI;
      expect(area(coarse) / area(hull)).toBeLessThan(regularRatio * 1.01);
    }
  });

  it('keeps a hull that is already coarse enough as it is', () => {
    const hex = convexHull(regular(6, 50));
    expect(circumscribedConvex(hex, 64)).toEqual(hex);
  });

  it('lays finely drawn discs in a lattice, checked on their true outlines: the search works on the coarse hull', () => {
    // 360 points, well over the search's 64 (fewer than the 1,000 of the slow case to keep the check quick).
    const outline = circle(360, 100);
    const sheet = { widthMm: 600, heightMm: 400, marginMm: 5, gapMm: 3 };
    const lattices = sheetLattices(outline, sheet, {
      anglesDeg: [0, 90],
      free: false,
      partnerAllowed: () => true,
    });
    expect(lattices.length).toBeGreaterThan(0);
    // 200 mm discs 3 mm apart within 590 × 390: two rows of two at most (a square grid needs 203 × 203 each).
    expect(lattices[0]!.placements.length).toBe(4);
    expectSheetClear(outline, lattices[0]!, 600, 400, 5 - 1e-3, 3 - 2e-3);
  });
});
