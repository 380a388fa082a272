import { type Vec3 } from '../math/vec';
import { type Solid, SolidError, solidFromPoints } from './polyhedron';

const PHI = (1 + Math.sqrt(5)) / 2;

/** Every sign combination of the non-zero coordinates of p. */
function signs(p: Vec3): Vec3[] {
  let out: Vec3[] = [p];
  for (let k = 0; k < 3; k++) {
    if (p[k] === 0) continue;
    out = out.flatMap((q) => {
      const r: [number, number, number] = [q[0], q[1], q[2]];
      r[k] = -(r[k] as number);
      return [q, r];
    });
  }
  return out;
}
/** The three cyclic permutations of p. */
const cyclic = (p: Vec3): Vec3[] => [p, [p[2], p[0], p[1]], [p[1], p[2], p[0]]];
/** All six permutations of p (duplicates removed later). */
const allPerms = (p: Vec3): Vec3[] => [...cyclic(p), ...cyclic([p[1], p[0], p[2]] as Vec3)];
function unique(points: Vec3[]): Vec3[] {
  const seen = new Set<string>();
  return points.filter((p) => {
    const k = p.map((c) => c.toFixed(12)).join(',');
    if (seen.has(k)) return false;
    seen.add(k);
    return true;
  });
}
const signedCyclic = (p: Vec3) => unique(cyclic(p).flatMap(signs));
const signedAll = (p: Vec3) => unique(allPerms(p).flatMap(signs));

/** A uniform n-gonal prism: unit edges. */
function prism(n: number): Vec3[] {
  const r = 1 / (2 * Math.sin(Math.PI / n));
  const out: Vec3[] = [];
  for (const z of [0.5, -0.5]) {
    for (let j = 0; j < n; j++) {
      const a = (2 * Math.PI * j) / n;
      out.push([r * Math.cos(a), r * Math.sin(a), z]);
    }
  }
  return out;
}

/** A uniform n-gonal antiprism: unit edges, the lower ring turned by half a step. */
function antiprism(n: number): Vec3[] {
  const r = 1 / (2 * Math.sin(Math.PI / n));
  // Lateral edges of length 1: 1 = 2r²(1 − cos(π/n)) + h².
  const h = Math.sqrt(1 - 2 * r * r * (1 - Math.cos(Math.PI / n)));
  const out: Vec3[] = [];
  for (let j = 0; j < n; j++) {
    const a = (2 * Math.PI * j) / n;
    out.push([r * Math.cos(a), r * Math.sin(a), h / 2]);
  }
  for (let j = 0; j < n; j++) {
    const a = (2 * Math.PI * j + Math.PI) / n;
    out.push([r * Math.cos(a), r * Math.sin(a), -h / 2]);
  }
  return out;
}

interface CatalogueEntry {
  name: string;
  points: () => Vec3[];
}

const SQRT2 = Math.SQRT2;
/** The tribonacci constant: the real root of t³ = t² + t + 1 (the snub cube's coordinates). */
const TRIBONACCI = (1 + Math.cbrt(19 + 3 * Math.sqrt(33)) + Math.cbrt(19 - 3 * Math.sqrt(33))) / 3;

/** Points with an even (or odd) number of negative coordinates among every sign combination of p. */
const signsWithParity = (p: Vec3, evenMinus: boolean): Vec3[] =>
  signs(p).filter((q) => (q.filter((c) => c < 0).length % 2 === 0) === evenMinus);

/** The snub cube: even permutations of (±1, ±1/t, ±t) with an even number of plus signs, odd ones with odd. */
function snubCube(): Vec3[] {
  const t = TRIBONACCI;
  const base: Vec3 = [1, 1 / t, t];
  const even = cyclic(base);
  const odd = cyclic([base[1], base[0], base[2]]);
  const plusCount = (q: Vec3) => q.filter((c) => c > 0).length;
  return unique([
    ...even.flatMap(signs).filter((q) => plusCount(q) % 2 === 0),
    ...odd.flatMap(signs).filter((q) => plusCount(q) % 2 === 1),
  ]);
}

/**
 * Archimedean solids from their canonical coordinates (the usual textbook ones, centred on the origin); each
 * has all edges of one length and all corners on one sphere, which the tests check.
 */
