import * as ClipperLib from 'clipper-lib';
import { buildModel } from '../build';
import { buildWithLayout } from '../layout/build-with-layout';
import { type Vec2 } from '../math/vec';
import { design } from '../test-support/designs';
import { bestFitRatio } from './fit-ratio';
import { MAX_SCALE_MM, validateSpec } from '../spec/validate-spec';

const square = (s: number, turnDeg = 0): Vec2[] => {
  const a = (turnDeg * Math.PI) / 180;
  return (
    [
      [0, 0],
      [s, 0],
      [s, s],
      [0, s],
    ] as Vec2[]
  ).map(([x, y]) => [x * Math.cos(a) - y * Math.sin(a), x * Math.sin(a) + y * Math.cos(a)] as Vec2);
};

describe('bestFitRatio', () => {
  it('fits a square of side s on a b × b bed exactly when s ≤ b, whichever way it is turned', () => {
    // Derived: a square's bounding box is least when its sides are parallel to the bed's (side s); turned
    // 45° it needs s√2. The search turns it back, so the ratio is s / b for any starting turn.
    for (const turn of [0, 17, 45, 80]) {
      expect(bestFitRatio(square(100, turn), 120, 120).ratio).toBeCloseTo(100 / 120, 9);
      expect(bestFitRatio(square(100, turn), 100, 100).ratio).toBeCloseTo(1, 9);
    }
    // Held at 45° (no search), the box is s√2 wide (derived): that is what the search must beat.
    const turned = square(100, 45);
    const xs = turned.map((p) => p[0]);
    expect(Math.max(...xs) - Math.min(...xs)).toBeCloseTo(100 * Math.SQRT2, 9);
  });

  it('fits nothing in an empty rectangle, and a router bed no wider than the bit holds no piece', () => {
    // A 3 × 3 mm bed less a 3.175 mm bit's path leaves a negative rectangle; the ratios came out negative, so
    // the cube's squares (176.5 mm sides: README worked example 2, derived) were said to fit it.
    expect(bestFitRatio(square(10), -0.175, 5).ratio).toBe(Infinity);
    expect(bestFitRatio(square(10), 5, 0).ratio).toBe(Infinity);
    const spec = {
      ...design({ solid: 'cube', piece: { sides: 4, step: 1, rotationDeg: 45, size: 1.5 } }),
      scale: { by: 'diameter' as const, mm: 300 },
      stock: { thicknessMm: 6, flexible: false },
      machine: { kind: 'router' as const, toolDiameterMm: 3.175 },
      bed: { widthMm: 3, heightMm: 3 },
    };
    const tooLarge = buildModel(spec).report.errors.filter((e) => e.code === 'PIECE.LARGER_THAN_BED');
    expect(tooLarge.flatMap((e) => e.pieces)).toEqual(['P1', 'P2', 'P3', 'P4', 'P5', 'P6']);
    // Scaled to that bed, the search had an empty rectangle (it crashed in Clipper on a negative scale): the
    // spec is refused, naming the bed. A sheet whose bit-wide margins leave nothing is refused too.
    const refused = (s: unknown) => {
      const v = validateSpec(s);
      return v.ok ? [] : v.errors.map((e) => e.field);
    };
    expect(refused({ ...spec, scale: { by: 'fitBed' } })).toEqual(['bed']);
    expect(() => buildModel({ ...spec, scale: { by: 'fitBed' } })).toThrow(/bed leaves no room/);
    expect(refused({ ...spec, bed: { widthMm: 3.2, heightMm: 600 }, scale: { by: 'fitBed' } })).toEqual([]);
    const sheet = { widthMm: 100, heightMm: 100 };
    const bit50 = { kind: 'router' as const, toolDiameterMm: 50 };
    expect(refused({ ...spec, machine: bit50, stock: { thicknessMm: 60, sheet, marginMm: 1 } })).toEqual([
      'stock.sheet',
    ]);
    expect(
      refused({
        ...spec,
        machine: { ...bit50, toolDiameterMm: 49 },
        stock: { thicknessMm: 60, sheet, marginMm: 1 },
      }),
    ).toEqual([]);
  });

  it('finds the diagonal for a strip longer than the bed', () => {
    // Derived: an L × w strip turned by θ has a box (L cos θ + w sin θ) × (L sin θ + w cos θ); on a square
    // bed the larger side is least where both are equal, θ = 45°, giving (L + w)/√2.
    const L = 130;
    const w = 5;
    const strip: Vec2[] = [
      [0, 0],
      [L, 0],
      [L, w],
      [0, w],
    ];
    const r = bestFitRatio(strip, 100, 100);
    expect(r.ratio).toBeCloseTo((L + w) / Math.SQRT2 / 100, 7);
    expect(Math.abs(r.angleDeg - 45)).toBeLessThan(1e-3);
    // On a 140 × 6 bed only lying along it works (derived: the width L cos θ + w sin θ stays ≥ L up to
    // θ = 2·atan(w/L) ≈ 4.4°, beyond which the height L sin θ + w cos θ exceeds 6): ratio 130/140.
    expect(bestFitRatio(strip, 140, 6).ratio).toBeCloseTo(130 / 140, 9);
  });
});

