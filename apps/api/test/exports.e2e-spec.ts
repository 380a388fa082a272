import { createHash, randomUUID } from 'node:crypto';
import { setTimeout as sleep } from 'node:timers/promises';
import { type ExportView } from '@kerfwright/contracts';
import { type Response } from 'superagent';
import { ExportsService } from '../src/exports/exports.service';
import { OBJECT_STORAGE, type ObjectStorage } from '../src/storage/object-storage';
import {
  acknowledge,
  approvedJob,
  auth,
  binary,
  isolateExports,
  jobActor,
  pollExport,
} from './support/export-fixtures';
import { type S3Fake, startS3Fake } from './support/object-store';
import { dropQueueKeys } from './support/queue-keys';
import {
  createUser,
  expectErrorBody,
  startTestApp,
  type TestContext,
  type TestUser,
  until,
  waitingOnLock,
} from './support/test-app';
import { startWorker, stopWorker, type WorkerProcess } from './support/worker-process';
import { createWorkshop, type WorkshopFixture } from './support/workshop-fixtures';

jest.setTimeout(90000);

type People = Record<'owner' | 'other' | 'fabricator' | 'operator' | 'supervisor', TestUser>;

/** SHA-256 of the bytes as Node's crypto computes it (FIPS 180-4), the reference every checksum must match. */
const sha256 = (b: Buffer) => createHash('sha256').update(b).digest('hex');

/** Each run gets its own Bull key prefix and bucket so nothing else on this Redis takes its jobs. */
function isolatedEnv(s3: S3Fake, tag: string): Record<string, string> {
  return {
    KW_QUEUE_PREFIX: `kw-test-${tag}`,
    KW_STORAGE: 's3',
    KW_S3_PORT: String(s3.port),
    KW_S3_BUCKET: `kw-test-${tag}`,
    KW_EXPORT_LOCK_MS: '3000',
    KW_EXPORT_STALLED_CHECK_MS: '1000',
    KW_EXPORT_BACKOFF_MS: '300',
    KW_EXPORT_ATTEMPTS: '4',
  };
}

async function everyone(ctx: TestContext): Promise<People> {
  return {
    owner: await createUser(ctx, 'hobbyist'),
    other: await createUser(ctx, 'hobbyist'),
    fabricator: await createUser(ctx, 'fabricator'),
    operator: await createUser(ctx, 'operator'),
    supervisor: await createUser(ctx, 'supervisor'),
  };
}

async function download(ctx: TestContext, user: TestUser, exportId: string, name: string, status = 200) {
  return ctx.http
    .get(`/api/exports/${exportId}/files/${name}`)
    .set(auth(user))
    .set('Accept-Encoding', 'gzip')
    .buffer(true)
    .parse(binary)
    .expect(status);
}

/** Releases the job at its current version (202); returns the id of the export that builds its files. */
async function postRelease(ctx: TestContext, fabricator: TestUser, jobId: string): Promise<string> {
  const job = await ctx.http.get(`/api/jobs/${jobId}`).set(auth(fabricator)).expect(200);
  const res = await ctx.http
    .post(`/api/jobs/${jobId}/release`)
    .set(auth(fabricator))
    .send({ version: job.body.version })
    .expect(202);
  return res.body.exportId as string;
}

/** Releases the job and waits until the export building its files is done or has failed. */
async function releaseAndWait(ctx: TestContext, fabricator: TestUser, jobId: string): Promise<ExportView> {
  return pollExport(
    ctx,
    fabricator,
    await postRelease(ctx, fabricator, jobId),
    (v) => v.state === 'done' || v.state === 'failed',
    90000,
  );
}

/** A superagent parser that collects a server-sent event stream as text until it ends. */
function streamText(res: Response, done: (err: Error | null, body: string) => void): void {
  let text = '';
  const stream = res as unknown as NodeJS.ReadableStream;
  stream.setEncoding('utf8');
  stream.on('data', (c: string) => (text += c));
  stream.on('end', () => done(null, text));
}

