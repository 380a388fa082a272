import * as fs from 'node:fs';
import * as os from 'node:os';
import * as path from 'node:path';
import { createHash, randomUUID } from 'node:crypto';
import { DEV_JWT_SECRET } from '../src/config/env.validation';
import { badInputCases, type BadInputCase, goodSpec, type Who, type World } from './fixtures/bad-input/cases';
import { createUser, expectErrorBody, startTestApp, type TestContext } from './support/test-app';
import { createWorkshop } from './support/workshop-fixtures';

/**
 * The hostile and bad input corpus (fixtures/bad-input) against the real application: PostgreSQL, Redis and
 * a file-system object store of its own. For every case: the status and the one error body, no stack trace,
 * not a single row or stored file changed, and /api/health still 200.
 */
const UPLOADS = path.join(__dirname, 'fixtures', 'bad-input', 'uploads');

/** Tables whose every row is hashed before and after a case; mail_outbox is only counted (its sender updates it). */
const HASHED_TABLES = [
  'users',
  'designs',
  'jobs',
  'job_transitions',
  'audit_events',
  'exports',
  'export_files',
  'materials',
  'material_hazards',
  'machine_profiles',
  'machine_profile_versions',
  'kerf_records',
  'safety_notices',
  'safety_acknowledgements',
  'local_rules',
];