describe('fitBed scale', () => {
  // Cube planes with squares at rotation 0 (sides parallel to the cube's edges) and size 1.8: each slot
  // opens inside an edge, away from the corners, so the compensated piece is a square of side
  // 2h + kerf (h = half-side = R/√2; a mitred kerf/2 offset adds kerf/2 on each side) — derived.
  const cube = (extra: object) =>
    design({ solid: 'cube', piece: { sides: 4, rotationDeg: 0, size: 1.8 }, ...extra });

  it('makes the largest piece just fit the bed', () => {
    const b = 300;
    const kerf = 0.15;
    const r = buildModel(cube({ scale: { by: 'fitBed' }, bed: { widthMm: b, heightMm: b } })).report;
    // Derived: 2h + kerf = b; R = h√2; plane distance d = R / 1.8; diameter = 2 d √(1 + 1.8²).
    const h = (b - kerf) / 2;
    const d = (h * Math.SQRT2) / 1.8;
    expect(r.diameterMm).toBeCloseTo(2 * d * Math.sqrt(1 + 1.8 ** 2), 3);
    expect(r.planeDistanceMm).toBeCloseTo(d, 3);
    expect(r.scale).toMatchObject({ method: 'fitBed', diameterMm: r.diameterMm });
    expect(r.errors).toEqual([]);
    for (const p of r.pieces) expect(bestFitRatio(p.outline, b, b).ratio).toBeLessThanOrEqual(1 + 1e-9);
  });

  it('fits the largest piece to the stock sheet less its margins too, so that it can be laid out', () => {
    // The same square pieces (derived as above: side 2h + kerf): on a 300 × 300 bed with a 300 × 300 sheet
    // and 5 mm margins the piece may be 290 mm, not 300.
    const b = 300;
    const kerf = 0.15;
    const spec = cube({
      scale: { by: 'fitBed' },
      bed: { widthMm: b, heightMm: b },
      stock: { thicknessMm: 3, sheet: { widthMm: b, heightMm: b }, marginMm: 5, gapMm: 3 },
    });
    const r = buildModel(spec).report;
    const h = (b - 10 - kerf) / 2;
    expect(r.planeDistanceMm).toBeCloseTo((h * Math.SQRT2) / 1.8, 3);
    const sheets = buildWithLayout(spec);
    expect(sheets.layout?.ok).toBe(true);
  });

  it('says in one sentence that no size fits when even the largest model for the bed has design errors', () => {
    // A 2 mm bed holds pieces 2 mm across, narrower than the 3 mm stock they slot into: the design errors
    // of that largest model stand, and a smaller model cannot help.
    const r = buildModel(cube({ scale: { by: 'fitBed' }, bed: { widthMm: 2, heightMm: 2 } })).report;
    const codes = r.errors.map((e) => e.code);
    expect(codes.length).toBeGreaterThan(1);
    expect(codes.filter((c) => c === 'SCALE.NO_FIT')).toHaveLength(1);
    expect(r.errors.find((e) => e.code === 'SCALE.NO_FIT')?.message).toMatch(
      /^no size fits the bed: even the largest model whose pieces fit \(\d+(\.\d)? mm across\) has design errors at 3 mm stock/,
    );
    // A bed that holds a sound model gets no such sentence.
    const fine = buildModel(cube({ scale: { by: 'fitBed' }, bed: { widthMm: 300, heightMm: 300 } })).report;
    expect(fine.errors).toEqual([]);
  });

  it('says to change the design, not the bed, when its pieces cross nowhere at any size', () => {
    // A tetrahedron's face has a circumradius of 2√2 ≈ 2.83 × the plane distance (from memory): triangles of
    // 2.2 lie inside their faces and reach no line where two planes meet, at any size.
    const fitBed: object = {
      scale: { by: 'fitBed' },
      bed: { widthMm: 600, heightMm: 400 },
      machine: { kind: 'router', toolDiameterMm: 3.175 },
    };
    const r = buildModel(design({ solid: 'tetrahedron', piece: { sides: 3, size: 2.2 }, ...fitBed })).report;
    expect(r.errors.map((e) => e.code)).toContain('DESIGN.NO_CROSSINGS');
    const said = r.errors.find((e) => e.code === 'SCALE.NO_FIT')?.message ?? '';
    expect(said).toMatch(/has errors at every size \(no two pieces touch.*\); change the design$/);
    expect(said).not.toMatch(/larger bed/);
  });

  it('holds a fit on a huge bed at the largest scale a spec may give, so the size found can be rebuilt', () => {
    // On a 10 m bed the cube's pieces would fit at a diameter far over MAX_SCALE_MM (10,000 mm).
    const r = buildModel(
      cube({ scale: { by: 'fitBed' }, bed: { widthMm: 10_000, heightMm: 10_000 } }),
    ).report;
    expect(r.diameterMm).toBeLessThanOrEqual(MAX_SCALE_MM);
    expect(r.diameterMm).toBeGreaterThan(MAX_SCALE_MM - 1e-3);
    expect(r.warnings.map((w) => w.code)).toContain('SCALE.CAPPED');
    // The size found, given back as a diameter, is a valid spec that builds the same model.
    const again = cube({
      scale: { by: 'diameter', mm: r.diameterMm },
      bed: { widthMm: 10_000, heightMm: 10_000 },
    });
    expect(validateSpec(again).ok).toBe(true);
    expect(buildModel(again).report.planeDistanceMm).toBeCloseTo(r.planeDistanceMm, 6);
  });

  it("fits a router's tool path to the bed: the nominal outline grown by the bit's radius", () => {
    // Common practice: a router's bed limits where the bit's centre can go, and with the tool offset that
    // centre runs the nominal outline offset by the radius r. The offset path is built here with Clipper's
    // round-joined offset and its best box found by turning it in 0.05° steps (independent of the search).
    const b = 300;
    const tool = 3.175;
    const spec = design({
      solid: 'cube',
      piece: { sides: 4, rotationDeg: 45, size: 1.5 },
      ...({ scale: { by: 'fitBed' } } as object),
      stock: { thicknessMm: 6, flexible: false },
      machine: { kind: 'router', toolDiameterMm: tool },
      fitMm: 0.1,
      bed: { widthMm: b, heightMm: b },
    });
    const r = buildModel(spec).report;
    expect(r.errors).toEqual([]);
    let worst = 0;
    for (const p of r.pieces) {
      const co = new ClipperLib.ClipperOffset(2, 0.25);
      const S = 1e4;
      co.AddPath(
        p.outline.map(([x, y]) => ({ X: Math.round(x * S), Y: Math.round(y * S) })),
        ClipperLib.JoinType.jtRound,
        ClipperLib.EndType.etClosedPolygon,
      );
      const out: { X: number; Y: number }[][] = [];
      co.Execute(out, (tool / 2) * S);
      const path = out[0]!.map((q) => [q.X / S, q.Y / S] as Vec2);
      let best = Infinity;
      for (let deg = 0; deg < 90; deg += 0.05) {
        const t = (deg * Math.PI) / 180;
        const xs = path.map(([x, y]) => x * Math.cos(t) - y * Math.sin(t));
        const ys = path.map(([x, y]) => x * Math.sin(t) + y * Math.cos(t));
        best = Math.min(best, Math.max(Math.max(...xs) - Math.min(...xs), Math.max(...ys) - Math.min(...ys)));
      }
      worst = Math.max(worst, best);
    }
    // The tool path just fits (to the offset's arc tolerance), where the nominal outline alone filled the bed.
    expect(worst).toBeLessThanOrEqual(b + 1e-3);
    expect(worst).toBeGreaterThan(b - 0.05);
    // The same size given as a diameter builds cleanly; 0.5 % larger, the tool path leaves the bed.
    const fixed = { ...spec, scale: { by: 'diameter', mm: r.diameterMm } };
    expect(buildModel(fixed).report.errors).toEqual([]);
    const larger = buildModel({ ...spec, scale: { by: 'diameter', mm: r.diameterMm * 1.005 } }).report;
    const tooLarge = larger.errors.find((e) => e.code === 'PIECE.LARGER_THAN_BED');
    expect(tooLarge?.message).toMatch(/with the 3\.175 mm bit passing outside it/);
  });

  it('gives a model that fits, while 1 % larger does not', () => {
    const bed = { widthMm: 400, heightMm: 250 };
    const fitted = buildModel(cube({ scale: { by: 'fitBed' }, bed })).report;
    expect(fitted.errors).toEqual([]);
    const larger = buildModel(cube({ scale: { by: 'diameter', mm: fitted.diameterMm * 1.01 }, bed })).report;
    expect(larger.errors.map((e) => e.code)).toContain('PIECE.LARGER_THAN_BED');
  });
});
