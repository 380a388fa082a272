import { type JobAction, JOB_TRANSITIONS } from '@kerfwright/contracts';
import { type MailCatcher, startMailCatcher } from '../src/dev-mail/mail-catcher';
import { MailDispatcherService } from '../src/mail/mail-dispatcher.service';
import {
  countRows,
  createUser,
  expectErrorBody,
  startTestApp,
  type TestContext,
  type TestUser,
} from './support/test-app';
import { createWorkshop, octahedronHexagons, type WorkshopFixture } from './support/workshop-fixtures';

describe('jobs through their states', () => {
  let ctx: TestContext;
  let catcher: MailCatcher;
  let w: WorkshopFixture;
  const users = {} as Record<'hobbyist' | 'other' | 'fabricator' | 'operator' | 'supervisor', TestUser>;

  beforeAll(async () => {
    catcher = await startMailCatcher({ smtpPort: 0 });
    process.env.KW_SMTP_PORT = String(catcher.smtpPort);
    ctx = await startTestApp();
    users.hobbyist = await createUser(ctx, 'hobbyist');
    users.other = await createUser(ctx, 'hobbyist');
    users.fabricator = await createUser(ctx, 'fabricator');
    users.operator = await createUser(ctx, 'operator');
    users.supervisor = await createUser(ctx, 'supervisor');
    w = await createWorkshop(ctx);
  });
  afterAll(async () => {
    await ctx.app.close();
    await catcher.stop();
  });
  const auth = (u: TestUser) => ({ Authorization: `Bearer ${u.token}` });

  async function draftJob(owner = users.hobbyist) {
    const d = await ctx.http
      .post('/api/designs')
      .set(auth(owner))
      .send({ name: 'Hanging octahedron', spec: octahedronHexagons() })
      .expect(201);
    const j = await ctx.http
      .post('/api/jobs')
      .set(auth(owner))
      .send({ designId: d.body.id, quantity: 1 })
      .expect(201);
    return j.body as { id: string; version: number; state: string };
  }
  async function act(
    u: TestUser,
    id: string,
    action: JobAction,
    body: Record<string, unknown> = {},
    status = 200,
  ) {
    const current = await ctx.http.get(`/api/jobs/${id}`).set(auth(users.supervisor)).expect(200);
    return ctx.http
      .post(`/api/jobs/${id}/${action}`)
      .set(auth(u))
      .send({ version: current.body.version, ...body })
      .expect(status);
  }
  const prepareBody = () => ({
    materialId: w.acrylicId,
    profileVersionId: w.laserVersionId,
    colours: ['clear'],
  });

  async function mailsSent() {
    await ctx.app.get(MailDispatcherService).dispatchDue();
    return catcher.messages;
  }

  it('walks draft → requested → prepared → approved → released → cut → closed, recording each step', async () => {
    const job = await draftJob();
    await act(users.hobbyist, job.id, 'request');
    const prepared = await act(users.fabricator, job.id, 'prepare', prepareBody());
    expect(prepared.body.state).toBe('prepared');
    const prep = prepared.body.preparation;
    expect(prep).toMatchObject({ thicknessMm: 3, machineKind: 'laser', kerfMm: 0.18, pieceCount: 8 });
    // Sheets: at least the area bound, at most one per piece; utilisation is pieces' area over the sheets'.
    expect(prep.sheetCount).toBeGreaterThanOrEqual(1);
    expect(prep.sheetCount).toBeLessThanOrEqual(8);
    expect(prep.utilisation).toBeGreaterThan(0.2);
    expect(prep.utilisation).toBeLessThanOrEqual(1);
    expect(prepared.body.profileVersionId).toBe(w.laserVersionId);
    await act(users.supervisor, job.id, 'approve');
    await act(users.fabricator, job.id, 'release');
    const cut = await act(users.operator, job.id, 'cut', {
      actualMinutes: 22.5,
      sheetsUsed: 1,
      measuredKerfMm: 0.19,
    });
    expect(cut.body).toMatchObject({
      state: 'cut',
      actualMinutes: 22.5,
      sheetsUsed: 1,
      measuredKerfMm: 0.19,
    });
    const closed = await act(users.operator, job.id, 'close');
    expect(closed.body.transitions.map((t: { to: string }) => t.to)).toEqual([
      'draft',
      'requested',
      'prepared',
      'approved',
      'released',
      'cut',
      'closed',
    ]);
    expect(closed.body.transitions[2].actorId).toBe(users.fabricator.id);
    const kerf: { kerf_mm: string }[] = await ctx.db.query(
      `SELECT kerf_mm FROM kerf_records WHERE job_id = $1`,
      [job.id],
    );
    expect(Number(kerf[0]!.kerf_mm)).toBeCloseTo(0.19, 3);
    const audit: { action: string }[] = await ctx.db.query(
      `SELECT action FROM audit_events WHERE entity_id = $1 ORDER BY id`,
      [job.id],
    );
    expect(audit.map((a) => a.action)).toEqual([
      'job.create',
      'job.request',
      'job.prepare',
      'job.approve',
      'job.release',
      'job.cut',
      'job.close',
    ]);
  });

  it('answers every illegal transition with 409 and the error body, changing nothing', async () => {
    const job = await draftJob();
    // Every action that is not legal from "draft", taken by a supervisor (who holds every role).
    for (const rule of JOB_TRANSITIONS.filter((t) => !t.from.includes('draft'))) {
      const body =
        rule.action === 'return'
          ? { reason: 'testing' }
          : rule.action === 'prepare'
            ? prepareBody()
            : rule.action === 'cut'
              ? { actualMinutes: 1, sheetsUsed: 1 }
              : {};
      const res = await act(users.supervisor, job.id, rule.action, body, 409);
      expectErrorBody(res.body, 409, 'JOB.ILLEGAL_TRANSITION');
    }
    const after = await ctx.http.get(`/api/jobs/${job.id}`).set(auth(users.hobbyist)).expect(200);
    expect(after.body.state).toBe('draft');
    expect(after.body.transitions).toHaveLength(1);
  });

  it('refuses actions the role may not take with 403, and other people’s jobs with 404', async () => {
    const job = await draftJob();
    expectErrorBody((await act(users.fabricator, job.id, 'request', {}, 404)).body, 404, 'JOB.NOT_FOUND'); // staff do not see drafts
    await act(users.hobbyist, job.id, 'request');
    expectErrorBody(
      (await act(users.hobbyist, job.id, 'prepare', prepareBody(), 403)).body,
      403,
      'JOB.ACTION_NOT_ALLOWED',
    );
    expectErrorBody((await act(users.operator, job.id, 'prepare', prepareBody(), 403)).body, 403);
    expectErrorBody((await act(users.other, job.id, 'request', {}, 404)).body, 404, 'JOB.NOT_FOUND');
    await ctx.http.get(`/api/jobs/${job.id}`).set(auth(users.other)).expect(404);
    await act(users.fabricator, job.id, 'prepare', prepareBody());
    expectErrorBody((await act(users.fabricator, job.id, 'approve', {}, 403)).body, 403);
    expectErrorBody((await act(users.hobbyist, job.id, 'approve', {}, 403)).body, 403);
  });

  it('refuses a prohibited material for a laser job with a clear error and writes nothing', async () => {
    const job = await draftJob();
    await act(users.hobbyist, job.id, 'request');
    const before = await countRows(ctx, 'job_transitions');
    const res = await act(
      users.fabricator,
      job.id,
      'prepare',
      { ...prepareBody(), materialId: w.pvcId, colours: [] },
      409,
    );
    expectErrorBody(res.body, 409, 'MATERIAL.LASER_PROHIBITED');
    expect(res.body.message).toMatch(/laser/i);
    expect(res.body.message).toMatch(/hydrogen chloride/);
    expect(await countRows(ctx, 'job_transitions')).toBe(before);
  });

  it('uses only approved profile versions, and a job keeps its version when the profile changes', async () => {
    const job = await draftJob();
    await act(users.hobbyist, job.id, 'request');
    const res = await act(
      users.fabricator,
      job.id,
      'prepare',
      { ...prepareBody(), profileVersionId: w.draftVersionId },
      409,
    );
    expectErrorBody(res.body, 409, 'MACHINE_PROFILE.NOT_APPROVED');
    await act(users.fabricator, job.id, 'prepare', prepareBody());
    // A newer version is approved: the old one retires, the job still names the version it was prepared with.
    await ctx.db.query(`UPDATE machine_profile_versions SET state = 'retired' WHERE id = $1`, [
      w.laserVersionId,
    ]);
    await ctx.db.query(`UPDATE machine_profile_versions SET state = 'approved' WHERE id = $1`, [
      w.draftVersionId,
    ]);
    const after = await ctx.http.get(`/api/jobs/${job.id}`).set(auth(users.fabricator)).expect(200);
    expect(after.body.profileVersionId).toBe(w.laserVersionId);
    expect(after.body.profileVersionNumber).toBe(1);
    // Approving the job now is refused: its version is no longer approved.
    expectErrorBody(
      (await act(users.supervisor, job.id, 'approve', {}, 409)).body,
      409,
      'MACHINE_PROFILE.NOT_APPROVED',
    );
    await ctx.db.query(`UPDATE machine_profile_versions SET state = 'draft' WHERE id = $1`, [
      w.draftVersionId,
    ]);
    await ctx.db.query(`UPDATE machine_profile_versions SET state = 'approved' WHERE id = $1`, [
      w.laserVersionId,
    ]);
  });

  it('lets exactly one of two fabricators preparing the same job win', async () => {
    const job = await draftJob();
    await act(users.hobbyist, job.id, 'request');
    const second = await createUser(ctx, 'fabricator');
    const current = (await ctx.http.get(`/api/jobs/${job.id}`).set(auth(users.fabricator))).body.version;
    const results = await Promise.all(
      [users.fabricator, second].map((u) =>
        ctx.http
          .post(`/api/jobs/${job.id}/prepare`)
          .set(auth(u))
          .send({ version: current, ...prepareBody() }),
      ),
    );
    expect(results.map((r) => r.status).sort()).toEqual([200, 409]);
    expect(results.find((r) => r.status === 409)!.body.code).toBe('JOB.STALE_VERSION');
  });

  it('returns a job with a reason, and the requester can reopen it', async () => {
    const job = await draftJob();
    await act(users.hobbyist, job.id, 'request');
    const bad = await act(users.fabricator, job.id, 'return', { reason: '' }, 400);
    expect(bad.body.details[0].field).toBe('reason');
    const returned = await act(users.fabricator, job.id, 'return', {
      reason: 'Pieces too small for 3 mm acrylic',
    });
    expect(returned.body).toMatchObject({
      state: 'returned',
      returnReason: 'Pieces too small for 3 mm acrylic',
    });
    expect(returned.body.transitions.at(-1)).toMatchObject({
      action: 'return',
      reason: 'Pieces too small for 3 mm acrylic',
    });
    const reopened = await act(users.hobbyist, job.id, 'reopen');
    expect(reopened.body.state).toBe('draft');
  });

  it('sends mail to the right people on request, approval, release and return', async () => {
    catcher.messages.length = 0;
    const job = await draftJob();
    await act(users.hobbyist, job.id, 'request');
    let mails = await mailsSent();
    const requested = mails.find((m) => m.subject.startsWith('Cut requested') && m.text.includes(job.id));
    expect(requested?.to).toContain(users.fabricator.email);
    expect(requested?.to).not.toContain(users.hobbyist.email);
    await act(users.fabricator, job.id, 'prepare', prepareBody());
    await act(users.supervisor, job.id, 'approve');
    await act(users.fabricator, job.id, 'release');
    mails = await mailsSent();
    for (const prefix of ['Job approved', 'Job released']) {
      // Other suites' mail may still be queued in the shared outbox: pick this job's by its requester.
      const m = mails.find((x) => x.subject.startsWith(prefix) && x.to.includes(users.hobbyist.email));
      expect(m?.to).toEqual(expect.arrayContaining([users.hobbyist.email, users.operator.email]));
      expect(m?.html).toContain('<p>');
    }
    const other = await draftJob(users.other);
    await act(users.other, other.id, 'request');
    await act(users.fabricator, other.id, 'return', { reason: 'Needs a thicker stock' });
    mails = await mailsSent();
    const ret = mails.find(
      (m) => m.subject.startsWith('Job returned') && m.text.includes('Needs a thicker stock'),
    );
    expect(ret?.to).toEqual([users.other.email]);
  });

  it('keeps the state change when the mail server is down, and delivers later', async () => {
    const downPort = catcher.smtpPort;
    await catcher.stop();
    const job = await draftJob();
    const res = await act(users.hobbyist, job.id, 'request');
    expect(res.body.state).toBe('requested');
    await ctx.app.get(MailDispatcherService).dispatchDue();
    const pending: { attempts: number; status: string }[] = await ctx.db.query(
      `SELECT attempts, status FROM mail_outbox WHERE kind = 'job.requested' ORDER BY id DESC LIMIT 1`,
    );
    expect(pending[0]).toMatchObject({ status: 'pending', attempts: 1 });
    catcher = await startMailCatcher({ smtpPort: downPort });
    await ctx.db.query(`UPDATE mail_outbox SET next_attempt_at = now() WHERE status = 'pending'`);
    await ctx.app.get(MailDispatcherService).dispatchDue();
    expect(catcher.messages.some((m) => m.subject.startsWith('Cut requested'))).toBe(true);
  });
});
