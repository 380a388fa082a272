// Cut packs per minute through the export queue with one and with two `npm run worker` processes.
// Self-contained (scripts/bench-harness.mjs): a private PostgreSQL, Redis and S3 fake, the API with worker mode
// off (it only enqueues), jobs prepared and approved through the real API, then N exports timed per run from
// the first POST to the last "done". Needs `npm run build`.
// Env: KW_BENCH_PACKS (per run, default 32). Target: two workers ≥ 1.7 × one (on a machine with ≥ 2 cores).
import os from 'node:os';
import {
  benchWorkshop,
  cpuSeconds,
  machineLine,
  sleep,
  startBenchServices,
  stopChild,
} from './bench-harness.mjs';

const PACKS = Number(process.env.KW_BENCH_PACKS ?? 32);
const TARGET = 1.7;
const log = (s) => console.log(`[bench-queue] ${s}`);

async function main(svc) {
  const { api, db, startNode } = svc;
  const { tokens, approvedJob } = await benchWorkshop(svc);

  async function waitDone(ids) {
    for (;;) {
      const r = await db.query(
        `SELECT state, count(*)::int AS n FROM exports WHERE id = ANY($1::uuid[]) GROUP BY state`,
        [ids],
      );
      const by = Object.fromEntries(r.rows.map((x) => [x.state, x.n]));
      if (by.failed) throw new Error(`${by.failed} export(s) failed`);
      if ((by.done ?? 0) === ids.length) return;
      await sleep(100);
    }
  }

  async function timedRun(workers) {
    const jobs = [];
    for (let i = 0; i < PACKS; i++) jobs.push(await approvedJob());
    const procs = Array.from({ length: workers }, () =>
      startNode('apps/api/dist/worker.js', {}, /working the cut-packs queue/),
    );
    await Promise.all(procs.map((p) => p.ready));
    // One warm-up pack per worker, not timed (first-run compilation of the geometry code).
    const warm = [];
    for (let i = 0; i < workers; i++)
      warm.push((await api('POST', `/jobs/${await approvedJob()}/exports`, tokens.fabricator)).exportId);
    await waitDone(warm);
    const shared = [svc.started[0].pid, svc.apiPid()];
    const cpu0 = [...procs.map((p) => cpuSeconds(p.child.pid)), ...shared.map(cpuSeconds)];
    const t0 = performance.now();
    const ids = [];
    for (const id of jobs) ids.push((await api('POST', `/jobs/${id}/exports`, tokens.fabricator)).exportId);
    await waitDone(ids);
    const seconds = (performance.now() - t0) / 1000;
    const cpu1 = [...procs.map((p) => cpuSeconds(p.child.pid)), ...shared.map(cpuSeconds)];
    const used = cpu1.map((c, i) => c - cpu0[i]);
    const workerCpu = used.slice(0, workers).reduce((a, b) => a + b, 0);
    const sharedCpu = used.slice(workers).reduce((a, b) => a + b, 0);
    for (const p of procs) await stopChild(p.child);
    return {
      workers,
      packs: PACKS,
      seconds,
      perMinute: (PACKS / seconds) * 60,
      workerCpuPerPack: workerCpu / PACKS,
      sharedCpuPerPack: sharedCpu / PACKS,
    };
  }

  // Cores kept busy = CPU seconds ÷ wall seconds. One worker process can use more than one core (zlib and
  // hashing on libuv's thread pool, V8's parallel garbage collector), which caps what a second worker can add
  // on a machine with few cores.
  const report = (r) =>
    log(
      `${r.workers} worker(s): ${r.packs} packs in ${r.seconds.toFixed(1)} s = ${r.perMinute.toFixed(1)} packs/min ` +
        `(CPU per pack: workers ${r.workerCpuPerPack.toFixed(2)} s, S3 fake + API ${r.sharedCpuPerPack.toFixed(2)} s; ` +
        `cores busy: workers ${((r.workerCpuPerPack * r.packs) / r.seconds).toFixed(2)}, ` +
        `S3 fake + API ${((r.sharedCpuPerPack * r.packs) / r.seconds).toFixed(2)})`,
    );
  const one = await timedRun(1);
  report(one);
  const two = await timedRun(2);
  report(two);
  const ratio = two.perMinute / one.perMinute;
  console.log(
    `cut packs per minute: 1 worker ${one.perMinute.toFixed(1)}, 2 workers ${two.perMinute.toFixed(1)}, ` +
      `ratio ${ratio.toFixed(2)} (target ≥ ${TARGET}: ${ratio >= TARGET ? 'met' : 'not met'}; ${machineLine()})`,
  );
  if (os.cpus().length < 2) log('fewer than two cores: two workers cannot be faster than one here');
}

let svc;
try {
  svc = await startBenchServices('queue', { KW_WORKER_MODE: 'off' });
  await main(svc);
} catch (err) {
  console.error(`[bench-queue] ${err instanceof Error ? err.message : err}`);
  process.exitCode = 1;
} finally {
  await svc?.close();
}
