// Cut-pack benchmark: a 60-piece, 3-colour design from spec to finished cut pack (build, colour plan, layout,
// labels, per-sheet DXF and SVG, coupon, setup sheet and assembly guide PDFs, manifest, ZIP), the way the CLI's
// `pack` command and the export queue run it. Prints the median wall and CPU time of the whole pack and of its
// stages (from the pack's own progress points). Not a timed test.
// Run after `npm run build -w @kerfwright/geometry`:  node libs/geometry/bench/pack.bench.mjs
import os from 'node:os';
import { packInputFrom } from '../dist/pack/cli-commands.js';
import { createCutPack } from '../dist/pack/index.js';
import { MODEL_DESIGNS } from './model-designs.mjs';

const RUNS = Number(process.env.BENCH_RUNS ?? 5);
const TARGET_MS = 2000;

const median = (xs) => {
  const s = [...xs].sort((a, b) => a - b);
  const m = Math.floor(s.length / 2);
  return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
};

// The pack reports progress at fixed points; the stretch between two points is one stage.
const STAGES = [
  [0.02, 0.15, 'build'],
  [0.15, 0.35, 'colour plan + layout'],
  [0.35, 0.55, 'labels + sheet drawings'],
  [0.55, 0.7, 'DXF + SVG + coupon'],
  [0.7, 0.92, 'PDFs'],
  [0.92, 1, 'manifest + ZIP'],
];

async function timePack(input) {
  const marks = new Map();
  const c0 = process.cpuUsage();
  const t0 = performance.now();
  const result = await createCutPack(input, (f) => marks.set(f, performance.now()));
  const wall = performance.now() - t0;
  const c = process.cpuUsage(c0);
  const stages = Object.fromEntries(
    STAGES.map(([a, b, name]) => [name, (marks.get(b) ?? NaN) - (marks.get(a) ?? NaN)]),
  );
  return { wall, cpu: (c.user + c.system) / 1000, stages, result };
}

console.log(
  `machine: ${os.cpus().length} × ${os.cpus()[0]?.model ?? 'cpu'}, Node ${process.version}, ` +
    `load average ${os
      .loadavg()
      .map((l) => l.toFixed(2))
      .join(' ')}; ${RUNS} timed runs per case after 1 warm-up`,
);
const medians = [];
for (const c of MODEL_DESIGNS) {
  const input = packInputFrom(c.spec, { quantity: c.quantity, archive: true });
  const warm = await timePack(input);
  const runs = [];
  for (let i = 0; i < RUNS; i++) runs.push(await timePack(input));
  const wall = median(runs.map((r) => r.wall));
  medians.push(wall);
  const files = warm.result.files;
  const bytes = files.reduce((s, f) => s + f.data.length, 0);
  console.log(`\n${c.name}`);
  console.log(
    `  ${warm.result.manifest.sheetCount} sheets, ${files.length} files (${(bytes / 1024).toFixed(0)} KiB` +
      `, ${warm.result.manifest.warnings?.length ?? 0} warnings); whole pack median ${wall.toFixed(0)} ms wall, ` +
      `${median(runs.map((r) => r.cpu)).toFixed(0)} ms CPU (runs ${runs.map((r) => r.wall.toFixed(0)).join(', ')} ms)`,
  );
  console.log(
    '  stages (median wall): ' +
      STAGES.map(([, , name]) => `${name} ${median(runs.map((r) => r.stages[name])).toFixed(0)} ms`).join(
        ', ',
      ),
  );
}
const worst = Math.max(...medians);
console.log(
  `\ntarget (issue #4): a 60-piece, 3-colour design laid out and packed in under ${TARGET_MS} ms median — ` +
    `slowest case ${worst.toFixed(0)} ms: ${worst < TARGET_MS ? 'met' : 'NOT met'}`,
);
