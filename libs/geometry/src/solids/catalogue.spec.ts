import { type Vec3, dot3 } from '../math/vec';
import { getSolid, listSolids } from './catalogue';
import { SolidError, symmetryRotations } from './polyhedron';

const distinct = (xs: number[]) =>
  [...new Set(xs.map((x) => x.toFixed(3)))].map(Number).sort((a, b) => a - b);

describe('catalogue solids', () => {
  // Dihedral angles: standard handbook tables (CRC Standard Mathematical Tables; values from memory,
  // as listed in REFERENCES.md), compared to 4 decimals.
  const handbook: Record<string, number[]> = {
    tetrahedron: [70.5288],
    cube: [90],
    octahedron: [109.4712],
    dodecahedron: [116.5651],
    icosahedron: [138.1897],
    cuboctahedron: [125.2644],
    icosidodecahedron: [142.6226],
    'truncated-octahedron': [109.4712, 125.2644],
    'rhombic-dodecahedron': [120],
    'rhombic-triacontahedron': [144],
    // Archimedean solids (from memory): one angle per kind of edge.
    'truncated-tetrahedron': [70.5288, 109.4712],
    'truncated-cube': [90, 125.2644],
    rhombicuboctahedron: [135, 144.7356],
    'truncated-cuboctahedron': [125.2644, 135, 144.7356],
    'snub-cube': [142.983, 153.2346],
    'truncated-icosahedron': [138.1897, 142.6226],
    'truncated-dodecahedron': [116.5651, 142.6226],
    rhombicosidodecahedron: [148.2825, 159.0948],
    'truncated-icosidodecahedron': [142.6226, 148.2825, 159.0948],
    // Catalan solids (from memory): every edge alike.
    'triakis-tetrahedron': [129.5212],
    'triakis-octahedron': [147.3502],
    'tetrakis-hexahedron': [143.1301],
    'deltoidal-icositetrahedron': [138.1176],
    'disdyakis-dodecahedron': [155.0823],
    'pentagonal-icositetrahedron': [136.3092],
    'pentakis-dodecahedron': [156.7188],
    'triakis-icosahedron': [160.6126], // arccos(−(24 + 15√5)/61)
    'deltoidal-hexecontahedron': [154.1214],
    'disdyakis-triacontahedron': [164.8876],
  };
  it.each(Object.entries(handbook))('%s has the handbook dihedral angles', (id, angles) => {
    const found = distinct(getSolid(id).edges.map((e) => e.dihedralDeg));
    expect(found).toHaveLength(angles.length);
    found.forEach((a, i) => expect(a).toBeCloseTo(angles[i] as number, 3));
  });

  // Face, edge and vertex counts: standard tables of the Platonic, Archimedean and Catalan solids
  // (common knowledge, from memory).
  const counts: Record<string, [number, number, number]> = {
    tetrahedron: [4, 6, 4],
    cube: [8, 12, 6],
    octahedron: [6, 12, 8],
    dodecahedron: [20, 30, 12],
    icosahedron: [12, 30, 20],
    cuboctahedron: [12, 24, 14],
    icosidodecahedron: [30, 60, 32],
    'truncated-octahedron': [24, 36, 14],
    'rhombic-dodecahedron': [14, 24, 12],
    'rhombic-triacontahedron': [32, 60, 30],
    'truncated-tetrahedron': [12, 18, 8],
    'truncated-cube': [24, 36, 14],
    rhombicuboctahedron: [24, 48, 26],
    'truncated-cuboctahedron': [48, 72, 26],
    'snub-cube': [24, 60, 38],
    'truncated-icosahedron': [60, 90, 32],
    'truncated-dodecahedron': [60, 90, 32],
    rhombicosidodecahedron: [60, 120, 62],
    'truncated-icosidodecahedron': [120, 180, 62],
    // A Catalan solid has its Archimedean partner's counts with V and F exchanged.
    'triakis-tetrahedron': [8, 18, 12],
    'triakis-octahedron': [14, 36, 24],
    'tetrakis-hexahedron': [14, 36, 24],
    'deltoidal-icositetrahedron': [26, 48, 24],
    'disdyakis-dodecahedron': [26, 72, 48],
    'pentagonal-icositetrahedron': [38, 60, 24],
    'pentakis-dodecahedron': [32, 90, 60],
    'triakis-icosahedron': [32, 90, 60],
    'deltoidal-hexecontahedron': [62, 120, 60],
    'disdyakis-triacontahedron': [62, 180, 120],
  };
  it.each(Object.entries(counts))('%s has the tabulated V, E, F', (id, [v, e, f]) => {
    const s = getSolid(id);
    expect([s.vertices.length, s.edges.length, s.faces.length]).toEqual([v, e, f]);
  });

  it('Archimedean solids have one edge length and their corners on one sphere; Catalan solids, one face distance', () => {
    // The defining properties (derived): uniform polyhedra are vertex-transitive with equal edges; their duals
    // are face-transitive.
    const spread = (xs: number[]) => (Math.max(...xs) - Math.min(...xs)) / Math.max(...xs);
    const length = (s: ReturnType<typeof getSolid>, e: { vertices: [number, number] }) =>
      Math.hypot(...[0, 1, 2].map((k) => s.vertices[e.vertices[0]]![k]! - s.vertices[e.vertices[1]]![k]!));
    for (const id of [
      'truncated-tetrahedron',
      'truncated-cube',
      'rhombicuboctahedron',
      'truncated-cuboctahedron',
      'snub-cube',
      'truncated-icosahedron',
      'truncated-dodecahedron',
      'rhombicosidodecahedron',
      'truncated-icosidodecahedron',
    ]) {
      const s = getSolid(id);
      expect([id, spread(s.edges.map((e) => length(s, e))) < 1e-12]).toEqual([id, true]);
      expect([id, spread(s.vertices.map((v) => Math.hypot(...v))) < 1e-12]).toEqual([id, true]);
    }
    for (const id of Object.keys(counts).filter((k) => /kis|deltoidal|disdyakis|pentagonal/.test(k))) {
      const s = getSolid(id);
      expect([id, spread(s.faces.map((f) => f.distance)) < 1e-12]).toEqual([id, true]);
    }
  });

  it('lists 29 named solids plus prisms and antiprisms with 3 to 12 sides', () => {
    const ids = listSolids().map((s) => s.id);
    expect(ids).toHaveLength(29 + 2 * 10);
    expect(ids).toContain('prism-3');
    expect(ids).toContain('antiprism-12');
  });

  it.each(listSolids().map((s) => s.id))("%s satisfies Euler's formula V − E + F = 2", (id) => {
    // Euler's polyhedron formula for convex polyhedra.
    const s = getSolid(id);
    expect(s.vertices.length - s.edges.length + s.faces.length).toBe(2);
  });

  it.each(listSolids().map((s) => s.id))(
    '%s has outward unit normals and every vertex inside each plane',
    (id) => {
      const s = getSolid(id);
      for (const f of s.faces) {
        expect(Math.hypot(...f.normal)).toBeCloseTo(1, 12);
        expect(f.distance).toBeGreaterThan(0);
        for (const v of s.vertices) expect(dot3(f.normal, v)).toBeLessThanOrEqual(f.distance + 1e-9);
        for (const vi of f.vertices)
          expect(dot3(f.normal, s.vertices[vi] ?? [0, 0, 0])).toBeCloseTo(f.distance, 9);
      }
      // Every vertex belongs to at least three faces, and incidence agrees with the faces.
      s.vertexFaces.forEach((faces, v) => {
        expect(faces.length).toBeGreaterThanOrEqual(3);
        for (const fi of faces) expect(s.faces[fi]?.vertices).toContain(v);
      });
    },
  );

  it('uniform prisms have 90° base–side dihedrals and the n-gon interior angle between sides', () => {
    for (let n = 3; n <= 12; n++) {
      const s = getSolid(`prism-${n}`);
      const expected = distinct([90, 180 - 360 / n]);
      expect(distinct(s.edges.map((e) => e.dihedralDeg))).toEqual(expected);
    }
  });

  it('uniform antiprisms have unit edges and regular faces', () => {
    for (let n = 3; n <= 12; n++) {
      const s = getSolid(`antiprism-${n}`);
      for (const e of s.edges) {
        const [a, b] = e.vertices.map((i) => s.vertices[i] ?? [0, 0, 0]) as [Vec3, Vec3];
        expect(Math.hypot(a[0] - b[0], a[1] - b[1], a[2] - b[2])).toBeCloseTo(1, 9);
      }
      expect(s.faces).toHaveLength(2 * n + 2);
      expect(s.faces.filter((f) => f.vertices.length === 3).length).toBe(n === 3 ? 8 : 2 * n);
    }
    // The triangular antiprism is the octahedron: same dihedral angle.
    expect(getSolid('antiprism-3').edges[0]?.dihedralDeg).toBeCloseTo(109.4712, 3);
  });

  it('finds opposite face pairs exactly where the solid is centrally symmetric', () => {
    expect(getSolid('tetrahedron').oppositeFaces).toHaveLength(0);
    expect(getSolid('cube').oppositeFaces).toHaveLength(3);
    expect(getSolid('octahedron').oppositeFaces).toHaveLength(4);
    expect(getSolid('rhombic-triacontahedron').oppositeFaces).toHaveLength(15);
    expect(getSolid('prism-5').oppositeFaces).toHaveLength(1);
    expect(getSolid('prism-6').oppositeFaces).toHaveLength(4);
  });

  it('finds the rotation group of each solid (orders 12, 24, 60 and 2n)', () => {
    // Group theory (from memory): the rotation groups of the tetrahedron, cube/octahedron and
    // dodecahedron/icosahedron have orders 12, 24 and 60; a uniform n-prism or n-antiprism has the
    // dihedral group of order 2n, except the cube (prism-4) and the octahedron (antiprism-3).
    const order = (id: string) => {
      const s = getSolid(id);
      return symmetryRotations(s.vertices, s.faces, 1e-6).length;
    };
    expect(order('tetrahedron')).toBe(12);
    expect(order('cube')).toBe(24);
    expect(order('rhombic-dodecahedron')).toBe(24);
    expect(order('icosahedron')).toBe(60);
    expect(order('rhombic-triacontahedron')).toBe(60);
    expect(order('prism-7')).toBe(14);
    expect(order('antiprism-5')).toBe(10);
    expect(order('prism-4')).toBe(24);
    expect(order('antiprism-3')).toBe(24);
  });

  it('picks first vertices that the rotations carry onto each other (faces no rotation maps to themselves)', () => {
    // The antiprism's side triangles and the rhombic triacontahedron's rhombi (under its 2-fold axes
    // the first vertex may swap with the opposite one, so only the triangles are checked exactly).
    const s = getSolid('antiprism-5');
    const rotations = symmetryRotations(s.vertices, s.faces, 1e-6);
    const img = (m: (typeof rotations)[number], v: readonly number[]) =>
      m.map((row) => row[0] * v[0]! + row[1] * v[1]! + row[2] * v[2]!);
    const near = (a: readonly number[], b: readonly number[]) =>
      a.every((c, i) => Math.abs(c - b[i]!) < 1e-9);
    let checked = 0;
    for (const f of s.faces.filter((x) => x.vertices.length === 3)) {
      for (const m of rotations) {
        const g = s.faces.find((x) => near(x.normal, img(m, f.normal)))!;
        expect(near(img(m, s.vertices[f.vertices[0]!]!), s.vertices[g.vertices[0]!]!)).toBe(true);
        checked++;
      }
    }
    expect(checked).toBe(100);
  });

  it('refuses unknown ids and out-of-range prisms', () => {
    for (const id of ['cubee', 'prism-2', 'prism-13', 'antiprism-03', 'toString', '__proto__']) {
      expect(() => getSolid(id)).toThrow(SolidError);
    }
  });
});
