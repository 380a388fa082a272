import { cross3, dot3, normalize3, sub3 } from '../math/vec';
import { signedArea } from '../math/polygon';
import { getSolid, listSolids } from '../solids/catalogue';
import { fromFrame, pieceFrames, suggestSizes } from './place';
import { checkPieceShape, starOutline } from './shape';

describe('piece shapes', () => {
  it('refuses compounds and out-of-range steps with a message', () => {
    expect(checkPieceShape(6, 2).join()).toMatch(/compound of 2 separate \{3\/1\}/);
    expect(checkPieceShape(10, 4).join()).toMatch(/compound/);
    expect(checkPieceShape(8, 4).join()).toMatch(/step/);
    expect(checkPieceShape(2, 1).join()).toMatch(/sides/);
    expect(checkPieceShape(7, 3)).toEqual([]);
    expect(checkPieceShape(8, 3)).toEqual([]);
  });

  it.each([
    [5, 2],
    [7, 2],
    [7, 3],
    [8, 3],
    [12, 5],
  ])('{%i/%i}: each inner corner lies where the chords j→j+k and (j+1)→(j+1−k) cross', (n, k) => {
    // Definition of the regular star polygon {n/k} (tips on a circle at 2πj/n, joined j → j+k); the
    // chord crossing is computed here by a plain two-line intersection, independent of the library.
    const R = 10;
    const out = starOutline(n, k, R, 0);
    expect(out).toHaveLength(2 * n);
    expect(signedArea(out)).toBeGreaterThan(0);
    const tip = (j: number) => [R * Math.cos((2 * Math.PI * j) / n), R * Math.sin((2 * Math.PI * j) / n)];
    for (let j = 0; j < n; j++) {
      const [p1, p2, p3, p4] = [tip(j), tip(j + k), tip(j + 1), tip(j + 1 - k)] as number[][];
      const d1 = [p2![0]! - p1![0]!, p2![1]! - p1![1]!];
      const d2 = [p4![0]! - p3![0]!, p4![1]! - p3![1]!];
      const den = d1[0]! * d2[1]! - d1[1]! * d2[0]!;
      const s = ((p3![0]! - p1![0]!) * d2[1]! - (p3![1]! - p1![1]!) * d2[0]!) / den;
      const x = [p1![0]! + s * d1[0]!, p1![1]! + s * d1[1]!];
      const inner = out[2 * j + 1]!;
      expect(inner[0]).toBeCloseTo(x[0]!, 9);
      expect(inner[1]).toBeCloseTo(x[1]!, 9);
      expect(Math.hypot(...out[2 * j]!)).toBeCloseTo(R, 12);
    }
  });
});

describe('piece frames', () => {
  it.each(listSolids().map((s) => s.id))(
    '%s: frame is right-handed, centred on the foot of the perpendicular, tip 0 on the ray to the first vertex',
    (id) => {
      const solid = getSolid(id);
      const frames = pieceFrames(solid, 2);
      frames.forEach((fr, i) => {
        const face = solid.faces[i]!;
        expect(dot3(cross3(fr.x, fr.y), fr.normal)).toBeCloseTo(1, 12);
        expect(Math.abs(dot3(fr.x, fr.normal))).toBeLessThan(1e-12);
        // The centre is d·n: in the plane, and the nearest point of the plane to the solid's centre.
        expect(dot3(fr.centre, fr.normal)).toBeCloseTo(2 * face.distance, 12);
        expect(Math.hypot(...cross3(fr.centre, fr.normal))).toBeLessThan(1e-9);
        const first = solid.vertices[face.vertices[0]!]!.map((c) => c * 2) as [number, number, number];
        const tip0 = fromFrame(fr, starOutline(5, 2, 3, 0)[0]!);
        const a = normalize3(sub3(tip0, fr.centre));
        const b = normalize3(sub3(first, fr.centre));
        expect(dot3(a, b)).toBeCloseTo(1, 9);
      });
    },
  );
});

describe('suggested sizes', () => {
  // Derived: on a cube with plane distance a, a square's tips reach the edge midpoints (on the
  // neighbour's plane) at circumradius a when turned 45°, and the cube's corners at a√2 when not turned.
  it('cube with squares: touch at 1 when turned 45°, at √2 when a tip points at a corner', () => {
    const cube = getSolid('cube');
    const turned = suggestSizes(cube, { sides: 4, step: 1, rotationDeg: 45 });
    expect(turned.touch).toBeCloseTo(1, 9);
    expect(turned.overlap).toBeCloseTo(1, 6);
    expect(suggestSizes(cube, { sides: 4, step: 1, rotationDeg: 0 }).touch).toBeCloseTo(Math.SQRT2, 9);
  });

  it('octahedron with hexagons: tips reach the edge midpoints at √2/2', () => {
    // Derived: a face's inradius is half its circumradius, and circumradius ÷ plane distance is √2.
    const s = suggestSizes(getSolid('octahedron'), { sides: 6, step: 1, rotationDeg: 0 });
    expect(s.touch).toBeCloseTo(Math.SQRT2 / 2, 9);
    expect(s.overlap).toBeGreaterThanOrEqual((s.touch ?? 0) - 1e-9);
  });
});
