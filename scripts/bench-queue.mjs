// Cut packs per minute through the export queue with one and with two `npm run worker` processes.
// Self-contained: starts a private PostgreSQL, Redis and S3 fake on free loopback ports (folders under the
// system temp folder), migrates, prepares and approves jobs through the real API (worker mode off: it only
// enqueues), then times N exports per run from the first POST to the last "done". Needs `npm run build`.
// Env: KW_BENCH_PACKS (per run, default 16). Target: two workers ≥ 1.7 × one (on a machine with ≥ 2 cores).
import { spawn, spawnSync } from 'node:child_process';
import crypto from 'node:crypto';
import fs from 'node:fs';
import net from 'node:net';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import bcrypt from 'bcryptjs';
import pg from 'pg';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const PACKS = Number(process.env.KW_BENCH_PACKS ?? 16);
const TARGET = 1.7;
const started = [];
const state = fs.mkdtempSync(path.join(os.tmpdir(), 'kw-bench-queue-'));
fs.chmodSync(state, 0o755);
const sleep = (ms) => new Promise((r) => setTimeout(r, ms));
const log = (s) => console.log(`[bench-queue] ${s}`);

function freePort() {
  return new Promise((resolve, reject) => {
    const srv = net.createServer();
    srv.once('error', reject);
    srv.listen(0, '127.0.0.1', () => {
      const { port } = srv.address();
      srv.close(() => resolve(port));
    });
  });
}

const [dbPort, redisPort, s3Port, apiPort] = [
  await freePort(),
  await freePort(),
  await freePort(),
  await freePort(),
];
const tag = crypto.randomUUID().slice(0, 8);
const env = {
  ...process.env,
  KW_MODE: 'test',
  KW_DB_PORT: String(dbPort),
  KW_DB_NAME: 'kerfwright_bench',
  KW_PG_DATA: path.join(state, 'postgres'),
  KW_PG_FAST: '1',
  KW_REDIS_PORT: String(redisPort),
  KW_REDIS_DIR: path.join(state, 'redis'),
  KW_REDIS_PERSIST: '0',
  KW_STORAGE: 's3',
  KW_S3_PORT: String(s3Port),
  KW_S3_DIR: path.join(state, 's3'),
  KW_S3_BUCKET: 'kerfwright-bench',
  KW_QUEUE_PREFIX: `kw-bench-${tag}`,
  KW_PORT: String(apiPort),
  KW_LOGIN_LIMIT: '1000',
  KW_SMTP_PORT: '9', // nothing listens: mail stays queued, which the bench does not measure
  KW_WORKER_MODE: 'off',
};
const run = (cmd, args) => {
  const r = spawnSync(cmd, args, { cwd: root, env, stdio: ['ignore', 'pipe', 'pipe'], encoding: 'utf8' });
  if (r.status !== 0) throw new Error(`${cmd} ${args.join(' ')} failed:\n${r.stdout}${r.stderr}`);
};

