// npm run bench: builds the libraries if needed, then runs every benchmark script in turn and prints
// their figures (medians, ratios and the machine). Benchmarks are measurements, not tests: nothing here
// fails a build when a target is missed; each script prints its target beside its figure.
import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const benches = [
  'libs/geometry/bench/build.bench.mjs',
  'libs/geometry/bench/nest.bench.mjs',
  'libs/geometry/bench/layout.bench.mjs',
  'libs/geometry/bench/fit.bench.mjs',
  'libs/geometry/bench/pack.bench.mjs',
  'scripts/bench-queue.mjs',
  'scripts/bench-api.mjs',
].filter((b) => fs.existsSync(path.join(root, b)));

if (!fs.existsSync(path.join(root, 'libs/geometry/dist/index.js'))) {
  spawnSync('npm', ['run', '-s', 'build'], { cwd: root, stdio: 'inherit' });
}
let failed = 0;
for (const bench of benches) {
  console.log(`\n=== ${bench} ===`);
  const r = spawnSync(process.execPath, [path.join(root, bench)], { cwd: root, stdio: 'inherit' });
  if (r.status !== 0) failed++;
}
process.exit(failed > 0 ? 1 : 0);
