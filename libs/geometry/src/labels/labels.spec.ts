import * as polygonClipping from 'polygon-clipping';
import { buildModel } from '../build';
import { cubeStars83, design, octahedronHexagons } from '../test-support/designs';
import { type Vec2 } from '../math/vec';
import { boxCorners, labelPiece, strokeBounds, strokeLength, strokeText, uprightStrokes } from './index';

type Ring = [number, number][];
const ring = (pts: readonly Vec2[]): Ring => pts.map((p) => [p[0], p[1]]);
const area = (g: polygonClipping.Geom): number =>
  (g as Ring[][]).reduce(
    (s, poly) =>
      s +
      poly.reduce((t, r, k) => {
        let a = 0;
        for (let i = 0; i < r.length - 1; i++) a += r[i]![0] * r[i + 1]![1] - r[i + 1]![0] * r[i]![1];
        return t + (k === 0 ? 1 : -1) * Math.abs(a / 2);
      }, 0),
    0,
  );

describe('strokeText', () => {
  it('draws capitals at the asked cap height with single strokes', () => {
    // The Hershey simplex capitals span 21 font units from baseline to cap line (hersheytext's glyph data:
    // "H" runs y 1…22); at 10 mm the strokes of "H" reach from 0 to 10 mm.
    const t = strokeText('H', 10);
    const b = strokeBounds(t);
    expect(b.y0).toBeCloseTo(0, 9);
    expect(b.y1).toBeCloseTo(10, 9);
    // "H" is three straight strokes: two uprights of 10 mm and a bar (from memory of the glyph).
    expect(t.strokes).toHaveLength(3);
    expect(strokeLength(t.strokes.slice(0, 2))).toBeCloseTo(20, 9);
  });

  it('scales linearly and places characters left to right', () => {
    const a = strokeBounds(strokeText('P12', 5));
    const b = strokeBounds(strokeText('P12', 10));
    expect(b.x1 - b.x0).toBeCloseTo(2 * (a.x1 - a.x0), 9);
    expect(strokeBounds(strokeText('P1', 5)).x1).toBeLessThan(a.x1);
  });
});

/**
 * polygon-clipping (an independent general-purpose polygon library): the label's box grown by the
 * clearance minus the piece's cut outline must be empty; and around every stroke point a square of half-side
 * the clearance (which holds the disc of that radius) lies wholly inside the piece, so no stroke comes
 * nearer than the clearance to any cut line.
 */
function expectInsideWithClearance(
  outline: readonly Vec2[],
  label: ReturnType<typeof labelPiece>['labels'][number],
  c: number,
) {
  const grown = ring(boxCorners(label.box, c * 0.999));
  expect(area(polygonClipping.difference([grown], [ring(outline)]))).toBeLessThan(1e-6);
  const pts = label.strokes.flat();
  expect(pts.length).toBeGreaterThan(0);
  for (const p of pts) {
    const sq: Ring = Array.from({ length: 32 }, (_, i) => [
      p[0] + 0.99 * c * Math.cos((i * Math.PI) / 16),
      p[1] + 0.99 * c * Math.sin((i * Math.PI) / 16),
    ]);
    expect(area(polygonClipping.difference([sq], [ring(outline)]))).toBeLessThan(1e-9);
  }
}

