import {
  countRows,
  createUser,
  expectErrorBody,
  startTestApp,
  type TestContext,
  type TestUser,
} from './support/test-app';

describe('users administration (supervisor only)', () => {
  let ctx: TestContext;
  let supervisor: TestUser;
  beforeAll(async () => {
    ctx = await startTestApp();
    supervisor = await createUser(ctx, 'supervisor');
  });
  afterAll(async () => {
    await ctx.app.close();
  });

  it.each(['hobbyist', 'fabricator', 'operator'] as const)(
    'refuses a %s with 403 and the error body',
    async (role) => {
      const user = await createUser(ctx, role);
      const list = await ctx.http.get('/api/users').set('Authorization', `Bearer ${user.token}`).expect(403);
      expectErrorBody(list.body, 403, 'AUTH.FORBIDDEN');
      const before = await countRows(ctx, 'audit_events');
      const patch = await ctx.http
        .patch(`/api/users/${user.id}`)
        .set('Authorization', `Bearer ${user.token}`)
        .send({ role: 'supervisor' })
        .expect(403);
      expectErrorBody(patch.body, 403, 'AUTH.FORBIDDEN');
      const rows: { role: string }[] = await ctx.db.query(`SELECT role FROM users WHERE id = $1`, [user.id]);
      expect(rows[0]!.role).toBe(role);
      expect(await countRows(ctx, 'audit_events')).toBe(before);
    },
  );

  it('lists users with paging, sorting and filtering', async () => {
    await createUser(ctx, 'operator');
    await createUser(ctx, 'operator');
    const res = await ctx.http
      .get('/api/users?role=operator&sort=-createdAt&page=1&pageSize=2')
      .set('Authorization', `Bearer ${supervisor.token}`)
      .expect(200);
    expect(res.body.items).toHaveLength(2);
    expect(res.body.total).toBeGreaterThanOrEqual(2);
    for (const u of res.body.items) expect(u.role).toBe('operator');
    expect(res.body.items[0].passwordHash).toBeUndefined();
    const times = res.body.items.map((u: { createdAt: string }) => Date.parse(u.createdAt));
    expect(times[0]).toBeGreaterThanOrEqual(times[1]);
    const bad = await ctx.http
      .get('/api/users?sort=password')
      .set('Authorization', `Bearer ${supervisor.token}`)
      .expect(400);
    expectErrorBody(bad.body, 400, 'VALIDATION.FAILED');
  });

  it('treats search text as text, not SQL', async () => {
    const res = await ctx.http
      .get(`/api/users?q=${encodeURIComponent("' OR 1=1 --")}`)
      .set('Authorization', `Bearer ${supervisor.token}`)
      .expect(200);
    expect(res.body.total).toBe(0);
  });

  it('changes a role, records it in the audit trail, and the new role applies on the next request', async () => {
    const user = await createUser(ctx, 'hobbyist');
    await ctx.http.get('/api/users').set('Authorization', `Bearer ${user.token}`).expect(403);
    const res = await ctx.http
      .patch(`/api/users/${user.id}`)
      .set('Authorization', `Bearer ${supervisor.token}`)
      .send({ role: 'fabricator' })
      .expect(200);
    expect(res.body.role).toBe('fabricator');
    const audit: { action: string; actor_id: string; before: { role: string }; after: { role: string } }[] =
      await ctx.db.query(`SELECT * FROM audit_events WHERE entity_id = $1 ORDER BY id`, [user.id]);
    expect(audit.at(-1)).toMatchObject({
      action: 'user.update',
      actor_id: supervisor.id,
      before: { role: 'hobbyist' },
      after: { role: 'fabricator' },
    });
  });

  it('tells every supervisor when someone is made a supervisor or stops being one, and no one else', async () => {
    const user = await createUser(ctx, 'hobbyist');
    const outbox = async (kind: string) =>
      (await ctx.db.query(
        `SELECT recipients, subject, text_body FROM mail_outbox WHERE kind = $1 AND text_body LIKE $2`,
        [kind, `%${user.email}%`],
      )) as { recipients: string[]; subject: string; text_body: string }[];
    // A change that leaves the supervisors as they were tells nobody.
    await ctx.http
      .patch(`/api/users/${user.id}`)
      .set('Authorization', `Bearer ${supervisor.token}`)
      .send({ role: 'fabricator' })
      .expect(200);
    expect(await outbox('user.supervisor-granted')).toHaveLength(0);
    await ctx.http
      .patch(`/api/users/${user.id}`)
      .set('Authorization', `Bearer ${supervisor.token}`)
      .send({ role: 'supervisor' })
      .expect(200);
    const supervisors = (
      (await ctx.db.query(`SELECT email FROM users WHERE active AND role = 'supervisor'`)) as {
        email: string;
      }[]
    ).map((r) => r.email);
    const granted = await outbox('user.supervisor-granted');
    // One mail per supervisor, the new one and the one who made the change included.
    expect(granted.map((g) => g.recipients[0]).sort()).toEqual([...supervisors].sort());
    expect(supervisors).toEqual(expect.arrayContaining([supervisor.email, user.email]));
    expect(granted[0]!.text_body).toContain('If this change was not agreed in the workshop');
    await ctx.http
      .patch(`/api/users/${user.id}`)
      .set('Authorization', `Bearer ${supervisor.token}`)
      .send({ role: 'operator' })
      .expect(200);
    const removed = await outbox('user.supervisor-removed');
    expect(removed.length).toBe(supervisors.length - 1);
    expect(removed.map((r) => r.recipients[0])).not.toContain(user.email);
  });

  it('deactivates a user, whose token then stops working', async () => {
    const user = await createUser(ctx, 'operator');
    await ctx.http
      .patch(`/api/users/${user.id}`)
      .set('Authorization', `Bearer ${supervisor.token}`)
      .send({ active: false })
      .expect(200);
    const res = await ctx.http.get('/api/auth/me').set('Authorization', `Bearer ${user.token}`).expect(401);
    expectErrorBody(res.body, 401);
  });

  it('refuses an unknown role, an empty change and a self-demotion, writing nothing', async () => {
    const user = await createUser(ctx, 'hobbyist');
    const before = await countRows(ctx, 'audit_events');
    const auth = { Authorization: `Bearer ${supervisor.token}` };
    const r1 = await ctx.http.patch(`/api/users/${user.id}`).set(auth).send({ role: 'admin' }).expect(400);
    expect(r1.body.details[0].field).toBe('role');
    await ctx.http.patch(`/api/users/${user.id}`).set(auth).send({}).expect(400);
    const r3 = await ctx.http
      .patch(`/api/users/${supervisor.id}`)
      .set(auth)
      .send({ role: 'hobbyist' })
      .expect(409);
    expectErrorBody(r3.body, 409, 'USER.SELF_CHANGE');
    expect(await countRows(ctx, 'audit_events')).toBe(before);
  });

  it('refuses a self-change however the own id is written (upper case, mixed case), role and deactivation alike', async () => {
    const auth = { Authorization: `Bearer ${supervisor.token}` };
    const before = await countRows(ctx, 'audit_events');
    const mixed = supervisor.id.replace(/[a-f]/g, (c, i: number) => (i % 2 ? c.toUpperCase() : c));
    for (const id of [supervisor.id.toUpperCase(), mixed]) {
      for (const change of [{ role: 'hobbyist' }, { active: false }]) {
        const res = await ctx.http.patch(`/api/users/${id}`).set(auth).send(change).expect(409);
        expectErrorBody(res.body, 409, 'USER.SELF_CHANGE');
      }
    }
    const rows: { role: string; active: boolean }[] = await ctx.db.query(
      `SELECT role, active FROM users WHERE id = $1`,
      [supervisor.id],
    );
    expect(rows).toEqual([{ role: 'supervisor', active: true }]);
    expect(await countRows(ctx, 'audit_events')).toBe(before);
    // Someone else's id in upper case still names them.
    const other = await createUser(ctx, 'hobbyist');
    const res = await ctx.http
      .patch(`/api/users/${other.id.toUpperCase()}`)
      .set(auth)
      .send({ role: 'operator' })
      .expect(200);
    expect(res.body).toMatchObject({ id: other.id, role: 'operator' });
  });

  it('settles two supervisors changing each other at the same moment: one change stands, never a 500', async () => {
    // Each change locks the user it changes and, through the audit row's foreign key, its own author: taken
    // in opposite orders that deadlocked (PostgreSQL 40P01, answered 500). docs/security.md: a race is a 409.
    for (const change of [{ role: 'operator' }, { active: false }]) {
      for (let round = 0; round < 4; round++) {
        const a = await createUser(ctx, 'supervisor');
        const b = await createUser(ctx, 'supervisor');
        const answers = await Promise.all([
          ctx.http.patch(`/api/users/${b.id}`).set('Authorization', `Bearer ${a.token}`).send(change),
          ctx.http.patch(`/api/users/${a.id}`).set('Authorization', `Bearer ${b.token}`).send(change),
        ]);
        const statuses = answers.map((r) => r.status);
        expect(statuses.filter((s) => s === 200)).toHaveLength(1);
        // The other one lost the race (409) or, sent after the first change, came from an account no longer
        // a supervisor (403) or no longer active (401).
        const refused = answers.find((r) => r.status !== 200)!;
        expect([401, 403, 409]).toContain(refused.status);
        expectErrorBody(refused.body, refused.status);
        const rows: { role: string; active: boolean }[] = await ctx.db.query(
          `SELECT role, active FROM users WHERE id = ANY($1)`,
          [[a.id, b.id]],
        );
        expect(rows.filter((r) => r.role === 'supervisor' && r.active)).toHaveLength(1);
      }
    }
  });

  it('answers 404 for an unknown user and 400 for a malformed id', async () => {
    const auth = { Authorization: `Bearer ${supervisor.token}` };
    const nf = await ctx.http
      .patch('/api/users/00000000-0000-4000-8000-000000000000')
      .set(auth)
      .send({ active: false })
      .expect(404);
    expectErrorBody(nf.body, 404, 'USER.NOT_FOUND');
    await ctx.http.patch('/api/users/..%2F..%2Fetc').set(auth).send({ active: false }).expect(400);
  });
});
