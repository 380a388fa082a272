// Models of our own for the benchmarks: 60 pieces each in 3 colours (neighbour-distinct), a model's pieces
// times the copies a job asks for, laid on 600 × 400 mm sheets with a 5 mm margin and a 3 mm gap.
import geometry from '../dist/index.js';

const { getSolid, suggestSizes } = geometry;

/** A design of our own: a catalogue solid's face planes, each carrying one regular polygon or star piece. */
export function design(solid, sides, step, rotationDeg, factor, machine, diameterMm = 400) {
  const overlap = suggestSizes(getSolid(solid), { sides, step, rotationDeg }).overlap ?? 1;
  return {
    solid,
    piece: { sides, step, rotationDeg, size: overlap * factor },
    scale: { by: 'diameter', mm: diameterMm },
    stock: { thicknessMm: 3, sheet: { widthMm: 600, heightMm: 400 }, marginMm: 5, gapMm: 3 },
    machine,
    fitMm: -0.05,
    colours: { count: 3, rule: 'neighbour-distinct', names: ['red', 'white', 'blue'] },
  };
}
const laser = { kind: 'laser', kerfMm: 0.15 };
const router = { kind: 'router', toolDiameterMm: 3.175 };

export const MODEL_DESIGNS = [
  {
    name: 'rhombic triacontahedron, slotted triangles, 2 copies, laser',
    spec: design('rhombic-triacontahedron', 3, 1, 0, 1.9, laser),
    quantity: 2,
  },
  {
    name: 'rhombic triacontahedron, slotted hexagons, 2 copies, router dog-bones',
    spec: design('rhombic-triacontahedron', 6, 1, 30, 1.3, router),
    quantity: 2,
  },
  {
    // Its pieces differ in where their slots open (12 slot patterns), and its design report warns of thin
    // webs: a hard case for the nesting rather than a model to cut.
    name: 'icosahedron, slotted {5/2} stars, 3 copies, laser',
    spec: design('icosahedron', 5, 2, 36, 1.9, laser),
    quantity: 3,
  },
  {
    name: 'cube, slotted {8/3} stars, 200 mm, 10 copies, laser',
    spec: design('cube', 8, 3, 36, 1.9, laser, 200),
    quantity: 10,
  },
];
