// Fit-to-sheets bench: the largest model of each example design (samples/specs) that fits 1 to 4 sheets of
// 600 × 400 mm (margin 5, gap 3), with the size found, the sheets it uses, the sizes laid out and the median
// wall and CPU time of the search. Not a timed test: compare runs of the same machine, before and after.
// Run after `npm run build -w @kerfwright/geometry`:  node libs/geometry/bench/fit.bench.mjs
// BENCH_RUNS (default 3) sets the runs per case; BENCH_FILTER keeps only cases whose name contains it.
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import geometry from '../dist/index.js';

const { buildWithLayout } = geometry;
const here = path.dirname(fileURLToPath(import.meta.url));
const specsDir = path.resolve(here, '../../../samples/specs');
const RUNS = Number(process.env.BENCH_RUNS ?? 3);
const FILTER = process.env.BENCH_FILTER ?? '';
const SHEET = { widthMm: 600, heightMm: 400 };

const cases = [];
for (const file of fs
  .readdirSync(specsDir)
  .filter((f) => f.endsWith('.json'))
  .sort()) {
  const spec = JSON.parse(fs.readFileSync(path.join(specsDir, file), 'utf8'));
  // Each colour is cut from its own sheets: at least one sheet per colour.
  for (let sheets = spec.colours?.count ?? 1; sheets <= 4; sheets++)
    cases.push({
      name: `${file.replace(/\.json$/, '')} on ${sheets}`,
      spec: {
        ...spec,
        scale: { by: 'fitSheets', sheets },
        stock: { ...spec.stock, sheet: SHEET, marginMm: 5, gapMm: 3 },
      },
    });
}

const median = (xs) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];
const rows = [];
for (const c of cases) {
  if (!c.name.includes(FILTER)) continue;
  const wall = [];
  const cpu = [];
  let r;
  for (let i = 0; i < RUNS; i++) {
    const t0 = performance.now();
    const c0 = process.cpuUsage();
    r = buildWithLayout(c.spec);
    wall.push(performance.now() - t0);
    const d = process.cpuUsage(c0);
    cpu.push((d.user + d.system) / 1000);
  }
  rows.push({
    case: c.name,
    diameterMm: r.model.report.diameterMm.toFixed(3),
    sheets: r.layout?.ok ? r.layout.totals.sheetCount : 'none',
    layouts: r.model.report.scale?.evaluations,
    medianMs: median(wall).toFixed(0),
    cpuMs: median(cpu).toFixed(0),
  });
}
console.table(rows);
const total = (k) => rows.reduce((s, r) => s + Number(r[k]), 0);
console.log(
  `${rows.length} searches: median times summed ${total('medianMs').toFixed(0)} ms wall, ` +
    `${total('cpuMs').toFixed(0)} ms CPU (${RUNS} runs each)`,
);
const cpus = os.cpus();
console.log(
  `machine: ${cpus[0]?.model ?? 'unknown'} × ${cpus.length}, node ${process.version}, load average ${os
    .loadavg()
    .map((x) => x.toFixed(1))
    .join(' ')}`,
);
