import {
  createUser,
  expectErrorBody,
  startTestApp,
  type TestContext,
  type TestUser,
} from './support/test-app';
import { auth, jobActor } from './support/export-fixtures';
import { createWorkshop, octahedronHexagons, type WorkshopFixture } from './support/workshop-fixtures';

jest.setTimeout(90000);

/** The limit this suite boots the API with (KW_OPEN_REQUEST_LIMIT; the other suites raise it out of the way). */
const LIMIT = 3;

describe('jobs one requester may have open with the workshop', () => {
  let ctx: TestContext;
  let w: WorkshopFixture;
  let before: string | undefined;
  const staff = {} as Record<'fabricator' | 'supervisor', TestUser>;

  beforeAll(async () => {
    before = process.env.KW_OPEN_REQUEST_LIMIT;
    process.env.KW_OPEN_REQUEST_LIMIT = String(LIMIT);
    ctx = await startTestApp();
    staff.fabricator = await createUser(ctx, 'fabricator');
    staff.supervisor = await createUser(ctx, 'supervisor');
    w = await createWorkshop(ctx);
  });
  afterAll(async () => {
    await ctx.app.close();
    if (before === undefined) delete process.env.KW_OPEN_REQUEST_LIMIT;
    else process.env.KW_OPEN_REQUEST_LIMIT = before;
  });

  /** A new draft job of `owner`'s, and how to act on it (each action with the job's current version). */
  async function draft(owner: TestUser) {
    const d = await ctx.http
      .post('/api/designs')
      .set(auth(owner))
      .send({ name: 'Limit test octahedron', spec: octahedronHexagons() })
      .expect(201);
    const j = await ctx.http.post('/api/jobs').set(auth(owner)).send({ designId: d.body.id }).expect(201);
    const id = j.body.id as string;
    return { id, act: jobActor(ctx, staff.supervisor, id) };
  }
  const requestMails = async (jobId: string) =>
    (
      await ctx.db.query(`SELECT 1 FROM mail_outbox WHERE kind = 'job.requested' AND text_body LIKE $1`, [
        `%/jobs/${jobId}%`,
      ])
    ).length;
  const prepareBody = () => ({
    materialId: w.acrylicId,
    profileVersionId: w.laserVersionId,
    colours: ['clear'],
  });

  it('refuses a request past the limit with 429, saying how many are open and that the workshop can raise it', async () => {
    const hobbyist = await createUser(ctx, 'hobbyist');
    const open = [];
    for (let i = 0; i < LIMIT; i++) {
      const job = await draft(hobbyist);
      await job.act(hobbyist, 'request');
      open.push(job);
    }
    // One of them prepared: still waiting for the workshop (for approval), so still open.
    await open[0]!.act(staff.fabricator, 'prepare', prepareBody());
    const next = await draft(hobbyist);
    const refused = await next.act(hobbyist, 'request', {}, 429);
    expectErrorBody(refused.body, 429, 'JOB.TOO_MANY_OPEN_REQUESTS');
    expect(refused.body.message).toContain(`${LIMIT} jobs are already waiting for the workshop`);
    expect(refused.body.message).toContain(`${LIMIT} are allowed at a time`);
    expect(refused.body.message).toMatch(/The workshop can raise the limit\.$/);
    expect(refused.body.details).toEqual({
      open: LIMIT,
      limit: LIMIT,
      openStates: ['requested', 'prepared'],
    });
    // Nothing changed and nobody was mailed.
    const after = await ctx.http.get(`/api/jobs/${next.id}`).set(auth(hobbyist)).expect(200);
    expect(after.body.state).toBe('draft');
    expect(await requestMails(next.id)).toBe(0);
    // Another requester is not held back by this one's jobs.
    const other = await createUser(ctx, 'hobbyist');
    await (await draft(other)).act(other, 'request');
  });

  it('counts a job open until it is approved, returned or withdrawn', async () => {
    const hobbyist = await createUser(ctx, 'hobbyist');
    const open = [];
    for (let i = 0; i < LIMIT; i++) {
      const job = await draft(hobbyist);
      await job.act(hobbyist, 'request');
      open.push(job);
    }
    const next = await draft(hobbyist);
    await next.act(hobbyist, 'request', {}, 429);
    // Approved: it is the workshop's now, and no longer waits.
    await open[0]!.act(staff.fabricator, 'prepare', prepareBody());
    await open[0]!.act(staff.supervisor, 'approve');
    await next.act(hobbyist, 'request');
    expect(await requestMails(next.id)).toBeGreaterThan(0);
    const third = await draft(hobbyist);
    await third.act(hobbyist, 'request', {}, 429);
    // Returned.
    await open[1]!.act(staff.fabricator, 'return', { reason: 'Out of clear acrylic this month' });
    await third.act(hobbyist, 'request');
    const fourth = await draft(hobbyist);
    await fourth.act(hobbyist, 'request', {}, 429);
    // Withdrawn by its requester.
    await open[2]!.act(hobbyist, 'withdraw');
    await fourth.act(hobbyist, 'request');
    // Reopening a returned job and requesting it again counts it again.
    await open[1]!.act(hobbyist, 'reopen');
    const again = await open[1]!.act(hobbyist, 'request', {}, 429);
    expectErrorBody(again.body, 429, 'JOB.TOO_MANY_OPEN_REQUESTS');
  });

  it('lets exactly one of two requests sent at once take the last place', async () => {
    const hobbyist = await createUser(ctx, 'hobbyist');
    for (let i = 0; i < LIMIT - 1; i++) await (await draft(hobbyist)).act(hobbyist, 'request');
    const [a, b] = [await draft(hobbyist), await draft(hobbyist)];
    const version = async (id: string) =>
      (await ctx.http.get(`/api/jobs/${id}`).set(auth(hobbyist)).expect(200)).body.version as number;
    const send = async (id: string) =>
      ctx.http
        .post(`/api/jobs/${id}/request`)
        .set(auth(hobbyist))
        .send({ version: await version(id) });
    const answers = await Promise.all([send(a.id), send(b.id)]);
    expect(answers.map((r) => r.status).sort()).toEqual([200, 429]);
  });

  it('does not limit the workshop’s own fabricators and supervisors', async () => {
    for (const role of ['fabricator', 'supervisor'] as const) {
      const person = await createUser(ctx, role);
      for (let i = 0; i <= LIMIT; i++) await (await draft(person)).act(person, 'request');
      const rows: { n: number }[] = await ctx.db.query(
        `SELECT count(*)::int AS n FROM jobs WHERE requester_id = $1 AND state = 'requested'`,
        [person.id],
      );
      expect(rows[0]!.n).toBe(LIMIT + 1);
    }
  });
});
