// npm run soak: the long reliability run that does not fit in `npm test`. Against private services
// (scripts/bench-harness.mjs) it keeps the API busy for KW_SOAK_MINUTES (default 10) with a steady mix of reads
// (autocannon, 20 connections) and cut-pack exports worked by one `npm run worker` process, kills that worker
// with SIGKILL every KW_SOAK_KILL_EVERY_S seconds (default 90) and starts a new one, and at the end checks:
// no read failed, every export finished exactly once (done, none failed or stuck), no job is released twice,
// storage holds exactly the files PostgreSQL lists, and the API's memory (RSS) did not keep growing.
// Exits non-zero when a check fails. Needs `npm run build`.
import fs from 'node:fs';
import autocannon from 'autocannon';
import { S3Client, ListObjectsV2Command } from '@aws-sdk/client-s3';
import { benchWorkshop, machineLine, sleep, startBenchServices, stopChild } from './bench-harness.mjs';

const MINUTES = Number(process.env.KW_SOAK_MINUTES ?? 10);
const KILL_EVERY_S = Number(process.env.KW_SOAK_KILL_EVERY_S ?? 90);
const log = (s) => console.log(`[soak ${new Date().toISOString().slice(11, 19)}] ${s}`);

function rssMiB(pid) {
  try {
    const line = fs.readFileSync(`/proc/${pid}/status`, 'utf8').match(/VmRSS:\s+(\d+)/);
    return line ? Number(line[1]) / 1024 : 0;
  } catch {
    return 0;
  }
}

/** Queue settings the API and every worker share, so a killed worker's export is taken over in seconds. */
const QUEUE_ENV = { KW_EXPORT_LOCK_MS: '5000', KW_EXPORT_STALLED_CHECK_MS: '2000' };

async function main(svc) {
  const { api, db, startNode, env, baseUrl } = svc;
  const { tokens, approvedJob } = await benchWorkshop(svc);
  const failures = [];
  const end = Date.now() + MINUTES * 60000;

  let worker = startNode('apps/api/dist/worker.js', QUEUE_ENV, /working the cut-packs queue/);
  await worker.ready;
  let kills = 0;
  const killer = (async () => {
    while (Date.now() < end) {
      await sleep(KILL_EVERY_S * 1000);
      if (Date.now() >= end) break;
      worker.child.kill('SIGKILL');
      kills++;
      log(`worker killed (SIGKILL #${kills}); starting another`);
      worker = startNode('apps/api/dist/worker.js', QUEUE_ENV, /working the cut-packs queue/);
      await worker.ready;
    }
  })();

  const exportIds = [];
  const exporter = (async () => {
    while (Date.now() < end) {
      try {
        const jobId = await approvedJob();
        exportIds.push((await api('POST', `/jobs/${jobId}/exports`, tokens.fabricator)).exportId);
      } catch (err) {
        failures.push(`export request: ${err.message}`);
      }
      await sleep(4000);
    }
  })();

  const rss = [];
  const sampler = (async () => {
    while (Date.now() < end) {
      rss.push(rssMiB(svc.apiPid()));
      await sleep(15000);
    }
  })();

  const reads = await autocannon({
    url: `${baseUrl}/api/jobs?pageSize=25`,
    connections: 20,
    duration: MINUTES * 60,
    headers: { authorization: `Bearer ${tokens.operator}` },
  });
  await Promise.all([killer, exporter, sampler]);
  const readErrors = reads.errors + reads.timeouts + reads.non2xx;
  if (readErrors > 0)
    failures.push(`${readErrors} reads failed (non-2xx ${reads.non2xx}, timeouts ${reads.timeouts})`);
  log(
    `reads: ${reads.requests.total} in ${MINUTES} min, p50 ${reads.latency.p50} ms, p99 ${reads.latency.p99} ms, errors ${readErrors}`,
  );

  // Every export finishes (the last worker is still running), exactly once.
  const deadline = Date.now() + 180000;
  let states;
  for (;;) {
    const r = await db.query(
      `SELECT state, count(*)::int AS n FROM exports WHERE id = ANY($1::uuid[]) GROUP BY state`,
      [exportIds],
    );
    states = Object.fromEntries(r.rows.map((x) => [x.state, x.n]));
    if ((states.done ?? 0) + (states.failed ?? 0) === exportIds.length || Date.now() > deadline) break;
    await sleep(1000);
  }
  log(`exports: ${exportIds.length} requested, ${JSON.stringify(states)}; worker killed ${kills} time(s)`);
  if ((states.done ?? 0) !== exportIds.length)
    failures.push(`exports not all done: ${JSON.stringify(states)}`);
  const twice = await db.query(
    `SELECT job_id FROM job_transitions WHERE to_state = 'released' GROUP BY job_id HAVING count(*) > 1`,
  );
  if (twice.rows.length > 0) failures.push(`${twice.rows.length} job(s) released more than once`);

  // Storage against PostgreSQL: no orphan objects, no missing ones.
  const s3 = new S3Client({
    endpoint: `http://127.0.0.1:${env.KW_S3_PORT}`,
    region: 'us-east-1',
    forcePathStyle: true,
    credentials: { accessKeyId: 'S3RVER', secretAccessKey: 'S3RVER' },
  });
  // Listed job by job: each job's prefix holds a few files, so no listing needs a continuation token.
  const stored = [];
  for (const { id } of (await db.query(`SELECT id FROM jobs`)).rows) {
    const page = await s3.send(
      new ListObjectsV2Command({ Bucket: env.KW_S3_BUCKET, Prefix: `jobs/${id}/`, MaxKeys: 1000 }),
    );
    if (page.IsTruncated) failures.push(`more than 1000 objects stored for job ${id}`);
    stored.push(...(page.Contents ?? []).map((o) => o.Key));
  }
  const listed = (await db.query(`SELECT storage_key FROM export_files`)).rows.map((r) => r.storage_key);
  const orphans = stored.filter((k) => !listed.includes(k));
  const missing = listed.filter((k) => !stored.includes(k));
  log(
    `storage: ${stored.length} objects, ${listed.length} listed; orphans ${orphans.length}, missing ${missing.length}`,
  );
  if (orphans.length || missing.length)
    failures.push(`storage differs: ${orphans.length} orphan(s), ${missing.length} missing`);

  // Memory: the last quarter's median RSS against the second quarter's (after warm-up).
  const q = Math.max(1, Math.floor(rss.length / 4));
  const median = (a) => [...a].sort((x, y) => x - y)[Math.floor(a.length / 2)] ?? 0;
  const early = median(rss.slice(q, 2 * q));
  const late = median(rss.slice(-q));
  log(
    `API RSS: ${early.toFixed(0)} MiB after warm-up, ${late.toFixed(0)} MiB at the end (${rss.length} samples)`,
  );
  if (early > 0 && late > early * 1.5 && late - early > 64)
    failures.push(`API memory grew from ${early.toFixed(0)} to ${late.toFixed(0)} MiB`);

  await stopChild(worker.child);
  console.log(
    `soak ${MINUTES} min: ${failures.length === 0 ? 'passed' : `FAILED (${failures.join('; ')})`}; ${machineLine()}`,
  );
  if (failures.length) process.exitCode = 1;
}

let svc;
try {
  svc = await startBenchServices('soak', { KW_WORKER_MODE: 'off', ...QUEUE_ENV });
  await main(svc);
} catch (err) {
  console.error(`[soak] ${err instanceof Error ? err.message : err}`);
  process.exitCode = 1;
} finally {
  await svc?.close();
}