const ARCHIMEDEAN: Record<string, CatalogueEntry> = {
  'truncated-tetrahedron': {
    name: 'Truncated tetrahedron',
    points: () => unique(allPerms([3, 1, 1]).flatMap((q) => signsWithParity(q, true))),
  },
  'truncated-cube': { name: 'Truncated cube', points: () => signedAll([SQRT2 - 1, 1, 1]) },
  rhombicuboctahedron: { name: 'Rhombicuboctahedron', points: () => signedAll([1, 1, 1 + SQRT2]) },
  'truncated-cuboctahedron': {
    name: 'Truncated cuboctahedron',
    points: () => signedAll([1, 1 + SQRT2, 1 + 2 * SQRT2]),
  },
  'snub-cube': { name: 'Snub cube', points: snubCube },
  'truncated-icosahedron': {
    name: 'Truncated icosahedron',
    points: () =>
      unique([
        ...signedCyclic([0, 1, 3 * PHI]),
        ...signedCyclic([1, 2 + PHI, 2 * PHI]),
        ...signedCyclic([PHI, 2, PHI ** 3]),
      ]),
  },
  'truncated-dodecahedron': {
    name: 'Truncated dodecahedron',
    points: () =>
      unique([
        ...signedCyclic([0, 1 / PHI, 2 + PHI]),
        ...signedCyclic([1 / PHI, PHI, 2 * PHI]),
        ...signedCyclic([PHI, 2, PHI + 1]),
      ]),
  },
  rhombicosidodecahedron: {
    name: 'Rhombicosidodecahedron',
    points: () =>
      unique([
        ...signedCyclic([1, 1, PHI ** 3]),
        ...signedCyclic([PHI ** 2, PHI, 2 * PHI]),
        ...signedCyclic([2 + PHI, 0, PHI ** 2]),
      ]),
  },
  'truncated-icosidodecahedron': {
    name: 'Truncated icosidodecahedron',
    points: () =>
      unique([
        ...signedCyclic([1 / PHI, 1 / PHI, 3 + PHI]),
        ...signedCyclic([2 / PHI, PHI, 1 + 2 * PHI]),
        ...signedCyclic([1 / PHI, PHI ** 2, -1 + 3 * PHI]),
        ...signedCyclic([2 * PHI - 1, 2, 2 + PHI]),
        ...signedCyclic([PHI, 3, 2 * PHI]),
      ]),
  },
};

/**
 * Catalan solids as the duals of the Archimedean ones: the pole n / d of each face plane (unit normal n at
 * distance d) of the Archimedean solid is a corner of its dual, whose faces then lie in the polar planes of the
 * Archimedean corners (all at one distance: every face of a Catalan solid is alike).
 */
const CATALAN: Record<string, { name: string; dualOf: string }> = {
  'triakis-tetrahedron': { name: 'Triakis tetrahedron', dualOf: 'truncated-tetrahedron' },
  'triakis-octahedron': { name: 'Triakis octahedron', dualOf: 'truncated-cube' },
  'tetrakis-hexahedron': { name: 'Tetrakis hexahedron', dualOf: 'truncated-octahedron' },
  'deltoidal-icositetrahedron': { name: 'Deltoidal icositetrahedron', dualOf: 'rhombicuboctahedron' },
  'disdyakis-dodecahedron': { name: 'Disdyakis dodecahedron', dualOf: 'truncated-cuboctahedron' },
  'pentagonal-icositetrahedron': { name: 'Pentagonal icositetrahedron', dualOf: 'snub-cube' },
  'pentakis-dodecahedron': { name: 'Pentakis dodecahedron', dualOf: 'truncated-icosahedron' },
  'triakis-icosahedron': { name: 'Triakis icosahedron', dualOf: 'truncated-dodecahedron' },
  'deltoidal-hexecontahedron': { name: 'Deltoidal hexecontahedron', dualOf: 'rhombicosidodecahedron' },
  'disdyakis-triacontahedron': { name: 'Disdyakis triacontahedron', dualOf: 'truncated-icosidodecahedron' },
};

function dualPoints(solid: Solid): Vec3[] {
  return solid.faces.map((f): Vec3 => [
    f.normal[0] / f.distance,
    f.normal[1] / f.distance,
    f.normal[2] / f.distance,
  ]);
}

