import { type INestApplication } from '@nestjs/common';
import { getDataSourceToken } from '@nestjs/typeorm';
import bcrypt from 'bcryptjs';
import { randomUUID } from 'node:crypto';
import request from 'supertest';
import { type DataSource } from 'typeorm';
import { type Role } from '@kerfwright/contracts';
import { createApp } from '../../src/app.factory';

/**
 * The real application against the test PostgreSQL and Redis that scripts/test.sh started
 * (KW_DB_PORT, KW_REDIS_PORT in the environment). Nothing is mocked.
 */
export interface TestContext {
  app: INestApplication;
  http: ReturnType<typeof request>;
  db: DataSource;
}

export async function startTestApp(): Promise<TestContext> {
  const app = await createApp({ logger: process.env.KW_TEST_LOG ? ['error', 'warn'] : false });
  await app.init();
  const db = app.get<DataSource>(getDataSourceToken());
  return { app, http: request(app.getHttpServer()), db };
}

export interface TestUser {
  id: string;
  email: string;
  password: string;
  role: Role;
  token: string;
}

/** Inserts a user straight into the database (cheap hash cost for speed) and signs in through the API. */
export async function createUser(
  ctx: TestContext,
  role: Role,
  opts: { active?: boolean } = {},
): Promise<TestUser> {
  const email = `${role}-${randomUUID().slice(0, 8)}@tests.example`;
  const password = `pw-${randomUUID()}`;
  const hash = await bcrypt.hash(password, 4);
  const rows: { id: string }[] = await ctx.db.query(
    `INSERT INTO users (email, display_name, password_hash, role, active) VALUES ($1, $2, $3, $4, true) RETURNING id`,
    [email, `Test ${role}`, hash, role],
  );
  const id = rows[0]!.id;
  const res = await ctx.http.post('/api/auth/login').send({ email, password }).expect(200);
  if (opts.active === false) await ctx.db.query(`UPDATE users SET active = false WHERE id = $1`, [id]);
  return { id, email, password, role, token: res.body.accessToken as string };
}

export async function countRows(ctx: TestContext, table: string): Promise<number> {
  const rows: { n: string }[] = await ctx.db.query(`SELECT count(*)::text AS n FROM ${table}`);
  return Number(rows[0]!.n);
}

/** Whether some statement waits for a lock and its text matches `like` (a race held at a known point). */
export async function waitingOnLock(ctx: TestContext, like: string): Promise<boolean> {
  const rows: unknown[] = await ctx.db.query(
    `SELECT 1 FROM pg_stat_activity WHERE wait_event_type = 'Lock' AND query ILIKE $1`,
    [like],
  );
  return rows.length > 0;
}

/** Polls `holds` every 50 ms until it is true; throws after 30 s, naming `what` it waited for. */
export async function until(what: string, holds: () => Promise<boolean>): Promise<void> {
  const end = Date.now() + 30_000;
  while (!(await holds())) {
    if (Date.now() > end) throw new Error(`timed out waiting for ${what}`);
    await new Promise((r) => setTimeout(r, 50));
  }
}

/** Asserts the one error body every non-2xx response carries. */
export function expectErrorBody(body: unknown, statusCode: number, code?: string): void {
  expect(body).toEqual(
    expect.objectContaining({
      statusCode,
      code: code ?? expect.any(String),
      message: expect.any(String),
      requestId: expect.any(String),
    }),
  );
  expect(JSON.stringify(body)).not.toMatch(/at \S+ \(.*:\d+:\d+\)/); // no stack trace
}