describe('cut-pack exports worked inside the API process', () => {
  const tag = randomUUID().slice(0, 8);
  let s3: S3Fake;
  let ctx: TestContext;
  let w: WorkshopFixture;
  let p: People;
  let jobId: string;
  let exportId: string;
  const saved: Record<string, string | undefined> = {};

  beforeAll(async () => {
    s3 = await startS3Fake(`kw-test-${tag}`);
    for (const [k, v] of Object.entries({ ...isolatedEnv(s3, tag), KW_WORKER_MODE: 'inline' })) {
      saved[k] = process.env[k];
      process.env[k] = v;
    }
    ctx = await startTestApp();
    w = await createWorkshop(ctx);
    p = await everyone(ctx);
    jobId = await approvedJob(ctx, w, p);
  });
  afterAll(async () => {
    await ctx?.app.close();
    await s3?.dispose();
    await dropQueueKeys(`kw-test-${tag}`);
    for (const [k, v] of Object.entries(saved)) {
      if (v === undefined) delete process.env[k];
      else process.env[k] = v;
    }
  });

  it('builds the pack off the request path and releases the approved job with checksummed files', async () => {
    // The price list changes after approval: the pack still prices its sheets as the approved job did (18 EUR).
    await ctx.db.query(`UPDATE materials SET stock_sheets = $2 WHERE id = $1`, [
      w.acrylicId,
      JSON.stringify([{ widthMm: 600, heightMm: 400, pricePerSheet: 36, currency: 'EUR' }]),
    ]);
    const res = await ctx.http.post(`/api/jobs/${jobId}/exports`).set(auth(p.fabricator)).expect(202);
    exportId = res.body.exportId as string;
    expect(exportId).toMatch(/^[0-9a-f-]{36}$/);
    const view = await pollExport(
      ctx,
      p.fabricator,
      exportId,
      (v) => v.state === 'done' || v.state === 'failed',
    );
    expect(view).toMatchObject({ state: 'done', progress: 100, attempts: 1, errorCode: null });

    const job = await ctx.http.get(`/api/jobs/${jobId}`).set(auth(p.fabricator)).expect(200);
    expect(job.body.state).toBe('released');
    const last = job.body.transitions.at(-1);
    expect(last).toMatchObject({
      from: 'approved',
      to: 'released',
      action: 'release',
      actorId: p.fabricator.id,
    });
    const audit: { action: string }[] = await ctx.db.query(
      `SELECT action FROM audit_events WHERE entity_id = $1 ORDER BY id`,
      [jobId],
    );
    expect(audit.map((a) => a.action).slice(-3)).toEqual(['export.request', 'export.done', 'job.release']);
    const mail: { n: string }[] = await ctx.db.query(
      `SELECT count(*)::text AS n FROM mail_outbox WHERE kind = 'job.released' AND subject LIKE '%Octahedron lamp%'`,
    );
    expect(Number(mail[0]!.n)).toBeGreaterThanOrEqual(1);

    // Every kind of file a cut pack holds, each stored under the job-scoped prefix.
    const roles = new Set(view.files.map((f) => f.role));
    for (const role of ['sheet-dxf', 'sheet-svg', 'setup-sheet', 'assembly-guide', 'manifest', 'archive']) {
      expect(roles).toContain(role);
    }
    const rows: { name: string; storage_key: string; sha256: string; bytes: string }[] = await ctx.db.query(
      `SELECT name, storage_key, sha256, bytes FROM export_files WHERE export_id = $1 ORDER BY storage_key`,
      [exportId],
    );
    expect(rows).toHaveLength(view.files.length);
    for (const r of rows) expect(r.storage_key).toBe(`jobs/${jobId}/exports/${exportId}/${r.name}`);
    const storage = ctx.app.get<ObjectStorage>(OBJECT_STORAGE);
    const listed = await storage.list(`jobs/${jobId}/exports/${exportId}/`);
    expect(listed.map((o) => o.key)).toEqual(rows.map((r) => r.storage_key));

    // Downloaded bytes hash to the recorded checksums, with the stored content type and a safe file name.
    await acknowledge(ctx, p.operator, jobId);
    const manifestFile = view.files.find((f) => f.role === 'manifest')!;
    const manifest = JSON.parse(
      (await download(ctx, p.operator, exportId, manifestFile.name)).body.toString('utf8'),
    ) as {
      files: { name: string; sha256: string; bytes: number }[];
      sheetCount: number;
      estimate: { materialCost: number | null };
    };
    // The job was approved on the time and cost its cut pack now gives.
    expect(job.body.preparation.estimate).toEqual(manifest.estimate);
    expect(job.body.preparation.pricePerSheet).toBe(18);
    expect(manifest.estimate.materialCost).toBeCloseTo(18 * manifest.sheetCount, 6);
    for (const f of view.files) {
      const got = await download(ctx, p.operator, exportId, f.name);
      const body = got.body as Buffer;
      expect(sha256(body)).toBe(f.sha256);
      expect(body.length).toBe(f.bytes);
      expect(got.headers['content-type']).toContain(f.contentType.split(';')[0]!);
      expect(got.headers['content-disposition']).toBe(`attachment; filename="${f.name}"`);
      // Sent as stored, never re-encoded (gzip): the Repr-Digest and the recorded checksum are of these bytes.
      expect(got.headers['content-encoding']).toBeUndefined();
      // RFC 9530 Repr-Digest: the algorithm, then the digest in base64 between colons.
      expect(got.headers['repr-digest']).toBe(
        `sha-256=:${createHash('sha256').update(body).digest('base64')}:`,
      );
      const entry = manifest.files.find((e) => e.name === f.name);
      if (entry) expect(entry.sha256).toBe(f.sha256);
      // File signatures: PDF header "%PDF-" (ISO 32000-1, 7.5.2), ZIP local header "PK\x03\x04"
      // (PKWARE APPNOTE.TXT 4.3.7), DXF opens with a SECTION group (AutoCAD DXF Reference), SVG root element.
      if (f.name.endsWith('.pdf')) expect(body.subarray(0, 5).toString('latin1')).toBe('%PDF-');
      if (f.name.endsWith('.zip')) expect(body.subarray(0, 4).toString('latin1')).toBe('PK\x03\x04');
      if (f.name.endsWith('.dxf')) expect(body.toString('utf8')).toMatch(/^\s*0\s*\r?\nSECTION/);
      if (f.name.endsWith('.svg')) expect(body.toString('utf8')).toMatch(/<svg[\s>]/);
    }
    expect(manifest.files.length).toBeGreaterThan(0);
  });

  it('refuses downloads before acknowledgement, and other people’s files', async () => {
    const view = (await ctx.http.get(`/api/exports/${exportId}`).set(auth(p.supervisor)).expect(200))
      .body as ExportView;
    const guide = view.files.find((f) => f.role === 'assembly-guide')!;
    const sheet = view.files.find((f) => f.role === 'sheet-dxf')!;
    // Staff who have not acknowledged the current notices: 403. A fabricator, who cannot acknowledge them,
    // is told that downloads are the operators' and supervisors'.
    expectErrorBody(
      JSON.parse((await download(ctx, p.supervisor, exportId, sheet.name, 403)).body.toString()),
      403,
      'SAFETY.ACKNOWLEDGEMENT_REQUIRED',
    );
    expectErrorBody(
      JSON.parse((await download(ctx, p.fabricator, exportId, sheet.name, 403)).body.toString()),
      403,
      'EXPORT.DOWNLOAD_NOT_ALLOWED',
    );
    await acknowledge(ctx, p.supervisor, jobId);
    await download(ctx, p.supervisor, exportId, sheet.name, 200);
    const acks: { notice_versions: { id: string; version: number }[]; created_at: Date }[] =
      await ctx.db.query(
        `SELECT notice_versions, created_at FROM safety_acknowledgements WHERE job_id = $1 AND user_id = $2`,
        [jobId, p.supervisor.id],
      );
    expect(acks).toHaveLength(1);
    expect(acks[0]!.notice_versions.length).toBeGreaterThan(0);

    // New local rules make every earlier acknowledgement stale.
    await ctx.http
      .put('/api/safety/local-rules')
      .set(auth(p.supervisor))
      .send({ body: `Rules ${tag}` })
      .expect(200);
    expectErrorBody(
      JSON.parse((await download(ctx, p.operator, exportId, sheet.name, 403)).body.toString()),
      403,
      'SAFETY.ACKNOWLEDGEMENT_REQUIRED',
    );
    await acknowledge(ctx, p.operator, jobId);
    await download(ctx, p.operator, exportId, sheet.name, 200);
    // The pack's setup sheet (and the ZIP holding it) prints the old rules version: out of date, refused.
    const stale = (await ctx.http.get(`/api/exports/${exportId}`).set(auth(p.operator)).expect(200))
      .body as ExportView;
    expect(stale.safetyChanged).toBe(true);
    for (const role of ['setup-sheet', 'archive']) {
      const name = view.files.find((f) => f.role === role)!.name;
      const res = await download(ctx, p.operator, exportId, name, 409);
      expectErrorBody(JSON.parse(res.body.toString()), 409, 'EXPORT.SAFETY_CHANGED');
    }

    // The requester gets the assembly guide of their own job, and nothing else.
    const mine = await ctx.http.get(`/api/exports/${exportId}`).set(auth(p.owner)).expect(200);
    expect(mine.body.files.map((f: { role: string }) => f.role)).toEqual(['assembly-guide']);
    const got = await download(ctx, p.owner, exportId, guide.name, 200);
    expect(sha256(got.body as Buffer)).toBe(guide.sha256);
    await download(ctx, p.owner, exportId, sheet.name, 404);
    // Another hobbyist sees neither the export nor the file.
    await ctx.http.get(`/api/exports/${exportId}`).set(auth(p.other)).expect(404);
    await ctx.http.get(`/api/jobs/${jobId}/exports`).set(auth(p.other)).expect(404);
    await download(ctx, p.other, exportId, guide.name, 404);
  });

  it('never lets a requested name reach storage unless it is a recorded file of the export', async () => {
    for (const name of [
      '..%2F..%2Fetc%2Fpasswd',
      '%2E%2E',
      'SHEET-01.DXF',
      `..%2F${exportId}%2Fmanifest.json`,
      'manifest.json%00.pdf',
      'no-such-file.pdf',
    ]) {
      const res = await ctx.http.get(`/api/exports/${exportId}/files/${name}`).set(auth(p.operator));
      expect([400, 404]).toContain(res.status);
    }
    await ctx.http.get(`/api/exports/not-a-uuid/files/manifest.json`).set(auth(p.operator)).expect(400);
  });

  it('refuses to queue a job that is not approved, and roles that may not', async () => {
    const d = await ctx.http.get(`/api/jobs/${jobId}/exports`).set(auth(p.operator)).expect(200);
    expect(d.body).toHaveLength(1);
    await ctx.http.post(`/api/jobs/${jobId}/exports`).set(auth(p.operator)).expect(403);
    await ctx.http.post(`/api/jobs/${jobId}/exports`).set(auth(p.owner)).expect(403);
    // The version read, when sent, is compared (docs/security.md 11.1.2): a stale one queues nothing.
    const read = await ctx.http.get(`/api/jobs/${jobId}`).set(auth(p.fabricator)).expect(200);
    const stale = await ctx.http
      .post(`/api/jobs/${jobId}/exports`)
      .set(auth(p.fabricator))
      .send({ version: (read.body.version as number) - 1 })
      .expect(409);
    expectErrorBody(stale.body, 409, 'JOB.STALE_VERSION');
    await ctx.http
      .post(`/api/jobs/${jobId}/exports`)
      .set(auth(p.fabricator))
      .send({ version: 'latest' })
      .expect(400);
    const still = await ctx.http.get(`/api/jobs/${jobId}/exports`).set(auth(p.operator)).expect(200);
    expect(still.body).toHaveLength(1);
    const j = await ctx.http
      .post('/api/jobs')
      .set(auth(p.owner))
      .send({
        designId: (await ctx.db.query(`SELECT design_id FROM jobs WHERE id = $1`, [jobId]))[0].design_id,
      })
      .expect(201);
    await ctx.http
      .post(`/api/jobs/${j.body.id}/request`)
      .set(auth(p.owner))
      .send({ version: j.body.version })
      .expect(200);
    const res = await ctx.http.post(`/api/jobs/${j.body.id}/exports`).set(auth(p.fabricator)).expect(409);
    expectErrorBody(res.body, 409, 'EXPORT.JOB_NOT_READY');
  });

  it('streams progress as server-sent events for a re-export of the released job', async () => {
    const res = await ctx.http.post(`/api/jobs/${jobId}/exports`).set(auth(p.supervisor)).expect(202);
    const id = res.body.exportId as string;
    expect(id).not.toBe(exportId);
    const sse = await ctx.http
      .get(`/api/exports/${id}/events`)
      .set(auth(p.fabricator))
      .set('Accept-Encoding', 'gzip')
      .buffer(true)
      .parse(streamText)
      .expect(200);
    expect(sse.headers['content-type']).toContain('text/event-stream');
    // Never gzipped: each event must reach the client when it is sent, not when the stream ends.
    expect(sse.headers['content-encoding']).toBeUndefined();
    const events = (sse.body as string)
      .split('\n\n')
      .filter((b) => b.includes('data:'))
      .map((b) => ({
        type: /^event: (.*)$/m.exec(b)?.[1],
        data: JSON.parse(/^data: (.*)$/m.exec(b)![1]!) as ExportView,
      }));
    expect(events.at(-1)).toMatchObject({ type: 'done', data: { state: 'done', progress: 100 } });
    const progress = events.map((e) => e.data.progress);
    expect([...progress].sort((a, b) => a - b)).toEqual(progress);
    // The re-export prints the current notices and rules: its setup sheet is served again.
    const fresh = (await ctx.http.get(`/api/exports/${id}`).set(auth(p.operator)).expect(200))
      .body as ExportView;
    expect(fresh.safetyChanged).toBe(false);
    await acknowledge(ctx, p.operator, jobId);
    await download(ctx, p.operator, id, fresh.files.find((f) => f.role === 'setup-sheet')!.name, 200);
    // The re-export of a released job leaves the job as it is: one release in its history.
    const job = await ctx.http.get(`/api/jobs/${jobId}`).set(auth(p.fabricator)).expect(200);
    expect(job.body.transitions.filter((t: { action: string }) => t.action === 'release')).toHaveLength(1);
  });

  it('retries with backoff while storage is down, then finishes once', async () => {
    const id2 = await approvedJob(ctx, w, p);
    await s3.stop();
    const res = await ctx.http.post(`/api/jobs/${id2}/exports`).set(auth(p.fabricator)).expect(202);
    const id = res.body.exportId as string;
    const failedOnce = await pollExport(
      ctx,
      p.fabricator,
      id,
      (v) => v.attempts >= 1 && v.errorCode !== null,
    );
    expect(failedOnce.state).not.toBe('done');
    // The hobbyist who owns the job reads plain words about it, never the storage client's own text
    // ("connect ECONNREFUSED 127.0.0.1:<port>"), which stays in the server log.
    const seen = (await ctx.http.get(`/api/exports/${id}`).set(auth(p.owner)).expect(200)).body as ExportView;
    for (const v of [failedOnce, seen]) {
      expect(v.errorCode).toBe('EXPORT.ATTEMPT_FAILED');
      expect(v.errorMessage).toMatch(/^The file storage could not be reached.*tried again/);
      expect(v.errorMessage).not.toMatch(/ECONN|127\.0\.0\.1|:\d{2,5}\b/);
    }
    await s3.restart();
    const view = await pollExport(ctx, p.fabricator, id, (v) => v.state === 'done' || v.state === 'failed');
    expect(view.state).toBe('done');
    expect(view.attempts).toBeGreaterThanOrEqual(2);
    expect(view.errorCode).toBeNull();
    const job = await ctx.http.get(`/api/jobs/${id2}`).set(auth(p.fabricator)).expect(200);
    expect(job.body.state).toBe('released');
  });
});