describe('hostile and bad input (fixtures/bad-input)', () => {
  let ctx: TestContext;
  let world: World;
  let storageDir: string;
  const saved = {
    storage: process.env.KW_STORAGE,
    dir: process.env.KW_STORAGE_DIR,
    worker: process.env.KW_WORKER_MODE,
  };

  beforeAll(async () => {
    storageDir = fs.mkdtempSync(path.join(os.tmpdir(), 'kw-bad-input-store-'));
    process.env.KW_STORAGE = 'fs';
    process.env.KW_STORAGE_DIR = storageDir;
    // This app works no queue: exports another suite left on the shared test Redis would change rows between
    // a case's before and after snapshots.
    process.env.KW_WORKER_MODE = 'off';
    ctx = await startTestApp();
    world = await buildWorld(ctx);
  }, 60000);

  afterAll(async () => {
    await ctx.app.close();
    fs.rmSync(storageDir, { recursive: true, force: true });
    restoreEnv('KW_STORAGE', saved.storage);
    restoreEnv('KW_STORAGE_DIR', saved.dir);
    restoreEnv('KW_WORKER_MODE', saved.worker);
  });

  it('holds at least 60 cases that must be refused with a 4xx', () => {
    const refused = badInputCases.filter((c) => c.status >= 400 && c.status < 500);
    expect(refused.length).toBe(badInputCases.length);
    expect(refused.length).toBeGreaterThanOrEqual(60);
    expect(new Set(badInputCases.map((c) => c.name)).size).toBe(badInputCases.length);
  });

  for (const c of badInputCases) {
    it(`${c.name} → ${c.status}`, async () => {
      await c.before?.(world, async (email, password) => {
        const res = await ctx.http.post('/api/auth/login').send({ email, password });
        return res.status;
      });
      const before = await snapshot(ctx, storageDir);
      const res = await send(ctx, c, world);
      expect({ status: res.status, body: res.body as unknown }).toEqual({
        status: c.status,
        body: expect.anything(),
      });
      expectErrorBody(res.body, c.status, c.code);
      expect(res.text).not.toMatch(/QueryFailedError|node_modules|\.ts:\d+|at \w+ \(/);
      expect(await snapshot(ctx, storageDir)).toEqual(before);
      await ctx.http.get('/api/health').expect(200);
    });
  }

  describe('input that is harmless text: answered normally, stored and matched literally', () => {
    const SQL = "' OR '1'='1'; DROP TABLE users; --";
    const SCRIPT = '<script>alert(document.cookie)</script>';
    const filters: [Who, string, Record<string, string>][] = [
      ['owner', '/api/designs', { q: SQL }],
      ['owner', '/api/designs', { q: '%' }],
      ['fabricator', '/api/jobs', { q: SCRIPT }],
      ['fabricator', '/api/materials', { q: SQL }],
      ['fabricator', '/api/machine-profiles', { q: `${SQL}%_` }],
      ['supervisor', '/api/users', { q: SQL }],
      ['supervisor', '/api/audit', { action: `${SQL}%` }],
    ];
    for (const [who, url, query] of filters) {
      it(`${url} with ${JSON.stringify(query)} matches nothing and changes nothing`, async () => {
        const before = await snapshot(ctx, storageDir);
        const res = await ctx.http
          .get(url)
          .query(query)
          .set('Authorization', `Bearer ${world.tokens[who as Exclude<Who, 'anonymous'>]}`)
          .expect(200);
        expect(res.body).toMatchObject({ items: [], total: 0 });
        expect(await snapshot(ctx, storageDir)).toEqual(before);
      });
    }

    it('keeps SQL and script text in a design name verbatim, as data', async () => {
      const name = `${SQL} ${SCRIPT}`.slice(0, 120);
      const res = await ctx.http
        .post('/api/designs')
        .set('Authorization', `Bearer ${world.tokens.owner}`)
        .send({ name, description: SCRIPT, spec: goodSpec() })
        .expect(201);
      const read = await ctx.http
        .get(`/api/designs/${res.body.id}`)
        .set('Authorization', `Bearer ${world.tokens.owner}`)
        .expect(200);
      expect(read.body).toMatchObject({ name, description: SCRIPT });
      expect(read.headers['content-type']).toMatch(/^application\/json/);
      expect(read.headers['x-content-type-options']).toBe('nosniff');
      const users: { n: number }[] = await ctx.db.query(`SELECT count(*)::int AS n FROM users`);
      expect(users[0]!.n).toBeGreaterThan(0);
    });

    it('takes the convex hull of a non-convex upload (base solids are convex by definition)', async () => {
      const res = await ctx.http
        .post('/api/designs/solid-check')
        .set('Authorization', `Bearer ${world.tokens.owner}`)
        .attach('file', fs.readFileSync(path.join(UPLOADS, 'non-convex.obj')), { filename: 'ell.obj' })
        .expect(200);
      // An L-shaped prism has 12 corners; its hull keeps the 10 outer ones and has 7 faces.
      expect(res.body).toMatchObject({ format: 'obj', vertexCount: 10, faceCount: 7 });
    });

    it('strips the directories from an uploaded file name before it is kept', async () => {
      const res = await ctx.http
        .post(`/api/designs/${world.designId}/duplicate`)
        .set('Authorization', `Bearer ${world.tokens.owner}`)
        .expect(201);
      const up = await ctx.http
        .post(`/api/designs/${res.body.id}/solid`)
        .set('Authorization', `Bearer ${world.tokens.owner}`)
        .attach('file', fs.readFileSync(path.join(UPLOADS, 'cube.obj')), {
          filename: '..\\..\\windows\\cube.obj',
        })
        .expect(201);
      expect(up.body.solidFileName).not.toMatch(/[\\/]|\.\./);
    });
  });
});

async function buildWorld(ctx: TestContext): Promise<World> {
  const people = {
    owner: await createUser(ctx, 'hobbyist'),
    intruder: await createUser(ctx, 'hobbyist'),
    fabricator: await createUser(ctx, 'fabricator'),
    operator: await createUser(ctx, 'operator'),
    supervisor: await createUser(ctx, 'supervisor'),
    deactivated: await createUser(ctx, 'fabricator', { active: false }),
  };
  const workshop = await createWorkshop(ctx);
  const as = { Authorization: `Bearer ${people.owner.token}` };
  const design = await ctx.http
    .post('/api/designs')
    .set(as)
    .send({ name: 'Owner lamp', spec: goodSpec() })
    .expect(201);
  const wide = await ctx.http
    .post('/api/designs')
    .set(as)
    .send({ name: 'Kerf wider than slots', spec: goodSpec({ machine: { kind: 'laser', kerfMm: 4.9 } }) })
    .expect(201);
  expect(wide.body.preview.valid).toBe(false);
  const job = async (designId: string) =>
    (await ctx.http.post('/api/jobs').set(as).send({ designId }).expect(201)).body as {
      id: string;
      version: number;
    };
  const draft = await job(design.body.id);
  const toRequest = await job(design.body.id);
  const requested = await ctx.http
    .post(`/api/jobs/${toRequest.id}/request`)
    .set(as)
    .send({ version: toRequest.version })
    .expect(200);
  const wideJob = await job(wide.body.id);
  const exportId = await recordDoneExport(ctx, requested.body.id, people.fabricator.id);
  const tokens = Object.fromEntries(Object.entries(people).map(([k, u]) => [k, u.token]));
  const users = Object.fromEntries(Object.entries(people).map(([k, u]) => [k, u.id]));
  return {
    secret: process.env.KW_JWT_SECRET ?? DEV_JWT_SECRET,
    tokens: tokens as World['tokens'],
    users: users as World['users'],
    designId: design.body.id,
    draftJobId: draft.id,
    requestedJobId: requested.body.id,
    requestedJobVersion: requested.body.version,
    wideKerfJobId: wideJob.id,
    wideKerfJobVersion: wideJob.version,
    exportId,
    acrylicId: workshop.acrylicId,
    pvcId: workshop.pvcId,
    laserProfileId: workshop.laserProfileId,
    laserVersionId: workshop.laserVersionId,
    draftVersionId: workshop.draftVersionId,
  };
}

/** A finished export recorded straight in the database (the queue has its own suite), with two files. */
async function recordDoneExport(ctx: TestContext, jobId: string, by: string): Promise<string> {
  const id = randomUUID();
  const prefix = `jobs/${jobId}/exports/${id}/`;
  await ctx.db.query(
    `INSERT INTO exports (id, job_id, state, progress, requested_by, storage_prefix, finished_at)
     VALUES ($1, $2, 'done', 100, $3, $4, now())`,
    [id, jobId, by, prefix],
  );
  for (const [name, role] of [
    ['assembly-guide.pdf', 'assembly-guide'],
    ['setup-sheet.pdf', 'setup-sheet'],
  ]) {
    await ctx.db.query(
      `INSERT INTO export_files (export_id, name, role, content_type, bytes, sha256, storage_key)
       VALUES ($1, $2, $3, 'application/pdf', 0, $4, $5)`,
      [id, name, role, createHash('sha256').update('').digest('hex'), `${prefix}${name}`],
    );
  }
  return id;
}

async function send(ctx: TestContext, c: BadInputCase, w: World) {
  let req = ctx.http[c.method](c.path(w));
  const who = c.as ?? 'owner';
  const authorization = c.authorization
    ? await c.authorization(w)
    : who === 'anonymous'
      ? null
      : `Bearer ${w.tokens[who]}`;
  if (authorization) req = req.set('Authorization', authorization);
  if (c.raw) {
    const { type, body } = c.raw();
    return req.set('Content-Type', type).send(body);
  }
  if (c.upload) {
    const u = c.upload;
    const bytes = u.bytes ? u.bytes() : u.file ? fs.readFileSync(path.join(UPLOADS, u.file)) : null;
    if (!bytes) return req.field('comment', 'no file attached');
    for (let i = 0; i < (u.times ?? 1); i++) {
      req = req.attach(u.field ?? 'file', bytes, { filename: u.filename ?? u.file ?? 'upload.obj' });
    }
    return req;
  }
  return c.json ? req.send(c.json(w) as object) : req;
}

/** Every row of every table (hashed), the outbox count and the stored files. */
async function snapshot(ctx: TestContext, storageDir: string) {
  const parts = HASHED_TABLES.map(
    (t) =>
      `SELECT '${t}' AS t, count(*)::int AS n, md5(coalesce(string_agg(x::text, '|' ORDER BY x::text), '')) AS h FROM ${t} x`,
  );
  const rows: { t: string; n: number; h: string }[] = await ctx.db.query(parts.join(' UNION ALL '));
  const outbox: { n: number }[] = await ctx.db.query(`SELECT count(*)::int AS n FROM mail_outbox`);
  return {
    tables: Object.fromEntries(rows.map((r) => [r.t, `${r.n}:${r.h}`])),
    mailOutbox: outbox[0]!.n,
    storedFiles: (fs.readdirSync(storageDir, { recursive: true }) as string[]).sort(),
  };
}

function restoreEnv(key: string, value: string | undefined): void {
  if (value === undefined) delete process.env[key];
  else process.env[key] = value;
}
