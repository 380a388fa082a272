import { randomUUID } from 'node:crypto';
import * as fs from 'node:fs';
import * as os from 'node:os';
import * as path from 'node:path';
import { setTimeout as sleep } from 'node:timers/promises';
import { type ExportView } from '@kerfwright/contracts';
import { approvedJob, auth, pollExport } from './support/export-fixtures';
import {
  type PrivatePostgres,
  type PrivateRedis,
  startPrivatePostgres,
  startPrivateRedis,
} from './support/private-services';
import {
  createUser,
  expectErrorBody,
  startTestApp,
  type TestContext,
  type TestUser,
} from './support/test-app';
import { createWorkshop, octahedronHexagons, type WorkshopFixture } from './support/workshop-fixtures';

jest.setTimeout(180000);

/**
 * The API against a PostgreSQL and a Redis of this suite's own, which it stops and starts while requests
 * are in flight. Nothing is mocked: the servers really go away.
 */
describe('outages of the backing services', () => {
  let pg: PrivatePostgres;
  let redis: PrivateRedis;
  let ctx: TestContext;
  let w: WorkshopFixture;
  let people: Record<'owner' | 'fabricator' | 'operator' | 'supervisor', TestUser>;
  const storageDir = path.join(os.tmpdir(), `kw-outage-files-${process.pid}-${randomUUID().slice(0, 8)}`);
  const saved: Record<string, string | undefined> = {};

  beforeAll(async () => {
    [pg, redis] = await Promise.all([startPrivatePostgres(), startPrivateRedis()]);
    const env: Record<string, string> = {
      ...pg.env,
      KW_REDIS_PORT: String(redis.port),
      KW_QUEUE_PREFIX: `kw-outage-${randomUUID().slice(0, 8)}`,
      KW_WORKER_MODE: 'inline',
      KW_STORAGE: 'fs',
      KW_STORAGE_DIR: storageDir,
      KW_EXPORT_LOCK_MS: '3000',
      KW_EXPORT_STALLED_CHECK_MS: '1000',
      KW_EXPORT_BACKOFF_MS: '300',
      KW_EXPORT_RECONCILE_MS: '1000',
      KW_SMTP_PORT: '1', // no mail server: mail stays in the outbox, which must not matter here
    };
    for (const [k, v] of Object.entries(env)) {
      saved[k] = process.env[k];
      process.env[k] = v;
    }
    ctx = await startTestApp();
    w = await createWorkshop(ctx);
    people = {
      owner: await createUser(ctx, 'hobbyist'),
      fabricator: await createUser(ctx, 'fabricator'),
      operator: await createUser(ctx, 'operator'),
      supervisor: await createUser(ctx, 'supervisor'),
    };
  });

  afterAll(async () => {
    await ctx?.app.close();
    await redis?.kill();
    await pg?.destroy();
    fs.rmSync(storageDir, { recursive: true, force: true });
    for (const [k, v] of Object.entries(saved)) {
      if (v === undefined) delete process.env[k];
      else process.env[k] = v;
    }
  });

  /** Polls until `ok` holds, failing after `ms`. */
  async function eventually<T>(what: string, probe: () => Promise<T>, ok: (v: T) => boolean, ms = 60000) {
    const end = Date.now() + ms;
    for (;;) {
      const v = await probe();
      if (ok(v)) return v;
      if (Date.now() > end) throw new Error(`${what}: still not so after ${ms} ms`);
      await sleep(250);
    }
  }

  it('keeps answering reads prepared before a schema change that alters their result', async () => {
    // The jobs list runs as a named prepared statement on every pooled connection. A migration that changes a
    // column it returns (here text → varchar and back) makes PostgreSQL refuse the old statement ("cached plan
    // must not change result type"); the API must re-prepare instead of failing (PostgreSQL docs, PREPARE).
    const list = () => ctx.http.get('/api/jobs').query({ pageSize: 5 }).set(auth(people.supervisor));
    const burst = async () => (await Promise.all(Array.from({ length: 6 }, list))).map((r) => r.status);
    expect(await burst()).toEqual(Array(6).fill(200));
    try {
      await ctx.db.query(`ALTER TABLE jobs ALTER COLUMN notes TYPE varchar(4000)`);
      expect(await burst()).toEqual(Array(6).fill(200));
      expect(await burst()).toEqual(Array(6).fill(200));
    } finally {
      await ctx.db.query(`ALTER TABLE jobs ALTER COLUMN notes TYPE text`);
    }
    expect(await burst()).toEqual(Array(6).fill(200));
  });

  it('answers 503 with the error body while PostgreSQL is down, and recovers without a restart', async () => {
    // A burst of job writes is in flight when the database stops.
    const design = await ctx.http
      .post('/api/designs')
      .set(auth(people.owner))
      .send({ name: `Outage lamp ${randomUUID().slice(0, 6)}`, spec: octahedronHexagons() })
      .expect(201);
    const burst = Array.from({ length: 12 }, async (_, i) => {
      await sleep(i * 40);
      const created = await ctx.http
        .post('/api/jobs')
        .set(auth(people.owner))
        .send({ designId: design.body.id, quantity: 1 });
      if (created.status !== 201) return [created.status, created.body] as const;
      const requested = await ctx.http
        .post(`/api/jobs/${created.body.id}/request`)
        .set(auth(people.owner))
        .send({ version: created.body.version });
      return [requested.status, requested.body] as const;
    });
    await sleep(150);
    await pg.stop();
    const outcomes = await Promise.all(burst);
    for (const [status, body] of outcomes) {
      // Each write either happened or was refused as "unavailable" — never a 500.
      expect([200, 201, 503]).toContain(status);
      if (status === 503) expectErrorBody(body, 503, 'SERVICE.DATABASE_UNAVAILABLE');
    }

    const health = await ctx.http.get('/api/health').expect(503);
    expectErrorBody(health.body, 503, 'SERVICE.DEGRADED');
    expect(health.body.details).toMatchObject({ database: 'down', redis: 'up' });
    const list = await ctx.http.get('/api/jobs').set(auth(people.fabricator)).expect(503);
    expectErrorBody(list.body, 503, 'SERVICE.DATABASE_UNAVAILABLE');
    const login = await ctx.http
      .post('/api/auth/login')
      .send({ email: people.owner.email, password: people.owner.password })
      .expect(503);
    expectErrorBody(login.body, 503);

    await pg.start();
    await eventually(
      'health after PostgreSQL came back',
      () => ctx.http.get('/api/health'),
      (r) => r.status === 200,
    );
    await ctx.http.get('/api/jobs').set(auth(people.fabricator)).expect(200);

    // No job is left in an impossible state: every job's state is the one its last recorded transition
    // reached (a job with no transitions is a draft), and each transition continues from the previous one.
    const broken: unknown[] = await ctx.db.query(`
      WITH t AS (
        SELECT job_id, from_state, to_state,
               lag(to_state) OVER (PARTITION BY job_id ORDER BY id) AS prev_to,
               row_number() OVER (PARTITION BY job_id ORDER BY id DESC) AS from_end
          FROM job_transitions)
      SELECT j.id, j.state FROM jobs j
        LEFT JOIN t ON t.job_id = j.id AND t.from_end = 1
       WHERE (t.job_id IS NULL AND j.state <> 'draft') OR (t.job_id IS NOT NULL AND t.to_state <> j.state)
      UNION ALL
      SELECT job_id, to_state FROM t WHERE prev_to IS NOT NULL AND from_state IS DISTINCT FROM prev_to`);
    expect(broken).toEqual([]);
  });

  it('loses no export when Redis dies during a burst of exports; all finish once it is back', async () => {
    const jobIds: string[] = [];
    for (let i = 0; i < 4; i++) jobIds.push(await approvedJob(ctx, w, people));
    const request = async (jobId: string) => {
      const res = await ctx.http.post(`/api/jobs/${jobId}/exports`).set(auth(people.fabricator));
      expect(res.status).toBe(202);
      return res.body.exportId as string;
    };
    const exportIds = [await request(jobIds[0]!), await request(jobIds[1]!)];

    await redis.kill(); // the queue and everything on it is gone
    const down = await ctx.http.get('/api/health').expect(503);
    expect(down.body.details).toMatchObject({ database: 'up', redis: 'down' });
    // Asking for packs while Redis is away still records them, and the request does not hang.
    const t0 = Date.now();
    exportIds.push(await request(jobIds[2]!), await request(jobIds[3]!));
    expect(Date.now() - t0).toBeLessThan(15000);

    await sleep(1500);
    await redis.start();
    const views: ExportView[] = [];
    for (const id of exportIds) {
      views.push(await pollExport(ctx, people.fabricator, id, (v) => v.state === 'done', 120000));
    }
    expect(views.map((v) => v.state)).toEqual(['done', 'done', 'done', 'done']);

    for (const jobId of jobIds) {
      const job = await ctx.http.get(`/api/jobs/${jobId}`).set(auth(people.fabricator)).expect(200);
      expect(job.body.state).toBe('released');
      // Released exactly once, by exactly one done export.
      expect((job.body.transitions as { to: string }[]).filter((t) => t.to === 'released')).toHaveLength(1);
      const done: unknown[] = await ctx.db.query(
        `SELECT id FROM exports WHERE job_id = $1 AND state = 'done'`,
        [jobId],
      );
      expect(done).toHaveLength(1);
    }

    // Storage holds exactly the files PostgreSQL lists: no orphans from attempts Redis lost.
    const rows: { storage_key: string }[] = await ctx.db.query(
      `SELECT f.storage_key FROM export_files f JOIN exports e ON e.id = f.export_id WHERE e.job_id = ANY($1)`,
      [jobIds],
    );
    const stored = jobIds.flatMap((id) => listFiles(path.join(storageDir, 'jobs', id)));
    expect(stored.map((f) => path.relative(storageDir, f).split(path.sep).join('/')).sort()).toEqual(
      rows.map((r) => r.storage_key).sort(),
    );
  });
});

function listFiles(dir: string): string[] {
  if (!fs.existsSync(dir)) return [];
  return fs.readdirSync(dir, { withFileTypes: true }).flatMap((e) => {
    const p = path.join(dir, e.name);
    return e.isDirectory() ? listFiles(p) : [p];
  });
}