describe('cut-pack exports worked by separate worker processes', () => {
  const tag = randomUUID().slice(0, 8);
  let s3: S3Fake;
  let ctx: TestContext;
  let w: WorkshopFixture;
  let p: People;
  const workers: WorkerProcess[] = [];
  const saved: Record<string, string | undefined> = {};
  let env: Record<string, string>;

  beforeAll(async () => {
    s3 = await startS3Fake(`kw-test-${tag}`);
    env = isolatedEnv(s3, tag);
    for (const [k, v] of Object.entries({ ...env, KW_WORKER_MODE: 'off' })) {
      saved[k] = process.env[k];
      process.env[k] = v;
    }
    ctx = await startTestApp();
    w = await createWorkshop(ctx);
    p = await everyone(ctx);
  });
  afterAll(async () => {
    for (const worker of workers) await stopWorker(worker, 'SIGKILL');
    await ctx?.app.close();
    await s3?.dispose();
    await dropQueueKeys(`kw-test-${tag}`);
    for (const [k, v] of Object.entries(saved)) {
      if (v === undefined) delete process.env[k];
      else process.env[k] = v;
    }
  });

  it('lets the API only enqueue when its worker mode is off', async () => {
    const jobId = await approvedJob(ctx, w, p);
    const res = await ctx.http.post(`/api/jobs/${jobId}/exports`).set(auth(p.fabricator)).expect(202);
    await sleep(1500);
    const view = await pollExport(ctx, p.fabricator, res.body.exportId as string, () => true);
    expect(view).toMatchObject({ state: 'queued', attempts: 0, progress: 0 });
    // A worker process picks it up.
    const worker = startWorker(env);
    workers.push(worker);
    await worker.ready;
    const done = await pollExport(
      ctx,
      p.fabricator,
      view.id,
      (v) => v.state === 'done' || v.state === 'failed',
    );
    expect(done.state).toBe('done');
    await stopWorker(worker);
  });

  it('ends the progress stream of a user deactivated while watching it', async () => {
    // No worker runs here: the pack stays queued and the stream would stay open.
    const jobId = await approvedJob(ctx, w, p);
    const exportId = await postRelease(ctx, p.fabricator, jobId);
    const watcher = await createUser(ctx, 'operator');
    const started = Date.now();
    const stream = ctx.http
      .get(`/api/exports/${exportId}/events`)
      .set(auth(watcher))
      .buffer(true)
      .parse(streamText)
      .timeout(15_000)
      // Sent now (a supertest request goes out when it is first awaited).
      .then((r) => r);
    await sleep(800);
    await ctx.http
      .patch(`/api/users/${watcher.id}`)
      .set(auth(p.supervisor))
      .send({ active: false })
      .expect(200);
    const sse = await stream;
    expect(Date.now() - started).toBeLessThan(10_000);
    expect(sse.body as string).toContain('"state":"queued"');
    await ctx.http.get(`/api/exports/${exportId}/events`).set(auth(watcher)).expect(401);
    // Returned, the job takes its queued pack with it (no later worker builds it).
    const job = await ctx.http.get(`/api/jobs/${jobId}`).set(auth(p.fabricator)).expect(200);
    await ctx.http
      .post(`/api/jobs/${jobId}/return`)
      .set(auth(p.fabricator))
      .send({ version: job.body.version, reason: 'Test over' })
      .expect(200);
  });

  it('cancels a queued pack when its job is returned: approved again, the job waits for a new release', async () => {
    // No worker yet: the release is owed in the queue (a backlog, or Redis down), then the job is returned.
    const jobId = await approvedJob(ctx, w, p);
    const act = jobActor(ctx, p.supervisor, jobId);
    const owed = (await act(p.fabricator, 'release', {}, 202)).body.exportId as string;
    await act(p.fabricator, 'return', { reason: 'Wrong colours on the rack' });
    const cancelled = await ctx.http.get(`/api/exports/${owed}`).set(auth(p.fabricator)).expect(200);
    expect(cancelled.body).toMatchObject({ state: 'failed', errorCode: 'EXPORT.JOB_CHANGED', files: [] });
    // Corrected and approved again: nobody has asked for its release yet.
    await act(p.owner, 'reopen');
    await act(p.owner, 'request');
    await act(p.fabricator, 'prepare', {
      materialId: w.acrylicId,
      profileVersionId: w.laserVersionId,
      colours: ['clear'],
    });
    await act(p.supervisor, 'approve');
    const worker = startWorker(env);
    workers.push(worker);
    await worker.ready;
    // A new release is a new pack (the cancelled one is not reused); the worker takes the old queue entry
    // first and builds nothing for it.
    const fresh = (await act(p.fabricator, 'release', {}, 202)).body.exportId as string;
    expect(fresh).not.toBe(owed);
    const done = await pollExport(
      ctx,
      p.fabricator,
      fresh,
      (v) => v.state === 'done' || v.state === 'failed',
    );
    expect(done.state).toBe('done');
    expect(
      (await ctx.http.get(`/api/exports/${owed}`).set(auth(p.fabricator)).expect(200)).body,
    ).toMatchObject({
      state: 'failed',
      errorCode: 'EXPORT.JOB_CHANGED',
      attempts: 0,
      files: [],
    });
    const job = await ctx.http.get(`/api/jobs/${jobId}`).set(auth(p.fabricator)).expect(200);
    expect(job.body.state).toBe('released');
    expect(job.body.transitions.filter((t: { action: string }) => t.action === 'release')).toHaveLength(1);
    await stopWorker(worker);
  });

  it('finishes exactly once after the worker building it is killed (SIGKILL) half-way', async () => {
    const jobId = await approvedJob(ctx, w, p);
    const slow = { ...env, KW_EXPORT_STEP_DELAY_MS: '700' };
    const first = startWorker(slow);
    workers.push(first);
    await first.ready;
    const res = await ctx.http.post(`/api/jobs/${jobId}/exports`).set(auth(p.fabricator)).expect(202);
    const exportId = res.body.exportId as string;
    const prefix = `jobs/${jobId}/exports/${exportId}/`;
    const storage = ctx.app.get<ObjectStorage>(OBJECT_STORAGE);
    // Wait until some, not all, files are stored, then kill the worker without warning.
    const end = Date.now() + 30000;
    while ((await storage.list(prefix)).length < 2) {
      if (Date.now() > end) throw new Error(`no files stored:\n${first.output()}`);
      await sleep(100);
    }
    first.child.kill('SIGKILL');
    await first.exited;
    const stored = (await storage.list(prefix)).length;

    // Nothing half-written is visible: not done, no files listed, downloads refused.
    const mid = (await ctx.http.get(`/api/exports/${exportId}`).set(auth(p.operator)).expect(200))
      .body as ExportView;
    expect(mid.state).toBe('running');
    expect(mid.files).toEqual([]);
    await acknowledge(ctx, p.operator, jobId);
    const early = await download(ctx, p.operator, exportId, 'manifest.json', 409);
    expectErrorBody(JSON.parse(early.body.toString()), 409, 'EXPORT.NOT_DONE');
    const job = await ctx.http.get(`/api/jobs/${jobId}`).set(auth(p.operator)).expect(200);
    expect(job.body.state).toBe('approved');

    // Another worker takes the export over once the dead worker's lock has expired.
    const second = startWorker(env);
    workers.push(second);
    const view = await pollExport(
      ctx,
      p.fabricator,
      exportId,
      (v) => v.state === 'done' || v.state === 'failed',
    );
    expect(view.state).toBe('done');
    expect(view.attempts).toBe(2);
    expect(view.files.length).toBeGreaterThan(stored);

    const exportsOfJob: { state: string }[] = await ctx.db.query(
      `SELECT state FROM exports WHERE job_id = $1`,
      [jobId],
    );
    expect(exportsOfJob).toEqual([{ state: 'done' }]);
    const events: { action: string }[] = await ctx.db.query(
      `SELECT action FROM audit_events WHERE entity_id = $1 AND action IN ('export.done', 'job.release')`,
      [jobId],
    );
    expect(events.map((e) => e.action).sort()).toEqual(['export.done', 'job.release']);
    const released = await ctx.http.get(`/api/jobs/${jobId}`).set(auth(p.operator)).expect(200);
    expect(released.body.transitions.filter((t: { action: string }) => t.action === 'release')).toHaveLength(
      1,
    );

    // No orphan objects: the stored objects are exactly the recorded files, and their bytes match.
    const rows: { storage_key: string; sha256: string; name: string }[] = await ctx.db.query(
      `SELECT storage_key, sha256, name FROM export_files WHERE export_id = $1 ORDER BY storage_key`,
      [exportId],
    );
    expect((await storage.list(prefix)).map((o) => o.key)).toEqual(rows.map((r) => r.storage_key));
    for (const r of rows) {
      expect(sha256((await download(ctx, p.operator, exportId, r.name)).body as Buffer)).toBe(r.sha256);
    }
    await stopWorker(second);
  });
});

