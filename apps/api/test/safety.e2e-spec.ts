import {
  countRows,
  createUser,
  expectErrorBody,
  startTestApp,
  type TestContext,
  type TestUser,
} from './support/test-app';
import { createWorkshop, octahedronHexagons, type WorkshopFixture } from './support/workshop-fixtures';

/**
 * Safety content as seeded from safety/ (scripts/test.sh seeds the test database before the suites run),
 * the workshop's local rules, and acknowledgements that name notice versions.
 */
describe('safety notices, local rules and acknowledgements', () => {
  let ctx: TestContext;
  let w: WorkshopFixture;
  const u = {} as Record<'hobbyist' | 'fabricator' | 'operator' | 'supervisor', TestUser>;
  beforeAll(async () => {
    ctx = await startTestApp();
    for (const role of ['hobbyist', 'fabricator', 'operator', 'supervisor'] as const)
      u[role] = await createUser(ctx, role);
    w = await createWorkshop(ctx);
  });
  afterAll(async () => {
    await ctx.app.close();
  });
  const auth = (x: TestUser) => ({ Authorization: `Bearer ${x.token}` });

  it('serves the current notices to every role, each deferring to local rules', async () => {
    for (const role of Object.keys(u) as (keyof typeof u)[]) {
      const res = await ctx.http.get('/api/safety/notices').set(auth(u[role])).expect(200);
      expect(res.body.length).toBeGreaterThan(0);
      for (const n of res.body) {
        expect(n.version).toBeGreaterThanOrEqual(1);
        expect(n.appliesTo.machineKinds.length).toBeGreaterThan(0);
        // Every notice defers to the workshop's own rules (common practice; safety/README.md).
        expect(n.body).toMatch(/workshop/i);
      }
    }
    await ctx.http.get('/api/safety/notices').expect(401);
  });

  it('filters notices by machine kind: a router sees no laser-class notice', async () => {
    const laser = await ctx.http
      .get('/api/safety/notices?machineKind=co2-laser')
      .set(auth(u.operator))
      .expect(200);
    const router = await ctx.http
      .get('/api/safety/notices?machineKind=cnc-router')
      .set(auth(u.operator))
      .expect(200);
    const kinds = (list: { appliesTo: { machineKinds: string[] } }[], k: string) =>
      list.every((n) => n.appliesTo.machineKinds.includes('*') || n.appliesTo.machineKinds.includes(k));
    expect(kinds(laser.body, 'co2-laser')).toBe(true);
    expect(kinds(router.body, 'cnc-router')).toBe(true);
    expect(laser.body.map((n: { id: string }) => n.id)).not.toEqual(
      router.body.map((n: { id: string }) => n.id),
    );
    await ctx.http.get('/api/safety/notices?machineKind=plasma').set(auth(u.operator)).expect(400);
  });

  it('lists the hazard table with PVC refused for lasers', async () => {
    const res = await ctx.http.get('/api/safety/hazards').set(auth(u.hobbyist)).expect(200);
    const pvc = res.body.find((h: { family: string }) => h.family === 'pvc');
    expect(pvc).toMatchObject({ laser: 'no' });
    expect(pvc.source).toBeTruthy();
  });

  it('lets only a supervisor replace the local rules, each edit a new version', async () => {
    const before = (await ctx.http.get('/api/safety/local-rules').set(auth(u.operator)).expect(200)).body;
    const r = await ctx.http
      .put('/api/safety/local-rules')
      .set(auth(u.fabricator))
      .send({ body: 'No.' })
      .expect(403);
    expectErrorBody(r.body, 403, 'AUTH.FORBIDDEN');
    await ctx.http.put('/api/safety/local-rules').set(auth(u.supervisor)).send({ body: '' }).expect(400);
    const next = await ctx.http
      .put('/api/safety/local-rules')
      .set(auth(u.supervisor))
      .send({ body: '## House rules\n\nTwo people in the room while the laser runs.' })
      .expect(200);
    expect(next.body.version).toBe((before?.version ?? 0) + 1);
    expect(next.body.authorName).toBe('Test supervisor');
  });

  it('refuses rules written over a version another supervisor has replaced since (409), keeping theirs', async () => {
    const read = (await ctx.http.get('/api/safety/local-rules').set(auth(u.supervisor)).expect(200)).body as {
      version: number;
    } | null;
    const seen = read?.version ?? 0;
    // Two supervisors open the same version; the first to save makes the next one.
    const first = await ctx.http
      .put('/api/safety/local-rules')
      .set(auth(u.supervisor))
      .send({ body: 'Ear defenders at the router.', version: seen })
      .expect(200);
    expect(first.body.version).toBe(seen + 1);
    const second = await ctx.http
      .put('/api/safety/local-rules')
      .set(auth(u.supervisor))
      .send({ body: 'Goggles on at the laser.', version: seen })
      .expect(409);
    expectErrorBody(second.body, 409, 'SAFETY.STALE_RULES');
    expect(second.body.message).toMatch(
      /changed since you opened them \(now version \d+, by Test supervisor\)/,
    );
    const now = (await ctx.http.get('/api/safety/local-rules').set(auth(u.operator)).expect(200)).body;
    expect(now).toMatchObject({ version: seen + 1, body: 'Ear defenders at the router.' });
    // A version that is not a count is refused as such.
    await ctx.http
      .put('/api/safety/local-rules')
      .set(auth(u.supervisor))
      .send({ body: 'x', version: -1 })
      .expect(400);
  });

  it('records an acknowledgement of exactly the current notice versions, and refuses a stale one', async () => {
    const d = await ctx.http
      .post('/api/designs')
      .set(auth(u.hobbyist))
      .send({ name: 'Ack test', spec: octahedronHexagons() })
      .expect(201);
    const j = await ctx.http
      .post('/api/jobs')
      .set(auth(u.hobbyist))
      .send({ designId: d.body.id })
      .expect(201);
    // Requested, not prepared yet: every notice is listed, and none can be acknowledged for the job.
    await ctx.http
      .post(`/api/jobs/${j.body.id}/request`)
      .set(auth(u.hobbyist))
      .send({ version: j.body.version })
      .expect(200);
    const early = (await ctx.http.get(`/api/jobs/${j.body.id}/safety`).set(auth(u.operator)).expect(200))
      .body;
    expect(early).toMatchObject({ machineKind: null, materialFamily: null, acknowledged: false });
    const blanket = await ctx.http
      .post(`/api/jobs/${j.body.id}/safety/acknowledge`)
      .set(auth(u.operator))
      .send({
        notices: early.notices.map((n: { id: string; version: number }) => ({
          id: n.id,
          version: n.version,
        })),
        localRulesVersion: early.localRules?.version ?? null,
        preparationId: '1',
      })
      .expect(409);
    expectErrorBody(blanket.body, 409, 'SAFETY.JOB_NOT_PREPARED');
    expect(early.preparationId).toBeNull();
    const requested = (await ctx.http.get(`/api/jobs/${j.body.id}`).set(auth(u.fabricator)).expect(200)).body;
    await ctx.http
      .post(`/api/jobs/${j.body.id}/prepare`)
      .set(auth(u.fabricator))
      .send({
        materialId: w.acrylicId,
        profileVersionId: w.laserVersionId,
        colours: ['clear'],
        version: requested.version,
      })
      .expect(200);
    const view = (await ctx.http.get(`/api/jobs/${j.body.id}/safety`).set(auth(u.operator)).expect(200)).body;
    expect(view).toMatchObject({ machineKind: 'co2-laser', materialFamily: 'acrylic', acknowledged: false });
    const refs = view.notices.map((n: { id: string; version: number }) => ({ id: n.id, version: n.version }));
    const rulesVersion = view.localRules?.version ?? null;
    const preparationId = view.preparationId;
    // A hobbyist cannot acknowledge for the operators.
    await ctx.http
      .post(`/api/jobs/${j.body.id}/safety/acknowledge`)
      .set(auth(u.hobbyist))
      .send({ notices: refs, localRulesVersion: rulesVersion, preparationId })
      .expect(403);
    const before = await countRows(ctx, 'safety_acknowledgements');
    const stale = await ctx.http
      .post(`/api/jobs/${j.body.id}/safety/acknowledge`)
      .set(auth(u.operator))
      .send({ notices: refs.slice(1), localRulesVersion: rulesVersion, preparationId })
      .expect(409);
    expectErrorBody(stale.body, 409, 'SAFETY.STALE_ACKNOWLEDGEMENT');
    expect(await countRows(ctx, 'safety_acknowledgements')).toBe(before);
    const ok = await ctx.http
      .post(`/api/jobs/${j.body.id}/safety/acknowledge`)
      .set(auth(u.operator))
      .send({ notices: refs, localRulesVersion: rulesVersion, preparationId })
      .expect(200);
    expect(ok.body.acknowledged).toBe(true);
    const rows: { notice_versions: unknown; user_id: string; preparation_id: string }[] = await ctx.db.query(
      `SELECT notice_versions, user_id, preparation_id FROM safety_acknowledgements WHERE job_id = $1`,
      [j.body.id],
    );
    expect(rows).toHaveLength(1);
    expect(rows[0]!.user_id).toBe(u.operator.id);
    // Stored with the preparation it was read for: the job's prepare transition.
    const [prepare] = await ctx.db.query(
      `SELECT id FROM job_transitions WHERE job_id = $1 AND action = 'prepare'`,
      [j.body.id],
    );
    expect(rows[0]!.preparation_id).toBe(prepare.id);
    expect(rows[0]!.notice_versions).toEqual(refs);
    // Another hobbyist does not see the job at all.
    const other = await createUser(ctx, 'hobbyist');
    await ctx.http.get(`/api/jobs/${j.body.id}/safety`).set(auth(other)).expect(404);
  });
});
