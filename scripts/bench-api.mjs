// The API under load with autocannon on loopback: the jobs list and a design (with the engine's preview
// figures) read by 100 concurrent connections for 30 s each, against a private PostgreSQL, Redis and S3 fake
// (scripts/bench-harness.mjs) holding the demo workshop plus extra jobs. Needs `npm run build`.
// Env: KW_BENCH_API_SECONDS (per endpoint, default 30), KW_BENCH_API_CONNECTIONS (default 100),
//      KW_BENCH_API_WARMUP_SECONDS (unmeasured load before each endpoint, default 5),
//      KW_BENCH_API_JOBS (extra jobs in the table, default 200), KW_BENCH_API_USERS (fabricators the spread
//      run's connections sign in as, default 20), KW_BENCH_API_ONLY (comma-separated keys of the runs to do:
//      list, spread, design; default all). Target: zero errors, p99 of reads < 100 ms.
import crypto from 'node:crypto';
import autocannon from 'autocannon';
import bcrypt from 'bcryptjs';
import { benchWorkshop, cpuSeconds, machineLine, startBenchServices } from './bench-harness.mjs';

const SECONDS = Number(process.env.KW_BENCH_API_SECONDS ?? 30);
const CONNECTIONS = Number(process.env.KW_BENCH_API_CONNECTIONS ?? 100);
const JOBS = Number(process.env.KW_BENCH_API_JOBS ?? 200);
const USERS = Number(process.env.KW_BENCH_API_USERS ?? 20);
// Unmeasured load first, so the figures are of the warmed-up server (compiled code paths, prepared statements
// on every pooled connection, a settled heap), as a long-running API is; 0 measures from the cold start.
const WARMUP_SECONDS = Number(process.env.KW_BENCH_API_WARMUP_SECONDS ?? 5);
const P99_TARGET_MS = 100;
const log = (s) => console.log(`[bench-api] ${s}`);

async function main(svc) {
  const { api, baseUrl } = svc;
  const { tokens, design } = await benchWorkshop(svc);
  // A realistic table: jobs of the design in several states, written through the API.
  for (let i = 0; i < JOBS; i++) {
    const job = await api('POST', '/jobs', tokens.hobbyist, { designId: design.id, quantity: 1 + (i % 3) });
    if (i % 2 === 0) await api('POST', `/jobs/${job.id}/request`, tokens.hobbyist, { version: job.version });
  }
  // Identical reads arriving together are sent to the database once (preparedQuery), so the same list read by
  // 100 connections of one user is the kindest case; the same connections spread over USERS fabricators (each
  // with their own drafts in the filter) are measured too.
  const password = crypto.randomUUID();
  const hash = await bcrypt.hash(password, 4);
  const spread = [];
  for (let i = 0; i < USERS; i++) {
    const email = `fabricator-${i}-${svc.tag}@bench.example`;
    await svc.db.query(
      `INSERT INTO users (email, display_name, password_hash, role, active) VALUES ($1, $2, $3, 'fabricator', true)`,
      [email, `Bench fabricator ${i}`, hash],
    );
    spread.push((await api('POST', '/auth/login', null, { email, password })).accessToken);
  }
  const targets = [
    {
      key: 'list',
      name: 'jobs list (GET /api/jobs, page of 25, newest first)',
      path: '/api/jobs?pageSize=25',
      token: tokens.fabricator,
    },
    {
      key: 'spread',
      name: `jobs list, the connections spread over ${USERS} fabricators`,
      path: '/api/jobs?pageSize=25',
      token: tokens.fabricator,
      tokens: spread,
    },
    {
      key: 'design',
      name: `design with preview (GET /api/designs/:id)`,
      path: `/api/designs/${design.id}`,
      token: tokens.hobbyist,
    },
  ];
  const only = process.env.KW_BENCH_API_ONLY?.split(',').map((k) => k.trim());
  const results = [];
  for (const t of targets.filter((x) => !only || only.includes(x.key))) {
    let next = 0;
    const load = {
      url: `${baseUrl}${t.path}`,
      connections: CONNECTIONS,
      headers: { authorization: `Bearer ${t.token}` },
      // Each connection signs in as the next user of the list, round robin.
      setupClient: t.tokens
        ? (client) => client.setHeaders({ authorization: `Bearer ${t.tokens[next++ % t.tokens.length]}` })
        : undefined,
    };
    if (WARMUP_SECONDS > 0) await autocannon({ ...load, duration: WARMUP_SECONDS });
    const cpu0 = cpuSeconds(svc.apiPid());
    const r = await autocannon({ ...load, duration: SECONDS });
    const cpu = cpuSeconds(svc.apiPid()) - cpu0;
    const errors = r.errors + r.timeouts + r.non2xx;
    results.push({ ...t, r, errors });
    log(
      `${t.name}: ${r.requests.average.toFixed(0)} req/s (total ${r.requests.total}), latency median ${r.latency.p50} ms, ` +
        `p90 ${r.latency.p90} ms, p99 ${r.latency.p99} ms, max ${r.latency.max} ms; errors ${errors} ` +
        `(non-2xx ${r.non2xx}, timeouts ${r.timeouts}); API process CPU ${(cpu / SECONDS).toFixed(2)} cores`,
    );
  }
  const worstP99 = Math.max(...results.map((x) => x.r.latency.p99));
  const totalErrors = results.reduce((a, x) => a + x.errors, 0);
  console.log(
    `API reads at ${CONNECTIONS} connections × ${SECONDS} s: worst p99 ${worstP99} ms (target < ${P99_TARGET_MS} ms: ` +
      `${worstP99 < P99_TARGET_MS ? 'met' : 'not met'}), errors ${totalErrors} (target 0: ${totalErrors === 0 ? 'met' : 'not met'}); ${machineLine()}`,
  );
}

let svc;
try {
  // KW_BENCH_API_PROFILE=<folder>: write a V8 CPU profile of the API process there (open it in Chrome DevTools).
  const prof = process.env.KW_BENCH_API_PROFILE;
  svc = await startBenchServices(
    'api',
    { KW_WORKER_MODE: 'off' },
    prof ? ['--cpu-prof', `--cpu-prof-dir=${prof}`] : [],
  );
  await main(svc);
} catch (err) {
  console.error(`[bench-api] ${err instanceof Error ? err.message : err}`);
  process.exitCode = 1;
} finally {
  await svc?.close();
}
