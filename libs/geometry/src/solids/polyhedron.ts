import { type Vec2, type Vec3, at, cross3, dot3, length3, normalize3, scale3, sub3, add3 } from '../math/vec';
import { convexHull2 } from '../math/polygon';
import { hullTriangles } from './hull';

/** A face of a base solid: its corners counter-clockwise seen from outside, its outward plane. */
export interface SolidFace {
  /** Vertex indices, counter-clockwise seen from outside; `vertices[0]` is the face's first vertex. */
  vertices: number[];
  /** Outward unit normal. */
  normal: Vec3;
  /** Distance from the solid's centre (the origin) to the face plane, model units; always > 0. */
  distance: number;
}

export interface SolidEdge {
  vertices: [number, number];
  faces: [number, number];
  /** Interior dihedral angle between the two faces, degrees. */
  dihedralDeg: number;
}

/** A convex base solid centred on the origin. Model units are those of the source coordinates. */
export interface Solid {
  id: string;
  name: string;
  vertices: Vec3[];
  faces: SolidFace[];
  edges: SolidEdge[];
  /** For each vertex, the faces that contain it. */
  vertexFaces: number[][];
  /** Pairs of faces with opposite normals (parallel planes on both sides of the centre). */
  oppositeFaces: [number, number][];
  /**
   * Uploads only: how many of the given points the hull leaves inside: clear of every face (by more than 10 ×
   * the coplanar tolerance), or corners of a face of the upload that lies on no face of the hull. More than
   * none means the uploaded solid was not convex, and its hull is used.
   */
  interiorPointCount?: number;
}

/** Coplanar facets are merged when all their corners lie within this fraction of the solid's radius. */
export const COPLANAR_TOLERANCE = 1e-4;

export class SolidError extends Error {
  constructor(
    readonly code: string,
    message: string,
  ) {
    super(message);
    this.name = 'SolidError';
  }
}

/**
 * Builds a convex solid from points: convex hull, coplanar facets merged into faces (tolerance
 * {@link COPLANAR_TOLERANCE} × radius), centred on the solid's volume centroid. Faces are ordered top
 * to bottom (by normal z, then azimuth); each face starts at its first vertex, chosen so that the
 * solid's rotations carry first vertices onto each other (see alignFirstVertices). The result depends
 * only on the points and their input order.
 */
/** Largest vertex coordinate (in the drawing's own units) an uploaded solid may have. */
export const MAX_SOLID_COORDINATE = 1e12;
/** Smallest bounding radius (half the bounding-box diagonal, drawing units) of an uploaded solid. */
export const MIN_SOLID_RADIUS = 1e-9;

