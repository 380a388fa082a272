import convexHull from 'monotone-convex-hull-2d';
import { buildModel } from '../build';
import { suggestSizes } from '../pieces/place';
import { getSolid } from '../solids/catalogue';
import { type Vec2 } from './vec';
import { convexHull2, signedArea, simplePolygonHull } from './polygon';

/** A seeded generator (Park–Miller), so a failure can be replayed. */
function random(seed: number): () => number {
  let s = seed;
  return () => (s = (s * 48271) % 2147483647) / 2147483647;
}

/** A star-shaped simple polygon: sorted angles, random radii. */
function starShaped(rnd: () => number, n: number): Vec2[] {
  const angles = Array.from({ length: n }, () => rnd() * 2 * Math.PI).sort((a, b) => a - b);
  return angles.map((a) => {
    const r = 10 + rnd() * 90;
    return [r * Math.cos(a), r * Math.sin(a)];
  });
}

/** A thick spiral: simple but far from star-shaped, the hard case for a hull that walks the outline. */
function spiral(turns: number, n: number): Vec2[] {
  const arm = (offset: number) =>
    Array.from({ length: n }, (_, i) => {
      const a = (i / (n - 1)) * turns * 2 * Math.PI;
      const r = 5 + 4 * a + offset;
      return [r * Math.cos(a), r * Math.sin(a)] as Vec2;
    });
  return [...arm(0), ...arm(6).reverse()];
}

/** The reference: the npm package monotone-convex-hull-2d (Andrew's monotone chain, robust predicates). */
function referenceHull(points: readonly Vec2[]): Vec2[] {
  return convexHull(points).map((i) => points[i] as Vec2);
}

const key = (p: Vec2) => `${p[0]},${p[1]}`;

function expectSameHull(poly: readonly Vec2[]): void {
  const hull = simplePolygonHull(poly);
  const ref = referenceHull(poly);
  expect(new Set(hull.map(key))).toEqual(new Set(ref.map(key)));
  expect(hull).toHaveLength(ref.length);
  // Counter-clockwise, and every vertex of the polygon on or inside it.
  expect(signedArea(hull)).toBeGreaterThan(0);
  let worst = Infinity;
  for (let k = 0; k < hull.length; k++) {
    const a = hull[k] as Vec2;
    const b = hull[(k + 1) % hull.length] as Vec2;
    for (const p of poly)
      worst = Math.min(worst, (b[0] - a[0]) * (p[1] - a[1]) - (b[1] - a[1]) * (p[0] - a[0]));
  }
  expect(worst).toBeGreaterThanOrEqual(-1e-9);
}

describe('simplePolygonHull (Melkman 1987), against monotone-convex-hull-2d', () => {
  it('star-shaped polygons of 4–400 vertices, both orientations, seeded', () => {
    const rnd = random(11);
    for (let trial = 0; trial < 200; trial++) {
      const poly = starShaped(rnd, 4 + Math.floor(rnd() * 397));
      expectSameHull(poly);
      expectSameHull([...poly].reverse());
      // Starting anywhere along the outline.
      const at = Math.floor(rnd() * poly.length);
      expectSameHull([...poly.slice(at), ...poly.slice(0, at)]);
    }
  });

  it('spirals, where most of the outline lies inside the hull', () => {
    for (const turns of [1.5, 2, 3.25]) {
      const poly = spiral(turns, 150);
      expectSameHull(poly);
      expectSameHull([...poly].reverse());
      expectSameHull([...poly.slice(97), ...poly.slice(0, 97)]);
    }
  });

  it('router-cut star pieces (hundreds of relief-arc vertices), and the general hull agrees', () => {
    const piece = { sides: 10, step: 3, rotationDeg: 0 };
    const overlap = suggestSizes(getSolid('rhombic-triacontahedron'), piece).overlap ?? 1;
    const model = buildModel({
      solid: 'rhombic-triacontahedron',
      piece: { ...piece, size: overlap * 2.35 },
      scale: { by: 'planeDistance', mm: 100 },
      stock: { thicknessMm: 3 },
      machine: { kind: 'router', toolDiameterMm: 3.175 },
    });
    for (const piece of model.pieces.slice(0, 6)) {
      expect(piece.nominalOutline.length).toBeGreaterThan(100);
      expectSameHull(piece.nominalOutline);
      expect(new Set(convexHull2(piece.nominalOutline).map(key))).toEqual(
        new Set(referenceHull(piece.nominalOutline).map(key)),
      );
    }
  });

  it('outlines closing on a hull edge, repeated points, and an outline touching itself', () => {
    // (1, −45) lies on the hull edge from (−5, −88) to (19, 84), where the outline closes.
    expectSameHull([
      [19, 84],
      [-20, 30],
      [-66, 39],
      [-50, 15],
      [-27, -13],
      [-5, -88],
      [1, -45],
    ]);
    expectSameHull([
      [0, 0],
      [4, 0],
      [4, 0],
      [4, 4],
      [2, 1],
      [2, 1],
      [0, 4],
    ]);
    // (−5, 22) lies on the edge from (9, −5) to (−33, 76): not simple, so the general hull is used.
    expectSameHull([
      [81, -41],
      [9, -5],
      [-33, 76],
      [-5, 22],
      [25, 17],
      [25, 3],
    ]);
  });

  it('collinear starts and squares with points along their edges', () => {
    expectSameHull([
      [0, 0],
      [1, 0],
      [2, 0],
      [2, 2],
      [1, 2],
      [0, 2],
      [0, 1],
    ]);
    expectSameHull([
      [0, 0],
      [2, 0],
      [2, 1],
      [2, 2],
      [0, 2],
    ]);
  });
});
