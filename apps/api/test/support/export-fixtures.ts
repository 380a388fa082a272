import { setTimeout as sleep } from 'node:timers/promises';
import { type Response } from 'superagent';
import { type ExportView } from '@kerfwright/contracts';
import { type TestContext, type TestUser } from './test-app';
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
  const act = async (u: TestUser, action: string, body: Record<string, unknown> = {}) => {
    const current = await ctx.http.get(`/api/jobs/${id}`).set(auth(people.supervisor)).expect(200);
    await ctx.http
      .post(`/api/jobs/${id}/${action}`)
      .set(auth(u))
      .send({ version: current.body.version, ...body })
      .expect(200);
  };
  await act(people.owner, 'request');
  await act(people.fabricator, 'prepare', {
    materialId: w.acrylicId,
    profileVersionId: w.laserVersionId,
    colours,
  });
  await act(people.supervisor, 'approve');
  return id;
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