export function solidFromPoints(
  id: string,
  name: string,
  input: readonly Vec3[],
  maxFaces = Infinity,
  meshFaces: readonly (readonly number[])[] = [],
): Solid {
  for (const p of input) {
    if (!p.every((c) => Number.isFinite(c))) {
      throw new SolidError('SOLID.NOT_FINITE', 'a vertex coordinate is NaN or infinite');
    }
  }
  const radius = boundingRadius(input);
  // Far outside any real drawing unit the hull's products overflow or underflow (1e160 squared is Infinity).
  const largest = Math.max(...input.map((p) => Math.max(Math.abs(p[0]), Math.abs(p[1]), Math.abs(p[2]))));
  if (largest > MAX_SOLID_COORDINATE || radius < MIN_SOLID_RADIUS) {
    throw new SolidError(
      'SOLID.OUT_OF_RANGE',
      `vertex coordinates must be at most ${MAX_SOLID_COORDINATE} in size and the solid at least ` +
        `${MIN_SOLID_RADIUS} across (rescale the drawing's units)`,
    );
  }
  const tol = COPLANAR_TOLERANCE * radius;
  assertNotFlat(input, tol);

  // Noise in an export (edge midpoints and face grids written to a few decimals) leaves points a hair off
  // the true faces and edges; faces built with them disagree about shared edges. So the corners are found
  // first (points on three or more face planes) and the hull is built again from them alone.
  let points: readonly Vec3[] = input;
  // The first pass may hold a few planes more than the solid has faces (noise the corners then drop), but a
  // hull far beyond the limit (a finely sampled sphere) is refused here, before any more work.
  const first = facePlanes(input, tol, Number.isFinite(maxFaces) ? 2 * maxFaces : Infinity, maxFaces);
  const corners = cornerPoints(input, first, tol);
  if (corners.length >= 4 && corners.length < input.length) {
    try {
      assertNotFlat(corners, tol);
      points = corners;
    } catch {
      points = input;
    }
  }
  const groups = facePlanes(points, tol, maxFaces);

  // Order each face's corners and drop points inside a face or along an edge.
  const rawFaces = groups.map((g) => {
    const idx = [...g.pts];
    const u = normalize3(anyPerpendicular(g.n));
    const v = cross3(g.n, u);
    const proj = idx.map((i): Vec2 & { i?: number } => {
      const p = at(points, i);
      return [dot3(p, u), dot3(p, v)];
    });
    const hull = convexHull2WithIndex(proj, idx, tol);
    return hull;
  });

  const used = [...new Set(rawFaces.flat())].sort((a, b) => a - b);
  const remap = new Map(used.map((old, i) => [old, i]));
  const pts = used.map((i) => at(points, i));
  const centroid = volumeCentroid(
    pts,
    rawFaces.map((f) => f.map((i) => remap.get(i) ?? 0)),
  );
  const vertices = pts.map((p) => sub3(p, centroid));

  let faces: SolidFace[] = rawFaces.map((f) => {
    const vs = f.map((i) => remap.get(i) ?? 0);
    const normal = newellNormal(vs.map((i) => at(vertices, i)));
    const distance = vs.reduce((s, i) => s + dot3(normal, at(vertices, i)), 0) / vs.length;
    const first = vs.indexOf(Math.min(...vs));
    return { vertices: [...vs.slice(first), ...vs.slice(0, first)], normal, distance };
  });
  if (faces.some((f) => !(f.distance > tol))) {
    throw new SolidError('SOLID.DEGENERATE', 'the solid has no interior around its centroid');
  }
  faces = faces.sort((a, b) => faceOrderKey(a) - faceOrderKey(b) || azimuth(a) - azimuth(b));
  faces = alignFirstVertices(vertices, faces, tol);
  const solid = assembleSolid(id, name, vertices, faces);
  // Points well inside the hull (dents, hollows, a second inner shell) are dropped by taking the hull: count them
  // so the build can say the upload was not convex. Points on a face within rounding are not counted.
  const interior = new Set<number>();
  input.forEach((p, i) => {
    const q = sub3(p, centroid);
    if (faces.every((f) => dot3(f.normal, q) - f.distance < -10 * tol)) interior.add(i);
  });
  // A face of the upload off every face plane of the hull lies inside it (an extruded L's inner walls, whose
  // corners are all on the hull's top and bottom): its corners that are no corner of the hull were dropped too.
  const onPlane = (i: number, f: SolidFace) =>
    Math.abs(dot3(f.normal, sub3(at(input, i), centroid)) - f.distance) <= 2 * tol;
  const isCorner = (i: number) => vertices.some((v) => length3(sub3(v, sub3(at(input, i), centroid))) <= tol);
  for (const mf of meshFaces) {
    if (faces.some((f) => mf.every((i) => onPlane(i, f)))) continue;
    for (const i of mf) if (!isCorner(i)) interior.add(i);
  }
  return interior.size > 0 ? { ...solid, interiorPointCount: interior.size } : solid;
}

interface FacePlane {
  /** Outward unit normal (the area-weighted mean of its triangles' normals). */
  n: Vec3;
  /** Offset of the plane: the mean of n · p over its points. */
  d: number;
  pts: Set<number>;
}

