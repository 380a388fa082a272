// Layout-speed benchmark: builds slotted designs with buildModel and lays them out with layoutModel (true-shape
// nesting per colour), printing the median wall and CPU time of each. Not a timed test.
// Run after `npm run build -w @kerfwright/geometry`:  node libs/geometry/bench/layout.bench.mjs
import os from 'node:os';
import geometry from '../dist/index.js';

const { buildModel, buildWithLayout, getSolid, suggestSizes, layoutModel } = geometry;
const RUNS = Number(process.env.BENCH_RUNS ?? 3);
const SHEET = { widthMm: 600, heightMm: 400 };

/** A design of our own: a solid's face planes, each carrying one regular polygon or star piece. */
function design(solid, sides, step, factor, scaleMm, machine, rotationDeg = 0) {
  const overlap = suggestSizes(getSolid(solid), { sides, step, rotationDeg }).overlap ?? 1;
  return {
    solid,
    piece: { sides, step, rotationDeg, size: overlap * factor },
    scale: { by: 'planeDistance', mm: scaleMm },
    stock: { thicknessMm: 3 },
    machine,
    fitMm: -0.05,
  };
}

const laser = { kind: 'laser', kerfMm: 0.15 };
const router = { kind: 'router', toolDiameterMm: 3.175 };
const CASES = [
  {
    name: 'rhombic triacontahedron, 30 slotted triangles, 3 colours',
    spec: design('rhombic-triacontahedron', 3, 1, 1.9, 100, laser),
    colours: 3,
  },
  {
    name: 'the same, two copies: 60 slotted triangles, 3 colours',
    spec: design('rhombic-triacontahedron', 3, 1, 1.9, 100, laser),
    colours: 3,
    quantity: 2,
  },
  {
    name: 'cube, 6 squares at 45°, router dog-bones, 3 colours',
    spec: {
      solid: 'cube',
      piece: { sides: 4, rotationDeg: 45, size: 1.5 },
      scale: { by: 'diameter', mm: 300 },
      stock: { thicknessMm: 6 },
      machine: router,
      fitMm: 0.1,
    },
    colours: 3,
  },
  {
    name: 'octahedron, 8 slotted hexagons, 2 colours',
    spec: {
      solid: 'octahedron',
      piece: { sides: 6, step: 1, rotationDeg: 0, size: 1.3 },
      scale: { by: 'planeDistance', mm: 80 },
      stock: { thicknessMm: 3, flexible: false },
      machine: laser,
      fitMm: -0.05,
    },
    colours: 2,
  },
];

const median = (xs) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];
const rows = [];
for (const c of CASES) {
  const model = buildModel(c.spec);
  const options = {
    sheet: SHEET,
    marginMm: 5,
    gapMm: 3,
    colours: { count: c.colours, rule: 'neighbour-distinct' },
    quantity: c.quantity ?? 1,
  };
  layoutModel(model, options); // warm-up: the first call also compiles the code paths
  const wall = [];
  const cpu = [];
  let r;
  for (let i = 0; i < RUNS; i++) {
    const t0 = performance.now();
    const c0 = process.cpuUsage();
    r = layoutModel(model, options);
    wall.push(performance.now() - t0);
    const d = process.cpuUsage(c0);
    cpu.push((d.user + d.system) / 1000);
  }
  const vertices = model.pieces.map((p) => p.outline.length);
  rows.push({
    case: c.name,
    pieces: model.pieces.length * (c.quantity ?? 1),
    verticesPerPiece: `${Math.min(...vertices)}–${Math.max(...vertices)}`,
    buildErrors: model.report.errors.length,
    sheets: r.ok ? r.totals.sheetCount : `failed: ${r.message}`,
    utilisation: r.ok ? r.totals.utilisation.toFixed(3) : '',
    medianMs: median(wall).toFixed(0),
    cpuMs: median(cpu).toFixed(0),
    msPerPiece: (median(wall) / (model.pieces.length * (c.quantity ?? 1))).toFixed(1),
    cpuMsPerPiece: (median(cpu) / (model.pieces.length * (c.quantity ?? 1))).toFixed(1),
  });
}
console.table(rows);

// Fit to sheets: the largest model on N sheets, a search of up to 16 layouts (build-with-layout.ts).
const FIT_CASES = [
  {
    name: 'octahedron lamp, 8 slotted hexagons, 2 colours, 2 sheets of 500 × 450',
    spec: {
      solid: 'octahedron',
      piece: { sides: 6, size: 1.3 },
      scale: { by: 'fitSheets', sheets: 2 },
      stock: { thicknessMm: 3, sheet: { widthMm: 500, heightMm: 450 }, marginMm: 8, gapMm: 4 },
      machine: laser,
      colours: { count: 2, rule: 'neighbour-distinct' },
    },
  },
  {
    name: 'rhombic triacontahedron, 30 slotted triangles, 3 colours, 3 sheets of 600 × 400',
    spec: {
      ...design('rhombic-triacontahedron', 3, 1, 1.9, 100, laser),
      scale: { by: 'fitSheets', sheets: 3 },
      stock: { thicknessMm: 3, sheet: SHEET, marginMm: 5, gapMm: 3 },
      colours: { count: 3, rule: 'neighbour-distinct' },
    },
  },
];
const fitRows = [];
for (const c of FIT_CASES) {
  const wall = [];
  let r;
  for (let i = 0; i < RUNS; i++) {
    const t0 = performance.now();
    r = buildWithLayout(c.spec);
    wall.push(performance.now() - t0);
  }
  const scale = r.model.report.scale;
  fitRows.push({
    case: c.name,
    diameterMm: scale?.diameterMm?.toFixed(1),
    layouts: scale?.evaluations,
    sheets: r.layout?.ok ? r.layout.totals.sheetCount : 'failed',
    medianMs: median(wall).toFixed(0),
  });
}
console.table(fitRows);
const cpus = os.cpus();
console.log(
  `machine: ${cpus[0]?.model ?? 'unknown'} × ${cpus.length}, node ${process.version}, load average ${os
    .loadavg()
    .map((x) => x.toFixed(1))
    .join(' ')}`,
);
