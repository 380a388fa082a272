import { randomUUID } from 'node:crypto';
import bcrypt from 'bcryptjs';
import { type Role } from '@kerfwright/contracts';
import { acknowledge, isolateExports, releaseJob } from './support/export-fixtures';
import {
  createUser,
  expectErrorBody,
  startTestApp,
  type TestContext,
  type TestUser,
} from './support/test-app';
import { registeredRoutes } from './support/registered-routes';
import { createWorkshop, octahedronHexagons, type WorkshopFixture } from './support/workshop-fixtures';

jest.setTimeout(120000);

/**
 * One table of every route of every controller × every caller: each role, the owner of the object (a
 * hobbyist) and an anonymous caller. Allowed → 2xx (a write leaves an audit event under the request's id
 * where the resource is audited), a role that may not → 403, another user's object → 404 (broken
 * object-level authorisation is the first item of the OWASP API Security Top 10, 2023), no token → 401.
 * The `hobbyist` column is a hobbyist who does NOT own the object. The table is compared with the routes
 * Nest actually registered and with the OpenAPI document, so a new route without a row fails this suite.
 */
type Caller = Role | 'owner' | 'anonymous';
type Outcome = 'ok' | 401 | 403 | 404;
type Expectations = Record<Role | 'anonymous', Outcome> & { owner?: Outcome };
interface Call {
  method: 'get' | 'post' | 'patch' | 'put' | 'delete';
  path: string;
  /** A token of the caller's own for this call (one the call ends, say), instead of the caller's usual one. */
  token?: string;
  body?: object;
  file?: { name: string; text: string };
}
interface Row {
  route: string;
  expect: Expectations;
  /** Builds a fresh object for one call (writes change state), as seen by `caller`. */
  arrange: (caller: Caller) => Promise<Call>;
  /** Allowed writes record an audit event carrying the request's id. */
  audited?: boolean;
}

const ROLES: Role[] = ['hobbyist', 'fabricator', 'operator', 'supervisor'];
const CALLERS: Caller[] = [...ROLES, 'owner', 'anonymous'];

/** The listed roles may (a supervisor always may); others get 403, an anonymous caller 401. */
function roles(...allowed: Role[]): Expectations {
  const e = { anonymous: 401 } as Expectations;
  for (const r of ROLES) e[r] = r === 'supervisor' || allowed.includes(r) ? 'ok' : 403;
  return e;
}
const EVERY_ROLE = roles('hobbyist', 'fabricator', 'operator');
const PUBLIC: Expectations = { ...EVERY_ROLE, anonymous: 'ok' };
/** An object owned by a hobbyist: its owner, staff as listed; another hobbyist never learns it exists. */
function owned(owner: Outcome, staff: Partial<Record<Role, Outcome>>): Expectations {
  return {
    hobbyist: 404,
    fabricator: staff.fabricator ?? 'ok',
    operator: staff.operator ?? 'ok',
    supervisor: staff.supervisor ?? 'ok',
    owner,
    anonymous: 401,
  };
}

// A small convex solid of our own as OFF text: a square pyramid (5 vertices, 5 faces).
const PYRAMID_OFF =
  'OFF\n5 5 0\n-1 -1 0\n1 -1 0\n1 1 0\n-1 1 0\n0 0 1.2\n4 0 3 2 1\n3 0 1 4\n3 1 2 4\n3 2 3 4\n3 3 0 4\n';

/** Every route Nest registered, as "METHOD /api/path/:param". */
function routeKeys(ctx: TestContext): string[] {
  return registeredRoutes(ctx)
    .map((r) => `${r.method.toUpperCase()} ${r.route}`)
    .sort();
}

