// Build-speed benchmark for the geometry engine (not a timed test). Run after `npm run build -w
// @kerfwright/geometry`: `node libs/geometry/bench/build.bench.mjs`. Builds 30-piece star designs on the
// rhombic triacontahedron (the catalogue solid with 30 faces) with compensation and prints the median
// build time of each, the slowest median against the 50 ms target, and the machine.
//
// For each star the size is the one (between 1.05 and 3 times the size where pieces first overlap) that
// gives a design without errors and the most crossings; stars with no valid size are built at 1.5 times
// and marked "has errors" (such designs take the slower general path for cut-apart pieces).
import os from 'node:os';
import geometry from '../dist/index.js';

const { buildModel, getSolid, suggestSizes } = geometry;

const TARGET_MS = 50;
const WARMUP = 10;
const RUNS = Number(process.env.BENCH_RUNS ?? 60);
const SOLID = 'rhombic-triacontahedron';
const STARS = [
  [5, 2],
  [7, 2],
  [7, 3],
  [8, 3],
  [9, 4],
  [10, 3],
  [12, 5],
];
const MACHINES = [
  { kind: 'laser', kerfMm: 0.15 },
  { kind: 'router', toolDiameterMm: 3.175 },
];

const median = (xs) => {
  const s = [...xs].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
};

const design = (sides, step, size, machine) => ({
  solid: SOLID,
  piece: { sides, step, rotationDeg: 0, size },
  scale: { by: 'planeDistance', mm: 100 },
  stock: { thicknessMm: 3 },
  machine,
  fitMm: -0.05,
});

/** The size factor giving a valid design with the most crossings, or null when none is valid. */
function pickFactor(sides, step, overlap) {
  let best = null;
  for (let f = 1.05; f <= 3.0001; f += 0.05) {
    const m = buildModel(design(sides, step, overlap * f, MACHINES[0]));
    if (m.report.errors.length === 0 && (!best || m.crossings.length > best.crossings)) {
      best = { factor: f, crossings: m.crossings.length };
    }
  }
  return best?.factor ?? null;
}

const rows = [];
for (const [sides, step] of STARS) {
  const overlap = suggestSizes(getSolid(SOLID), { sides, step, rotationDeg: 0 }).overlap ?? 1;
  const picked = pickFactor(sides, step, overlap);
  const factor = picked ?? 1.5;
  for (const machine of MACHINES) {
    // Nudge the size every run, as a user dragging a slider would (nothing is reused between runs but
    // the cached size suggestions).
    const spec = (i) => design(sides, step, overlap * factor * (1 + i * 1e-6), machine);
    for (let i = 0; i < WARMUP; i++) buildModel(spec(i));
    const times = [];
    const cpuTimes = [];
    let model;
    for (let i = 0; i < RUNS; i++) {
      const c0 = process.cpuUsage();
      const t0 = performance.now();
      model = buildModel(spec(i));
      times.push(performance.now() - t0);
      const c = process.cpuUsage(c0);
      cpuTimes.push((c.user + c.system) / 1000);
    }
    rows.push({
      design:
        `${SOLID} {${sides}/${step}} size ${(overlap * factor).toFixed(3)} ${machine.kind}` +
        (model.report.errors.length ? ' (has errors)' : ''),
      valid: model.report.errors.length === 0,
      pieces: model.pieces.length,
      crossings: model.crossings.length,
      medianMs: median(times),
      cpuMedianMs: median(cpuTimes),
    });
  }
}

const cpus = os.cpus();
console.log(
  `machine: ${cpus[0]?.model ?? 'unknown CPU'} × ${cpus.length}, Node ${process.version}, ${os.platform()} ${os.arch()}`,
);
console.log(
  `runs per design: ${RUNS} (after ${WARMUP} warm-up builds); load average ${os.loadavg()[0].toFixed(2)}`,
);
console.log('wall-clock median, then CPU-time median of the process (less sensitive to other load):');
for (const r of rows) {
  console.log(
    `${r.medianMs.toFixed(2).padStart(8)} ms  ${r.cpuMedianMs.toFixed(2).padStart(8)} ms cpu  ${r.design}  ` +
      `(${r.pieces} pieces, ${r.crossings} crossings)`,
  );
}
const slowestOf = (list) => list.reduce((a, b) => (b.medianMs > a.medianMs ? b : a));
const valid = rows.filter((r) => r.valid);
if (valid.length) {
  const v = slowestOf(valid);
  console.log(
    `slowest valid design: ${v.design}: ${v.medianMs.toFixed(2)} ms median wall clock, ` +
      `${v.cpuMedianMs.toFixed(2)} ms CPU (target < ${TARGET_MS} ms) ${v.medianMs < TARGET_MS ? 'OK' : 'OVER'}`,
  );
}
const slowest = slowestOf(rows);
const ok = slowest.medianMs < TARGET_MS;
console.log(
  `slowest of all: ${slowest.design}: ${slowest.medianMs.toFixed(2)} ms median wall clock, ` +
    `${slowest.cpuMedianMs.toFixed(2)} ms CPU (target < ${TARGET_MS} ms) ${ok ? 'OK' : 'OVER'}`,
);
