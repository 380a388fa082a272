import { randomUUID } from 'node:crypto';
import { type ExportView, type JobAction, JOB_TRANSITIONS } from '@kerfwright/contracts';
import { type MailCatcher, startMailCatcher } from '../src/dev-mail/mail-catcher';
import { MailDispatcherService } from '../src/mail/mail-dispatcher.service';
import {
  countRows,
  createUser,
  expectErrorBody,
  startTestApp,
  type TestContext,
  type TestUser,
  until,
  waitingOnLock,
} from './support/test-app';
import { acknowledge, isolateExports, releaseJob } from './support/export-fixtures';
import { createWorkshop, octahedronHexagons, type WorkshopFixture } from './support/workshop-fixtures';

jest.setTimeout(90000);

describe('jobs through their states', () => {
  let ctx: TestContext;
  let catcher: MailCatcher;
  let w: WorkshopFixture;
  let exportsEnv: { restore(): Promise<void> };
  const users = {} as Record<'hobbyist' | 'other' | 'fabricator' | 'operator' | 'supervisor', TestUser>;

  beforeAll(async () => {
    catcher = await startMailCatcher({ smtpPort: 0 });
    process.env.KW_SMTP_PORT = String(catcher.smtpPort);
    exportsEnv = isolateExports();
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
    await exportsEnv.restore();
  });
  const auth = (u: TestUser) => ({ Authorization: `Bearer ${u.token}` });

  async function draftJob(
    owner = users.hobbyist,
    name = 'Hanging octahedron',
    spec: object = octahedronHexagons(),
  ) {
    const d = await ctx.http.post('/api/designs').set(auth(owner)).send({ name, spec }).expect(201);
    const j = await ctx.http
      .post('/api/jobs')
      .set(auth(owner))
      .send({ designId: d.body.id, quantity: 1 })
      .expect(201);
    return j.body as { id: string; version: number; state: string };
  }
  /** A job taken through the workshop to released, whose files the operator's acknowledgement opened. */
  async function releasedAndAcknowledged() {
    const job = await draftJob();
    await act(users.hobbyist, job.id, 'request');
    await act(users.fabricator, job.id, 'prepare', prepareBody());
    await act(users.supervisor, job.id, 'approve');
    await releaseJob(ctx, users.fabricator, job.id);
    await acknowledge(ctx, users.operator, job.id);
    return job;
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
    // The time and cost it is approved on (the cut pack's figures: exports.e2e-spec compares the two), at the
    // fixture's 40 EUR an hour and 18 EUR a 600 × 400 sheet.
    expect(prep.estimate).toMatchObject({ currency: 'EUR', materialCost: prep.sheetCount * 18, pierces: 8 });
    expect(prep.estimate.minutes).toBeGreaterThan(0);
    expect(prep.estimate.machineCost).toBeCloseTo((prep.estimate.minutes / 60) * 40, 1);
    expect(prepared.body.profileVersionId).toBe(w.laserVersionId);
    await act(users.supervisor, job.id, 'approve');
    await releaseJob(ctx, users.fabricator, job.id);
    await acknowledge(ctx, users.operator, job.id);
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
      'export.request',
      'export.done',
      'job.release',
      'safety.acknowledge',
      'job.cut',
      'job.close',
    ]);
    // Every entry about the job names it by its design (state changes, its cut pack, the acknowledgement), so
    // the audit trail can say which job it is about.
    // The name stands in both snapshots of an entry that has two, so it never reads as a changed field.
    const named: { logged: string | null; was: string | null; fresh: boolean; name: string }[] =
      await ctx.db.query(
        `SELECT a.after->>'designName' AS logged, a.before->>'designName' AS was, a.before IS NULL AS fresh, d.name
         FROM audit_events a
         JOIN jobs j ON j.id::text = a.entity_id JOIN designs d ON d.id = j.design_id
        WHERE a.entity_id = $1`,
        [job.id],
      );
    expect(named).toHaveLength(10);
    for (const n of named) {
      expect(n.logged).toBe(n.name);
      if (!n.fresh) expect(n.was).toBe(n.name);
    }
    expect(named.filter((n) => !n.fresh).length).toBeGreaterThanOrEqual(6);
  });

  it('releases only through the cut-pack queue: 202 { exportId }, released in the transaction that stores the files', async () => {
    const job = await draftJob();
    await act(users.hobbyist, job.id, 'request');
    await act(users.fabricator, job.id, 'prepare', prepareBody());
    await act(users.supervisor, job.id, 'approve');
    const exportsBefore = await countRows(ctx, 'exports');
    // A stale version and a role that may not release change nothing and queue nothing.
    const stale = await ctx.http
      .post(`/api/jobs/${job.id}/release`)
      .set(auth(users.fabricator))
      .send({ version: 1 })
      .expect(409);
    expectErrorBody(stale.body, 409, 'JOB.STALE_VERSION');
    await act(users.hobbyist, job.id, 'release', {}, 403);
    await act(users.operator, job.id, 'release', {}, 403);
    expect(await countRows(ctx, 'exports')).toBe(exportsBefore);

    const done = await releaseJob(ctx, users.fabricator, job.id);
    expect(done.files.length).toBeGreaterThan(0);
    const after = await ctx.http.get(`/api/jobs/${job.id}`).set(auth(users.hobbyist)).expect(200);
    expect(after.body.state).toBe('released');
    expect(after.body.transitions.at(-1)).toMatchObject({
      from: 'approved',
      to: 'released',
      action: 'release',
      actorId: users.fabricator.id,
    });
    // now() is the transaction's start time in PostgreSQL: equal stamps mean one transaction.
    const stamps: { finished: Date; released: Date }[] = await ctx.db.query(
      `SELECT e.finished_at AS finished, t.created_at AS released
         FROM exports e JOIN job_transitions t ON t.job_id = e.job_id AND t.action = 'release'
        WHERE e.id = $1`,
      [done.id],
    );
    expect(stamps).toHaveLength(1);
    expect(stamps[0]!.released.getTime()).toBe(stamps[0]!.finished.getTime());
    // Released already: a second release is an illegal transition (a re-export goes through /exports).
    expectErrorBody(
      (await act(users.fabricator, job.id, 'release', {}, 409)).body,
      409,
      'JOB.ILLEGAL_TRANSITION',
    );
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
    expect(after.body.preparedByCaller).toBe(true);
    // The supervisor is not offered an approval the server would refuse, and is told why.
    const seen = await ctx.http.get(`/api/jobs/${job.id}`).set(auth(users.supervisor)).expect(200);
    expect(seen.body.profileVersionRetired).toBe(true);
    expect(seen.body.preparedByCaller).toBe(false);
    expect(seen.body.actions).not.toContain('approve');
    expect(seen.body.actions).toContain('return');
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

  it('prepares at the size a fit scale finds: the design’s fitBed, or a fitSheets override', async () => {
    const j = await draftJob(users.hobbyist, 'Bed-sized octahedron', {
      ...octahedronHexagons(),
      scale: { by: 'fitBed' },
      bed: { widthMm: 1000, heightMm: 600 },
      stock: {
        thicknessMm: 3,
        flexible: false,
        sheet: { widthMm: 600, heightMm: 400 },
        marginMm: 6,
        gapMm: 4,
      },
    });
    await act(users.hobbyist, j.id, 'request');
    // The test laser's bed is 1000 × 600 mm; the material's stock sheet 600 × 400 mm (workshop fixture).
    const one = await act(users.fabricator, j.id, 'prepare', {
      ...prepareBody(),
      scale: { by: 'fitSheets', sheets: 1 },
    });
    expect(one.body.preparation).toMatchObject({ sheetCount: 1, marginMm: 6, gapMm: 4 });
    const stored = async () =>
      (
        (await ctx.db.query(`SELECT spec->'scale' AS scale FROM jobs WHERE id = $1`, [j.id])) as {
          scale: { by: string; mm: number };
        }[]
      )[0]!.scale;
    // The job keeps the size found as a fixed diameter, so its cut pack is cut at exactly that size.
    expect(await stored()).toEqual({ by: 'diameter', mm: expect.any(Number) });
    expect((await stored()).mm).toBeCloseTo(one.body.preparation.diameterMm, 1);
    // Prepared again without a scale: from the design as requested (its fitBed, margin and gap), not from the
    // first preparation's spec (its fixed diameter, and no margin or gap of the design's).
    const bed = await act(users.fabricator, j.id, 'prepare', prepareBody());
    expect((await stored()).by).toBe('diameter');
    expect(bed.body.preparation).toMatchObject({ marginMm: 6, gapMm: 4 });
    // Laid out on one 600 × 400 sheet the model is smaller than when only each piece must fit the bed.
    expect(one.body.preparation.diameterMm).toBeLessThan(bed.body.preparation.diameterMm - 1);
    const again = await act(users.fabricator, j.id, 'prepare', prepareBody());
    expect(again.body.preparation.diameterMm).toBeCloseTo(bed.body.preparation.diameterMm, 6);
    for (const scale of [{ by: 'fitBed', mm: 200 }, { by: 'fitSheets' }, { by: 'diameter' }]) {
      const bad = await act(users.fabricator, j.id, 'prepare', { ...prepareBody(), scale }, 400);
      expectErrorBody(bad.body, 400);
      expect(bad.body.details.map((x: { field: string }) => x.field)).toContain('scale.by');
    }
    // Fewer sheets than colours (each colour is cut from its own sheets): the engine's refusal names the field
    // as this request does, not as the design's spec would.
    const few = await act(
      users.fabricator,
      j.id,
      'prepare',
      { ...prepareBody(), colours: ['clear', 'amber'], scale: { by: 'fitSheets', sheets: 1 } },
      400,
    );
    expectErrorBody(few.body, 400, 'DESIGN.INVALID_SPEC');
    expect(few.body.details.map((x: { field: string }) => x.field)).toEqual(['scale.sheets']);
  });

  it('answers other requests while a fit search runs: the engine works in a worker thread', async () => {
    // Twelve pentagons fitted to two sheets: the search lays the model out many times (about a second).
    const j = await draftJob(users.hobbyist, 'Two-sheet pentagon lamp', {
      ...octahedronHexagons(),
      solid: 'dodecahedron',
      piece: { sides: 5, step: 1, rotationDeg: 36, size: 1.45 },
      scale: { by: 'fitSheets', sheets: 2 },
      stock: { thicknessMm: 3, flexible: false, sheet: { widthMm: 600, heightMm: 400 } },
    });
    await act(users.hobbyist, j.id, 'request');
    const current = await ctx.http.get(`/api/jobs/${j.id}`).set(auth(users.supervisor)).expect(200);
    const started = performance.now();
    let preparedAt = 0;
    const preparing = ctx.http
      .post(`/api/jobs/${j.id}/prepare`)
      .set(auth(users.fabricator))
      .send({ version: current.body.version, ...prepareBody() })
      .then((res) => {
        preparedAt = performance.now();
        return res;
      });
    // Health asked one after another while the preparation runs: on a blocked event loop one of them would
    // wait for the whole search.
    const latencies: number[] = [];
    while (preparedAt === 0) {
      const t = performance.now();
      await ctx.http.get('/api/health').expect(200);
      if (preparedAt === 0) latencies.push(performance.now() - t);
    }
    const prepared = await preparing;
    expect(prepared.status).toBe(200);
    expect(prepared.body.preparation.sheetCount).toBeLessThanOrEqual(2);
    const duration = preparedAt - started;
    // The check means something only if the search is long next to a health answer.
    expect(duration).toBeGreaterThan(250);
    expect(latencies.length).toBeGreaterThanOrEqual(3);
    expect(Math.max(...latencies)).toBeLessThan(duration / 2);
  });

  it('keeps four eyes on a job: the supervisor who prepared it cannot approve it (403), another can', async () => {
    const job = await draftJob();
    await act(users.hobbyist, job.id, 'request');
    const mine = await act(users.supervisor, job.id, 'prepare', prepareBody());
    // The actions offered leave approval out for the supervisor who prepared it.
    expect(mine.body.actions).not.toContain('approve');
    expect(mine.body.actions).toContain('return');
    const before = await countRows(ctx, 'job_transitions');
    const refused = await act(users.supervisor, job.id, 'approve', {}, 403);
    expectErrorBody(refused.body, 403, 'JOB.SELF_APPROVAL');
    expect(refused.body.message).toMatch(/another supervisor/);
    expect(await countRows(ctx, 'job_transitions')).toBe(before);
    const second = await createUser(ctx, 'supervisor');
    const seen = await ctx.http.get(`/api/jobs/${job.id}`).set(auth(second)).expect(200);
    expect(seen.body.actions).toContain('approve');
    const approved = await act(second, job.id, 'approve');
    expect(approved.body.state).toBe('approved');
    // It is the preparation in effect that counts: re-prepared by a fabricator, the first supervisor may approve.
    const other = await draftJob();
    await act(users.hobbyist, other.id, 'request');
    await act(users.supervisor, other.id, 'prepare', prepareBody());
    await act(users.fabricator, other.id, 'prepare', prepareBody());
    expect((await act(users.supervisor, other.id, 'approve')).body.state).toBe('approved');
  });

  it('lists a page of jobs with the same row the job route gives, filtered, searched and counted', async () => {
    const other = await draftJob(users.other); // another hobbyist's draft: staff below a supervisor do not see it
    const prepared = await draftJob();
    await act(users.hobbyist, prepared.id, 'request');
    await act(users.supervisor, prepared.id, 'prepare', prepareBody());
    const list = (u: TestUser, query: Record<string, string | number> = {}) =>
      ctx.http
        .get('/api/jobs')
        .query({ pageSize: 200, ...query })
        .set(auth(u))
        .expect(200);
    const withoutTransitions = ({ transitions: _t, ...row }: Record<string, unknown>) => row;

    // Every row equals the job route's view of it for the same caller, names and offered actions included.
    for (const u of [users.supervisor, users.fabricator, users.hobbyist]) {
      const page = (await list(u)).body as { items: { id: string }[]; total: number };
      expect(page.items.length).toBe(Math.min(page.total, 200)); // a database reused by earlier runs holds more
      const row = page.items.find((r) => r.id === prepared.id);
      const detail = await ctx.http.get(`/api/jobs/${prepared.id}`).set(auth(u)).expect(200);
      expect(row).toEqual(withoutTransitions(detail.body));
    }
    const supervisorRow = (await list(users.supervisor)).body.items.find(
      (r: { id: string }) => r.id === prepared.id,
    );
    expect(supervisorRow.materialName).toBeTruthy();
    expect(supervisorRow.profileName).toBeTruthy();
    expect(supervisorRow.actions).not.toContain('approve'); // four eyes: the supervisor prepared it
    // The timestamps PostgreSQL formats for a row are what JSON gives for the stored values (Date#toISOString,
    // ECMA-262 Date Time String Format: UTC, milliseconds).
    const [stored] = (await ctx.db.query(`SELECT created_at, updated_at FROM jobs WHERE id = $1`, [
      prepared.id,
    ])) as { created_at: Date; updated_at: Date }[];
    expect([supervisorRow.createdAt, supervisorRow.updatedAt]).toEqual([
      stored!.created_at.toISOString(),
      stored!.updated_at.toISOString(),
    ]);

    // Who sees what: drafts of others stay with their owner (and supervisors); hobbyists see only their own.
    const ids = async (u: TestUser, q = {}) => (await list(u, q)).body.items.map((r: { id: string }) => r.id);
    expect(await ids(users.fabricator)).not.toContain(other.id);
    expect(await ids(users.supervisor)).toContain(other.id);
    expect(await ids(users.hobbyist)).not.toContain(other.id);
    expect(await ids(users.other)).toEqual([other.id]);

    // Filters and search, and the total on a page past the end.
    expect(await ids(users.supervisor, { state: 'prepared' })).toContain(prepared.id);
    expect(await ids(users.supervisor, { state: 'draft' })).not.toContain(prepared.id);
    expect(await ids(users.supervisor, { q: 'hanging OCTA' })).toEqual(
      expect.arrayContaining([prepared.id, other.id]),
    );
    expect(await ids(users.supervisor, { q: 'no such design 100%' })).toEqual([]);
    const all = (await list(users.supervisor)).body.total as number;
    const past = await list(users.supervisor, { pageSize: 5, page: Math.ceil(all / 5) + 3 });
    expect(past.body).toMatchObject({ items: [], total: all, pageSize: 5 });
    const last = await list(users.supervisor, { pageSize: 1, page: all });
    expect(last.body.items).toHaveLength(1);
    expect(last.body.total).toBe(all);
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
    // White space is no reason: trimmed, at least 3 characters must be left.
    for (const reason of ['     ', ' \t\n ', '  ok  ']) {
      const blank = await act(users.fabricator, job.id, 'return', { reason }, 400);
      expectErrorBody(blank.body, 400, 'VALIDATION.FAILED');
      expect(blank.body.details[0].field).toBe('reason');
    }
    const still = await ctx.http.get(`/api/jobs/${job.id}`).set(auth(users.fabricator)).expect(200);
    expect(still.body.state).toBe('requested');
    const returned = await act(users.fabricator, job.id, 'return', {
      reason: '   Pieces too small for 3 mm acrylic  ',
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

  it('drops the layout and figures of a job whose design changed before it was requested again', async () => {
    const job = await draftJob();
    await act(users.hobbyist, job.id, 'request');
    const prepared = await act(users.fabricator, job.id, 'prepare', prepareBody());
    expect(prepared.body.preparation).not.toBeNull();
    await act(users.fabricator, job.id, 'return', { reason: 'Make the pieces a little larger' });
    await act(users.hobbyist, job.id, 'reopen');
    // Requested again unchanged: the earlier figures stay, for the fabricator to compare.
    const same = await act(users.hobbyist, job.id, 'request');
    expect(same.body.preparation).toEqual(prepared.body.preparation);
    await act(users.fabricator, job.id, 'return', { reason: 'Make the pieces a little larger' });
    await act(users.hobbyist, job.id, 'reopen');
    const designId = (same.body as { designId: string }).designId;
    const design = await ctx.http.get(`/api/designs/${designId}`).set(auth(users.hobbyist)).expect(200);
    const spec = design.body.spec as { piece: { size: number } };
    await ctx.http
      .patch(`/api/designs/${designId}`)
      .set(auth(users.hobbyist))
      .send({
        version: design.body.version,
        spec: { ...spec, piece: { ...spec.piece, size: spec.piece.size * 1.02 } },
      })
      .expect(200);
    // Requested again after the edit: the layout and estimate were for the design before it.
    const changed = await act(users.hobbyist, job.id, 'request');
    expect(changed.body.preparation).toBeNull();
  });

  it('says in a sentence when the colours chosen cannot meet the colour rule', async () => {
    // Four faces meet at each corner of the octahedron, so "all faces at a corner differ" needs 4 (derived).
    const job = await draftJob();
    await act(users.hobbyist, job.id, 'request');
    const res = await act(
      users.fabricator,
      job.id,
      'prepare',
      { ...prepareBody(), colours: ['clear', 'smoke'], colourRule: 'vertex-distinct' },
      409,
    );
    expectErrorBody(res.body, 409, 'JOB.LAYOUT_FAILED');
    expect(res.body.message).toBe(
      'The colour rule “All pieces around a vertex differ” cannot be met with 2 colours; it needs at least 4. ' +
        'Choose more colours of stock, or another rule.',
    );
  });

  it('lets the requester withdraw a request until it is prepared, and tells the fabricators', async () => {
    const job = await draftJob();
    const requested = await act(users.hobbyist, job.id, 'request');
    expect(requested.body.actions).toContain('withdraw');
    // Only the requester (or a supervisor): a fabricator works on requests, and does not take them back.
    await act(users.fabricator, job.id, 'withdraw', {}, 403);
    const withdrawn = await act(users.hobbyist, job.id, 'withdraw');
    expect(withdrawn.body.state).toBe('draft');
    expect(withdrawn.body.transitions.at(-1)).toMatchObject({
      action: 'withdraw',
      from: 'requested',
      to: 'draft',
    });
    const mail: { subject: string }[] = await ctx.db.query(
      `SELECT subject FROM mail_outbox WHERE subject = $1`,
      [`Request withdrawn: ${withdrawn.body.designName}`],
    );
    expect(mail.length).toBeGreaterThan(0);
    // Once prepared, it is the fabricator's to return; the requester cannot pull it back.
    await act(users.hobbyist, job.id, 'request');
    await act(users.fabricator, job.id, 'prepare', prepareBody());
    const late = await act(users.hobbyist, job.id, 'withdraw', {}, 409);
    expectErrorBody(late.body, 409, 'JOB.ILLEGAL_TRANSITION');
  });

  it('says who withdrew a request, links the fabricators to a page they can open, and tells a requester a supervisor withdrew theirs', async () => {
    // The mails' main link is the last "label: address" line of the text body (mail-templates.ts).
    const linkOf = (text: string) => /: (\S+)\n\n— Kerfwright/.exec(text)?.[1] ?? '';
    const pathOf = (url: string) => new URL(url).pathname;

    // Withdrawn by its requester: the fabricators hear it, the requester (who did it) does not.
    const own = await draftJob();
    await act(users.hobbyist, own.id, 'request');
    // Earlier tests' mails (this hobbyist's too) are sent first, so that only this test's are read.
    await mailsSent();
    catcher.messages.length = 0;
    await act(users.hobbyist, own.id, 'withdraw');
    let mails = await mailsSent();
    let toFabricator = mails.find(
      (m) => m.subject.startsWith('Request withdrawn') && m.to.includes(users.fabricator.email),
    );
    expect(toFabricator?.text).toContain('was withdrawn by its requester before it was prepared');
    expect(mails.filter((m) => m.to.includes(users.hobbyist.email))).toEqual([]);
    // The job is a draft again, which a fabricator cannot open: the link is a page they can.
    const link = pathOf(linkOf(toFabricator!.text));
    expect(link).toBe('/jobs');
    await ctx.http.get(`/api/jobs/${own.id}`).set(auth(users.fabricator)).expect(404);

    // Withdrawn by a supervisor: the fabricators hear who did it, and so does the requester.
    const job = await draftJob();
    await act(users.hobbyist, job.id, 'request');
    await mailsSent();
    catcher.messages.length = 0;
    await act(users.supervisor, job.id, 'withdraw');
    mails = await mailsSent();
    toFabricator = mails.find(
      (m) => m.subject.startsWith('Request withdrawn') && m.to.includes(users.fabricator.email),
    );
    expect(toFabricator?.text).toContain(
      'was withdrawn by a supervisor, Test supervisor, before it was prepared',
    );
    expect(toFabricator?.text).not.toContain('its requester');
    const toRequester = mails.filter((m) => m.to.includes(users.hobbyist.email));
    expect(toRequester.map((m) => m.subject)).toEqual(['Your request was withdrawn: Hanging octahedron']);
    expect(toRequester[0]!.text).toContain('Test supervisor, a supervisor, withdrew your request');
    // The requester's link is their job's page, which they can open.
    expect(pathOf(linkOf(toRequester[0]!.text))).toBe(`/jobs/${job.id}`);
    await ctx.http.get(`/api/jobs/${job.id}`).set(auth(users.hobbyist)).expect(200);
  });

  it('lets a job be requested three times in ten minutes, no more: withdrawing in a loop cannot flood the fabricators', async () => {
    const job = await draftJob();
    const mails = async () =>
      (
        (await ctx.db.query(
          `SELECT count(*)::int AS n FROM mail_outbox WHERE kind = 'job.requested' AND text_body LIKE $1`,
          [`%/jobs/${job.id}%`],
        )) as { n: number }[]
      )[0]!.n;
    for (let i = 0; i < 3; i++) {
      await act(users.hobbyist, job.id, 'request');
      await act(users.hobbyist, job.id, 'withdraw');
    }
    const sent = await mails();
    expect(sent).toBeGreaterThan(0);
    const fourth = await act(users.hobbyist, job.id, 'request', {}, 429);
    expectErrorBody(fourth.body, 429, 'JOB.REQUESTED_TOO_OFTEN');
    expect(fourth.body.message).toMatch(/requested 3 times in the last 10 minutes/);
    // Nothing changed and nobody was mailed; ten minutes on, the job may be requested again.
    const after = await ctx.http.get(`/api/jobs/${job.id}`).set(auth(users.hobbyist)).expect(200);
    expect(after.body.state).toBe('draft');
    expect(await mails()).toBe(sent);
    await ctx.db.query(
      `UPDATE job_transitions SET created_at = created_at - interval '11 minutes' WHERE job_id = $1`,
      [job.id],
    );
    expect((await act(users.hobbyist, job.id, 'request')).body.state).toBe('requested');
  });

  it("lets the requester change a draft's copies and notes; a new count drops the old layout", async () => {
    const job = await draftJob();
    const patch = (u: TestUser, body: Record<string, unknown>, status = 200) =>
      ctx.http.patch(`/api/jobs/${job.id}`).set(auth(u)).send(body).expect(status);
    const read = async () =>
      (await ctx.http.get(`/api/jobs/${job.id}`).set(auth(users.supervisor)).expect(200)).body as {
        version: number;
        quantity: number;
        notes: string;
        preparation: {
          pieceCount: number;
          sheet: { widthMm: number; heightMm: number };
          marginMm: number;
          gapMm: number;
        } | null;
        layoutChoice: unknown;
      };
    // Requested, then prepared, then returned and reopened: a draft carrying the old layout for one copy.
    await act(users.hobbyist, job.id, 'request');
    const requested = await read();
    expectErrorBody(
      (await patch(users.hobbyist, { version: requested.version, quantity: 2 }, 409)).body,
      409,
      'JOB.NOT_EDITABLE',
    );
    await act(users.fabricator, job.id, 'prepare', prepareBody());
    await act(users.fabricator, job.id, 'return', { reason: 'Two copies fit on the same sheets' });
    await act(users.hobbyist, job.id, 'reopen');
    const draft = await read();
    expect(draft.preparation).not.toBeNull();
    // Staff do not see drafts; another hobbyist does not either.
    await patch(users.fabricator, { version: draft.version, quantity: 2 }, 404);
    await patch(users.other, { version: draft.version, quantity: 2 }, 404);
    expectErrorBody(
      (await patch(users.hobbyist, { version: draft.version, quantity: 0 }, 400)).body,
      400,
      'VALIDATION.FAILED',
    );
    // Notes alone keep the layout.
    const noted = await patch(users.hobbyist, { version: draft.version, notes: 'Two copies, please' });
    expect(noted.body).toMatchObject({ state: 'draft', quantity: 1, notes: 'Two copies, please' });
    expect(noted.body.version).toBeGreaterThan(draft.version);
    expect((await read()).preparation).not.toBeNull();
    // A stale version is refused, the current one takes the new count and drops the layout.
    expectErrorBody(
      (await patch(users.hobbyist, { version: draft.version, quantity: 2 }, 409)).body,
      409,
      'JOB.STALE_VERSION',
    );
    const twice = await patch(users.hobbyist, { version: noted.body.version, quantity: 2 });
    expect(twice.body).toMatchObject({ state: 'draft', quantity: 2, preparation: null });
    // The layout's figures go, its choices stay: the next Prepare starts from the same sheet and spacing.
    const { sheet, marginMm, gapMm } = draft.preparation!;
    expect(draft.layoutChoice).toEqual({ sheet, marginMm, gapMm });
    expect(twice.body.layoutChoice).toEqual(draft.layoutChoice);
    const audit: { before: unknown; after: unknown }[] = await ctx.db.query(
      `SELECT before, after FROM audit_events WHERE entity_id = $1 AND action = 'job.update' ORDER BY id`,
      [job.id],
    );
    expect(audit.map((a) => a.after)).toEqual([
      expect.objectContaining({ quantity: 1, notes: 'Two copies, please' }),
      expect.objectContaining({ quantity: 2, notes: 'Two copies, please' }),
    ]);
    // The job's history says what changed and who changed it, beside its steps.
    const history = (await ctx.http.get(`/api/jobs/${job.id}`).set(auth(users.hobbyist)).expect(200)).body
      .transitions as { from: string; to: string; action: string; reason: string; actorId: string }[];
    expect(history.filter((t) => t.action === 'change')).toEqual([
      expect.objectContaining({
        from: 'draft',
        to: 'draft',
        reason: 'notes changed',
        actorId: users.hobbyist.id,
      }),
      expect.objectContaining({
        from: 'draft',
        to: 'draft',
        reason: 'copies 1 → 2; the earlier layout was dropped',
        actorId: users.hobbyist.id,
      }),
    ]);
    // Requested again and prepared, the layout is for two copies.
    await act(users.hobbyist, job.id, 'request');
    const prepared = await act(users.fabricator, job.id, 'prepare', prepareBody());
    expect(prepared.body.preparation.pieceCount).toBe(2 * draft.preparation!.pieceCount);
  });

  /** A job of its own workshop (so a material can be changed without touching other tests) taken to `until`. */
  async function jobInOwnWorkshop(
    until: 'prepared' | 'approved' | 'released',
    materialOf = (x: WorkshopFixture) => x.cardId,
  ) {
    const own = await createWorkshop(ctx);
    const job = await draftJob();
    await act(users.hobbyist, job.id, 'request');
    await act(users.fabricator, job.id, 'prepare', {
      materialId: materialOf(own),
      profileVersionId: own.laserVersionId,
      colours: ['clear'],
    });
    if (until !== 'prepared') await act(users.supervisor, job.id, 'approve');
    if (until === 'released') await releaseJob(ctx, users.fabricator, job.id);
    return { own, jobId: job.id };
  }
  /** Changes a material's family to PVC through the materials route, as a fabricator would by mistake. */
  async function makePvc(materialId: string) {
    const m = await ctx.http.get(`/api/materials/${materialId}`).set(auth(users.fabricator)).expect(200);
    const res = await ctx.http
      .patch(`/api/materials/${materialId}`)
      .set(auth(users.fabricator))
      .send({ version: m.body.version, family: 'pvc' })
      .expect(200);
    expect(res.body.laserAllowed).toBe(false);
  }
  /** The refusal preparing a job with this material on this laser gives now (the message to match). */
  async function preparationRefusal(own: WorkshopFixture, materialId: string) {
    const fresh = await draftJob();
    await act(users.hobbyist, fresh.id, 'request');
    const res = await act(
      users.fabricator,
      fresh.id,
      'prepare',
      { materialId, profileVersionId: own.laserVersionId, colours: [] },
      409,
    );
    expectErrorBody(res.body, 409, 'MATERIAL.LASER_PROHIBITED');
    return res.body.message as string;
  }

  it('refuses to approve a job whose material was taken off the laser after preparation, as preparation would', async () => {
    const { own, jobId } = await jobInOwnWorkshop('prepared');
    await makePvc(own.cardId);
    const res = await act(users.supervisor, jobId, 'approve', {}, 409);
    expectErrorBody(res.body, 409, 'MATERIAL.LASER_PROHIBITED');
    // The same code and message as preparing with that material now.
    expect(res.body.message).toBe(await preparationRefusal(own, own.cardId));
    expect(res.body.message).toMatch(/hydrogen chloride/);
    const after = await ctx.http.get(`/api/jobs/${jobId}`).set(auth(users.fabricator)).expect(200);
    expect(after.body.state).toBe('prepared');
  });

  it('refuses to approve a job whose material was measured thicker since it was prepared, until it is prepared again', async () => {
    const { own, jobId } = await jobInOwnWorkshop('prepared');
    const card = await ctx.http.get(`/api/materials/${own.cardId}`).set(auth(users.fabricator)).expect(200);
    const before = (card.body.measuredThicknessMm ?? card.body.nominalThicknessMm) as number;
    const thicker = Math.round((before + 0.2) * 100) / 100;
    await ctx.http
      .patch(`/api/materials/${own.cardId}`)
      .set(auth(users.fabricator))
      .send({ version: card.body.version, measuredThicknessMm: thicker })
      .expect(200);
    const res = await act(users.supervisor, jobId, 'approve', {}, 409);
    expectErrorBody(res.body, 409, 'JOB.MATERIAL_CHANGED');
    expect(res.body.message).toContain(`is now ${thicker} mm thick; the job was prepared for ${before} mm`);
    expect(res.body.message).toMatch(/Prepare the job again/);
    expect(
      (await ctx.http.get(`/api/jobs/${jobId}`).set(auth(users.fabricator)).expect(200)).body.state,
    ).toBe('prepared');
    // Prepared again for the new thickness, it goes through.
    await act(users.fabricator, jobId, 'prepare', {
      materialId: own.cardId,
      profileVersionId: own.laserVersionId,
      colours: ['clear'],
    });
    await act(users.supervisor, jobId, 'approve');
  });

  it('refuses to release or re-export an approved job whose material was taken off the laser, queueing nothing', async () => {
    const { own, jobId } = await jobInOwnWorkshop('approved');
    await makePvc(own.cardId);
    const exportsBefore = await countRows(ctx, 'exports');
    const released = await act(users.fabricator, jobId, 'release', {}, 409);
    expectErrorBody(released.body, 409, 'MATERIAL.LASER_PROHIBITED');
    expect(released.body.message).toBe(await preparationRefusal(own, own.cardId));
    const exported = await ctx.http
      .post(`/api/jobs/${jobId}/exports`)
      .set(auth(users.fabricator))
      .expect(409);
    expectErrorBody(exported.body, 409, 'MATERIAL.LASER_PROHIBITED');
    expect(await countRows(ctx, 'exports')).toBe(exportsBefore);
    const after = await ctx.http.get(`/api/jobs/${jobId}`).set(auth(users.fabricator)).expect(200);
    expect(after.body.state).toBe('approved');
  });

  it('stops a released job whose material was taken off the laser: no downloads, no re-export, no cut, no laser kerf', async () => {
    const { own, jobId } = await jobInOwnWorkshop('released');
    const [exp] = (await ctx.http.get(`/api/jobs/${jobId}/exports`).set(auth(users.operator)).expect(200))
      .body as { id: string; files: { name: string; role: string }[] }[];
    await acknowledge(ctx, users.operator, jobId);
    const file = exp!.files[0]!.name;
    await ctx.http.get(`/api/exports/${exp!.id}/files/${file}`).set(auth(users.operator)).expect(200);
    await makePvc(own.cardId);
    // The notices of the job change with its material: acknowledge the current ones, then still no files.
    await acknowledge(ctx, users.operator, jobId);
    for (const name of exp!.files.map((f) => f.name)) {
      const res = await ctx.http
        .get(`/api/exports/${exp!.id}/files/${name}`)
        .set(auth(users.operator))
        .expect(409);
      expectErrorBody(res.body, 409, 'MATERIAL.LASER_PROHIBITED');
    }
    const guide = exp!.files.find((f) => f.role === 'assembly-guide')!.name;
    await ctx.http.get(`/api/exports/${exp!.id}/files/${guide}`).set(auth(users.hobbyist)).expect(409);
    const again = await ctx.http.post(`/api/jobs/${jobId}/exports`).set(auth(users.fabricator)).expect(409);
    expectErrorBody(again.body, 409, 'MATERIAL.LASER_PROHIBITED');
    const kerfBefore = await countRows(ctx, 'kerf_records');
    const cut = await act(
      users.operator,
      jobId,
      'cut',
      { actualMinutes: 9, sheetsUsed: 1, measuredKerfMm: 0.2 },
      409,
    );
    expectErrorBody(cut.body, 409, 'MATERIAL.LASER_PROHIBITED');
    expect(await countRows(ctx, 'kerf_records')).toBe(kerfBefore);
    const after = await ctx.http.get(`/api/jobs/${jobId}`).set(auth(users.operator)).expect(200);
    expect(after.body.state).toBe('released');
  });

  it('says on the job, in the list and the job view, why a material taken off the laser stops it, and offers no action the server refuses', async () => {
    const refused: Record<string, JobAction[]> = {
      prepared: ['approve'],
      approved: ['release'],
      released: ['cut'],
    };
    for (const state of ['prepared', 'approved', 'released'] as const) {
      const { own, jobId } = await jobInOwnWorkshop(state);
      const before = await ctx.http.get(`/api/jobs/${jobId}`).set(auth(users.supervisor)).expect(200);
      expect(before.body.materialRefusal).toBeNull();
      expect(before.body.actions).toEqual(expect.arrayContaining(refused[state]!));
      await makePvc(own.cardId);
      const message = await preparationRefusal(own, own.cardId);
      for (const who of [users.supervisor, users.fabricator, users.operator, users.hobbyist]) {
        const view = (await ctx.http.get(`/api/jobs/${jobId}`).set(auth(who)).expect(200)).body;
        expect(view.state).toBe(state);
        // The reason is the server's own refusal, word for word (the page shows it beside the job).
        expect(view.materialRefusal).toBe(message);
        for (const a of ['approve', 'release', 'cut']) expect(view.actions).not.toContain(a);
        // The list's row says the same as the job's view.
        const row = (
          await ctx.http.get('/api/jobs').set(auth(who)).query({ state, pageSize: 100 }).expect(200)
        ).body.items.find((j: { id: string }) => j.id === jobId);
        expect(row).toMatchObject({ materialRefusal: message, actions: view.actions });
      }
      // What is still offered still works: the fabricator returns it (or prepares it with another material).
      const fabricatorView = (await ctx.http.get(`/api/jobs/${jobId}`).set(auth(users.fabricator))).body;
      expect(fabricatorView.actions).toContain('return');
      // Each action no longer offered is refused by the server, as the reason says.
      const action = refused[state]![0]!;
      const who =
        action === 'approve' ? users.supervisor : action === 'cut' ? users.operator : users.fabricator;
      if (action === 'cut') await acknowledge(ctx, users.operator, jobId);
      const res = await act(
        who,
        jobId,
        action,
        action === 'cut' ? { actualMinutes: 5, sheetsUsed: 1 } : {},
        409,
      );
      expectErrorBody(res.body, 409, 'MATERIAL.LASER_PROHIBITED');
      expect(res.body.message).toBe(message);
      await act(users.fabricator, jobId, 'return', { reason: 'Material taken off the laser' });
      const returned = (await ctx.http.get(`/api/jobs/${jobId}`).set(auth(users.fabricator))).body;
      expect(returned.materialRefusal).toBeNull();
    }
  });

  it('stops a released job by returning it: its files are no longer offered and it cannot be cut', async () => {
    const job = await releasedAndAcknowledged();
    const [exp] = (await ctx.http.get(`/api/jobs/${job.id}/exports`).set(auth(users.operator)).expect(200))
      .body as { id: string; files: { name: string }[] }[];
    const file = exp!.files[0]!.name;
    await ctx.http.get(`/api/exports/${exp!.id}/files/${file}`).set(auth(users.operator)).expect(200);
    // The machine version it was released on is withdrawn: the job says so, and the supervisor stops it.
    const released = await ctx.http.get(`/api/jobs/${job.id}`).set(auth(users.supervisor)).expect(200);
    await ctx.db.query(`UPDATE machine_profile_versions SET state = 'retired' WHERE id = $1`, [
      released.body.profileVersionId,
    ]);
    try {
      const seen = await ctx.http.get(`/api/jobs/${job.id}`).set(auth(users.operator)).expect(200);
      expect(seen.body).toMatchObject({ state: 'released', profileVersionRetired: true, actions: ['cut'] });
      // The operator cannot return it; the fabricator who released it and a supervisor can.
      await act(users.operator, job.id, 'return', { reason: 'Not on this laser version' }, 403);
      expect(
        (await ctx.http.get(`/api/jobs/${job.id}`).set(auth(users.fabricator)).expect(200)).body.actions,
      ).toContain('return');
      const back = await act(users.supervisor, job.id, 'return', {
        reason: 'Laser version withdrawn after release: prepare it again on the current one',
      });
      expect(back.body).toMatchObject({
        state: 'returned',
        returnReason: expect.stringContaining('withdrawn'),
      });
      expect(back.body.transitions.at(-1)).toMatchObject({
        from: 'released',
        to: 'returned',
        action: 'return',
      });
      const refused = await ctx.http
        .get(`/api/exports/${exp!.id}/files/${file}`)
        .set(auth(users.operator))
        .expect(409);
      expectErrorBody(refused.body, 409, 'EXPORT.JOB_NOT_RELEASED');
      expect(refused.body.message).toContain('returned');
      const cut = await act(users.operator, job.id, 'cut', { actualMinutes: 5, sheetsUsed: 1 }, 409);
      expectErrorBody(cut.body, 409, 'JOB.ILLEGAL_TRANSITION');
      // The operators, told to cut it, are told not to.
      const recalled: { recipients: string[]; subject: string }[] = await ctx.db.query(
        `SELECT recipients, subject FROM mail_outbox WHERE kind = 'job.recalled' AND text_body LIKE $1`,
        [`%/jobs/${job.id}%`],
      );
      expect(recalled.map((r) => r.recipients[0])).toContain(users.operator.email);
      expect(recalled[0]!.subject).toMatch(/^Do not cut: /);
      // Its requester reopens it as a draft, to request it again.
      expect((await act(users.hobbyist, job.id, 'reopen')).body.state).toBe('draft');
    } finally {
      await ctx.db.query(`UPDATE machine_profile_versions SET state = 'approved' WHERE id = $1`, [
        released.body.profileVersionId,
      ]);
    }
  });

  it('asks for the notices again once a returned job is prepared and released again', async () => {
    const job = await releasedAndAcknowledged();
    await act(users.fabricator, job.id, 'return', { reason: 'Wrong acrylic batch on the bed' });
    await act(users.hobbyist, job.id, 'reopen');
    await act(users.hobbyist, job.id, 'request');
    await act(users.fabricator, job.id, 'prepare', prepareBody());
    await act(users.supervisor, job.id, 'approve');
    await releaseJob(ctx, users.fabricator, job.id);
    // The acknowledgement read before the return does not count for the job as prepared now.
    const safety = await ctx.http.get(`/api/jobs/${job.id}/safety`).set(auth(users.operator)).expect(200);
    expect(safety.body.acknowledged).toBe(false);
    const cut = await act(users.operator, job.id, 'cut', { actualMinutes: 9, sheetsUsed: 1 }, 409);
    expectErrorBody(cut.body, 409, 'SAFETY.ACKNOWLEDGEMENT_REQUIRED');
    await acknowledge(ctx, users.operator, job.id);
    expect((await act(users.operator, job.id, 'cut', { actualMinutes: 9, sheetsUsed: 1 })).body.state).toBe(
      'cut',
    );
  });

  it('serves no file of a cut pack built for a preparation the job has replaced since (returned and prepared again)', async () => {
    const job = await draftJob();
    await act(users.hobbyist, job.id, 'request');
    await act(users.fabricator, job.id, 'prepare', prepareBody());
    await act(users.supervisor, job.id, 'approve');
    const first = await releaseJob(ctx, users.fabricator, job.id);
    await act(users.fabricator, job.id, 'return', { reason: 'Use card for this one' });
    await act(users.hobbyist, job.id, 'reopen');
    await act(users.hobbyist, job.id, 'request');
    // Prepared again on another material (another thickness and kerf): the first pack's files are not for it.
    await act(users.fabricator, job.id, 'prepare', { ...prepareBody(), materialId: w.cardId });
    await act(users.supervisor, job.id, 'approve');
    const second = await releaseJob(ctx, users.fabricator, job.id);
    await acknowledge(ctx, users.operator, job.id);
    for (const f of first.files) {
      const res = await ctx.http
        .get(`/api/exports/${first.id}/files/${f.name}`)
        .set(auth(users.operator))
        .expect(409);
      expectErrorBody(res.body, 409, 'EXPORT.PREPARATION_REPLACED');
      expect(res.body.message).toMatch(/prepared again/);
      expect(res.body.details).toEqual({ exportId: first.id, jobId: job.id });
    }
    const guide = (x: typeof first) => x.files.find((f) => f.role === 'assembly-guide')!.name;
    await ctx.http
      .get(`/api/exports/${first.id}/files/${guide(first)}`)
      .set(auth(users.hobbyist))
      .expect(409);
    for (const f of second.files) {
      await ctx.http.get(`/api/exports/${second.id}/files/${f.name}`).set(auth(users.operator)).expect(200);
    }
    await ctx.http
      .get(`/api/exports/${second.id}/files/${guide(second)}`)
      .set(auth(users.hobbyist))
      .expect(200);
  });

  it("lists only the cut packs of the job's preparation in effect: none once it is prepared again, until one is built", async () => {
    const job = await draftJob();
    const listed = async (u: TestUser) =>
      ((await ctx.http.get(`/api/jobs/${job.id}/exports`).set(auth(u)).expect(200)).body as ExportView[]).map(
        (e) => ({ id: e.id, state: e.state, replaced: e.replaced }),
      );
    await act(users.hobbyist, job.id, 'request');
    await act(users.fabricator, job.id, 'prepare', prepareBody());
    await act(users.supervisor, job.id, 'approve');
    const first = await releaseJob(ctx, users.fabricator, job.id);
    expect(first.replaced).toBe(false);
    for (const u of [users.fabricator, users.operator, users.hobbyist]) {
      expect(await listed(u)).toEqual([{ id: first.id, state: 'done', replaced: false }]);
    }
    await act(users.fabricator, job.id, 'return', { reason: 'Use card for this one' });
    // Returned, not yet prepared again: its pack is still the one of its preparation in effect (refused to the
    // machines because the job is returned).
    expect(await listed(users.operator)).toEqual([{ id: first.id, state: 'done', replaced: false }]);
    await act(users.hobbyist, job.id, 'reopen');
    await act(users.hobbyist, job.id, 'request');
    await act(users.fabricator, job.id, 'prepare', { ...prepareBody(), materialId: w.cardId });
    await act(users.supervisor, job.id, 'approve');
    // Prepared again and approved: no pack is built for this preparation yet, and the first one is not offered.
    for (const u of [users.fabricator, users.operator, users.hobbyist]) expect(await listed(u)).toEqual([]);
    const read = await ctx.http.get(`/api/exports/${first.id}`).set(auth(users.operator)).expect(200);
    expect(read.body).toMatchObject({ id: first.id, state: 'done', replaced: true });
    const second = await releaseJob(ctx, users.fabricator, job.id);
    expect(second.replaced).toBe(false);
    for (const u of [users.fabricator, users.operator, users.hobbyist]) {
      expect(await listed(u)).toEqual([{ id: second.id, state: 'done', replaced: false }]);
    }
    // The audit trail keeps both packs.
    const trail = await ctx.http
      .get('/api/audit')
      .query({ entityType: 'job', entityId: job.id })
      .set(auth(users.supervisor))
      .expect(200);
    const built = (trail.body.items as { action: string; after: { exportId?: string } }[])
      .filter((e) => e.action === 'export.done')
      .map((e) => e.after.exportId);
    expect(built.sort()).toEqual([first.id, second.id].sort());
  });

  /** The operator's safety view of a job, and the acknowledgement body that view asks for. */
  async function safetyRead(jobId: string, reader = users.operator) {
    const view = (await ctx.http.get(`/api/jobs/${jobId}/safety`).set(auth(reader)).expect(200)).body as {
      notices: { id: string; version: number }[];
      localRules: { version: number } | null;
      preparationId: string | null;
      acknowledged: boolean;
    };
    const body = {
      notices: view.notices.map((n) => ({ id: n.id, version: n.version })),
      localRulesVersion: view.localRules?.version ?? null,
      preparationId: view.preparationId,
    };
    return { view, body };
  }

  it('binds an acknowledgement to the preparation it was read for: prepared again, the files need a fresh one', async () => {
    const job = await draftJob();
    await act(users.hobbyist, job.id, 'request');
    await act(users.fabricator, job.id, 'prepare', prepareBody());
    const first = await safetyRead(job.id);
    expect(first.view.preparationId).toMatch(/^[1-9][0-9]*$/);
    await ctx.http
      .post(`/api/jobs/${job.id}/safety/acknowledge`)
      .set(auth(users.operator))
      .send(first.body)
      .expect(200);
    // Prepared again on the same material and machine: the same notice versions, another preparation.
    await act(users.fabricator, job.id, 'prepare', { ...prepareBody(), marginMm: 12 });
    const second = await safetyRead(job.id);
    expect(second.body.notices).toEqual(first.body.notices);
    expect(second.body.localRulesVersion).toBe(first.body.localRulesVersion);
    expect(second.view.preparationId).not.toBe(first.view.preparationId);
    expect(second.view.acknowledged).toBe(false);
    // What was read for the first preparation is refused, and nothing is recorded.
    const before = await countRows(ctx, 'safety_acknowledgements');
    const stale = await ctx.http
      .post(`/api/jobs/${job.id}/safety/acknowledge`)
      .set(auth(users.operator))
      .send(first.body)
      .expect(409);
    expectErrorBody(stale.body, 409, 'SAFETY.PREPARATION_CHANGED');
    expect(stale.body.message).toMatch(/prepared again since you read its notices/);
    expect(stale.body.details).toEqual({ preparationId: second.view.preparationId });
    expect(await countRows(ctx, 'safety_acknowledgements')).toBe(before);
    // Approved and released as prepared now: no file and no cut on the first preparation's acknowledgement.
    await act(users.supervisor, job.id, 'approve');
    const pack = await releaseJob(ctx, users.fabricator, job.id);
    const file = pack.files[0]!.name;
    const refused = await ctx.http
      .get(`/api/exports/${pack.id}/files/${file}`)
      .set(auth(users.operator))
      .expect(403);
    expectErrorBody(refused.body, 403, 'SAFETY.ACKNOWLEDGEMENT_REQUIRED');
    const cut = await act(users.operator, job.id, 'cut', { actualMinutes: 9, sheetsUsed: 1 }, 409);
    expectErrorBody(cut.body, 409, 'SAFETY.ACKNOWLEDGEMENT_REQUIRED');
    await ctx.http
      .post(`/api/jobs/${job.id}/safety/acknowledge`)
      .set(auth(users.operator))
      .send(second.body)
      .expect(200);
    await ctx.http.get(`/api/exports/${pack.id}/files/${file}`).set(auth(users.operator)).expect(200);
  });

  it('refuses an acknowledgement read before a preparation that lands while it is sent (409, never counted)', async () => {
    const job = await draftJob();
    await act(users.hobbyist, job.id, 'request');
    await act(users.fabricator, job.id, 'prepare', prepareBody());
    const read = await safetyRead(job.id);
    const waiting = (like: string) => waitingOnLock(ctx, like);
    // Holding off the audit trail stops the second preparation after it has written the job and its prepare
    // transition (stamped with its transaction's start), before it commits: then the acknowledgement is sent.
    const hold = ctx.db.createQueryRunner();
    await hold.connect();
    await hold.startTransaction();
    let prepared: Promise<{ status: number }> | undefined;
    let acknowledged: Promise<{ status: number; body: Record<string, unknown> }> | undefined;
    try {
      await hold.query(`LOCK TABLE audit_events IN SHARE MODE`);
      const version = (await ctx.http.get(`/api/jobs/${job.id}`).set(auth(users.supervisor)).expect(200)).body
        .version as number;
      prepared = Promise.resolve(
        ctx.http
          .post(`/api/jobs/${job.id}/prepare`)
          .set(auth(users.fabricator))
          .send({ ...prepareBody(), marginMm: 14, version }),
      );
      await until('the preparation to wait on the audit trail', () => waiting('%INSERT INTO%audit_events%'));
      acknowledged = Promise.resolve(
        ctx.http.post(`/api/jobs/${job.id}/safety/acknowledge`).set(auth(users.operator)).send(read.body),
      );
      // It waits for the preparation to end, and then reads it.
      await until('the acknowledgement to wait for it', () => waiting('%FROM jobs WHERE id = $1 FOR SHARE%'));
    } finally {
      await hold.rollbackTransaction();
      await hold.release();
    }
    expect((await prepared).status).toBe(200);
    const ack = await acknowledged;
    expect(ack.status).toBe(409);
    expectErrorBody(ack.body, 409, 'SAFETY.PREPARATION_CHANGED');
    const now = await safetyRead(job.id);
    expect(now.view.preparationId).not.toBe(read.view.preparationId);
    expect(ack.body.details).toEqual({ preparationId: now.view.preparationId });
    expect(now.view.acknowledged).toBe(false);
  });

  it('lets only someone who acknowledged the job’s current safety notices record its cut (409 otherwise)', async () => {
    const job = await releasedAndAcknowledged();
    // A second operator, who never acknowledged, and a supervisor, who did not either.
    const second = await createUser(ctx, 'operator');
    for (const u of [second, users.supervisor]) {
      const res = await act(u, job.id, 'cut', { actualMinutes: 12, sheetsUsed: 1, measuredKerfMm: 0.2 }, 409);
      expectErrorBody(res.body, 409, 'SAFETY.ACKNOWLEDGEMENT_REQUIRED');
      expect(res.body.message).toMatch(/Acknowledge the current safety notices for this job/);
    }
    const kerf: unknown[] = await ctx.db.query(`SELECT 1 FROM kerf_records WHERE job_id = $1`, [job.id]);
    expect(kerf).toHaveLength(0);
    // New local rules make the first operator's acknowledgement stale as well.
    await ctx.http
      .put('/api/safety/local-rules')
      .set(auth(users.supervisor))
      .send({ body: 'Rules for the cut test' })
      .expect(200);
    expectErrorBody(
      (await act(users.operator, job.id, 'cut', { actualMinutes: 12, sheetsUsed: 1 }, 409)).body,
      409,
      'SAFETY.ACKNOWLEDGEMENT_REQUIRED',
    );
    await acknowledge(ctx, second, job.id);
    const done = await act(second, job.id, 'cut', { actualMinutes: 12, sheetsUsed: 1 });
    expect(done.body.state).toBe('cut');
  });

  it('keeps a job’s kerf record to the machine and material the job was prepared with', async () => {
    const job = await draftJob();
    await act(users.hobbyist, job.id, 'request');
    await act(users.fabricator, job.id, 'prepare', prepareBody());
    const other = await createWorkshop(ctx);
    const before = await countRows(ctx, 'kerf_records');
    for (const [profileId, materialId] of [
      [w.laserProfileId, w.cardId], // the job's machine, another material
      [other.laserProfileId, w.acrylicId], // the job's material, another machine
    ] as const) {
      const res = await ctx.http
        .post(`/api/machine-profiles/${profileId}/kerf-records`)
        .set(auth(users.operator))
        .send({ materialId, kerfMm: 0.18, jobId: job.id })
        .expect(400);
      expectErrorBody(res.body, 400, 'VALIDATION.FAILED');
      expect(res.body.details).toEqual([
        {
          field: 'jobId',
          messages: ['the job was not prepared with this machine profile and this material'],
        },
      ]);
    }
    expect(await countRows(ctx, 'kerf_records')).toBe(before);
    await ctx.http
      .post(`/api/machine-profiles/${w.laserProfileId.toUpperCase()}/kerf-records`)
      .set(auth(users.operator))
      .send({ materialId: w.acrylicId.toUpperCase(), kerfMm: 0.18, jobId: job.id.toUpperCase() })
      .expect(201);
  });

  it('checks a kerf measured at the cut against the job’s machine kind, as the kerf-records route does', async () => {
    // An approved router profile for the fixture's acrylic: a 2 mm end mill (common practice for 3 mm slots).
    const tag = randomUUID().slice(0, 8);
    const [router] = (await ctx.db.query(
      `INSERT INTO machine_profiles (name, kind) VALUES ($1, 'cnc-router') RETURNING id`,
      [`Test router ${tag}`],
    )) as { id: string }[];
    const setting = {
      materialId: w.acrylicId,
      toolDiameterMm: 2,
      cutSpeedMmS: 20,
      markSpeedMmS: 40,
      passes: 2,
      pierceTimeS: 0,
      spindleRpm: 18000,
    };
    const [version] = (await ctx.db.query(
      `INSERT INTO machine_profile_versions (profile_id, number, state, bed_width_mm, bed_height_mm, rapid_speed_mm_s, hourly_rate, settings)
       VALUES ($1, 1, 'approved', 1000, 600, 100, 40, $2) RETURNING id`,
      [router!.id, JSON.stringify([setting])],
    )) as { id: string }[];
    const job = await draftJob();
    await act(users.hobbyist, job.id, 'request');
    await act(users.fabricator, job.id, 'prepare', { ...prepareBody(), profileVersionId: version!.id });
    await act(users.supervisor, job.id, 'approve');
    await releaseJob(ctx, users.fabricator, job.id);
    await acknowledge(ctx, users.operator, job.id);
    const cut = (measuredKerfMm: number) => ({ actualMinutes: 30, sheetsUsed: 2, measuredKerfMm });
    const kerfBefore = await countRows(ctx, 'kerf_records');
    // The ranges are MACHINE_PROFILE_LIMITS (libs/contracts): a router's cut is as wide as a tool may be,
    // 0.1–25 mm; a laser's beam kerf 0.01–2 mm.
    const thin = await act(users.operator, job.id, 'cut', cut(0.05), 400);
    expectErrorBody(thin.body, 400, 'VALIDATION.FAILED');
    expect(thin.body.details).toEqual([
      { field: 'measuredKerfMm', messages: ['measuredKerfMm must be between 0.1 and 25 mm on a cnc-router'] },
    ]);
    expect(await countRows(ctx, 'kerf_records')).toBe(kerfBefore);
    const done = await act(users.operator, job.id, 'cut', cut(2.05));
    expect(done.body).toMatchObject({ state: 'cut', measuredKerfMm: 2.05 });
    const kept: { profile_id: string; kerf_mm: string }[] = await ctx.db.query(
      `SELECT profile_id, kerf_mm FROM kerf_records WHERE job_id = $1`,
      [job.id],
    );
    expect(kept.map((k) => [k.profile_id, Number(k.kerf_mm)])).toEqual([[router!.id, 2.05]]);
    // On a laser the same 2.05 mm is refused, and the job stays released.
    const laser = await releasedAndAcknowledged();
    const wide = await act(users.operator, laser.id, 'cut', cut(2.05), 400);
    expectErrorBody(wide.body, 400, 'VALIDATION.FAILED');
    expect(wide.body.details).toEqual([
      { field: 'measuredKerfMm', messages: ['measuredKerfMm must be between 0.01 and 2 mm on a co2-laser'] },
    ]);
    const after = await ctx.http.get(`/api/jobs/${laser.id}`).set(auth(users.operator)).expect(200);
    expect(after.body.state).toBe('released');
    const none: unknown[] = await ctx.db.query(`SELECT 1 FROM kerf_records WHERE job_id = $1`, [laser.id]);
    expect(none).toHaveLength(0);
  });

  it('queues no cut pack for a cut or closed job (409), only for an approved or released one', async () => {
    const job = await releasedAndAcknowledged();
    await act(users.operator, job.id, 'cut', { actualMinutes: 20, sheetsUsed: 1 });
    const before = await countRows(ctx, 'exports');
    for (const step of ['cut', 'closed']) {
      if (step === 'closed') await act(users.operator, job.id, 'close');
      const res = await ctx.http.post(`/api/jobs/${job.id}/exports`).set(auth(users.fabricator)).expect(409);
      expectErrorBody(res.body, 409, 'EXPORT.JOB_NOT_READY');
      expect(res.body.details).toMatchObject({ state: step });
    }
    expect(await countRows(ctx, 'exports')).toBe(before);
  });

  it('refuses a stock sheet the machine’s bed cannot hold either way round (409); a turned sheet that fits is fine', async () => {
    const job = await draftJob();
    await act(users.hobbyist, job.id, 'request');
    // The fixture's laser bed is 1000 × 600 mm.
    for (const sheet of [
      { widthMm: 3000, heightMm: 3000 },
      { widthMm: 1001, heightMm: 500 },
      { widthMm: 700, heightMm: 700 },
    ]) {
      const res = await act(users.fabricator, job.id, 'prepare', { ...prepareBody(), sheet }, 409);
      expectErrorBody(res.body, 409, 'JOB.SHEET_LARGER_THAN_BED');
      expect(res.body.details).toEqual({ sheet, bed: { widthMm: 1000, heightMm: 600 } });
    }
    const turned = await act(users.fabricator, job.id, 'prepare', {
      ...prepareBody(),
      sheet: { widthMm: 600, heightMm: 1000 },
    });
    expect(turned.body.state).toBe('prepared');
    expect(turned.body.preparation.sheet).toMatchObject({ widthMm: 600, heightMm: 1000 });
    // The material lists no 600 × 1000 sheet, so no price: the material cost is unknown, not nought.
    expect(turned.body.preparation.estimate).toMatchObject({ materialCost: null, currency: 'EUR' });
    expect(turned.body.preparation.estimate.machineCost).toBeGreaterThan(0);
  });

  it('asks the other supervisors, not the one who prepared it, to approve a job a supervisor prepared', async () => {
    const second = await createUser(ctx, 'supervisor');
    catcher.messages.length = 0;
    const job = await draftJob();
    await act(users.hobbyist, job.id, 'request');
    await act(users.supervisor, job.id, 'prepare', prepareBody());
    const asked = (await mailsSent())
      .filter((m) => m.subject.startsWith('Job prepared, waiting for approval') && m.text.includes(job.id))
      .flatMap((m) => m.to);
    // The preparer may not approve it (four eyes): the mail goes to those who may.
    expect(asked).toContain(second.email);
    expect(asked).not.toContain(users.supervisor.email);
    await act(users.supervisor, job.id, 'approve', {}, 403);
    await act(second, job.id, 'approve');
  });

  it('sends mail to the right people on request, preparation, approval, release and return', async () => {
    catcher.messages.length = 0;
    const job = await draftJob();
    await act(users.hobbyist, job.id, 'request');
    let mails = await mailsSent();
    // Each recipient gets a message of their own: the addresses of the job's mails, one per message.
    const recipientsOf = (subject: string) => {
      const of = mails.filter((m) => m.subject.startsWith(subject) && m.text.includes(job.id));
      expect(of.every((m) => m.to.length === 1)).toBe(true);
      return of.flatMap((m) => m.to);
    };
    expect(recipientsOf('Cut requested')).toContain(users.fabricator.email);
    expect(recipientsOf('Cut requested')).not.toContain(users.hobbyist.email);
    await act(users.fabricator, job.id, 'prepare', prepareBody());
    mails = await mailsSent();
    expect(recipientsOf('Job prepared, waiting for approval')).toContain(users.supervisor.email);
    expect(recipientsOf('Job prepared, waiting for approval')).not.toContain(users.hobbyist.email);
    await act(users.supervisor, job.id, 'approve');
    await releaseJob(ctx, users.fabricator, job.id);
    mails = await mailsSent();
    for (const [prefix, ownPrefix] of [
      ['Job approved', 'Your job is approved'],
      ['Job released', 'Your job is released'],
    ] as const) {
      // The requester and each operator get a message of their own: nobody sees the others' addresses. The
      // operators are told what to do next, the requester what happens to the job.
      const ofJob = mails.filter((x) => x.text.includes(job.id));
      const toOperator = ofJob.find(
        (x) => x.subject.startsWith(prefix) && x.to.includes(users.operator.email),
      );
      expect(toOperator?.to).toEqual([users.operator.email]);
      expect(toOperator?.html).toContain('<p>');
      const toOwner = ofJob.find((x) => x.subject.startsWith(ownPrefix));
      expect(toOwner?.to).toEqual([users.hobbyist.email]);
      expect(ofJob.filter((x) => x.subject.startsWith(prefix)).flatMap((x) => x.to)).not.toContain(
        users.hobbyist.email,
      );
      expect(toOwner?.text).not.toMatch(/acknowledge the safety notices/i);
    }
    expect(
      mails.find((x) => x.subject.startsWith('Job released') && x.text.includes(job.id))?.text,
    ).toContain('Acknowledge the safety notices for this job before downloading its files.');
    // The cut recorded: the requester hears their pieces are cut.
    await acknowledge(ctx, users.operator, job.id);
    await act(users.operator, job.id, 'cut', { actualMinutes: 12, sheetsUsed: 1 });
    mails = await mailsSent();
    const cut = mails.find((m) => m.subject.startsWith('Your job is cut') && m.text.includes(job.id));
    expect(cut?.to).toEqual([users.hobbyist.email]);

    const other = await draftJob(users.other);
    await act(users.other, other.id, 'request');
    await act(users.fabricator, other.id, 'return', { reason: 'Needs a thicker stock' });
    mails = await mailsSent();
    const ret = mails.find(
      (m) => m.subject.startsWith('Job returned') && m.text.includes('Needs a thicker stock'),
    );
    expect(ret?.to).toEqual([users.other.email]);
    expect(ret?.text).toMatch(/Reason given: \S/);
    // Returned after its preparation, the fabricator who prepared it hears why; not when they returned it.
    expect(mails.some((m) => m.subject.startsWith('A job you prepared was returned'))).toBe(false);
    await act(users.other, other.id, 'reopen');
    await act(users.other, other.id, 'request');
    await act(users.fabricator, other.id, 'prepare', prepareBody());
    await act(users.supervisor, other.id, 'return', { reason: 'Wrong sheet size for this batch' });
    mails = await mailsSent();
    const back = mails.find(
      (m) => m.subject.startsWith('A job you prepared was returned') && m.text.includes(other.id),
    );
    expect(back?.to).toEqual([users.fabricator.email]);
    expect(back?.text).toContain('Reason given: Wrong sheet size for this batch');
  });

  it('mails nobody about what they just did themselves, whatever their role', async () => {
    const second = await createUser(ctx, 'fabricator');
    const subjectsTo = (
      mails: { to: string[]; subject: string; text: string }[],
      who: TestUser,
      id: string,
    ) => mails.filter((m) => m.to.includes(who.email) && m.text.includes(id)).map((m) => m.subject);
    // A fabricator's own request, withdrawn, requested again and returned by them: the other fabricators hear of
    // the request and the withdrawal; the fabricator who did each hears of none of it.
    catcher.messages.length = 0;
    const own = await draftJob(users.fabricator, 'Fabricator’s own octahedron');
    await act(users.fabricator, own.id, 'request');
    await act(users.fabricator, own.id, 'withdraw');
    await act(users.fabricator, own.id, 'request');
    await act(users.fabricator, own.id, 'return', { reason: 'Cut it another day' });
    let mails = await mailsSent();
    const withdrawn = mails.filter(
      (m) => m.subject.startsWith('Request withdrawn') && m.to.includes(second.email),
    );
    expect(withdrawn.length).toBeGreaterThan(0);
    expect(subjectsTo(mails, second, own.id)).toContain('Cut requested: Fabricator’s own octahedron');
    expect(subjectsTo(mails, users.fabricator, own.id)).toEqual([]);
    expect(
      mails.filter((m) => m.to.includes(users.fabricator.email) && m.subject.includes('withdrawn')),
    ).toEqual([]);

    // A supervisor approving a job of their own (a fabricator prepared it) is asked to approve it, as every
    // supervisor is, but not told they approved it; once the queue has released it, they hear that, as any
    // requester does.
    catcher.messages.length = 0;
    const supervisors = await draftJob(users.supervisor, 'Supervisor’s own octahedron');
    await act(users.supervisor, supervisors.id, 'request');
    await act(users.fabricator, supervisors.id, 'prepare', prepareBody());
    await act(users.supervisor, supervisors.id, 'approve');
    await releaseJob(ctx, users.fabricator, supervisors.id);
    mails = await mailsSent();
    expect(subjectsTo(mails, users.supervisor, supervisors.id)).toEqual([
      'Job prepared, waiting for approval: Supervisor’s own octahedron',
      'Your job is released to the machines: Supervisor’s own octahedron',
    ]);
    expect(subjectsTo(mails, users.operator, supervisors.id)).toEqual([
      'Job approved: Supervisor’s own octahedron',
      'Job released to the machines: Supervisor’s own octahedron',
    ]);

    // An operator recording the cut of a job of their own is not told it is cut.
    catcher.messages.length = 0;
    const operators = await draftJob(users.operator, 'Operator’s own octahedron');
    await act(users.operator, operators.id, 'request');
    await act(users.fabricator, operators.id, 'prepare', prepareBody());
    await act(users.supervisor, operators.id, 'approve');
    await releaseJob(ctx, users.fabricator, operators.id);
    await acknowledge(ctx, users.operator, operators.id);
    await act(users.operator, operators.id, 'cut', { actualMinutes: 10, sheetsUsed: 1 });
    mails = await mailsSent();
    expect(subjectsTo(mails, users.operator, operators.id)).not.toContain(
      'Your job is cut: Operator’s own octahedron',
    );
    // Someone else recording it, the requester hears it.
    const other = await draftJob(users.operator, 'Operator’s second octahedron');
    await act(users.operator, other.id, 'request');
    await act(users.fabricator, other.id, 'prepare', prepareBody());
    await act(users.supervisor, other.id, 'approve');
    await releaseJob(ctx, users.fabricator, other.id);
    await acknowledge(ctx, users.supervisor, other.id);
    await act(users.supervisor, other.id, 'cut', { actualMinutes: 10, sheetsUsed: 1 });
    mails = await mailsSent();
    expect(subjectsTo(mails, users.operator, other.id)).toContain(
      'Your job is cut: Operator’s second octahedron',
    );
  });

  it('documents the response shapes of the designs and jobs routes at /api/docs', async () => {
    const doc = (await ctx.http.get('/api/docs-json').expect(200)).body as {
      paths: Record<string, Record<string, { responses: Record<string, { content?: unknown }> }>>;
      components: { schemas: Record<string, { properties: Record<string, unknown> }> };
    };
    const schemaOf = (path: string, method: string, status: string): string =>
      JSON.stringify(doc.paths[path]?.[method]?.responses[status]?.content ?? null);
    expect(schemaOf('/api/designs', 'get', '200')).toContain('#/components/schemas/DesignPageDto');
    expect(schemaOf('/api/designs/{id}', 'get', '200')).toContain('#/components/schemas/DesignViewDto');
    expect(schemaOf('/api/jobs', 'get', '200')).toContain('#/components/schemas/JobPageDto');
    expect(schemaOf('/api/jobs', 'post', '201')).toContain('#/components/schemas/JobDetailViewDto');
    expect(schemaOf('/api/jobs/{id}', 'get', '200')).toContain('#/components/schemas/JobDetailViewDto');
    for (const action of ['request', 'prepare', 'approve', 'cut', 'close', 'return', 'reopen', 'withdraw']) {
      expect(schemaOf(`/api/jobs/{id}/${action}`, 'post', '200')).toContain('JobDetailViewDto');
    }
    expect(schemaOf('/api/jobs/{id}/release', 'post', '202')).toContain('ExportRequestedDto');
    const s = doc.components.schemas;
    expect(Object.keys(s.DesignSummaryDto!.properties)).toEqual(expect.arrayContaining(['solid', 'preview']));
    expect(Object.keys(s.DesignSummaryDto!.properties)).not.toContain('spec');
    expect(Object.keys(s.JobDetailViewDto!.properties)).toEqual(
      expect.arrayContaining(['state', 'actions', 'preparation', 'transitions', 'version']),
    );
    expect(Object.keys(s.JobPageDto!.properties).sort()).toEqual(['items', 'page', 'pageSize', 'total']);
  });

  it('keeps the state change when the mail server is down, and delivers later', async () => {
    // Mail of earlier tests still due goes out first: a pass stops at its first failure, so an older message
    // tried while the server is down would leave this test's message untried.
    await ctx.app.get(MailDispatcherService).dispatchDue();
    const downPort = catcher.smtpPort;
    await catcher.stop();
    const job = await draftJob();
    const res = await act(users.hobbyist, job.id, 'request');
    expect(res.body.state).toBe('requested');
    // Mail queued meanwhile by earlier tests' background work (a cut pack released after its test ended) would
    // be tried first and stop the pass: it waits an hour, so this job's first message is the one tried.
    await ctx.db.query(
      `UPDATE mail_outbox SET next_attempt_at = now() + interval '1 hour'
        WHERE status = 'pending' AND text_body NOT LIKE $1`,
      [`%${job.id}%`],
    );
    await ctx.app.get(MailDispatcherService).dispatchDue();
    // One message per fabricator; the pass stops at the first that fails, the others wait their turn.
    const pending: { attempts: number; status: string }[] = await ctx.db.query(
      `SELECT attempts, status FROM mail_outbox WHERE kind = 'job.requested' AND text_body LIKE $1 ORDER BY id`,
      [`%${job.id}%`],
    );
    expect(pending.length).toBeGreaterThanOrEqual(1);
    expect(pending.every((m) => m.status === 'pending')).toBe(true);
    expect(pending[0]).toMatchObject({ attempts: 1 });
    catcher = await startMailCatcher({ smtpPort: downPort });
    await ctx.db.query(`UPDATE mail_outbox SET next_attempt_at = now() WHERE status = 'pending'`);
    await ctx.app.get(MailDispatcherService).dispatchDue();
    expect(catcher.messages.some((m) => m.subject.startsWith('Cut requested'))).toBe(true);
  });
});