/**
 * The hull's triangles merged into face planes: a triangle joins a plane when its normal is within about 1° of
 * the plane's and its corners lie within `tol` of it. Each plane is refitted as triangles join (normal: their
 * area-weighted mean; offset: the mean over its points), so a face whose first triangle is tilted by a point
 * slightly off it still gathers the rest. The corners of each merged plane are checked against the refitted
 * plane; should any lie further than tol from it, the planes are made again without refitting.
 */
function facePlanes(
  points: readonly Vec3[],
  tol: number,
  maxFaces: number,
  statedLimit = maxFaces,
): FacePlane[] {
  const mean = scale3(
    points.reduce((s, p) => add3(s, p), [0, 0, 0] as Vec3),
    1 / points.length,
  );
  const tris = hullTriangles(points)
    .map((t) => {
      const [a, b, c] = t.map((i) => at(points, i)) as [Vec3, Vec3, Vec3];
      let n = cross3(sub3(b, a), sub3(c, a));
      if (dot3(n, sub3(a, mean)) < 0) n = scale3(n, -1);
      const longest = Math.max(length3(sub3(b, a)), length3(sub3(c, b)), length3(sub3(a, c)));
      // Its least height: a triangle within tol of a line (a point a hair off an edge) has no plane of its own.
      return { t, n: normalize3(n), area: length3(n) / 2, height: length3(n) / longest };
    })
    .filter((x) => x.height > tol)
    .sort((x, y) => y.area - x.area);
  const build = (refit: boolean): FacePlane[] => {
    const groups: (FacePlane & { sumN: Vec3; sumP: Vec3 })[] = [];
    for (const tri of tris) {
      const near = (g: FacePlane, slack: number) =>
        dot3(g.n, tri.n) > 0.9998 &&
        tri.t.every((i) => Math.abs(dot3(g.n, at(points, i)) - g.d) <= slack * tol);
      // Within tol of the plane as it stands; or, refitting, within tol of the plane refitted with it.
      const joinsRefitted = (g: (typeof groups)[number]) => {
        if (!refit || !near(g, 3)) return false;
        const n = normalize3(add3(g.sumN, scale3(tri.n, tri.area)));
        const all = new Set([...g.pts, ...tri.t]);
        let sum = 0;
        for (const i of all) sum += dot3(n, at(points, i));
        const d = sum / all.size;
        for (const i of all) if (Math.abs(dot3(n, at(points, i)) - d) > tol) return false;
        return true;
      };
      let g = groups.find((c) => near(c, 1)) ?? groups.find(joinsRefitted);
      if (!g) {
        const a = at(points, tri.t[0]);
        g = { n: tri.n, d: dot3(tri.n, a), pts: new Set(), sumN: [0, 0, 0], sumP: [0, 0, 0] };
        groups.push(g);
        if (groups.length > maxFaces) {
          throw new SolidError(
            'SOLID.TOO_MANY_FACES',
            `the hull has more than ${statedLimit} faces after merging coplanar facets; at most ${statedLimit} are accepted`,
          );
        }
      }
      for (const i of tri.t) {
        if (g.pts.has(i)) continue;
        g.pts.add(i);
        g.sumP = add3(g.sumP, at(points, i));
      }
      if (refit) {
        // The mean of n · p over the points is n · (their mean).
        g.sumN = add3(g.sumN, scale3(tri.n, tri.area));
        g.n = normalize3(g.sumN);
        g.d = dot3(g.n, g.sumP) / g.pts.size;
      }
    }
    return groups;
  };
  const refitted = build(true);
  const fits = refitted.every((g) =>
    [...g.pts].every((i) => Math.abs(dot3(g.n, at(points, i)) - g.d) <= tol),
  );
  return fits ? refitted : build(false);
}

/**
 * The points that are corners of the solid: on three or more face planes (within 2 × tol), one of each
 * cluster of points closer than tol to each other. Points on one plane lie inside a face, on two along an edge.
 */
