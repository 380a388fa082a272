import { parseSolidText, MAX_SOLID_VERTICES, MAX_SOLID_TEXT_LENGTH } from './parse';
import { SolidError } from './polyhedron';
import { getSolid } from './catalogue';

// A cube of our own as a triangulated OBJ, shifted off the origin (12 triangles, 2 per square face).
const cubeObj = (dx = 10, dy = -4, dz = 7) => {
  const v: string[] = [];
  for (const x of [0, 2])
    for (const y of [0, 2]) for (const z of [0, 2]) v.push(`v ${x + dx} ${y + dy} ${z + dz}`);
  const f = [
    [1, 2, 4],
    [1, 4, 3],
    [5, 7, 8],
    [5, 8, 6],
    [1, 5, 6],
    [1, 6, 2],
    [3, 4, 8],
    [3, 8, 7],
    [1, 3, 7],
    [1, 7, 5],
    [2, 6, 8],
    [2, 8, 4],
  ].map((t) => `f ${t.join(' ')}`);
  return ['# our own test cube', 'o box', ...v, ...f].join('\n');
};

const offCube = `OFF
# a unit cube of our own, with a redundant point in the middle of one face
9 0 0
0 0 0
1 0 0
0 1 0
1 1 0
0 0 1
1 0 1
0 1 1
1 1 1
0.5 0.5 1
`;

const code = (f: () => unknown): string => {
  try {
    f();
  } catch (e) {
    if (e instanceof SolidError) return e.code;
    throw e;
  }
  return 'no error';
};

