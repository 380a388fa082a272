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
  const out: SolidSummary[] = Object.entries(FIXED).map(([id, e]) => ({ id, name: e.name }));
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
  const fixed = Object.hasOwn(FIXED, id) ? FIXED[id] : undefined;
  const m = /^(prism|antiprism)-(\d+)$/.exec(id);
  const n = m ? Number(m[2]) : NaN;
  if (fixed) {
    solid = solidFromPoints(id, fixed.name, fixed.points());
  } else if (m && n >= MIN_PRISM_SIDES && n <= MAX_PRISM_SIDES && String(n) === m[2]) {
    const kind = m[1] === 'prism' ? 'prism' : 'antiprism';
    solid = solidFromPoints(id, `${n}-gonal ${kind}`, kind === 'prism' ? prism(n) : antiprism(n));
  } else {
    throw new SolidError('SOLID.UNKNOWN', `unknown solid "${id}"`);
  }
  cache.set(id, solid);
  return solid;
}