function cornerPoints(points: readonly Vec3[], planes: readonly FacePlane[], tol: number): Vec3[] {
  // A face split in two by noise gives two nearly equal planes: those count once.
  const distinct: FacePlane[] = [];
  for (const g of planes)
    if (!distinct.some((h) => dot3(h.n, g.n) > 0.9998 && Math.abs(h.d - g.d) <= 2 * tol)) distinct.push(g);
  const out: Vec3[] = [];
  for (const p of points) {
    let on = 0;
    for (const g of distinct) if (Math.abs(dot3(g.n, p) - g.d) <= 2 * tol && ++on >= 3) break;
    if (on < 3) continue;
    if (out.some((q) => length3(sub3(p, q)) <= tol)) continue;
    out.push(p);
  }
  return out;
}

type Mat3 = readonly [Vec3, Vec3, Vec3]; // rows
const apply = (m: Mat3, v: Vec3): Vec3 => [dot3(m[0], v), dot3(m[1], v), dot3(m[2], v)];

/**
 * The rotations of the solid onto itself (as matrices), found by sending face 0 and its first vertex to
 * every face of the same shape and keeping the maps that carry every vertex onto a vertex (within tol).
 */
export function symmetryRotations(
  vertices: readonly Vec3[],
  faces: readonly SolidFace[],
  tol: number,
): Mat3[] {
  const f0 = faces[0];
  if (!f0) return [];
  const frame = (f: SolidFace, k: number): Mat3 | null => {
    const foot = scale3(f.normal, f.distance);
    const a = sub3(at(vertices, at(f.vertices, k)), foot);
    if (length3(a) <= tol) return null;
    const u = normalize3(a);
    return [f.normal, u, cross3(f.normal, u)];
  };
  const base = frame(f0, 0);
  if (!base) return [];
  const r0 = length3(sub3(at(vertices, at(f0.vertices, 0)), scale3(f0.normal, f0.distance)));
  const out: Mat3[] = [];
  // Vertices by rough position, to find images quickly.
  const cell = 10 * tol;
  const key = (p: Vec3) => p.map((c) => Math.round(c / cell)).join(',');
  const buckets = new Map<string, number[]>();
  vertices.forEach((p, i) => {
    const k = key(p);
    buckets.set(k, [...(buckets.get(k) ?? []), i]);
  });
  const findVertex = (p: Vec3): number => {
    const [cx, cy, cz] = p.map((c) => Math.round(c / cell)) as [number, number, number];
    for (let dx = -1; dx <= 1; dx++) {
      for (let dy = -1; dy <= 1; dy++) {
        for (let dz = -1; dz <= 1; dz++) {
          for (const i of buckets.get(`${cx + dx},${cy + dy},${cz + dz}`) ?? []) {
            if (length3(sub3(at(vertices, i), p)) <= tol) return i;
          }
        }
      }
    }
    return -1;
  };
  for (const f of faces) {
    if (f.vertices.length !== f0.vertices.length || Math.abs(f.distance - f0.distance) > tol) continue;
    for (let k = 0; k < f.vertices.length; k++) {
      const fr = frame(f, k);
      const rk = length3(sub3(at(vertices, at(f.vertices, k)), scale3(f.normal, f.distance)));
      if (!fr || Math.abs(rk - r0) > tol) continue;
      // R = Fᵀ·B: maps base's rows (n0, u0, w0) onto fr's rows.
      const m: Mat3 = [0, 1, 2].map((row) =>
        [0, 1, 2].map((col) => fr.reduce((s, axis, j) => s + at(axis, row) * at(at(base, j), col), 0)),
      ) as unknown as Mat3;
      if (vertices.every((v) => findVertex(apply(m, v)) >= 0)) out.push(m);
    }
  }
  return out;
}

/**
 * Chooses each face's first vertex so that the solid's rotations carry first vertices onto first
 * vertices where the faces allow it: the lowest-index face of each symmetry class keeps its lowest-index
 * vertex, and every face it can be rotated onto takes the image of that vertex. Faces keep their order.
 */
