import quickhull from 'quickhull3d/dist/quickhull3d.js';
import { type Vec3 } from '../math/vec';

/**
 * Triangles of the convex hull of `points` (indices into `points`), each counter-clockwise seen from
 * outside. The one place that touches the hull package.
 */
export function hullTriangles(points: readonly Vec3[]): [number, number, number][] {
  const faces = quickhull(points as [number, number, number][]);
  const out: [number, number, number][] = [];
  for (const f of faces) {
    const [a, b, c] = f;
    if (a !== undefined && b !== undefined && c !== undefined) out.push([a, b, c]);
  }
  return out;
}