describe('labelPiece', () => {
  it.each([
    ['octahedron hexagons', octahedronHexagons()],
    ['cube {8/3} stars', cubeStars83({ machine: { kind: 'laser', kerfMm: 0.1 } })],
    // Our own: fine {33/16} stars cross each other through several points, so one partner has several slots.
    [
      'octahedron {33/16} stars, router',
      design({
        solid: 'octahedron',
        piece: { sides: 33, step: 16, rotationDeg: 0, size: 1.3805 },
        scale: { by: 'planeDistance', mm: 70 },
        stock: { thicknessMm: 1.5, flexible: false },
        machine: { kind: 'router', toolDiameterMm: 1 },
        fitMm: 0.05,
      }),
    ],
  ])('labels every piece of %s inside the piece, clear of every cut line', (_, spec) => {
    const model = buildModel(spec);
    const clearance = 1;
    for (const piece of model.pieces) {
      const r = labelPiece(piece, { colourName: 'AMBER', clearanceMm: clearance });
      const own = r.labels.filter((l) => l.kind === 'piece');
      expect(own.map((l) => l.text)).toEqual([`${piece.id} AMBER`]);
      const slotTexts = r.labels.filter((l) => l.kind === 'slot').map((l) => l.text);
      // One partner label per slot, unless a note says it found no room (none without the piece's own); one
      // note per partner, counting its slots left unlabelled.
      expect(new Set(r.warnings).size).toBe(r.warnings.length);
      const unlabelled = r.warnings
        .map((w) => /beside (?:(\d+) of \S+ \d+ slots|\S+ (\d+) slots|\S+ slot) for/.exec(w))
        .map((m) => Number(m?.[1] ?? m?.[2] ?? (m ? 1 : NaN)));
      if (own.length)
        expect(slotTexts.length + unlabelled.reduce((a, b) => a + b, 0)).toBe(piece.slots.length);
      else expect([slotTexts.length, r.warnings.length]).toEqual([0, 1]);
      for (const t of slotTexts) expect(piece.slots.map((x) => x.partner)).toContain(t);
      for (const l of r.labels) expectInsideWithClearance(piece.outline, l, clearance);
      // Labels do not overlap each other (polygon-clipping).
      for (let i = 0; i < r.labels.length; i++)
        for (let j = i + 1; j < r.labels.length; j++) {
          const inter = polygonClipping.intersection(
            [ring(boxCorners(r.labels[i]!.box))],
            [ring(boxCorners(r.labels[j]!.box))],
          );
          expect(area(inter)).toBeLessThan(1e-9);
        }
    }
  });

  it('labels every slot of a router-cut design, whose slots are drawn at their full width', () => {
    const model = buildModel(octahedronHexagons({ machine: { kind: 'router', toolDiameterMm: 2 } }));
    expect(model.report.errors).toEqual([]);
    for (const piece of model.pieces) {
      const r = labelPiece(piece, { clearanceMm: 1 });
      expect(r.warnings).toEqual([]);
      expect(r.labels.filter((l) => l.kind === 'slot')).toHaveLength(piece.slots.length);
      for (const l of r.labels) expectInsideWithClearance(piece.outline, l, 1);
    }
  });

  it('puts each partner id beside its own slot, near the slot', () => {
    const model = buildModel(octahedronHexagons());
    const piece = model.pieces[0]!;
    const r = labelPiece(piece);
    for (const s of piece.slots) {
      const l = r.labels.find((x) => x.kind === 'slot' && x.text === s.partner);
      expect(l).toBeDefined();
      // Derived: the label's centre lies within the slot's depth plus the label's own length of the mouth.
      const d = Math.hypot(l!.box.centre[0] - s.end[0], l!.box.centre[1] - s.end[1]);
      expect(d).toBeLessThanOrEqual(s.depthMm + 2 * l!.box.halfW + s.widthMm + 2);
    }
  });

  it('shrinks text to fit a small piece and skips with a warning when nothing fits', () => {
    const small: Vec2[] = [
      [0, 0],
      [12, 0],
      [12, 6],
      [0, 6],
    ];
    const fits = labelPiece({ id: 'P7', outline: small, slots: [] }, { clearanceMm: 1 });
    expect(fits.labels).toHaveLength(1);
    expect(fits.labels[0]!.heightMm).toBeLessThan(4);
    expectInsideWithClearance(small, fits.labels[0]!, 1);
    const tiny: Vec2[] = [
      [0, 0],
      [3, 0],
      [3, 2],
      [0, 2],
    ];
    const none = labelPiece({ id: 'P7', outline: tiny, slots: [] }, { clearanceMm: 1 });
    expect(none.labels).toHaveLength(0);
    expect(none.warnings).toEqual([expect.stringContaining('no room')]);
    // With no room for its own id, a piece gets no partner ids either: "P3" alone would read as its name.
    const slotted = labelPiece(
      {
        id: 'P7',
        outline: tiny,
        slots: [{ partner: 'P3', end: [1.5, 2], axis: [0, -1], depthMm: 1, widthMm: 0.3 }],
      },
      { clearanceMm: 1 },
    );
    expect(slotted.labels).toEqual([]);
    expect(slotted.warnings).toEqual([
      'no room for the label "P7" on P7; its slot labels are left off so none is read as its id',
    ]);
  });
});

describe('uprightStrokes', () => {
  const turn = (p: Vec2, deg: number): Vec2 => {
    const t = (deg * Math.PI) / 180;
    return [p[0] * Math.cos(t) - p[1] * Math.sin(t), p[0] * Math.sin(t) + p[1] * Math.cos(t)];
  };
  const model = buildModel(octahedronHexagons());
  const piece = model.pieces[0]!;
  const labels = labelPiece({ id: piece.id, outline: piece.outline, slots: piece.slots }).labels;

  it.each([0, 45, 90, 135, 180, 225, 270, 315])(
    'keeps every label readable on a piece turned %i° on the sheet: its text runs left to right, upright',
    (deg) => {
      for (const l of labels) {
        const strokes = uprightStrokes(l, deg).map((st) => st.map((p) => turn(p, deg)));
        // Reading direction on the sheet: the direction from the text's first ink point to its last one
        // along the baseline is the box's angle turned by deg, or its half turn when flipped.
        const a = ((((l.box.angleDeg + deg) % 360) + 360) % 360) * (Math.PI / 180);
        const flipped = a > Math.PI / 2 + 1e-9 && a <= (3 * Math.PI) / 2 + 1e-9;
        const dir: Vec2 = flipped ? [-Math.cos(a), -Math.sin(a)] : [Math.cos(a), Math.sin(a)];
        expect(dir[0]).toBeGreaterThanOrEqual(-1e-9); // never reads right to left
        // The first stroke of the first character lies at the reading start: least along the reading direction.
        const along = (p: Vec2) => p[0] * dir[0] + p[1] * dir[1];
        const all = strokes.flat();
        const lo = Math.min(...all.map(along));
        const hi = Math.max(...all.map(along));
        const first = strokes[0]!.map(along);
        expect(Math.min(...first) - lo).toBeLessThan((hi - lo) / 2);
        // The same box: the turned ink stays inside the label's box (which was checked against the cuts).
        const t = (-l.box.angleDeg * Math.PI) / 180;
        for (const p of uprightStrokes(l, deg).flat()) {
          const dx = p[0] - l.box.centre[0];
          const dy = p[1] - l.box.centre[1];
          expect(Math.abs(dx * Math.cos(t) - dy * Math.sin(t))).toBeLessThanOrEqual(l.box.halfW + 1e-9);
          expect(Math.abs(dx * Math.sin(t) + dy * Math.cos(t))).toBeLessThanOrEqual(l.box.halfH + 1e-9);
        }
      }
    },
  );
});