function alignFirstVertices(
  vertices: readonly Vec3[],
  faces: readonly SolidFace[],
  tol: number,
): SolidFace[] {
  const rotations = symmetryRotations(vertices, faces, tol);
  const first = faces.map(() => -1);
  const faceOfNormal = (n: Vec3) => faces.findIndex((f) => dot3(f.normal, n) > 1 - 1e-9);
  const vertexAt = (p: Vec3) => vertices.findIndex((v) => length3(sub3(v, p)) <= tol);
  faces.forEach((f, fi) => {
    if (first[fi] !== -1) return;
    const v0 = at(f.vertices, 0);
    first[fi] = v0;
    for (const m of rotations) {
      const g = faceOfNormal(apply(m, f.normal));
      if (g < 0 || first[g] !== -1) continue;
      const image = vertexAt(apply(m, at(vertices, v0)));
      if (image >= 0 && at(faces, g).vertices.includes(image)) first[g] = image;
    }
  });
  return faces.map((f, fi) => {
    const k = f.vertices.indexOf(at(first, fi));
    return k > 0 ? { ...f, vertices: [...f.vertices.slice(k), ...f.vertices.slice(0, k)] } : f;
  });
}

function faceOrderKey(f: SolidFace): number {
  return -Math.round(f.normal[2] * 1e6);
}
function azimuth(f: SolidFace): number {
  const a = Math.atan2(f.normal[1], f.normal[0]);
  return Math.round((a < -1e-9 ? a + 2 * Math.PI : Math.max(a, 0)) * 1e6);
}

function assembleSolid(id: string, name: string, vertices: Vec3[], faces: SolidFace[]): Solid {
  const edgeMap = new Map<string, { vertices: [number, number]; faces: number[] }>();
  faces.forEach((f, fi) => {
    f.vertices.forEach((a, k) => {
      const b = at(f.vertices, (k + 1) % f.vertices.length);
      const key = a < b ? `${a}-${b}` : `${b}-${a}`;
      const e = edgeMap.get(key) ?? { vertices: [Math.min(a, b), Math.max(a, b)], faces: [] };
      e.faces.push(fi);
      edgeMap.set(key, e);
    });
  });
  const edges: SolidEdge[] = [];
  for (const e of edgeMap.values()) {
    const [f1, f2] = e.faces;
    if (e.faces.length !== 2 || f1 === undefined || f2 === undefined) {
      throw new SolidError(
        'SOLID.INCONSISTENT',
        'the hull could not be closed into faces; the points may be too close to coplanar',
      );
    }
    const c = Math.max(-1, Math.min(1, dot3(at(faces, f1).normal, at(faces, f2).normal)));
    edges.push({ vertices: e.vertices, faces: [f1, f2], dihedralDeg: 180 - (Math.acos(c) * 180) / Math.PI });
  }
  edges.sort((a, b) => a.vertices[0] - b.vertices[0] || a.vertices[1] - b.vertices[1]);
  const vertexFaces: number[][] = vertices.map(() => []);
  faces.forEach((f, fi) => f.vertices.forEach((v) => at(vertexFaces, v).push(fi)));
  const oppositeFaces: [number, number][] = [];
  for (let i = 0; i < faces.length; i++) {
    for (let j = i + 1; j < faces.length; j++) {
      if (dot3(at(faces, i).normal, at(faces, j).normal) < -1 + 1e-9) oppositeFaces.push([i, j]);
    }
  }
  return { id, name, vertices, faces, edges, vertexFaces, oppositeFaces };
}

function boundingRadius(points: readonly Vec3[]): number {
  const lo: [number, number, number] = [Infinity, Infinity, Infinity];
  const hi: [number, number, number] = [-Infinity, -Infinity, -Infinity];
  for (const p of points) {
    for (let k = 0; k < 3; k++) {
      lo[k] = Math.min(at(lo, k), at(p, k));
      hi[k] = Math.max(at(hi, k), at(p, k));
    }
  }
  return Math.max(1e-300, length3(sub3(hi, lo)) / 2);
}