function startNode(script, extra = {}, readyPattern) {
  const child = spawn(process.execPath, [path.join(root, script)], {
    cwd: root,
    env: { ...env, ...extra },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  started.push(child);
  let out = '';
  const ready = new Promise((resolve, reject) => {
    const on = (c) => {
      out += c.toString();
      if (readyPattern.test(out)) resolve();
    };
    child.stdout.on('data', on);
    child.stderr.on('data', on);
    child.once('exit', (code) => reject(new Error(`${script} exited (${code}):\n${out}`)));
  });
  return { child, ready };
}

/** CPU seconds (user + system) a process has used so far, from /proc (Linux); 0 elsewhere. */
function cpuSeconds(pid) {
  try {
    const fields = fs.readFileSync(`/proc/${pid}/stat`, 'utf8').split(') ')[1].split(' ');
    return (Number(fields[11]) + Number(fields[12])) / 100; // utime + stime in clock ticks (USER_HZ = 100)
  } catch {
    return 0;
  }
}

async function stop(child) {
  if (child.exitCode !== null || child.signalCode !== null) return;
  const exited = new Promise((r) => child.once('exit', r));
  child.kill('SIGTERM');
  await Promise.race([exited, sleep(10000).then(() => child.kill('SIGKILL'))]);
}

async function cleanup() {
  for (const c of started.reverse()) await stop(c).catch(() => undefined);
  spawnSync('bash', ['scripts/redis.sh', 'stop'], { cwd: root, env, stdio: 'ignore' });
  spawnSync('bash', ['db/scripts/pg.sh', 'stop'], { cwd: root, env, stdio: 'ignore' });
  fs.rmSync(state, { recursive: true, force: true });
}

async function api(method, url, token, body) {
  const res = await fetch(`http://127.0.0.1:${apiPort}/api${url}`, {
    method,
    headers: { 'content-type': 'application/json', ...(token ? { authorization: `Bearer ${token}` } : {}) },
    body: body ? JSON.stringify(body) : undefined,
  });
  const json = await res.json().catch(() => null);
  if (!res.ok) throw new Error(`${method} ${url}: ${res.status} ${JSON.stringify(json)}`);
  return json;
}

async function main() {
  for (const f of ['apps/api/dist/main.js', 'apps/api/dist/worker.js', 'apps/api/dist/dev-s3/main.js']) {
    if (!fs.existsSync(path.join(root, f))) throw new Error(`${f} missing: run npm run build first`);
  }
  log(`services in ${state}`);
  process.stdout.write('\n');
  run('bash', ['db/scripts/pg.sh', 'start']);
  run('bash', ['scripts/redis.sh', 'start']);
  run(process.execPath, ['db/dist/src/cli.js', 'migrate']);
  run(process.execPath, ['db/dist/src/cli.js', 'seed']); // hazard table and safety notices
  const s3 = startNode('apps/api/dist/dev-s3/main.js', {}, /object storage fake/);
  await s3.ready;
  const apiProc = startNode('apps/api/dist/main.js', {}, /listening on/);
  await apiProc.ready;

  // A workshop written straight to the database, and the staff who use it through the API.
  const db = new pg.Client({
    host: '127.0.0.1',
    port: dbPort,
    database: env.KW_DB_NAME,
    user: env.KW_DB_USER ?? 'kerfwright',
    password: env.KW_DB_PASSWORD ?? 'kerfwright-local',
  });
  db.on('error', () => undefined); // the server stops before the client at the end
  await db.connect();
  const password = crypto.randomUUID();
  const hash = await bcrypt.hash(password, 4);
  const tokens = {};
  for (const role of ['hobbyist', 'fabricator', 'supervisor']) {
    const email = `${role}-${tag}@bench.example`;
    await db.query(
      `INSERT INTO users (email, display_name, password_hash, role, active) VALUES ($1, $2, $3, $4, true)`,
      [email, `Bench ${role}`, hash, role],
    );
    tokens[role] = (await api('POST', '/auth/login', null, { email, password })).accessToken;
  }
  const sheets = JSON.stringify([{ widthMm: 600, heightMm: 400, pricePerSheet: 18, currency: 'EUR' }]);
  const material = (
    await db.query(
      `INSERT INTO materials (name, family, nominal_thickness_mm, flexible, colours, stock_sheets, laser_allowed)
       VALUES ('Bench acrylic 3 mm', 'acrylic', 3, false, '["clear","amber"]', $1, true) RETURNING id`,
      [sheets],
    )
  ).rows[0].id;
  const profile = (
    await db.query(
      `INSERT INTO machine_profiles (name, kind) VALUES ('Bench laser ' || $1, 'co2-laser') RETURNING id`,
      [tag],
    )
  ).rows[0].id;
  const settings = JSON.stringify([
    {
      materialId: material,
      kerfMm: 0.18,
      cutSpeedMmS: 12,
      markSpeedMmS: 200,
      powerPct: 65,
      passes: 1,
      pierceTimeS: 0.2,
    },
  ]);
  const version = (
    await db.query(
      `INSERT INTO machine_profile_versions (profile_id, number, state, bed_width_mm, bed_height_mm, rapid_speed_mm_s, hourly_rate, settings)
       VALUES ($1, 1, 'approved', 1000, 600, 400, 40, $2) RETURNING id`,
      [profile, settings],
    )
  ).rows[0].id;
  // An octahedron lamp with hexagon pieces (a design of our own), two colours of stock.
  const spec = {
    solid: 'octahedron',
    piece: { sides: 6, step: 1, rotationDeg: 0, size: 1.3 },
    scale: { by: 'diameter', mm: 240 },
    stock: { thicknessMm: 3, flexible: false },
    machine: { kind: 'laser', kerfMm: 0.15 },
    fitMm: 0,
  };
  const design = await api('POST', '/designs', tokens.hobbyist, { name: 'Bench octahedron lamp', spec });
  async function approvedJob() {
    let job = await api('POST', '/jobs', tokens.hobbyist, { designId: design.id, quantity: 1 });
    job = await api('POST', `/jobs/${job.id}/request`, tokens.hobbyist, { version: job.version });
    job = await api('POST', `/jobs/${job.id}/prepare`, tokens.fabricator, {
      version: job.version,
      materialId: material,
      profileVersionId: version,
      colours: ['clear', 'amber'],
    });
    job = await api('POST', `/jobs/${job.id}/approve`, tokens.supervisor, { version: job.version });
    return job.id;
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
    const shared = [s3.child.pid, apiProc.child.pid];
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
    for (const p of procs) await stop(p.child);
    return {
      workers,
      packs: PACKS,
      seconds,
      perMinute: (PACKS / seconds) * 60,
      workerCpuPerPack: workerCpu / PACKS,
      sharedCpuPerPack: sharedCpu / PACKS,
    };
  }

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

  const report = (r) =>
    log(
      `${r.workers} worker(s): ${r.packs} packs in ${r.seconds.toFixed(1)} s = ${r.perMinute.toFixed(1)} packs/min ` +
        `(CPU per pack: workers ${r.workerCpuPerPack.toFixed(2)} s, S3 fake + API ${r.sharedCpuPerPack.toFixed(2)} s)`,
    );
  const one = await timedRun(1);
  report(one);
  const two = await timedRun(2);
  report(two);
  const load = os.loadavg()[0];
  const ratio = two.perMinute / one.perMinute;
  console.log(
    `cut packs per minute: 1 worker ${one.perMinute.toFixed(1)}, 2 workers ${two.perMinute.toFixed(1)}, ` +
      `ratio ${ratio.toFixed(2)} (target ≥ ${TARGET}: ${ratio >= TARGET ? 'met' : 'not met'}; ${os.cpus().length} cores, ${os.cpus()[0]?.model ?? 'cpu'}, load average ${load.toFixed(1)})`,
  );
  await db.end();
}

try {
  await main();
} catch (err) {
  console.error(`[bench-queue] ${err instanceof Error ? err.message : err}`);
  process.exitCode = 1;
} finally {
  await cleanup();
}