describe('role matrix: every route × every role', () => {
  let ctx: TestContext;
  let exportsEnv: { restore(): Promise<void> };
  let w: WorkshopFixture;
  const users = {} as Record<Role | 'owner', TestUser>;
  let templateDesignId: string;
  let releasedJobId: string;
  let exportId: string;
  let guideName: string;

  const auth = (u: TestUser) => ({ Authorization: `Bearer ${u.token}` });

  /** A copy of the template design owned by the owner (straight SQL: the engine ran once for the template). */
  async function design(): Promise<{ id: string; version: number }> {
    const rows: { id: string; version: number }[] = await ctx.db.query(
      `INSERT INTO designs (owner_id, name, description, spec, preview)
       SELECT owner_id, name || ' ' || $2, description, spec, preview FROM designs WHERE id = $1
       RETURNING id, version`,
      [templateDesignId, randomUUID().slice(0, 6)],
    );
    return rows[0]!;
  }

  /**
   * A job of the owner in `state`, copied from the released template (same preparation, material and
   * approved profile version). A prepared copy records its preparation by the fabricator.
   */
  async function job(state: string): Promise<{ id: string; version: number }> {
    const rows: { id: string; version: number }[] = await ctx.db.query(
      `INSERT INTO jobs (design_id, requester_id, state, spec, material_id, colours, profile_version_id, quantity,
                         notes, preparation, return_reason, actual_minutes, sheets_used)
       SELECT design_id, requester_id, $2::job_state, spec, material_id, colours, profile_version_id, quantity,
              notes, preparation, CASE WHEN $2::text = 'returned' THEN 'Needs thicker stock' END,
              CASE WHEN $2::text IN ('cut', 'closed') THEN 20 END,
              CASE WHEN $2::text IN ('cut', 'closed') THEN 1 END
         FROM jobs WHERE id = $1
       RETURNING id, version`,
      [releasedJobId, state],
    );
    const j = rows[0]!;
    if (['prepared', 'approved', 'released', 'cut'].includes(state)) {
      await ctx.db.query(
        `INSERT INTO job_transitions (job_id, from_state, to_state, action, actor_id)
         VALUES ($1, 'requested', 'prepared', 'prepare', $2)`,
        [j.id, users.fabricator.id],
      );
    }
    return j;
  }

  /** A user nobody signs in as (for the users routes). */
  async function bystander(): Promise<string> {
    const rows: { id: string }[] = await ctx.db.query(
      `INSERT INTO users (email, display_name, password_hash, role, active) VALUES ($1, 'Bystander', $2, 'hobbyist', true)
       RETURNING id`,
      [`bystander-${randomUUID().slice(0, 8)}@tests.example`, await bcrypt.hash(randomUUID(), 4)],
    );
    return rows[0]!.id;
  }

  async function material(): Promise<{ id: string; version: number }> {
    const res = await ctx.http
      .post('/api/materials')
      .set(auth(users.fabricator))
      .send({ name: `Matrix acrylic ${randomUUID().slice(0, 8)}`, family: 'acrylic', nominalThicknessMm: 3 })
      .expect(201);
    return res.body as { id: string; version: number };
  }

  interface Profile {
    id: string;
    latest: { id: string; lockVersion: number };
  }
  /** CO2 laser on 3 mm cast acrylic: about 0.15–0.2 mm kerf (common practice, from memory). */
  const profileBody = () => ({
    name: `Matrix laser ${randomUUID().slice(0, 8)}`,
    kind: 'co2-laser',
    bedWidthMm: 600,
    bedHeightMm: 400,
    rapidSpeedMmS: 500,
    hourlyRate: 30,
    currency: 'EUR',
    settings: [
      {
        materialId: w.acrylicId,
        kerfMm: 0.18,
        cutSpeedMmS: 12,
        markSpeedMmS: 200,
        powerPct: 65,
        passes: 1,
        pierceTimeS: 0.2,
      },
    ],
  });
  async function profile(): Promise<Profile> {
    const res = await ctx.http
      .post('/api/machine-profiles')
      .set(auth(users.fabricator))
      .send(profileBody())
      .expect(201);
    return res.body as Profile;
  }
  const versionPath = (p: Profile, action = '') =>
    `/api/machine-profiles/${p.id}/versions/${p.latest.id}${action ? `/${action}` : ''}`;
  /** The profile with its latest version as it is now (submit and approve need the lockVersion read). */
  async function submitted(): Promise<Profile> {
    const p = await profile();
    const res = await ctx.http
      .post(versionPath(p, 'submit'))
      .set(auth(users.fabricator))
      .send({ lockVersion: p.latest.lockVersion })
      .expect(200);
    return { ...p, latest: res.body as Profile['latest'] };
  }
  async function approved(): Promise<Profile> {
    const p = await submitted();
    const res = await ctx.http
      .post(versionPath(p, 'approve'))
      .set(auth(users.supervisor))
      .send({ lockVersion: p.latest.lockVersion })
      .expect(200);
    return { ...p, latest: res.body as Profile['latest'] };
  }
  async function kerfRecord(p: Profile): Promise<string> {
    const res = await ctx.http
      .post(`/api/machine-profiles/${p.id}/kerf-records`)
      .set(auth(users.operator))
      .send({ materialId: w.acrylicId, kerfMm: 0.19 })
      .expect(201);
    return res.body.id as string;
  }

  beforeAll(async () => {
    exportsEnv = isolateExports();
    ctx = await startTestApp();
    for (const r of ROLES) users[r] = await createUser(ctx, r);
    users.owner = await createUser(ctx, 'hobbyist');
    w = await createWorkshop(ctx);
    // One real design and one job taken through the real routes to released, with its cut pack.
    templateDesignId = (
      await ctx.http
        .post('/api/designs')
        .set(auth(users.owner))
        .send({ name: 'Matrix octahedron', spec: octahedronHexagons() })
        .expect(201)
    ).body.id;
    const j = (
      await ctx.http.post('/api/jobs').set(auth(users.owner)).send({ designId: templateDesignId }).expect(201)
    ).body;
    releasedJobId = j.id;
    const act = async (u: TestUser, action: string, body: object = {}) => {
      const v = (await ctx.http.get(`/api/jobs/${j.id}`).set(auth(users.supervisor)).expect(200)).body
        .version;
      await ctx.http
        .post(`/api/jobs/${j.id}/${action}`)
        .set(auth(u))
        .send({ version: v, ...body })
        .expect(200);
    };
    await act(users.owner, 'request');
    await act(users.fabricator, 'prepare', {
      materialId: w.acrylicId,
      profileVersionId: w.laserVersionId,
      colours: ['clear'],
    });
    await act(users.supervisor, 'approve');
    const done = await releaseJob(ctx, users.fabricator, j.id);
    exportId = done.id;
    guideName = done.files.find((f) => f.role === 'assembly-guide')!.name;
  });
  afterAll(async () => {
    await ctx?.app.close();
    await exportsEnv?.restore();
  });

  const jobAction =
    (state: string, action: string, body: () => object = () => ({})) =>
    async (): Promise<Call> => {
      const j = await job(state);
      return { method: 'post', path: `/api/jobs/${j.id}/${action}`, body: { version: j.version, ...body() } };
    };

  const table: Row[] = [
    // auth and health
    {
      route: 'POST /api/auth/register',
      expect: PUBLIC,
      audited: true,
      arrange: async () => ({
        method: 'post',
        path: '/api/auth/register',
        body: {
          email: `matrix-${randomUUID().slice(0, 8)}@tests.example`,
          password: `pw-${randomUUID()}`,
          displayName: 'Matrix member',
        },
      }),
    },
    {
      route: 'POST /api/auth/login',
      expect: PUBLIC,
      arrange: async (caller) => {
        const u = caller === 'anonymous' ? users.owner : users[caller];
        return { method: 'post', path: '/api/auth/login', body: { email: u.email, password: u.password } };
      },
    },
    {
      // On a second sign-in of the caller's: signing out ends the token it is sent with.
      route: 'POST /api/auth/sign-out',
      expect: EVERY_ROLE,
      audited: true,
      arrange: async (caller) => {
        const u = caller === 'anonymous' ? users.owner : users[caller];
        const signIn = await ctx.http
          .post('/api/auth/login')
          .send({ email: u.email, password: u.password })
          .expect(200);
        return { method: 'post', path: '/api/auth/sign-out', token: signIn.body.accessToken as string };
      },
    },
    {
      route: 'GET /api/auth/me',
      expect: EVERY_ROLE,
      arrange: async () => ({ method: 'get', path: '/api/auth/me' }),
    },
    {
      route: 'GET /api/health',
      expect: PUBLIC,
      arrange: async () => ({ method: 'get', path: '/api/health' }),
    },
    // users and audit (supervisors)
    {
      route: 'GET /api/users',
      expect: roles(),
      arrange: async () => ({ method: 'get', path: '/api/users' }),
    },
    {
      route: 'PATCH /api/users/:id',
      expect: roles(),
      audited: true,
      arrange: async () => ({
        method: 'patch',
        path: `/api/users/${await bystander()}`,
        body: { role: 'operator' },
      }),
    },
    {
      route: 'GET /api/audit',
      expect: roles(),
      arrange: async () => ({ method: 'get', path: '/api/audit' }),
    },
    // materials
    {
      route: 'GET /api/materials',
      expect: EVERY_ROLE,
      arrange: async () => ({ method: 'get', path: '/api/materials' }),
    },
    {
      route: 'GET /api/materials/:id',
      expect: EVERY_ROLE,
      arrange: async () => ({ method: 'get', path: `/api/materials/${w.acrylicId}` }),
    },
    {
      route: 'POST /api/materials',
      expect: roles('fabricator'),
      audited: true,
      arrange: async () => ({
        method: 'post',
        path: '/api/materials',
        body: { name: `Matrix card ${randomUUID().slice(0, 8)}`, family: 'card', nominalThicknessMm: 0.45 },
      }),
    },
    {
      route: 'PATCH /api/materials/:id',
      expect: roles('fabricator'),
      audited: true,
      arrange: async () => {
        const m = await material();
        return {
          method: 'patch',
          path: `/api/materials/${m.id}`,
          body: { version: m.version, notes: 'changed' },
        };
      },
    },
    {
      route: 'DELETE /api/materials/:id',
      expect: roles('fabricator'),
      audited: true,
      arrange: async () => ({ method: 'delete', path: `/api/materials/${(await material()).id}` }),
    },
    // machine profiles and kerf records
    {
      route: 'GET /api/machine-profiles',
      expect: EVERY_ROLE,
      arrange: async () => ({ method: 'get', path: '/api/machine-profiles' }),
    },
    {
      route: 'GET /api/machine-profiles/:id',
      expect: EVERY_ROLE,
      arrange: async () => ({ method: 'get', path: `/api/machine-profiles/${w.laserProfileId}` }),
    },
    {
      route: 'POST /api/machine-profiles',
      expect: roles('fabricator'),
      audited: true,
      arrange: async () => ({ method: 'post', path: '/api/machine-profiles', body: profileBody() }),
    },
    {
      route: 'POST /api/machine-profiles/:id/versions',
      expect: roles('fabricator'),
      audited: true,
      arrange: async () => ({
        method: 'post',
        path: `/api/machine-profiles/${(await approved()).id}/versions`,
        body: { hourlyRate: 35 },
      }),
    },
    {
      route: 'PATCH /api/machine-profiles/:id/versions/:versionId',
      expect: roles('fabricator'),
      audited: true,
      arrange: async () => {
        const p = await profile();
        return {
          method: 'patch',
          path: versionPath(p),
          body: { lockVersion: p.latest.lockVersion, notes: 'edited' },
        };
      },
    },
    {
      route: 'POST /api/machine-profiles/:id/versions/:versionId/submit',
      expect: roles('fabricator'),
      audited: true,
      arrange: async () => {
        const p = await profile();
        return {
          method: 'post',
          path: versionPath(p, 'submit'),
          body: { lockVersion: p.latest.lockVersion },
        };
      },
    },
    {
      route: 'POST /api/machine-profiles/:id/versions/:versionId/approve',
      expect: roles(),
      audited: true,
      arrange: async () => {
        const p = await submitted();
        return {
          method: 'post',
          path: versionPath(p, 'approve'),
          body: { lockVersion: p.latest.lockVersion },
        };
      },
    },
    {
      route: 'POST /api/machine-profiles/:id/versions/:versionId/return',
      expect: roles(),
      audited: true,
      arrange: async () => {
        const p = await submitted();
        return {
          method: 'post',
          path: versionPath(p, 'return'),
          body: { lockVersion: p.latest.lockVersion, reason: 'Power too high for acrylic' },
        };
      },
    },
    {
      route: 'POST /api/machine-profiles/:id/versions/:versionId/retire',
      expect: roles(),
      audited: true,
      arrange: async () => ({ method: 'post', path: versionPath(await approved(), 'retire'), body: {} }),
    },
    {
      route: 'POST /api/machine-profiles/:id/kerf-records',
      expect: roles('operator', 'fabricator'),
      audited: true,
      arrange: async () => ({
        method: 'post',
        path: `/api/machine-profiles/${w.laserProfileId}/kerf-records`,
        body: { materialId: w.acrylicId, kerfMm: 0.17 },
      }),
    },
    {
      route: 'GET /api/machine-profiles/:id/kerf-records',
      expect: roles('operator', 'fabricator'),
      arrange: async () => ({
        method: 'get',
        path: `/api/machine-profiles/${w.laserProfileId}/kerf-records`,
      }),
    },
    {
      route: 'POST /api/machine-profiles/:id/kerf-records/:recordId/adopt',
      expect: roles('fabricator'),
      audited: true,
      arrange: async () => {
        const p = await approved();
        return {
          method: 'post',
          path: `/api/machine-profiles/${p.id}/kerf-records/${await kerfRecord(p)}/adopt`,
          body: {},
        };
      },
    },
    // designs (owned by a hobbyist; staff read all, only the owner or a supervisor changes one)
    {
      route: 'GET /api/designs',
      expect: EVERY_ROLE,
      arrange: async () => ({ method: 'get', path: '/api/designs' }),
    },
    {
      route: 'POST /api/designs',
      expect: EVERY_ROLE,
      audited: true,
      arrange: async () => ({
        method: 'post',
        path: '/api/designs',
        body: { name: 'Matrix design', spec: octahedronHexagons() },
      }),
    },
    {
      route: 'POST /api/designs/solid-check',
      expect: EVERY_ROLE,
      arrange: async () => ({
        method: 'post',
        path: '/api/designs/solid-check',
        file: { name: 'pyramid.off', text: PYRAMID_OFF },
      }),
    },
    {
      route: 'GET /api/designs/:id',
      expect: owned('ok', {}),
      arrange: async () => ({ method: 'get', path: `/api/designs/${(await design()).id}` }),
    },
    {
      route: 'PATCH /api/designs/:id',
      expect: owned('ok', { fabricator: 403, operator: 403 }),
      audited: true,
      arrange: async () => {
        const d = await design();
        return {
          method: 'patch',
          path: `/api/designs/${d.id}`,
          body: { version: d.version, name: 'Renamed' },
        };
      },
    },
    {
      route: 'DELETE /api/designs/:id',
      expect: owned('ok', { fabricator: 403, operator: 403 }),
      audited: true,
      arrange: async () => ({ method: 'delete', path: `/api/designs/${(await design()).id}` }),
    },
    {
      route: 'POST /api/designs/:id/duplicate',
      expect: owned('ok', {}),
      audited: true,
      arrange: async () => ({ method: 'post', path: `/api/designs/${(await design()).id}/duplicate` }),
    },
    {
      route: 'POST /api/designs/:id/solid',
      expect: owned('ok', { fabricator: 403, operator: 403 }),
      audited: true,
      arrange: async () => ({
        method: 'post',
        path: `/api/designs/${(await design()).id}/solid`,
        file: { name: 'pyramid.off', text: PYRAMID_OFF },
      }),
    },
    // jobs (requested by a hobbyist; staff see every job past draft; the state machine names the roles)
    {
      route: 'GET /api/jobs',
      expect: EVERY_ROLE,
      arrange: async () => ({ method: 'get', path: '/api/jobs' }),
    },
    {
      route: 'POST /api/jobs',
      expect: owned('ok', {}),
      audited: true,
      arrange: async () => ({ method: 'post', path: '/api/jobs', body: { designId: (await design()).id } }),
    },
    {
      route: 'GET /api/jobs/:id',
      expect: owned('ok', {}),
      arrange: async () => ({ method: 'get', path: `/api/jobs/${(await job('requested')).id}` }),
    },
    {
      route: 'PATCH /api/jobs/:id',
      expect: owned('ok', { fabricator: 404, operator: 404 }), // a draft's copies and notes; staff do not see drafts
      audited: true,
      arrange: async () => {
        const j = await job('draft');
        return { method: 'patch', path: `/api/jobs/${j.id}`, body: { version: j.version, notes: 'Matrix' } };
      },
    },
    {
      route: 'POST /api/jobs/:id/request',
      expect: owned('ok', { fabricator: 404, operator: 404 }), // staff do not see drafts
      audited: true,
      arrange: jobAction('draft', 'request'),
    },
    {
      route: 'POST /api/jobs/:id/prepare',
      expect: owned(403, { operator: 403 }),
      audited: true,
      arrange: jobAction('requested', 'prepare', () => ({
        materialId: w.acrylicId,
        profileVersionId: w.laserVersionId,
        colours: ['clear'],
      })),
    },
    {
      route: 'POST /api/jobs/:id/approve',
      expect: owned(403, { fabricator: 403, operator: 403 }),
      audited: true,
      arrange: jobAction('prepared', 'approve'),
    },
    {
      route: 'POST /api/jobs/:id/release',
      expect: { ...roles('fabricator'), owner: 403 },
      audited: true,
      arrange: jobAction('approved', 'release'),
    },
    {
      route: 'POST /api/jobs/:id/cut',
      expect: owned(403, { fabricator: 403 }),
      audited: true,
      // Whoever may record the cut has acknowledged the job's safety notices (recording needs it).
      arrange: async (caller) => {
        const call = await jobAction('released', 'cut', () => ({ actualMinutes: 18, sheetsUsed: 1 }))();
        if (caller === 'operator' || caller === 'supervisor') {
          await acknowledge(ctx, users[caller], call.path.split('/')[3]!);
        }
        return call;
      },
    },
    {
      route: 'POST /api/jobs/:id/close',
      expect: owned(403, {}),
      audited: true,
      arrange: jobAction('cut', 'close'),
    },
    {
      route: 'POST /api/jobs/:id/return',
      expect: owned(403, { operator: 403 }),
      audited: true,
      arrange: jobAction('requested', 'return', () => ({ reason: 'Pieces too small for the bed' })),
    },
    {
      route: 'POST /api/jobs/:id/reopen',
      expect: owned('ok', { fabricator: 403, operator: 403 }),
      audited: true,
      arrange: jobAction('returned', 'reopen'),
    },
    {
      route: 'POST /api/jobs/:id/withdraw',
      expect: owned('ok', { fabricator: 403, operator: 403 }),
      audited: true,
      arrange: jobAction('requested', 'withdraw'),
    },
    // cut packs
    {
      route: 'POST /api/jobs/:id/exports',
      expect: { ...roles('fabricator'), owner: 403 },
      audited: true,
      arrange: async () => ({ method: 'post', path: `/api/jobs/${(await job('released')).id}/exports` }),
    },
    {
      route: 'GET /api/jobs/:id/exports',
      expect: owned('ok', {}),
      arrange: async () => ({ method: 'get', path: `/api/jobs/${releasedJobId}/exports` }),
    },
    {
      route: 'GET /api/exports/:id',
      expect: owned('ok', {}),
      arrange: async () => ({ method: 'get', path: `/api/exports/${exportId}` }),
    },
    {
      route: 'GET /api/exports/:id/events',
      expect: owned('ok', {}),
      arrange: async () => ({ method: 'get', path: `/api/exports/${exportId}/events` }),
    },
    {
      // Staff download after acknowledging the job's notices (a fabricator cannot acknowledge: 403).
      route: 'GET /api/exports/:id/files/:name',
      expect: owned('ok', { fabricator: 403 }),
      arrange: async (caller) => {
        if (caller === 'operator' || caller === 'supervisor')
          await acknowledge(ctx, users[caller], releasedJobId);
        return { method: 'get', path: `/api/exports/${exportId}/files/${guideName}` };
      },
    },
    // safety
    {
      route: 'GET /api/safety/notices',
      expect: EVERY_ROLE,
      arrange: async () => ({ method: 'get', path: '/api/safety/notices' }),
    },
    {
      route: 'GET /api/safety/hazards',
      expect: EVERY_ROLE,
      arrange: async () => ({ method: 'get', path: '/api/safety/hazards' }),
    },
    {
      route: 'GET /api/safety/local-rules',
      expect: EVERY_ROLE,
      arrange: async () => ({ method: 'get', path: '/api/safety/local-rules' }),
    },
    {
      route: 'PUT /api/safety/local-rules',
      expect: roles(),
      audited: true,
      arrange: async () => ({
        method: 'put',
        path: '/api/safety/local-rules',
        body: { body: 'Never leave a running laser unattended. Extraction on before the first cut.' },
      }),
    },
    {
      route: 'GET /api/jobs/:id/safety',
      expect: owned('ok', {}),
      arrange: async () => ({ method: 'get', path: `/api/jobs/${(await job('released')).id}/safety` }),
    },
    {
      route: 'POST /api/jobs/:id/safety/acknowledge',
      expect: { ...roles('operator'), owner: 403 },
      audited: true,
      arrange: async (caller) => {
        const j = await job('released');
        const reader = caller === 'operator' || caller === 'supervisor' ? users[caller] : users.supervisor;
        const s = (await ctx.http.get(`/api/jobs/${j.id}/safety`).set(auth(reader)).expect(200)).body;
        return {
          method: 'post',
          path: `/api/jobs/${j.id}/safety/acknowledge`,
          body: {
            notices: (s.notices as { id: string; version: number }[]).map((n) => ({
              id: n.id,
              version: n.version,
            })),
            localRulesVersion: s.localRules?.version ?? null,
            preparationId: s.preparationId,
          },
        };
      },
    },
  ];

  it('has exactly one row for every route the application registers', () => {
    const routes = routeKeys(ctx);
    const rows = table.map((r) => r.route).sort();
    expect(new Set(rows).size).toBe(rows.length);
    expect(rows).toEqual(routes);
  });

  it('checks an audit event for every write on materials, machine profiles, jobs and users', () => {
    // Issue #5.6: the audit trail covers every write on these resources; each such row checks its event.
    const writes = table.filter(
      (r) =>
        !r.route.startsWith('GET ') &&
        /^\S+ \/api\/(materials|machine-profiles|jobs|users)\b/.test(r.route) &&
        !r.route.includes('/safety'),
    );
    expect(writes.length).toBeGreaterThanOrEqual(20);
    expect(writes.filter((r) => !r.audited).map((r) => r.route)).toEqual([]);
  });

  it('finds every route of the table in the OpenAPI document at /api/docs', async () => {
    const doc = (await ctx.http.get('/api/docs-json').expect(200)).body as {
      paths: Record<string, Record<string, unknown>>;
    };
    for (const { route } of table) {
      const [method, path] = route.split(' ') as [string, string];
      const openApiPath = path.replace(/:(\w+)/g, '{$1}');
      expect({ route, documented: Boolean(doc.paths[openApiPath]?.[method.toLowerCase()]) }).toEqual({
        route,
        documented: true,
      });
    }
  });

  const cases = table.flatMap((row) =>
    CALLERS.filter((c) => row.expect[c as keyof Expectations] !== undefined).map((caller) => ({
      route: row.route,
      caller,
      outcome: row.expect[caller as keyof Expectations]!,
      row,
    })),
  );

  it.each(cases)('$route as $caller → $outcome', async ({ caller, outcome, row }) => {
    const call = await row.arrange(caller);
    let req = ctx.http[call.method](call.path);
    if (caller !== 'anonymous')
      req = req.set(auth(call.token ? { ...users[caller], token: call.token } : users[caller]));
    if (call.file) req = req.attach('file', Buffer.from(call.file.text), call.file.name);
    else if (call.body) req = req.send(call.body);
    const res = await req;
    const requestId = res.headers['x-request-id'] as string;
    const audit: { n: string }[] = await ctx.db.query(
      `SELECT count(*)::text AS n FROM audit_events WHERE request_id = $1`,
      [requestId],
    );
    if (outcome === 'ok') {
      if (res.status < 200 || res.status >= 300) {
        throw new Error(`expected 2xx, got ${res.status}: ${JSON.stringify(res.body)}`);
      }
      if (row.audited) expect(Number(audit[0]!.n)).toBeGreaterThanOrEqual(1);
    } else {
      expect(res.status).toBe(outcome);
      expectErrorBody(res.body, outcome);
      // A refused call writes nothing.
      expect(Number(audit[0]!.n)).toBe(0);
    }
  });
});