/** Throws unless the points span three dimensions (at least four non-coplanar points). */
function assertNotFlat(points: readonly Vec3[], tol: number): void {
  const fail = () =>
    new SolidError('SOLID.FLAT', 'a solid needs at least 4 points that do not all lie in one plane');
  if (points.length < 4) throw fail();
  const p0 = at(points, 0);
  const far = (score: (p: Vec3) => number) =>
    points.reduce((best, p) => (score(p) > score(best) ? p : best), p0);
  const p1 = far((p) => length3(sub3(p, p0)));
  const dir = normalize3(sub3(p1, p0));
  const off = (p: Vec3) => length3(cross3(dir, sub3(p, p0)));
  const p2 = far(off);
  if (off(p2) <= tol) throw fail();
  const n = normalize3(cross3(sub3(p1, p0), sub3(p2, p0)));
  const p3 = far((p) => Math.abs(dot3(n, sub3(p, p0))));
  if (Math.abs(dot3(n, sub3(p3, p0))) <= tol) throw fail();
}

function anyPerpendicular(n: Vec3): Vec3 {
  const a: Vec3 = Math.abs(n[0]) < 0.6 ? [1, 0, 0] : [0, 1, 0];
  return cross3(n, a);
}

/** 2D convex hull returning the original indices, CCW, dropping points within `tol` of a hull edge. */
function convexHull2WithIndex(proj: Vec2[], idx: number[], tol: number): number[] {
  const key = new Map<string, number>();
  proj.forEach((p, k) => key.set(`${p[0]},${p[1]}`, at(idx, k)));
  const hull = convexHull2(proj);
  // Drop nearly collinear corners.
  let changed = true;
  let poly = hull;
  while (changed && poly.length > 3) {
    changed = false;
    for (let k = 0; k < poly.length; k++) {
      const a = at(poly, (k + poly.length - 1) % poly.length);
      const b = at(poly, k);
      const c = at(poly, (k + 1) % poly.length);
      const ac = Math.hypot(c[0] - a[0], c[1] - a[1]);
      const h = Math.abs((c[0] - a[0]) * (b[1] - a[1]) - (c[1] - a[1]) * (b[0] - a[0])) / ac;
      if (h <= tol) {
        poly = poly.filter((_, m) => m !== k);
        changed = true;
        break;
      }
    }
  }
  return poly.map((p) => key.get(`${p[0]},${p[1]}`) ?? -1);
}

/** Unit normal of a planar polygon by Newell's method (counter-clockwise corners give outward). */
function newellNormal(pts: readonly Vec3[]): Vec3 {
  let n: Vec3 = [0, 0, 0];
  for (let i = 0; i < pts.length; i++) {
    const a = at(pts, i);
    const b = at(pts, (i + 1) % pts.length);
    n = add3(n, [
      (a[1] - b[1]) * (a[2] + b[2]),
      (a[2] - b[2]) * (a[0] + b[0]),
      (a[0] - b[0]) * (a[1] + b[1]),
    ]);
  }
  return normalize3(n);
}

/** Centroid of the solid's volume, from a fan of tetrahedra about the mean of the corners. */
function volumeCentroid(pts: readonly Vec3[], faces: readonly number[][]): Vec3 {
  const o = scale3(
    pts.reduce((s, p) => add3(s, p), [0, 0, 0] as Vec3),
    1 / pts.length,
  );
  let vol = 0;
  let c: Vec3 = [0, 0, 0];
  for (const f of faces) {
    const a = at(pts, at(f, 0));
    for (let k = 1; k + 1 < f.length; k++) {
      const b = at(pts, at(f, k));
      const d = at(pts, at(f, k + 1));
      const v = Math.abs(dot3(sub3(a, o), cross3(sub3(b, o), sub3(d, o)))) / 6;
      vol += v;
      c = add3(c, scale3(add3(add3(o, a), add3(b, d)), v / 4));
    }
  }
  return vol > 0 ? scale3(c, 1 / vol) : o;
}