describe('cut packs whose job changes while they are built', () => {
  let ctx: TestContext;
  let w: WorkshopFixture;
  let p: People;
  let exportsEnv: { restore(): Promise<void> };
  const saved: Record<string, string | undefined> = {};

  beforeAll(async () => {
    exportsEnv = isolateExports();
    // A pause after each stored file, so the job can change while the pack is being stored.
    saved.KW_EXPORT_STEP_DELAY_MS = process.env.KW_EXPORT_STEP_DELAY_MS;
    process.env.KW_EXPORT_STEP_DELAY_MS = '400';
    ctx = await startTestApp();
    w = await createWorkshop(ctx);
    p = await everyone(ctx);
  });
  afterAll(async () => {
    await ctx?.app.close();
    await exportsEnv?.restore();
    if (saved.KW_EXPORT_STEP_DELAY_MS === undefined) delete process.env.KW_EXPORT_STEP_DELAY_MS;
    else process.env.KW_EXPORT_STEP_DELAY_MS = saved.KW_EXPORT_STEP_DELAY_MS;
  });

  /** Releases the job (202) and waits until its files are being stored. */
  async function releaseAndWaitForStoring(jobId: string): Promise<string> {
    const exportId = await postRelease(ctx, p.fabricator, jobId);
    // Past the build's share of the bar (60 %): the files are going up one at a time.
    const storing = await pollExport(
      ctx,
      p.fabricator,
      exportId,
      (v) => v.progress > 60 || (v.state !== 'running' && v.state !== 'queued'),
    );
    expect(storing.state).toBe('running');
    return exportId;
  }

  async function expectDiscarded(jobId: string, exportId: string, code: string): Promise<void> {
    const view = await pollExport(
      ctx,
      p.fabricator,
      exportId,
      (v) => v.state === 'done' || v.state === 'failed',
    );
    expect(view).toMatchObject({ state: 'failed', errorCode: code, files: [] });
    const rows: unknown[] = await ctx.db.query(`SELECT 1 FROM export_files WHERE export_id = $1`, [exportId]);
    expect(rows).toHaveLength(0);
    // The worker deletes what the attempts stored right after recording the failure (never before: a done
    // export's files are never touched): give it a moment.
    const storage = ctx.app.get<ObjectStorage>(OBJECT_STORAGE);
    const prefix = `jobs/${jobId}/exports/${exportId}/`;
    const until = Date.now() + 10_000;
    while ((await storage.list(prefix)).length > 0 && Date.now() < until) await sleep(100);
    expect(await storage.list(prefix)).toEqual([]);
    const job = await ctx.http.get(`/api/jobs/${jobId}`).set(auth(p.operator)).expect(200);
    expect(job.body.transitions.filter((t: { action: string }) => t.action === 'release')).toHaveLength(0);
    await acknowledge(ctx, p.operator, jobId);
    for (const name of ['manifest.json', 'setup-sheet.pdf']) {
      const res = await download(ctx, p.operator, exportId, name, 409);
      expectErrorBody(JSON.parse(res.body.toString()), 409, 'EXPORT.NOT_DONE');
    }
  }

  it('discards the pack of a job returned while it was built: failed, no files, the job not released', async () => {
    const jobId = await approvedJob(ctx, w, p);
    const exportId = await releaseAndWaitForStoring(jobId);
    const job = await ctx.http.get(`/api/jobs/${jobId}`).set(auth(p.fabricator)).expect(200);
    expect(job.body.state).toBe('approved');
    await ctx.http
      .post(`/api/jobs/${jobId}/return`)
      .set(auth(p.fabricator))
      .send({ version: job.body.version, reason: 'Wrong colours on the rack' })
      .expect(200);
    await expectDiscarded(jobId, exportId, 'EXPORT.JOB_CHANGED');
    const after = await ctx.http.get(`/api/jobs/${jobId}`).set(auth(p.fabricator)).expect(200);
    expect(after.body.state).toBe('returned');
  });

  it('discards the pack of a job whose material was taken off the laser while it was built', async () => {
    const jobId = await approvedJob(ctx, w, p);
    const exportId = await releaseAndWaitForStoring(jobId);
    // PVC releases hydrogen chloride under a beam (safety/material-hazards.json): the job's material becomes it.
    await ctx.db.query(
      `UPDATE materials SET family = 'pvc', laser_allowed = false, hazard_note = $2 WHERE id = $1`,
      [w.acrylicId, 'releases hydrogen chloride when cut with a beam'],
    );
    try {
      await expectDiscarded(jobId, exportId, 'MATERIAL.LASER_PROHIBITED');
      const after = await ctx.http.get(`/api/jobs/${jobId}`).set(auth(p.fabricator)).expect(200);
      expect(after.body.state).toBe('approved');
    } finally {
      await ctx.db.query(
        `UPDATE materials SET family = 'acrylic', laser_allowed = true, hazard_note = '' WHERE id = $1`,
        [w.acrylicId],
      );
    }
  });

  it('orders a retire and a release finishing at once: the out-of-use mail names the job as it ends, released', async () => {
    // A workshop of its own: its laser version is taken out of use here.
    const own = await createWorkshop(ctx);
    const jobId = await approvedJob(ctx, own, p);
    const design = (await ctx.http.get(`/api/jobs/${jobId}`).set(auth(p.fabricator)).expect(200)).body
      .designName as string;
    const waiting = (like: string) => waitingOnLock(ctx, like);
    // Holding off the files' rows stops the export's finishing transaction after it has checked the job's
    // machine version, before it commits: the moment a supervisor retires that version.
    const hold = ctx.db.createQueryRunner();
    await hold.connect();
    await hold.startTransaction();
    let exportId: string;
    let retired: Promise<Response> | undefined;
    try {
      await hold.query(`LOCK TABLE export_files IN SHARE MODE`);
      exportId = await postRelease(ctx, p.fabricator, jobId);
      await until('the export to reach its last transaction', () => waiting('%export_files%'));
      let answered = false;
      retired = Promise.resolve(
        ctx.http
          .post(`/api/machine-profiles/${own.laserProfileId}/versions/${own.laserVersionId}/retire`)
          .set(auth(p.supervisor))
          .send({ reason: 'Lens cracked; do not run' }),
      ).then((res) => {
        answered = true;
        return res;
      });
      await until('the retire to answer or wait for the release', async () =>
        answered ? true : waiting('%machine_profile_versions%'),
      );
    } finally {
      await hold.rollbackTransaction();
      await hold.release();
    }
    expect((await retired).status).toBe(200);
    const view = await pollExport(
      ctx,
      p.fabricator,
      exportId,
      (v) => v.state === 'done' || v.state === 'failed',
    );
    expect(view.state).toBe('done');
    const job = await ctx.http.get(`/api/jobs/${jobId}`).set(auth(p.fabricator)).expect(200);
    expect(job.body.state).toBe('released');
    // Whatever committed first, the mail sent with the retire says what became of the job: released on these
    // settings (it is on the release desk, marked), not waiting to be released.
    const profile = (
      await ctx.http.get(`/api/machine-profiles/${own.laserProfileId}`).set(auth(p.fabricator)).expect(200)
    ).body as { name: string };
    const mails: { text_body: string }[] = await ctx.db.query(
      `SELECT text_body FROM mail_outbox WHERE subject = $1`,
      [`Machine out of use: ${profile.name}`],
    );
    expect(mails.length).toBeGreaterThan(0);
    for (const m of mails) {
      expect(m.text_body).toContain(`- "${design}" (released): `);
      expect(m.text_body).not.toContain(`- "${design}" (approved): `);
    }
  });

  it('serves files only for a job released to the machines (or cut and closed since)', async () => {
    const jobId = await approvedJob(ctx, w, p);
    const view = await releaseAndWait(ctx, p.fabricator, jobId);
    expect(view.state).toBe('done');
    await acknowledge(ctx, p.operator, jobId);
    const name = view.files.find((f) => f.role === 'manifest')!.name;
    await download(ctx, p.operator, view.id, name, 200);
    // Had the job been put back before release (a state no route leads to from here), its files stay shut.
    await ctx.db.query(`UPDATE jobs SET state = 'approved' WHERE id = $1`, [jobId]);
    try {
      const refused = await download(ctx, p.operator, view.id, name, 409);
      expectErrorBody(JSON.parse(refused.body.toString()), 409, 'EXPORT.JOB_NOT_RELEASED');
    } finally {
      await ctx.db.query(`UPDATE jobs SET state = 'released' WHERE id = $1`, [jobId]);
    }
    // Cut since, then the rules change: its setup sheet prints old ones and no new pack is built for a cut job,
    // which the refusal says (instead of asking for a rebuild nobody can make); the cutting files stay.
    await ctx.db.query(`UPDATE jobs SET state = 'cut' WHERE id = $1`, [jobId]);
    await ctx.http
      .put('/api/safety/local-rules')
      .set(auth(p.supervisor))
      .send({ body: `Rules after the cut ${jobId}` })
      .expect(200);
    await acknowledge(ctx, p.operator, jobId);
    const setup = view.files.find((f) => f.role === 'setup-sheet')!.name;
    const old = JSON.parse((await download(ctx, p.operator, view.id, setup, 409)).body.toString());
    expectErrorBody(old, 409, 'EXPORT.SAFETY_CHANGED');
    expect(old.message).toMatch(/the job is cut, so no new pack is built/);
    await download(ctx, p.operator, view.id, view.files.find((f) => f.role === 'sheet-dxf')!.name, 200);
  });

  it("rebuilds a released job's pack on the version it was released on after a newer one retired it; an approved job's not", async () => {
    const released = await approvedJob(ctx, w, p);
    const first = await releaseAndWait(ctx, p.fabricator, released);
    expect(first.state).toBe('done');
    const approved = await approvedJob(ctx, w, p);
    // A newer version is approved (a kerf adopted, say): the one both jobs name retires.
    await ctx.db.query(`UPDATE machine_profile_versions SET state = 'retired' WHERE id = $1`, [
      w.laserVersionId,
    ]);
    try {
      // The released job's pack is built again (new safety notices, say) with the settings it was cut with.
      const res = await ctx.http.post(`/api/jobs/${released}/exports`).set(auth(p.fabricator)).expect(202);
      const again = await pollExport(
        ctx,
        p.fabricator,
        res.body.exportId as string,
        (v) => v.state === 'done' || v.state === 'failed',
        90000,
      );
      expect(again).toMatchObject({ state: 'done', errorCode: null });
      // The approved one must be prepared again on the current version: no pack, not released.
      const refused = await ctx.http
        .post(`/api/jobs/${approved}/exports`)
        .set(auth(p.fabricator))
        .expect(409);
      expectErrorBody(refused.body, 409, 'MACHINE_PROFILE.NOT_APPROVED');
      const job = await ctx.http.get(`/api/jobs/${approved}`).set(auth(p.fabricator)).expect(200);
      expect(job.body.state).toBe('approved');
    } finally {
      await ctx.db.query(`UPDATE machine_profile_versions SET state = 'approved' WHERE id = $1`, [
        w.laserVersionId,
      ]);
    }
  });

  it('builds a released pack again by itself once the notices or rules its setup sheet prints change, once', async () => {
    const released = await approvedJob(ctx, w, p);
    const first = await releaseAndWait(ctx, p.fabricator, released);
    expect(first.state).toBe('done');
    const packs = async () =>
      (await ctx.http.get(`/api/jobs/${released}/exports`).set(auth(p.fabricator)).expect(200))
        .body as ExportView[];
    // What the reconciler runs every few seconds (turned off in these suites, so called here).
    const service = ctx.app.get(ExportsService);
    await service.rebuildOutdated();
    expect(await packs()).toHaveLength(1);

    await ctx.http
      .put('/api/safety/local-rules')
      .set(auth(p.supervisor))
      .send({ body: `Rules of ${released}` })
      .expect(200);
    await service.rebuildOutdated();
    const [newest] = await packs();
    expect(newest?.id).not.toBe(first.id);
    const again = await pollExport(
      ctx,
      p.fabricator,
      newest!.id,
      (v) => v.state === 'done' || v.state === 'failed',
      90000,
    );
    expect(again).toMatchObject({ state: 'done', safetyChanged: false });
    // Current again: nothing more is queued, and the audit trail says why this one was.
    await service.rebuildOutdated();
    expect(await packs()).toHaveLength(2);
    const audit: { actor_id: string | null; after: { reason?: string } }[] = await ctx.db.query(
      `SELECT actor_id, after FROM audit_events WHERE entity_id = $1 AND action = 'export.request'
        ORDER BY id`,
      [released],
    );
    expect(audit.at(-1)).toMatchObject({
      actor_id: null,
      after: { reason: 'safety notices or workshop rules changed' },
    });
  });
});