/** Canonical coordinates (the usual textbook ones, centred on the origin). */
const FIXED: Record<string, CatalogueEntry> = {
  tetrahedron: {
    name: 'Tetrahedron',
    points: () => [
      [1, 1, 1],
      [1, -1, -1],
      [-1, 1, -1],
      [-1, -1, 1],
    ],
  },
  cube: { name: 'Cube', points: () => signs([1, 1, 1]) },
  octahedron: { name: 'Octahedron', points: () => signedCyclic([1, 0, 0]) },
  dodecahedron: {
    name: 'Dodecahedron',
    points: () => [...signs([1, 1, 1]), ...signedCyclic([0, 1 / PHI, PHI])],
  },
  icosahedron: { name: 'Icosahedron', points: () => signedCyclic([0, 1, PHI]) },
  cuboctahedron: { name: 'Cuboctahedron', points: () => signedAll([1, 1, 0]) },
  icosidodecahedron: {
    name: 'Icosidodecahedron',
    points: () => [...signedCyclic([0, 0, PHI]), ...signedCyclic([0.5, PHI / 2, (PHI * PHI) / 2])],
  },
  'truncated-octahedron': { name: 'Truncated octahedron', points: () => signedAll([0, 1, 2]) },
  'rhombic-dodecahedron': {
    name: 'Rhombic dodecahedron',
    points: () => [...signs([1, 1, 1]), ...signedCyclic([2, 0, 0])],
  },
  'rhombic-triacontahedron': {
    name: 'Rhombic triacontahedron',
    // Dual of the icosidodecahedron: a dodecahedron's 20 corners and an icosahedron's 12, scaled so
    // that each rhombus is planar.
    points: () => [...signs([1, 1, 1]), ...signedCyclic([0, 1 / PHI, PHI]), ...signedCyclic([0, PHI, 1])],
  },
};

export const MIN_PRISM_SIDES = 3;
export const MAX_PRISM_SIDES = 12;

export interface SolidSummary {
  id: string;
  name: string;
}

/** Ids and names of every catalogue solid. */
export function listSolids(): SolidSummary[] {
  const out: SolidSummary[] = [FIXED, ARCHIMEDEAN, CATALAN].flatMap((table) =>
    Object.entries(table).map(([id, e]) => ({ id, name: e.name })),
  );
  for (let n = MIN_PRISM_SIDES; n <= MAX_PRISM_SIDES; n++)
    out.push({ id: `prism-${n}`, name: `${n}-gonal prism` });
  for (let n = MIN_PRISM_SIDES; n <= MAX_PRISM_SIDES; n++) {
    out.push({ id: `antiprism-${n}`, name: `${n}-gonal antiprism` });
  }
  return out;
}

export function isSolidId(id: string): boolean {
  return listSolids().some((s) => s.id === id);
}

const cache = new Map<string, Solid>();

/** A catalogue solid by id (`cube`, `prism-5`, `antiprism-7`, …). Throws SolidError for unknown ids. */
export function getSolid(id: string): Solid {
  const hit = cache.get(id);
  if (hit) return hit;
  let solid: Solid;
  const fixed = Object.hasOwn(FIXED, id)
    ? FIXED[id]
    : Object.hasOwn(ARCHIMEDEAN, id)
      ? ARCHIMEDEAN[id]
      : undefined;
  const catalan = Object.hasOwn(CATALAN, id) ? CATALAN[id] : undefined;
  const m = /^(prism|antiprism)-(\d+)$/.exec(id);
  const n = m ? Number(m[2]) : NaN;
  if (fixed) {
    solid = solidFromPoints(id, fixed.name, fixed.points());
  } else if (catalan) {
    solid = solidFromPoints(id, catalan.name, dualPoints(getSolid(catalan.dualOf)));
  } else if (m && n >= MIN_PRISM_SIDES && n <= MAX_PRISM_SIDES && String(n) === m[2]) {
    const kind = m[1] === 'prism' ? 'prism' : 'antiprism';
    solid = solidFromPoints(id, `${n}-gonal ${kind}`, kind === 'prism' ? prism(n) : antiprism(n));
  } else {
    throw new SolidError('SOLID.UNKNOWN', `unknown solid "${id}"`);
  }
  cache.set(id, solid);
  return solid;
}
