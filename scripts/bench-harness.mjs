// Shared by the service benchmarks (bench-queue.mjs, bench-api.mjs): a private PostgreSQL, Redis and S3 fake
// on free loopback ports with folders under the system temp folder, the built API started as a child process,
// and a workshop (users, a material, an approved laser profile) to work with. Needs `npm run build`.
import { spawn, spawnSync } from 'node:child_process';
import crypto from 'node:crypto';
import fs from 'node:fs';
import net from 'node:net';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import bcrypt from 'bcryptjs';
import pg from 'pg';

export const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
export const sleep = (ms) => new Promise((r) => setTimeout(r, ms));

export function freePort() {
  return new Promise((resolve, reject) => {
    const srv = net.createServer();
    srv.once('error', reject);
    srv.listen(0, '127.0.0.1', () => {
      const { port } = srv.address();
      srv.close(() => resolve(port));
    });
  });
}

/** CPU seconds (user + system) a process has used so far, from /proc (Linux); 0 elsewhere. */
export function cpuSeconds(pid) {
  try {
    const fields = fs.readFileSync(`/proc/${pid}/stat`, 'utf8').split(') ')[1].split(' ');
    return (Number(fields[11]) + Number(fields[12])) / 100; // utime + stime in clock ticks (USER_HZ = 100)
  } catch {
    return 0;
  }
}

export async function stopChild(child) {
  if (child.exitCode !== null || child.signalCode !== null) return;
  const exited = new Promise((r) => child.once('exit', r));
  child.kill('SIGTERM');
  await Promise.race([exited, sleep(10000).then(() => child.kill('SIGKILL'))]);
}

/** The machine in one line, for every report. */
export function machineLine() {
  const cpus = os.cpus();
  return (
    `${cpus.length} cores (${cpus[0]?.model ?? 'cpu'}), ${(os.totalmem() / 2 ** 30).toFixed(1)} GiB, ` +
    `Node ${process.version}, ${os.type()} ${os.release()}, load average ${os.loadavg()[0].toFixed(1)}`
  );
}

/**
 * Starts private services and the API. `name` tags folders, database and queue prefix; `apiEnv` is added to
 * the API's environment. Returns helpers and `close()`, which stops everything and removes the folders.
 */
export async function startBenchServices(name, apiEnv = {}, apiNodeArgs = []) {
  for (const f of ['apps/api/dist/main.js', 'apps/api/dist/worker.js', 'apps/api/dist/dev-s3/main.js']) {
    if (!fs.existsSync(path.join(root, f))) throw new Error(`${f} missing: run npm run build first`);
  }
  const state = fs.mkdtempSync(path.join(os.tmpdir(), `kw-bench-${name}-`));
  fs.chmodSync(state, 0o755);
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
    KW_DB_NAME: `kerfwright_bench`,
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
    KW_OPEN_REQUEST_LIMIT: '100000', // one hobbyist requests every job the benchmarks cut
    KW_SMTP_PORT: '9', // nothing listens: mail stays queued, which the benchmarks do not measure
  };
  const started = [];
  const run = (cmd, args) => {
    const r = spawnSync(cmd, args, { cwd: root, env, stdio: ['ignore', 'pipe', 'pipe'], encoding: 'utf8' });
    if (r.status !== 0) throw new Error(`${cmd} ${args.join(' ')} failed:\n${r.stdout}${r.stderr}`);
  };
  const startNode = (script, extra, readyPattern, nodeArgs = []) => {
    const child = spawn(process.execPath, [...nodeArgs, path.join(root, script)], {
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
    ready.catch(() => undefined);
    return { child, ready };
  };
  let db = null;
  const close = async () => {
    await db?.end().catch(() => undefined);
    for (const c of started.reverse()) await stopChild(c).catch(() => undefined);
    spawnSync('bash', ['scripts/redis.sh', 'stop'], { cwd: root, env, stdio: 'ignore' });
    spawnSync('bash', ['db/scripts/pg.sh', 'stop'], { cwd: root, env, stdio: 'ignore' });
    fs.rmSync(state, { recursive: true, force: true });
  };
  try {
    run('bash', ['db/scripts/pg.sh', 'start']);
    run('bash', ['scripts/redis.sh', 'start']);
    run(process.execPath, ['db/dist/src/cli.js', 'migrate']);
    run(process.execPath, ['db/dist/src/cli.js', 'seed']); // hazard table, safety notices, demo workshop
    const s3 = startNode('apps/api/dist/dev-s3/main.js', {}, /object storage fake/);
    await s3.ready;
    const apiProc = startNode('apps/api/dist/main.js', apiEnv, /listening on/, apiNodeArgs);
    await apiProc.ready;
    db = new pg.Client({
      host: '127.0.0.1',
      port: dbPort,
      database: env.KW_DB_NAME,
      user: env.KW_DB_USER ?? 'kerfwright',
      password: env.KW_DB_PASSWORD ?? 'kerfwright-local',
    });
    db.on('error', () => undefined); // the server stops before the client at the end
    await db.connect();
  } catch (err) {
    await close();
    throw err;
  }
  const baseUrl = `http://127.0.0.1:${apiPort}`;
  const api = async (method, url, token, body) => {
    const res = await fetch(`${baseUrl}/api${url}`, {
      method,
      headers: { 'content-type': 'application/json', ...(token ? { authorization: `Bearer ${token}` } : {}) },
      body: body ? JSON.stringify(body) : undefined,
    });
    const json = await res.json().catch(() => null);
    if (!res.ok) throw new Error(`${method} ${url}: ${res.status} ${JSON.stringify(json)}`);
    return json;
  };
  return { env, tag, db, api, baseUrl, startNode, started, close, apiPid: () => started[1]?.pid };
}

/**
 * A workshop for the benchmarks, written straight to the database, and its staff signed in through the API:
 * returns tokens per role and `approvedJob()`, which takes a new job of an octahedron lamp with hexagon
 * pieces (a design of our own) through request, prepare and approve by the real routes.
 */
export async function benchWorkshop({ db, api, tag }) {
  const password = crypto.randomUUID();
  const hash = await bcrypt.hash(password, 4);
  const tokens = {};
  for (const role of ['hobbyist', 'fabricator', 'operator', 'supervisor']) {
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
       VALUES ('Bench acrylic 3 mm ' || $2, 'acrylic', 3, false, '["clear","amber"]', $1, true) RETURNING id`,
      [sheets, tag],
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
  return { tokens, design, approvedJob };
}
