import { JwtService } from '@nestjs/jwt';
import { randomUUID } from 'node:crypto';
import { DEV_JWT_SECRET } from '../src/config/env.validation';
import { countRows, createUser, expectErrorBody, startTestApp, type TestContext } from './support/test-app';

describe('sign-in and registration (real PostgreSQL)', () => {
  let ctx: TestContext;
  beforeAll(async () => {
    ctx = await startTestApp();
  });
  afterAll(async () => {
    await ctx.app.close();
  });

  it('reports PostgreSQL and Redis up on /api/health', async () => {
    const res = await ctx.http.get('/api/health').expect(200);
    expect(res.body).toMatchObject({ status: 'ok', database: 'up', redis: 'up' });
  });

  it('registers a hobbyist and returns a working token', async () => {
    const email = `new-${randomUUID().slice(0, 8)}@tests.example`;
    const res = await ctx.http
      .post('/api/auth/register')
      .send({ email, displayName: 'Ada New', password: 'a-long-password' })
      .expect(201);
    expect(res.body.user).toMatchObject({ email, role: 'hobbyist', active: true });
    const me = await ctx.http
      .get('/api/auth/me')
      .set('Authorization', `Bearer ${res.body.accessToken}`)
      .expect(200);
    expect(me.body.email).toBe(email);
  });

  it('refuses a second account with the same e-mail in any letter case', async () => {
    const email = `dup-${randomUUID().slice(0, 8)}@tests.example`;
    await ctx.http
      .post('/api/auth/register')
      .send({ email, displayName: 'One', password: 'a-long-password' })
      .expect(201);
    const res = await ctx.http
      .post('/api/auth/register')
      .send({ email: email.toUpperCase(), displayName: 'Two', password: 'a-long-password' })
      .expect(409);
    expectErrorBody(res.body, 409, 'AUTH.EMAIL_TAKEN');
  });

  it('gives requests racing to register one e-mail in different letter cases one account and EMAIL_TAKEN', async () => {
    const local = `race-${randomUUID().slice(0, 8)}`;
    const variants = [
      `${local}@tests.example`,
      `${local.toUpperCase()}@tests.example`,
      `${local}@TESTS.example`,
    ];
    variants.push(`${local.toUpperCase()}@TESTS.EXAMPLE`);
    const answers = await Promise.all(
      variants.map((email) =>
        ctx.http
          .post('/api/auth/register')
          .send({ email, displayName: 'Racer', password: 'a-long-password' }),
      ),
    );
    expect(answers.map((r) => r.status).sort()).toEqual([201, 409, 409, 409]);
    for (const r of answers.filter((a) => a.status === 409)) expectErrorBody(r.body, 409, 'AUTH.EMAIL_TAKEN');
    const rows: unknown[] = await ctx.db.query(`SELECT 1 FROM users WHERE lower(email) = lower($1)`, [
      variants[0],
    ]);
    expect(rows).toHaveLength(1);
  });

  it('rejects a malformed body with 400 naming the field, and writes nothing', async () => {
    const before = await countRows(ctx, 'users');
    const res = await ctx.http
      .post('/api/auth/register')
      .send({ email: 'not-an-email', displayName: 'X', password: 'short' })
      .expect(400);
    expectErrorBody(res.body, 400, 'VALIDATION.FAILED');
    const fields = (res.body.details as { field: string }[]).map((d) => d.field).sort();
    expect(fields).toEqual(['email', 'password']);
    expect(await countRows(ctx, 'users')).toBe(before);
  });

  it('refuses a password that is long only by its spaces, but takes spaces inside a passphrase', async () => {
    for (const password of [' '.repeat(12), '   abc     ', '\tshort pw\n']) {
      const res = await ctx.http
        .post('/api/auth/register')
        .send({ email: `sp-${randomUUID().slice(0, 8)}@tests.example`, displayName: 'S', password })
        .expect(400);
      expectErrorBody(res.body, 400, 'VALIDATION.FAILED');
      expect(JSON.stringify(res.body.details)).toMatch(/besides leading and trailing spaces/);
    }
    await ctx.http
      .post('/api/auth/register')
      .send({
        email: `sp-${randomUUID().slice(0, 8)}@tests.example`,
        displayName: 'S',
        password: 'a long pass phrase',
      })
      .expect(201);
  });

  it('refuses to let a registration choose its own role', async () => {
    const before = await countRows(ctx, 'users');
    const res = await ctx.http
      .post('/api/auth/register')
      .send({
        email: `esc-${randomUUID().slice(0, 8)}@tests.example`,
        displayName: 'E',
        password: 'a-long-password',
        role: 'supervisor',
      })
      .expect(400);
    expect(res.body.details).toEqual([expect.objectContaining({ field: 'role' })]);
    expect(await countRows(ctx, 'users')).toBe(before);
  });

  it('answers a wrong password and an unknown e-mail alike with 401', async () => {
    const user = await createUser(ctx, 'operator');
    const wrong = await ctx.http
      .post('/api/auth/login')
      .send({ email: user.email, password: 'wrong-password' })
      .expect(401);
    expectErrorBody(wrong.body, 401, 'AUTH.INVALID_CREDENTIALS');
    const unknown = await ctx.http
      .post('/api/auth/login')
      .send({ email: 'nobody@tests.example', password: 'wrong-password' })
      .expect(401);
    expect(unknown.body.message).toBe(wrong.body.message);
  });

  it('answers malformed JSON with 400 and the error body', async () => {
    const res = await ctx.http
      .post('/api/auth/login')
      .set('Content-Type', 'application/json')
      .send('{"email":')
      .expect(400);
    expectErrorBody(res.body, 400);
  });

  it('refuses requests without, with a tampered, or with an expired token', async () => {
    const user = await createUser(ctx, 'fabricator');
    expectErrorBody((await ctx.http.get('/api/auth/me').expect(401)).body, 401, 'AUTH.UNAUTHENTICATED');
    const [h, p, s] = user.token.split('.');
    const forgedPayload = Buffer.from(JSON.stringify({ sub: user.id, role: 'supervisor' })).toString(
      'base64url',
    );
    const tampered = `${h}.${forgedPayload}.${s}`;
    await ctx.http.get('/api/auth/me').set('Authorization', `Bearer ${tampered}`).expect(401);
    expect(p).toBeDefined();
    const otherKey = new JwtService({ secret: 'some-other-secret-entirely-0123456789' });
    const foreign = await otherKey.signAsync({ sub: user.id, role: 'supervisor' });
    await ctx.http.get('/api/auth/me').set('Authorization', `Bearer ${foreign}`).expect(401);
    const secret = process.env.KW_JWT_SECRET ?? DEV_JWT_SECRET;
    const expired = await new JwtService({ secret }).signAsync(
      { sub: user.id, role: user.role, exp: Math.floor(Date.now() / 1000) - 60 },
      {},
    );
    await ctx.http.get('/api/auth/me').set('Authorization', `Bearer ${expired}`).expect(401);
  });

  it('ends the session signed out: its token is refused, other sessions of the account go on', async () => {
    const user = await createUser(ctx, 'operator');
    const second = await ctx.http
      .post('/api/auth/login')
      .send({ email: user.email, password: user.password })
      .expect(200);
    const kept = { Authorization: `Bearer ${user.token}` };
    const ended = { Authorization: `Bearer ${second.body.accessToken as string}` };
    await ctx.http.get('/api/auth/me').set(ended).expect(200);
    await ctx.http.post('/api/auth/sign-out').set(ended).expect(204);
    // A copy of the token kept after signing out (a shared PC, a leaked header) opens nothing.
    expectErrorBody((await ctx.http.get('/api/auth/me').set(ended).expect(401)).body, 401);
    await ctx.http.get('/api/jobs').set(ended).expect(401);
    await ctx.http.get('/api/auth/me').set(kept).expect(200);
    const rows: { user_id: string; expires_at: Date }[] = await ctx.db.query(
      `SELECT user_id, expires_at FROM revoked_tokens WHERE user_id = $1`,
      [user.id],
    );
    expect(rows).toHaveLength(1);
    // Kept no longer than the token would have lived (8 h by default).
    expect(rows[0]!.expires_at.getTime()).toBeLessThanOrEqual(Date.now() + 8 * 3600e3 + 5e3);
    // Signed in again, the account works as before; no token is needed to sign out twice.
    await ctx.http.post('/api/auth/sign-out').set(ended).expect(401);
    await ctx.http.post('/api/auth/login').send({ email: user.email, password: user.password }).expect(200);
  });

  it('stops a deactivated user’s token at once', async () => {
    const user = await createUser(ctx, 'hobbyist');
    await ctx.http.get('/api/auth/me').set('Authorization', `Bearer ${user.token}`).expect(200);
    await ctx.db.query(`UPDATE users SET active = false WHERE id = $1`, [user.id]);
    await ctx.http.get('/api/auth/me').set('Authorization', `Bearer ${user.token}`).expect(401);
    await ctx.http.post('/api/auth/login').send({ email: user.email, password: user.password }).expect(401);
  });

  it('limits sign-in attempts per address and e-mail with 429', async () => {
    const email = `brute-${randomUUID().slice(0, 8)}@tests.example`;
    const limit = Number(process.env.KW_LOGIN_LIMIT ?? 10);
    for (let i = 0; i < limit; i++) {
      await ctx.http.post('/api/auth/login').send({ email, password: 'guess-guess' }).expect(401);
    }
    const res = await ctx.http.post('/api/auth/login').send({ email, password: 'guess-guess' }).expect(429);
    expectErrorBody(res.body, 429, 'RATE_LIMIT.EXCEEDED');
    // Another account from the same address is not locked out.
    const other = await createUser(ctx, 'hobbyist');
    expect(other.token).toBeTruthy();
  });

  it('counts a client’s sign-ins together whatever X-Forwarded-For it sends, and says when to try again', async () => {
    // No proxy is trusted unless KW_TRUST_PROXY names it: the address is the connection's (loopback here).
    const email = `rotating-${randomUUID().slice(0, 8)}@tests.example`;
    const limit = Number(process.env.KW_LOGIN_LIMIT ?? 10);
    const attempt = (i: number) =>
      ctx.http
        .post('/api/auth/login')
        .set('X-Forwarded-For', `203.0.113.${i + 1}`)
        .send({ email, password: 'guess-guess' });
    for (let i = 0; i < limit; i++) await attempt(i).expect(401);
    const res = await attempt(limit).expect(429);
    expectErrorBody(res.body, 429, 'RATE_LIMIT.EXCEEDED');
    // RFC 9110 §10.2.3: Retry-After is a date or a delay in whole seconds; here at most the window.
    expect(res.headers['retry-after']).toMatch(/^\d+$/);
    const seconds = Number(res.headers['retry-after']);
    expect(seconds).toBeGreaterThan(0);
    expect(seconds).toBeLessThanOrEqual(Number(process.env.KW_LOGIN_WINDOW_S ?? 60));
    expect(res.headers['retry-after-login']).toBeUndefined();
  });
});
