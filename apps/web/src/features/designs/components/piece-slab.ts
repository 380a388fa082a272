import { type ReportPiece } from '@kerfwright/contracts';
import { ShapeUtils, Vector2 } from 'three';

export interface SlabArrays {
  /** Triangle corners in model space, mm (x, y, z per corner; no index). */
  positions: Float32Array;
  /** Unit normal per corner: flat faces and flat sides. */
  normals: Float32Array;
}

/**
 * Whether a piece has an outline to draw: at least three finite corners enclosing some area. A model too
 * small for its stock can leave pieces with none (the slots eat the whole piece), and drawing an empty or
 * non-finite outline gives Infinity and NaN in SVG attributes and three.js bounds.
 */
export function pieceHasShape(piece: Pick<ReportPiece, 'outline'>): boolean {
  const pts = piece.outline;
  if (pts.length < 3 || !pts.every(([x, y]) => Number.isFinite(x) && Number.isFinite(y))) return false;
  let twiceArea = 0;
  for (let i = 0; i < pts.length; i++) {
    const [x0, y0] = pts[i] as [number, number];
    const [x1, y1] = pts[(i + 1) % pts.length] as [number, number];
    twiceArea += x0 * y1 - x1 * y0;
  }
  return Math.abs(twiceArea) > 0;
}

/**
 * A piece as a flat slab of the stock's thickness, placed in its plane: the outline (one closed contour in
 * the piece's frame) triangulated for the two faces (earcut, through three's ShapeUtils) and a quad per
 * outline edge for the sides, written straight into typed arrays in model space. Non-indexed, so each face
 * keeps its own flat normal. Same result as extruding the outline, without the extrusion's per-vertex
 * objects, bevels and UVs, which the preview does not use.
 */
export function pieceSlab(piece: ReportPiece, thicknessMm: number): SlabArrays {
  let contour = piece.outline;
  if (contour.length > 1) {
    const [fx, fy] = contour[0] as [number, number];
    const [lx, ly] = contour[contour.length - 1] as [number, number];
    if (fx === lx && fy === ly) contour = contour.slice(0, -1);
  }
  const points = contour.map(([x, y]) => new Vector2(x, y));
  // Counter-clockwise, so the face triangles wind towards +z and each edge's outward normal is (dy, −dx).
  if (ShapeUtils.isClockWise(points)) {
    points.reverse();
    contour = [...contour].reverse();
  }
  const triangles = ShapeUtils.triangulateShape(points, []);
  const n = contour.length;
  const corners = triangles.length * 3 * 2 + n * 6;
  const positions = new Float32Array(corners * 3);
  const normals = new Float32Array(corners * 3);
  const [cx, cy, cz] = piece.centreMm;
  const [ax, ay, az] = piece.frameX;
  const [bx, by, bz] = piece.frameY;
  const [nx, ny, nz] = piece.normal;
  const half = thicknessMm / 2;
  let k = 0;
  // Local (u, v, w) in the piece's frame → model space; (du, dv, dw) a local direction → model space.
  const put = (u: number, v: number, w: number, du: number, dv: number, dw: number) => {
    positions[k] = cx + u * ax + v * bx + w * nx;
    positions[k + 1] = cy + u * ay + v * by + w * ny;
    positions[k + 2] = cz + u * az + v * bz + w * nz;
    normals[k] = du * ax + dv * bx + dw * nx;
    normals[k + 1] = du * ay + dv * by + dw * ny;
    normals[k + 2] = du * az + dv * bz + dw * nz;
    k += 3;
  };
  const at = (i: number) => contour[i % n] as [number, number];
  for (const [i, j, l] of triangles as [number, number, number][]) {
    const [p, q, r] = [at(i), at(j), at(l)];
    put(p[0], p[1], half, 0, 0, 1);
    put(q[0], q[1], half, 0, 0, 1);
    put(r[0], r[1], half, 0, 0, 1);
    put(p[0], p[1], -half, 0, 0, -1);
    put(r[0], r[1], -half, 0, 0, -1);
    put(q[0], q[1], -half, 0, 0, -1);
  }
  for (let i = 0; i < n; i++) {
    const [x0, y0] = at(i);
    const [x1, y1] = at(i + 1);
    const len = Math.hypot(x1 - x0, y1 - y0) || 1;
    const ox = (y1 - y0) / len;
    const oy = -(x1 - x0) / len;
    put(x0, y0, -half, ox, oy, 0);
    put(x1, y1, -half, ox, oy, 0);
    put(x1, y1, half, ox, oy, 0);
    put(x0, y0, -half, ox, oy, 0);
    put(x1, y1, half, ox, oy, 0);
    put(x0, y0, half, ox, oy, 0);
  }
  return { positions, normals };
}
