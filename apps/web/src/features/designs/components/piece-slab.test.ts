import { buildModel } from '@kerfwright/geometry';
import { describe, expect, it } from 'vitest';
import { cachedColourPlan } from '../lib/colour-plan-cache';
import { pieceSlab } from './piece-slab';

const model = buildModel({
  solid: 'cube',
  piece: { sides: 5, step: 2, rotationDeg: 10, size: 1.4 },
  scale: { by: 'diameter', mm: 200 },
  stock: { thicknessMm: 3 },
  machine: { kind: 'laser', kerfMm: 0.15 },
});

/** Shoelace formula for a polygon's area (Gauss's area formula). */
function shoelace(points: readonly (readonly [number, number])[]): number {
  let twice = 0;
  for (let i = 0; i < points.length; i++) {
    const [x0, y0] = points[i] as [number, number];
    const [x1, y1] = points[(i + 1) % points.length] as [number, number];
    twice += x0 * y1 - x1 * y0;
  }
  return Math.abs(twice) / 2;
}

const cross = (a: number[], b: number[]) => [
  a[1]! * b[2]! - a[2]! * b[1]!,
  a[2]! * b[0]! - a[0]! * b[2]!,
  a[0]! * b[1]! - a[1]! * b[0]!,
];

describe('a piece as a slab for the 3D preview', () => {
  const piece = model.report.pieces[0]!;
  const { positions, normals } = pieceSlab(piece, 3);
  const corner = (i: number) => [positions[i * 3]!, positions[i * 3 + 1]!, positions[i * 3 + 2]!];

  it('covers the outline exactly on each face: the face triangles add up to the outline’s area', () => {
    let top = 0;
    for (let t = 0; t < positions.length / 9; t++) {
      const [a, b, c] = [corner(3 * t), corner(3 * t + 1), corner(3 * t + 2)];
      const n = [normals[9 * t]!, normals[9 * t + 1]!, normals[9 * t + 2]!];
      const facing = n[0]! * piece.normal[0] + n[1]! * piece.normal[1] + n[2]! * piece.normal[2];
      if (facing > 0.999) {
        const k = cross(
          [b[0]! - a[0]!, b[1]! - a[1]!, b[2]! - a[2]!],
          [c[0]! - a[0]!, c[1]! - a[1]!, c[2]! - a[2]!],
        );
        top += Math.hypot(k[0]!, k[1]!, k[2]!) / 2;
      }
    }
    // Positions are stored as 32-bit floats (about 7 significant digits), hence a relative tolerance.
    const area = shoelace(piece.outline);
    expect(Math.abs(top - area) / area).toBeLessThan(1e-5);
  });

  it('winds every triangle so that its normal points out of the slab', () => {
    for (let t = 0; t < positions.length / 9; t++) {
      const [a, b, c] = [corner(3 * t), corner(3 * t + 1), corner(3 * t + 2)];
      const k = cross(
        [b[0]! - a[0]!, b[1]! - a[1]!, b[2]! - a[2]!],
        [c[0]! - a[0]!, c[1]! - a[1]!, c[2]! - a[2]!],
      );
      const n = [normals[9 * t]!, normals[9 * t + 1]!, normals[9 * t + 2]!];
      expect(k[0]! * n[0]! + k[1]! * n[1]! + k[2]! * n[2]!).toBeGreaterThan(0);
    }
  });

  it('lies within half the thickness of the piece plane on both sides', () => {
    const [cx, cy, cz] = piece.centreMm;
    for (let i = 0; i < positions.length / 3; i++) {
      const p = corner(i);
      const d =
        (p[0]! - cx) * piece.normal[0] + (p[1]! - cy) * piece.normal[1] + (p[2]! - cz) * piece.normal[2];
      expect(Math.abs(d)).toBeLessThanOrEqual(1.5 + 1e-4);
    }
  });
});

describe('the colour plan cache', () => {
  it('solves a plan once per solid, count and rule, whatever the size', () => {
    const ids = model.pieces.map((p) => p.id);
    const first = cachedColourPlan(model.solid, ids, 3, 'opposite-match');
    expect(cachedColourPlan(model.solid, ids, 3, 'opposite-match')).toBe(first);
    expect(cachedColourPlan(model.solid, ids, 2, 'opposite-match')).not.toBe(first);
    // A cube's three pairs of opposite faces take three colours (common practice for colouring a cube).
    expect(first.feasible).toBe(true);
  });
});
