import { randomUUID } from 'node:crypto';
import * as fs from 'node:fs';
import * as os from 'node:os';
import * as path from 'node:path';
import { setTimeout as sleep } from 'node:timers/promises';
import { type Response } from 'superagent';
import { type ExportView } from '@kerfwright/contracts';
import { type TestContext, type TestUser } from './test-app';
import { dropQueueKeys } from './queue-keys';
import { octahedronHexagons, type WorkshopFixture } from './workshop-fixtures';

export const auth = (u: TestUser) => ({ Authorization: `Bearer ${u.token}` });

/** A job taken through the real routes to "approved": requested by `owner`, prepared, approved. */
export async function approvedJob(
  ctx: TestContext,
  w: WorkshopFixture,
  people: { owner: TestUser; fabricator: TestUser; supervisor: TestUser },
  colours: string[] = ['clear', 'amber'],
): Promise<string> {
  const d = await ctx.http
    .post('/api/designs')
    .set(auth(people.owner))
    .send({ name: 'Octahedron lamp with hexagons', spec: octahedronHexagons() })
    .expect(201);
  const j = await ctx.http
    .post('/api/jobs')
    .set(auth(people.owner))
    .send({ designId: d.body.id, quantity: 1 })
    .expect(201);
  const id = j.body.id as string;
  const act = jobActor(ctx, people.supervisor, id);
  await act(people.owner, 'request');
  await act(people.fabricator, 'prepare', {
    materialId: w.acrylicId,
    profileVersionId: w.laserVersionId,
    colours,
  });
  await act(people.supervisor, 'approve');
  return id;
}

/**
 * Takes job actions by their routes, each with the job's current version (read as `reader`, who sees it):
 * `act(user, action, body?, status = 200)` answers the response.
 */
export function jobActor(ctx: TestContext, reader: TestUser, jobId: string) {
  return async (u: TestUser, action: string, body: Record<string, unknown> = {}, status = 200) => {
    const current = await ctx.http.get(`/api/jobs/${jobId}`).set(auth(reader)).expect(200);
    return ctx.http
      .post(`/api/jobs/${jobId}/${action}`)
      .set(auth(u))
      .send({ version: current.body.version, ...body })
      .expect(status);
  };
}

/** Polls GET /api/exports/:id until `until` holds (or fails after `timeoutMs`). */
export async function pollExport(
  ctx: TestContext,
  user: TestUser,
  exportId: string,
  until: (v: ExportView) => boolean,
  timeoutMs = 60000,
): Promise<ExportView> {
  const end = Date.now() + timeoutMs;
  for (;;) {
    const res = await ctx.http.get(`/api/exports/${exportId}`).set(auth(user)).expect(200);
    const view = res.body as ExportView;
    if (until(view)) return view;
    if (Date.now() > end) throw new Error(`export ${exportId} still ${view.state} (${view.progress}%)`);
    await sleep(150);
  }
}

/** Acknowledges the job's current notices and local rules as `user` (operator or supervisor). */
export async function acknowledge(ctx: TestContext, user: TestUser, jobId: string): Promise<void> {
  const s = await ctx.http.get(`/api/jobs/${jobId}/safety`).set(auth(user)).expect(200);
  await ctx.http
    .post(`/api/jobs/${jobId}/safety/acknowledge`)
    .set(auth(user))
    .send({
      notices: (s.body.notices as { id: string; version: number }[]).map((n) => ({
        id: n.id,
        version: n.version,
      })),
      localRulesVersion: s.body.localRules?.version ?? null,
      preparationId: s.body.preparationId,
    })
    .expect(200);
}

/** Collects a supertest response body as raw bytes. */
export function binary(res: Response, done: (err: Error | null, body: Buffer) => void): void {
  const chunks: Buffer[] = [];
  const stream = res as unknown as NodeJS.ReadableStream;
  stream.on('data', (c: Buffer) => chunks.push(c));
  stream.on('end', () => done(null, Buffer.concat(chunks)));
}

/**
 * Gives a suite's app a cut-pack queue and file store of its own (a fresh Bull prefix on the test Redis and
 * the filesystem storage driver in a fresh folder), so releasing jobs works without the S3 fake and no other
 * suite's exports are taken. Call before startTestApp; `restore` after closing the app.
 */
export function isolateExports(): { restore(): Promise<void> } {
  const prefix = `kw-test-${randomUUID().slice(0, 8)}`;
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'kw-files-test-'));
  const env: Record<string, string> = {
    KW_QUEUE_PREFIX: prefix,
    KW_STORAGE: 'fs',
    KW_STORAGE_DIR: dir,
    KW_WORKER_MODE: 'inline',
    KW_EXPORT_BACKOFF_MS: '300',
  };
  const saved: Record<string, string | undefined> = {};
  for (const [k, v] of Object.entries(env)) {
    saved[k] = process.env[k];
    process.env[k] = v;
  }
  return {
    async restore() {
      await dropQueueKeys(prefix);
      fs.rmSync(dir, { recursive: true, force: true });
      for (const [k, v] of Object.entries(saved)) {
        if (v === undefined) delete process.env[k];
        else process.env[k] = v;
      }
    },
  };
}

/**
 * Releases an approved job the one way there is: POST /api/jobs/:id/release answers 202 { exportId } and the
 * job becomes released when that export is done. Waits for it and returns the finished export.
 */
export async function releaseJob(ctx: TestContext, user: TestUser, jobId: string): Promise<ExportView> {
  const current = await ctx.http.get(`/api/jobs/${jobId}`).set(auth(user)).expect(200);
  const res = await ctx.http
    .post(`/api/jobs/${jobId}/release`)
    .set(auth(user))
    .send({ version: current.body.version })
    .expect(202);
  const view = await pollExport(
    ctx,
    user,
    res.body.exportId as string,
    (v) => v.state === 'done' || v.state === 'failed',
  );
  if (view.state !== 'done')
    throw new Error(`export ${view.id} failed: ${view.errorCode} ${view.errorMessage}`);
  return view;
}