describe('uploaded solids', () => {
  it('counts the points a non-convex upload has inside its hull, and none on a face', () => {
    // The redundant face point of offCube lies on the hull: the solid is convex.
    expect(parseSolidText('off', offCube).interiorPointCount).toBeUndefined();
    expect(parseSolidText('obj', cubeObj()).interiorPointCount).toBeUndefined();
    // The unit cube with the middle of its top face pushed down by 0.3: a dent, one point inside the hull.
    const dented = offCube.replace('0.5 0.5 1\n', '0.5 0.5 0.7\n');
    const s = parseSolidText('off', dented);
    expect(s.interiorPointCount).toBe(1);
    expect(s.faces).toHaveLength(6);
  });

  it('merges the two triangles of each OBJ cube face into one square face and centres the cube', () => {
    const s = parseSolidText('obj', cubeObj());
    expect(s.faces).toHaveLength(6);
    expect(s.faces.every((f) => f.vertices.length === 4)).toBe(true);
    expect(s.vertices).toHaveLength(8);
    for (const f of s.faces) expect(f.distance).toBeCloseTo(1, 9);
    const c = s.vertices.reduce((a, v) => [a[0] + v[0], a[1] + v[1], a[2] + v[2]], [0, 0, 0]);
    c.forEach((x) => expect(x).toBeCloseTo(0, 9));
    // Euler's formula holds for the merged hull.
    expect(s.vertices.length - s.edges.length + s.faces.length).toBe(2);
    expect(s.edges.every((e) => Math.abs(e.dihedralDeg - 90) < 1e-9)).toBe(true);
  });

  it('reads OFF, dropping a point that lies inside a face', () => {
    const s = parseSolidText('off', offCube);
    expect(s.vertices).toHaveLength(8);
    expect(s.faces).toHaveLength(6);
  });

  it('reads OFF variants with counts on the header line and extra numbers per vertex (COFF)', () => {
    const lines = offCube.split('\n');
    const coff = ['COFF 8 0 0', ...lines.slice(3, 11).map((l) => `${l} 255 0 0 255`)].join('\n');
    expect(parseSolidText('off', coff).faces).toHaveLength(6);
    expect(code(() => parseSolidText('off', '4OFF\n4 0 0\n0 0 0 0\n1 0 0 0\n0 1 0 0\n0 0 1 0'))).toBe(
      'SOLID.NOT_OFF',
    );
  });

  it('merges the facets of a rotated, shifted dodecahedron written with 4 decimals into 12 pentagons', () => {
    // Our own upload: catalogue coordinates turned, moved and rounded as a mesh exporter might.
    const turn = ([x, y, z]: readonly number[]) => {
      const [a, b] = [0.3, 1.1];
      const x1 = x! * Math.cos(a) - y! * Math.sin(a);
      const y1 = x! * Math.sin(a) + y! * Math.cos(a);
      return [x1 + 5, y1 * Math.cos(b) - z! * Math.sin(b) - 3, y1 * Math.sin(b) + z! * Math.cos(b) + 2];
    };
    const text = getSolid('dodecahedron')
      .vertices.map(
        (v) =>
          `v ${turn(v)
            .map((c) => c.toFixed(4))
            .join(' ')}`,
      )
      .join('\n');
    const s = parseSolidText('obj', text);
    expect(s.faces).toHaveLength(12);
    expect(s.faces.every((f) => f.vertices.length === 5)).toBe(true);
    // Handbook dihedral of the dodecahedron (REFERENCES.md, from memory), within the rounding.
    for (const e of s.edges) expect(e.dihedralDeg).toBeCloseTo(116.5651, 1);
  });

  it('merges facets that are coplanar within the stated tolerance', () => {
    // Move one corner of the OBJ cube by 1e-7 (relative 3e-8 of the radius): still six faces.
    const s = parseSolidText('obj', cubeObj().replace('v 12 -2 9', 'v 12.0000001 -2 9'));
    expect(s.faces).toHaveLength(6);
  });

  it('merges a point off a face centre by the stated tolerance (1e-4 × the radius), not half of it', () => {
    // A ±1 cube (radius √3, tolerance 1.73e-4) with a point 1e-4 and 1.5e-4 above its top face's centre.
    for (const lift of [1e-4, 1.5e-4]) {
      const corners = [-1, 1].flatMap((x) => [-1, 1].flatMap((y) => [-1, 1].map((z) => `${x} ${y} ${z}`)));
      const text = ['OFF', '9 0 0', ...corners, `0 0 ${1 + lift}`].join('\n');
      const s = parseSolidText('off', text);
      expect(s.faces).toHaveLength(6);
      expect(s.vertices).toHaveLength(8);
    }
  });

  it('reads a turned cube exported with points along its edges and across its faces, rounded to a few decimals', () => {
    // A mesh as CAD and modelling programs export it: each face a k × k grid, coordinates rounded. Points
    // along an edge or inside a face lie a hair off it after rounding; the solid is still the cube (6 squares,
    // 8 corners, 12 edges at 90°: derived).
    const turn = (p: number[]): number[] => {
      const [a, b] = [0.7, 0.4];
      const [x0, y0, z0] = p as [number, number, number];
      const x = x0 * Math.cos(a) - y0 * Math.sin(a);
      const y1 = x0 * Math.sin(a) + y0 * Math.cos(a);
      return [x, y1 * Math.cos(b) - z0 * Math.sin(b), y1 * Math.sin(b) + z0 * Math.cos(b)];
    };
    for (const k of [2, 3, 4])
      for (const decimals of [4, 6, 8]) {
        const lines = new Set<string>();
        for (let i = 0; i <= k; i++)
          for (let j = 0; j <= k; j++)
            for (const axis of [0, 1, 2])
              for (const side of [-1, 1]) {
                const p = [0, 0, 0];
                p[axis] = side;
                p[(axis + 1) % 3] = -1 + (2 * i) / k;
                p[(axis + 2) % 3] = -1 + (2 * j) / k;
                lines.add(
                  `v ${turn(p)
                    .map((c) => c.toFixed(decimals))
                    .join(' ')}`,
                );
              }
        const s = parseSolidText('obj', [...lines].join('\n'));
        expect([k, decimals, s.faces.length, s.vertices.length, s.edges.length]).toEqual([
          k,
          decimals,
          6,
          8,
          12,
        ]);
        for (const e of s.edges) expect(e.dihedralDeg).toBeCloseTo(90, 2);
        expect(s.interiorPointCount).toBeUndefined();
      }
  });

  it('says an extruded L is not convex: its inner walls lie on no face of the hull', () => {
    // An L-shaped prism as OFF with its faces: the corner (1, 1) of the L lies on the hull's top and bottom
    // faces, not inside, so only the upload's own faces (two inner walls off every hull face) tell.
    const L = `OFF
12 8 0
0 0 0
2 0 0
2 1 0
1 1 0
1 2 0
0 2 0
0 0 1
2 0 1
2 1 1
1 1 1
1 2 1
0 2 1
6 5 4 3 2 1 0
6 6 7 8 9 10 11
4 0 1 7 6
4 1 2 8 7
4 2 3 9 8
4 3 4 10 9
4 4 5 11 10
4 5 0 6 11
`;
    const s = parseSolidText('off', L);
    expect(s.faces).toHaveLength(7);
    expect(s.interiorPointCount).toBe(2);
    // The same box without the notch, with its faces, is convex.
    const box = L.replace('2 1 0\n1 1 0\n1 2 0', '2 1 0\n2 2 0\n1 2 0').replace(
      '2 1 1\n1 1 1\n1 2 1',
      '2 1 1\n2 2 1\n1 2 1',
    );
    expect(parseSolidText('off', box).interiorPointCount).toBeUndefined();
  });

  it('rejects bad uploads with a coded error', () => {
    expect(code(() => parseSolidText('obj', 'hello, this is not a mesh'))).toBe('SOLID.NOT_OBJ');
    expect(code(() => parseSolidText('off', 'v 0 0 0\nv 1 0 0'))).toBe('SOLID.NOT_OFF');
    expect(code(() => parseSolidText('off', 'OFF\n4 0 0\n0 0 0\n1 0 0\n'))).toBe('SOLID.NOT_OFF');
    expect(code(() => parseSolidText('obj', 'v 0 0 0\nv 1 0 0\nv 0 1 0'))).toBe('SOLID.FLAT');
    expect(code(() => parseSolidText('obj', 'v 0 0 0\nv 1 0 0\nv 0 1 0\nv 1 1 0\nv 2 3 0'))).toBe(
      'SOLID.FLAT',
    );
    expect(code(() => parseSolidText('obj', 'v 0 0 0\nv 1 0 0\nv 0 1 0\nv 0 0 NaN'))).toBe(
      'SOLID.NOT_FINITE',
    );
    expect(code(() => parseSolidText('off', 'OFF\n4 0 0\n0 0 0\n1 0 0\n0 1 0\n0 0 Infinity\n'))).toBe(
      'SOLID.NOT_FINITE',
    );
    expect(code(() => parseSolidText('obj', 'v 1 2\nv 0 0 0\nv 1 0 0\nv 0 1 0'))).toBe('SOLID.NOT_OBJ');
    const many = Array.from(
      { length: MAX_SOLID_VERTICES + 1 },
      (_, i) => `v ${Math.cos(i)} ${Math.sin(i)} ${i % 7}`,
    );
    expect(code(() => parseSolidText('obj', many.join('\n')))).toBe('SOLID.TOO_MANY_VERTICES');
    expect(code(() => parseSolidText('off', `OFF\n${MAX_SOLID_VERTICES + 1} 0 0\n`))).toBe(
      'SOLID.TOO_MANY_VERTICES',
    );
    expect(code(() => parseSolidText('obj', ' '.repeat(MAX_SOLID_TEXT_LENGTH + 1)))).toBe('SOLID.TOO_LARGE');
  });

  it('refuses OBJ coordinates that are not numbers in full instead of reading their first digits', () => {
    // The OBJ format writes coordinates as floating-point numbers with a decimal point (Wavefront OBJ
    // specification, from memory); a file exported with decimal commas ("1,5") was read as 1, 2 and 3: a
    // 1 x 2 x 3 box accepted in place of the 1.5 x 2.5 x 3.5 one.
    const box = (fmt: (x: number) => string) =>
      [0, 1.5]
        .flatMap((x) => [0, 2.5].flatMap((y) => [0, 3.5].map((z) => `v ${fmt(x)} ${fmt(y)} ${fmt(z)}`)))
        .join('\n');
    const comma = box((x) => String(x).replace('.', ','));
    expect(code(() => parseSolidText('obj', comma))).toBe('SOLID.NOT_OBJ');
    expect(() => parseSolidText('obj', comma)).toThrow(
      /line 2: "3,5" is not a number \(write decimals with a point/,
    );
    expect(
      code(() =>
        parseSolidText(
          'obj',
          box((x) => `${x}mm`),
        ),
      ),
    ).toBe('SOLID.NOT_OBJ');
    // Numbers written in other valid ways still read in full: the same box, 1.5 x 2.5 x 3.5 (derived).
    for (const fmt of [(x: number) => String(x), (x: number) => x.toExponential(), (x: number) => `+${x}`]) {
      const s = parseSolidText('obj', box(fmt));
      const span = (k: number) =>
        Math.max(...s.vertices.map((v) => v[k]!)) - Math.min(...s.vertices.map((v) => v[k]!));
      expect([span(0), span(1), span(2)].map((x) => Number(x.toFixed(9)))).toEqual([1.5, 2.5, 3.5]);
    }
  });

  it('refuses OFF coordinates that are not decimal numbers, saying which and why, and reads NaN as not finite', () => {
    // OFF writes coordinates as decimal floating-point numbers (Geomview OFF format description, from memory).
    const corners = (fmt: (x: number) => string) =>
      [0, 1.5].flatMap((x) => [0, 2.5].flatMap((y) => [0, 3.5].map((z) => [x, y, z].map(fmt).join(' '))));
    const off = (fmt: (x: number) => string) => `OFF\n8 0 0\n${corners(fmt).join('\n')}\n`;
    expect(() =>
      parseSolidText(
        'off',
        off((x) => String(x).replace('.', ',')),
      ),
    ).toThrow(/OFF vertex 2: "3,5" is not a number \(write decimals with a point, not a comma\)/);
    expect(
      code(() =>
        parseSolidText(
          'off',
          off((x) => `0x${x === 0 ? 0 : 1}`),
        ),
      ),
    ).toBe('SOLID.NOT_OFF');
    expect(
      code(() =>
        parseSolidText(
          'off',
          off((x) => (x === 2.5 ? 'nan' : String(x))),
        ),
      ),
    ).toBe('SOLID.NOT_FINITE');
    // Exponents and signs read in full: a 1.5 × 2.5 × 3.5 box (derived).
    const s = parseSolidText(
      'off',
      off((x) => `+${x.toExponential()}`),
    );
    const span = (k: number) =>
      Math.max(...s.vertices.map((v) => v[k]!)) - Math.min(...s.vertices.map((v) => v[k]!));
    expect([span(0), span(1), span(2)].map((x) => Number(x.toFixed(9)))).toEqual([1.5, 2.5, 3.5]);
  });

  it('refuses OFF text with more lines than its header counts instead of reading only the first points', () => {
    // An OFF file gives the vertex and face counts, then exactly that many vertex and face lines (Geomview OFF
    // format description, from memory). A cube of eight corners under a header that counts five was read as
    // the five-point solid those lines span.
    const corners = [0, 1].flatMap((x) => [0, 1].flatMap((y) => [0, 1].map((z) => `${x} ${y} ${z}`)));
    const off = (header: string) => `OFF\n${header}\n${corners.join('\n')}\n`;
    expect(parseSolidText('off', off('8 0 0')).faces).toHaveLength(6);
    expect(code(() => parseSolidText('off', off('5 0 0')))).toBe('SOLID.NOT_OFF');
    expect(() => parseSolidText('off', off('5 0 0'))).toThrow(
      /counts 5 vertices and 0 faces, but 3 more lines/,
    );
    // Face lines within the count, comments and blank lines are still fine.
    expect(parseSolidText('off', `${off('8 1 0')}4 0 1 3 2\n# end\n\n`).faces).toHaveLength(6);
  });

  it('builds a cube drawn in any sensible unit, and refuses coordinates far beyond them with a coded error', () => {
    const cube = (k: number) =>
      [0, 1]
        .flatMap((x) => [0, 1].flatMap((y) => [0, 1].map((z) => `v ${x * k} ${y * k} ${z * k}`)))
        .join('\n');
    for (const k of [1e-6, 1, 1e3, 1e9]) expect(parseSolidText('obj', cube(k)).faces).toHaveLength(6);
    // 1e160 squared overflows to Infinity: these crashed the hull before they were refused.
    for (const k of [1e13, 1e160, 1e300, 1e-100, 1e-160])
      expect(code(() => parseSolidText('obj', cube(k)))).toBe('SOLID.OUT_OF_RANGE');
  });

  it('refuses a hull with too many faces to be pieces', () => {
    // A finely sampled sphere of our own (golden-angle spiral) has hundreds of faces.
    const pts = Array.from({ length: 400 }, (_, i) => {
      const z = 1 - (2 * (i + 0.5)) / 400;
      const r = Math.sqrt(1 - z * z);
      const a = i * Math.PI * (3 - Math.sqrt(5));
      return `v ${r * Math.cos(a)} ${r * Math.sin(a)} ${z}`;
    });
    expect(code(() => parseSolidText('obj', pts.join('\n')))).toBe('SOLID.TOO_MANY_FACES');
  });
});
