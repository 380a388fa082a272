import * as fs from 'node:fs';
import * as path from 'node:path';
import { randomUUID } from 'node:crypto';
import { type MaterialHazard, type Role } from '@kerfwright/contracts';
import { type MailCatcher, startMailCatcher } from '../src/dev-mail/mail-catcher';
import { MachineProfilesService } from '../src/machine-profiles/machine-profiles.service';
import { MailDispatcherService } from '../src/mail/mail-dispatcher.service';
import { octahedronHexagons } from './support/workshop-fixtures';
import {
  countRows,
  createUser,
  expectErrorBody,
  startTestApp,
  type TestContext,
  type TestUser,
} from './support/test-app';

/** The workshop's hazard table as shipped in safety/ (the file the seed loads into material_hazards). */
const HAZARD_FILE = path.join(__dirname, '..', '..', '..', 'safety', 'material-hazards.json');
const HAZARDS = (JSON.parse(fs.readFileSync(HAZARD_FILE, 'utf8')) as { rows: MaterialHazard[] }).rows;

async function ensureHazardTable(ctx: TestContext): Promise<void> {
  for (const r of HAZARDS) {
    await ctx.db.query(
      `INSERT INTO material_hazards (family, examples, laser, hazard, condition, source) VALUES ($1, $2, $3, $4, $5, $6)
       ON CONFLICT (family) DO NOTHING`,
      [r.family, JSON.stringify(r.examples), r.laser, r.hazard, r.condition ?? null, r.source],
    );
  }
}

const ROLES: Role[] = ['hobbyist', 'fabricator', 'operator', 'supervisor'];
const unique = (prefix: string): string => `${prefix} ${randomUUID().slice(0, 8)}`;

interface VersionBody {
  id: string;
  number: number;
  state: string;
  lockVersion: number;
  settings: {
    materialId: string;
    kerfMm?: number;
    toolDiameterMm?: number;
    materialName: string;
    laserCondition?: string;
  }[];
  basedOnNumber: number | null;
  returnReason: string | null;
}
interface ProfileBody {
  id: string;
  name: string;
  latest: VersionBody;
  currentApproved: VersionBody | null;
  versions: VersionBody[];
}

describe('machine profiles, versions and kerf records', () => {
  let ctx: TestContext;
  let catcher: MailCatcher;
  const users = {} as Record<Role, TestUser>;
  let secondSupervisor: TestUser;
  let plywood: string;
  let acrylic: string;
  let pvc: string;
  let felt: string;
  const auth = (who: Role | TestUser) => ({
    Authorization: `Bearer ${typeof who === 'string' ? users[who].token : who.token}`,
  });

  /** CO2 laser on 3 mm birch plywood: about 0.15 mm kerf (common practice, from memory). */
  const laserSetting = (materialId: string, kerfMm = 0.15) => ({
    materialId,
    kerfMm,
    cutSpeedMmS: 15,
    markSpeedMmS: 300,
    powerPct: 70,
    passes: 1,
    pierceTimeS: 0.2,
  });
  /** A 1/8 inch (3.175 mm) two-flute end mill is a usual router bit for 3–6 mm sheet (common practice). */
  const routerSetting = (materialId: string, toolDiameterMm = 3.175) => ({
    materialId,
    toolDiameterMm,
    cutSpeedMmS: 20,
    markSpeedMmS: 40,
    passes: 2,
    pierceTimeS: 0,
    spindleRpm: 18000,
  });
  const profileBody = (overrides: Record<string, unknown> = {}) => ({
    name: unique('Bay laser'),
    kind: 'co2-laser',
    bedWidthMm: 600,
    bedHeightMm: 400,
    rapidSpeedMmS: 500,
    hourlyRate: 30,
    currency: 'EUR',
    settings: [laserSetting(plywood)],
    notes: 'test profile',
    ...overrides,
  });

  async function material(family: string, extra: Record<string, unknown> = {}): Promise<string> {
    const res = await ctx.http
      .post('/api/materials')
      .set(auth('fabricator'))
      .send({ name: unique(`${family} sheet`), family, nominalThicknessMm: 3, ...extra })
      .expect(201);
    return res.body.id as string;
  }
  async function createProfile(overrides: Record<string, unknown> = {}): Promise<ProfileBody> {
    const res = await ctx.http
      .post('/api/machine-profiles')
      .set(auth('fabricator'))
      .send(profileBody(overrides));
    expect(res.status).toBe(201);
    return res.body as ProfileBody;
  }
  const versionPath = (p: { id: string }, v: { id: string }, action = '') =>
    `/api/machine-profiles/${p.id}/versions/${v.id}${action ? `/${action}` : ''}`;
  function act(who: Role | TestUser, p: { id: string }, v: { id: string }, action: string, body = {}) {
    return ctx.http
      .post(versionPath(p, v, action))
      .set(auth(who))
      .send(body);
  }
  /** The second supervisor, who had a hand in the version, is refused (403); the demo supervisor approves it. */
  async function expectOnlyTheOtherApproves(p: { id: string }, v: VersionBody) {
    expectErrorBody(
      (await act(secondSupervisor, p, v, 'approve', { lockVersion: v.lockVersion }).expect(403)).body,
      403,
      'MACHINE_PROFILE.SELF_APPROVAL',
    );
    await act('supervisor', p, v, 'approve', { lockVersion: v.lockVersion }).expect(200);
  }
  async function submitted(overrides: Record<string, unknown> = {}) {
    const p = await createProfile(overrides);
    const v = (
      await act('fabricator', p, p.latest, 'submit', { lockVersion: p.latest.lockVersion }).expect(200)
    ).body as VersionBody;
    return { p, v };
  }
  async function approved(
    overrides: Record<string, unknown> = {},
    checked: { conditionsChecked?: boolean } = {},
  ) {
    const { p, v } = await submitted(overrides);
    const a = (
      await act('supervisor', p, v, 'approve', { lockVersion: v.lockVersion, ...checked }).expect(200)
    ).body as VersionBody;
    return { p, v: a };
  }
  async function kerfRecord(p: { id: string }, materialId: string, kerfMm: number) {
    const res = await ctx.http
      .post(`/api/machine-profiles/${p.id}/kerf-records`)
      .set(auth('operator'))
      .send({ materialId, kerfMm, notes: 'test cut, 20 mm square, callipers' })
      .expect(201);
    return res.body as { id: string; kerfMm: number; adoptedVersionId: string | null };
  }
  async function mailsAbout(text: string) {
    await ctx.app.get(MailDispatcherService).dispatchDue();
    return catcher.messages.filter((m) => m.subject.includes(text));
  }

  beforeAll(async () => {
    catcher = await startMailCatcher({ smtpPort: 0 });
    process.env.KW_SMTP_PORT = String(catcher.smtpPort);
    ctx = await startTestApp();
    await ensureHazardTable(ctx);
    for (const role of ROLES) users[role] = await createUser(ctx, role);
    secondSupervisor = await createUser(ctx, 'supervisor');
    plywood = await material('plywood');
    acrylic = await material('acrylic');
    felt = await material('felt');
    pvc = await material('pvc');
  });
  afterAll(async () => {
    await ctx.app.close();
    await catcher.stop();
  });

  it('runs the whole version lifecycle, keeps approved versions unchanged, and audits every step', async () => {
    const service = ctx.app.get(MachineProfilesService);
    const p = await createProfile();
    expect(p.versions).toHaveLength(1);
    expect(p.latest).toMatchObject({ number: 1, state: 'draft', basedOnNumber: null, lockVersion: 1 });
    expect(p.latest.settings[0]!.materialName).toMatch(/plywood sheet/);
    expect(p.currentApproved).toBeNull();
    await expect(service.getApprovedVersion(p.latest.id)).rejects.toMatchObject({
      response: expect.objectContaining({ code: 'MACHINE_PROFILE.NOT_APPROVED' }),
    });
    await expect(service.currentApprovedVersion(p.id)).rejects.toMatchObject({ status: 409 });

    // Submit → a submitted version is fixed.
    const s1 = (await act('fabricator', p, p.latest, 'submit', { lockVersion: 1 }).expect(200))
      .body as VersionBody;
    expect(s1).toMatchObject({ state: 'submitted', lockVersion: 2 });
    const frozen = await ctx.http
      .patch(versionPath(p, s1))
      .set(auth('fabricator'))
      .send({ lockVersion: 2, hourlyRate: 99 })
      .expect(409);
    expectErrorBody(frozen.body, 409, 'MACHINE_PROFILE.INVALID_STATE');

    // Return with a reason → draft again; the reason is required.
    const noReason = await act('supervisor', p, s1, 'return', { lockVersion: s1.lockVersion }).expect(400);
    expect(noReason.body.details[0].field).toBe('reason');
    // A reason says something: at least 3 characters once trimmed, as for a job sent back or a machine retired.
    const tooShort = await act('supervisor', p, s1, 'return', {
      lockVersion: s1.lockVersion,
      reason: '  x ',
    });
    expectErrorBody(tooShort.body, 400, 'VALIDATION.FAILED');
    expect(tooShort.body.details[0].field).toBe('reason');
    const r1 = (
      await act('supervisor', p, s1, 'return', {
        lockVersion: s1.lockVersion,
        reason: 'Pierce time looks long for 3 mm ply',
      }).expect(200)
    ).body as VersionBody;
    expect(r1).toMatchObject({ state: 'draft', returnReason: 'Pierce time looks long for 3 mm ply' });

    // Edit the returned draft; a stale lockVersion is refused.
    const e1 = await ctx.http
      .patch(versionPath(p, r1))
      .set(auth('fabricator'))
      .send({ lockVersion: r1.lockVersion, settings: [{ ...laserSetting(plywood), pierceTimeS: 0.1 }] })
      .expect(200);
    const staleEdit = await ctx.http
      .patch(versionPath(p, r1))
      .set(auth('fabricator'))
      .send({ lockVersion: r1.lockVersion, notes: 'late' })
      .expect(409);
    expectErrorBody(staleEdit.body, 409, 'MACHINE_PROFILE.STALE_VERSION');

    // Submit again and approve.
    const s2 = (await act('fabricator', p, r1, 'submit', { lockVersion: e1.body.lockVersion }).expect(200))
      .body as VersionBody;
    const a1 = (await act('supervisor', p, r1, 'approve', { lockVersion: s2.lockVersion }).expect(200))
      .body as VersionBody;
    expect(a1.state).toBe('approved');
    expect(a1.returnReason).toBeNull();
    const approvedNow = await service.currentApprovedVersion(p.id);
    expect(approvedNow).toMatchObject({ id: r1.id, kind: 'co2-laser', profileName: p.name });
    expect((await service.getApprovedVersion(r1.id)).settings[0]).toMatchObject({
      kerfMm: 0.15,
      pierceTimeS: 0.1,
    });

    // Editing an approved profile makes a new draft from it; only one open version at a time.
    const approvedEdit = await ctx.http
      .patch(versionPath(p, a1))
      .set(auth('fabricator'))
      .send({ lockVersion: a1.lockVersion, hourlyRate: 40 })
      .expect(409);
    expectErrorBody(approvedEdit.body, 409, 'MACHINE_PROFILE.INVALID_STATE');
    const v2 = (
      await ctx.http
        .post(`/api/machine-profiles/${p.id}/versions`)
        .set(auth('fabricator'))
        .send({ settings: [laserSetting(plywood, 0.18)], hourlyRate: 40 })
        .expect(201)
    ).body as VersionBody;
    expect(v2).toMatchObject({ number: 2, state: 'draft', basedOnNumber: 1 });
    const another = await ctx.http
      .post(`/api/machine-profiles/${p.id}/versions`)
      .set(auth('fabricator'))
      .send({})
      .expect(409);
    expectErrorBody(another.body, 409, 'MACHINE_PROFILE.OPEN_VERSION_EXISTS');
    expect((await service.currentApprovedVersion(p.id)).id).toBe(r1.id);

    // Approving version 2 retires version 1, whose content is unchanged (jobs keep its id).
    const s3 = (await act('fabricator', p, v2, 'submit', { lockVersion: v2.lockVersion }).expect(200))
      .body as VersionBody;
    await act('supervisor', p, v2, 'approve', { lockVersion: s3.lockVersion }).expect(200);
    const detail = (await ctx.http.get(`/api/machine-profiles/${p.id}`).set(auth('hobbyist')).expect(200))
      .body as ProfileBody;
    expect(detail.versions.map((v) => [v.number, v.state])).toEqual([
      [2, 'approved'],
      [1, 'retired'],
    ]);
    expect(detail.currentApproved!.id).toBe(v2.id);
    expect(detail.versions[1]!.settings[0]!.kerfMm).toBe(0.15);
    expect(detail.versions[0]!.settings[0]!.kerfMm).toBe(0.18);
    await expect(service.getApprovedVersion(r1.id)).rejects.toMatchObject({ status: 409 });

    // Retire: no approved version is left.
    const v2now = detail.versions[0]!;
    await act('supervisor', p, v2now, 'retire', { lockVersion: v2now.lockVersion }).expect(200);
    await expect(service.currentApprovedVersion(p.id)).rejects.toMatchObject({
      response: expect.objectContaining({ code: 'MACHINE_PROFILE.NOT_APPROVED' }),
    });
    const again = await act('supervisor', p, v2now, 'approve', { lockVersion: v2now.lockVersion }).expect(
      409,
    );
    expectErrorBody(again.body, 409, 'MACHINE_PROFILE.INVALID_STATE');

    const audit: { action: string }[] = await ctx.db.query(
      `SELECT action FROM audit_events WHERE entity_id = ANY($1) ORDER BY id`,
      [[p.id, r1.id, v2.id]],
    );
    expect(audit.map((a) => a.action)).toEqual([
      'machine-profile.create',
      'machine-profile-version.create',
      'machine-profile-version.submit',
      'machine-profile-version.return',
      'machine-profile-version.update',
      'machine-profile-version.submit',
      'machine-profile-version.approve',
      'machine-profile-version.create',
      'machine-profile-version.submit',
      'machine-profile-version.retire',
      'machine-profile-version.approve',
      'machine-profile-version.retire',
    ]);
    // Version entries carry their profile's name, so the audit trail can say which machine.
    const named: { logged: string | null }[] = await ctx.db.query(
      `SELECT after->>'profileName' AS logged FROM audit_events
        WHERE entity_id = ANY($1) AND action LIKE 'machine-profile-version.%'`,
      [[r1.id, v2.id]],
    );
    expect(named.length).toBeGreaterThan(0);
    for (const n of named) expect(n.logged).toBe(p.name);
  });

  it('takes a machine out of use with a reason: kept on the version, mailed with the jobs it touches', async () => {
    const { p, v } = await approved();
    // Jobs on the version, written straight to the database (with a real spec, as every reader expects one).
    const spec = JSON.stringify(octahedronHexagons());
    const designs: { id: string; name: string }[] = [];
    for (const name of [unique('Lantern'), unique('Star lamp'), unique('Old cut')]) {
      const rows: { id: string }[] = await ctx.db.query(
        `INSERT INTO designs (owner_id, name, spec) VALUES ($1, $2, $3) RETURNING id`,
        [users.hobbyist.id, name, spec],
      );
      designs.push({ id: rows[0]!.id, name });
    }
    const jobIds: string[] = [];
    for (const [i, state] of (['released', 'approved', 'closed'] as const).entries()) {
      const rows: { id: string }[] = await ctx.db.query(
        `INSERT INTO jobs (design_id, requester_id, state, spec, material_id, profile_version_id)
         VALUES ($1, $2, $3, $4, $5, $6) RETURNING id`,
        [designs[i]!.id, users.hobbyist.id, state, spec, plywood, v.id],
      );
      jobIds.push(rows[0]!.id);
    }

    // A reason says why (3 characters at least once trimmed, as a job's return reason); only supervisors retire.
    const short = await act('supervisor', p, v, 'retire', { lockVersion: v.lockVersion, reason: '  x ' });
    expectErrorBody(short.body, 400, 'VALIDATION.FAILED');
    await act('fabricator', p, v, 'retire', { reason: 'Tube cracked' }).expect(403);
    const retired = (
      await act('supervisor', p, v, 'retire', {
        lockVersion: v.lockVersion,
        reason: '  Laser tube cracked; do not run until it is replaced  ',
      }).expect(200)
    ).body as VersionBody & { retireReason: string | null };
    expect(retired).toMatchObject({
      state: 'retired',
      retireReason: 'Laser tube cracked; do not run until it is replaced',
    });
    const detail = (await ctx.http.get(`/api/machine-profiles/${p.id}`).set(auth('operator')).expect(200))
      .body as ProfileBody;
    expect(detail.currentApproved).toBeNull();

    const mails = await mailsAbout(`Machine out of use: ${p.name}`);
    const to = mails.flatMap((m) => m.to);
    for (const role of ['fabricator', 'operator', 'supervisor'] as const)
      expect(to).toContain(users[role].email);
    expect(to).not.toContain(users.hobbyist.email);
    const mail = mails.find((m) => m.to.includes(users.fabricator.email))!;
    expect(mail.text).toContain('Reason given: Laser tube cracked; do not run until it is replaced');
    // Each job it touches named with a link to its page, under what to do with it.
    expect(mail.text).toMatch(
      new RegExp(
        'Released with these settings, not yet cut;[^\\n]*:\\n' +
          `- "${designs[0]!.name}" \\(released\\): https?://[^\\s]+/jobs/${jobIds[0]}\\n`,
      ),
    );
    expect(mail.text).toMatch(
      new RegExp(
        'Prepared or approved with these settings;[^\\n]*:\\n' +
          `- "${designs[1]!.name}" \\(approved\\): https?://[^\\s]+/jobs/${jobIds[1]}\\n`,
      ),
    );
    expect(mail.html).toMatch(new RegExp(`<li><a href="https?://[^"]+/jobs/${jobIds[0]}">`));
    expect(mail.text).toContain(`/machine-profiles/${p.id}`);
    expect(mail.text).not.toContain(designs[2]!.name);
    // Operators cannot return jobs nor open profiles: they are told to check before cutting, and sent to the desk.
    const operators = mails.find((m) => m.to.includes(users.operator.email))!;
    expect(operators.text).toContain(`- "${designs[0]!.name}" (released): `);
    expect(operators.text).toContain(`/jobs/${jobIds[0]}`);
    expect(operators.text).toContain('Check with a supervisor before cutting any of them');
    expect(operators.text).toContain('/release-desk');
    expect(operators.text).not.toContain('/machine-profiles/');
    expect(operators.text).not.toContain(designs[1]!.name);
    // The released job says why its version was retired, for the release desk to show.
    const job = await ctx.http.get(`/api/jobs/${jobIds[0]}`).set(auth('operator')).expect(200);
    expect(job.body).toMatchObject({
      profileVersionRetired: true,
      profileRetireReason: 'Laser tube cracked; do not run until it is replaced',
    });

    // Retiring a version that was never in use (a draft given up) tells nobody.
    const { p: q } = await submitted();
    const draft = (await ctx.http.get(`/api/machine-profiles/${q.id}`).set(auth('supervisor')).expect(200))
      .body as ProfileBody;
    await act('supervisor', q, draft.latest, 'retire', { reason: 'Superseded by the bay laser' }).expect(200);
    expect(await mailsAbout(`Machine out of use: ${q.name}`)).toHaveLength(0);

    // A draft started and closed while the machine is out of use says nothing of the machine.
    const mistake = (
      await ctx.http
        .post(`/api/machine-profiles/${p.id}/versions`)
        .set(auth('fabricator'))
        .send({ notes: 'Started by mistake' })
        .expect(201)
    ).body as VersionBody;
    const closed = await act('supervisor', p, mistake, 'retire', {
      reason: 'Draft started by mistake',
    }).expect(200);
    // Retired twice (a second tab): the answer says so in plain words.
    const twice = await act('supervisor', p, closed.body as VersionBody, 'retire').expect(409);
    expect(twice.body.message).toMatch(
      /^Version \d+ is retired already \(someone else may have just done it\); only an approved, draft or submitted version can be retired$/,
    );

    // A newer version approved: the machine is back in use, and the workshop hears so once.
    const v2 = (
      await ctx.http
        .post(`/api/machine-profiles/${p.id}/versions`)
        .set(auth('fabricator'))
        .send({ notes: 'New tube fitted and aligned' })
        .expect(201)
    ).body as VersionBody;
    const s2 = (await act('fabricator', p, v2, 'submit', { lockVersion: v2.lockVersion }).expect(200))
      .body as VersionBody;
    await act('supervisor', p, s2, 'approve', { lockVersion: s2.lockVersion }).expect(200);
    const back = await mailsAbout(`Machine back in use: ${p.name}`);
    expect(back.flatMap((m) => m.to)).toEqual(
      expect.arrayContaining([users.operator.email, users.fabricator.email]),
    );
    expect(back[0]!.text).toContain(
      'which was out of use (“Laser tube cracked; do not run until it is replaced”)',
    );
    // Version 3 replacing version 2 is an ordinary change: nobody hears of a machine coming back.
    const v3 = (
      await ctx.http
        .post(`/api/machine-profiles/${p.id}/versions`)
        .set(auth('fabricator'))
        .send({ notes: 'Mirror cleaned' })
        .expect(201)
    ).body as VersionBody;
    const s3 = (await act('fabricator', p, v3, 'submit', { lockVersion: v3.lockVersion }).expect(200))
      .body as VersionBody;
    const before = back.length;
    await act('supervisor', p, s3, 'approve', { lockVersion: s3.lockVersion }).expect(200);
    expect(await mailsAbout(`Machine back in use: ${p.name}`)).toHaveLength(before);
  });

  it('keeps submitted and approved versions fixed in the database itself; drafts stay editable', async () => {
    const { p, v } = await approved();
    await expect(
      ctx.db.query(`UPDATE machine_profile_versions SET hourly_rate = 99 WHERE id = $1`, [v.id]),
    ).rejects.toThrow(/cannot change/);
    await act('supervisor', p, v, 'retire').expect(200);
    await expect(
      ctx.db.query(`UPDATE machine_profile_versions SET settings = '[]' WHERE id = $1`, [v.id]),
    ).rejects.toThrow(/cannot change/);
    const d = await createProfile();
    await ctx.db.query(`UPDATE machine_profile_versions SET notes = 'raw edit' WHERE id = $1`, [d.latest.id]);
  });

  it('refuses to submit a version that changes nothing against the approved one', async () => {
    const { p, v } = await approved({ settings: [laserSetting(plywood), laserSetting(acrylic)] });
    // The same settings in another order: the same version.
    const same = (
      await ctx.http
        .post(`/api/machine-profiles/${p.id}/versions`)
        .set(auth('fabricator'))
        .send({ settings: [laserSetting(acrylic), laserSetting(plywood)] })
        .expect(201)
    ).body as VersionBody;
    const refused = await act('fabricator', p, same, 'submit', { lockVersion: same.lockVersion }).expect(409);
    expectErrorBody(refused.body, 409, 'MACHINE_PROFILE.NO_CHANGES');
    expect(refused.body.message).toContain(`approved version ${v.number}`);
    // One value changed, and it goes to review.
    const changed = await ctx.http
      .patch(versionPath(p, same))
      .set(auth('fabricator'))
      .send({ lockVersion: same.lockVersion, settings: [laserSetting(acrylic), laserSetting(plywood, 0.16)] })
      .expect(200);
    await act('fabricator', p, same, 'submit', { lockVersion: changed.body.lockVersion }).expect(200);
  });

  it('asks for review only the supervisors who may approve: not one who edited or submitted the version', async () => {
    // A supervisor changed the fabricator's draft: the four-eyes rule keeps them from approving it.
    const p = await createProfile({ name: unique('Review mail laser') });
    const edited = await ctx.http
      .patch(versionPath(p, p.latest))
      .set(auth(secondSupervisor))
      .send({ lockVersion: p.latest.lockVersion, settings: [laserSetting(plywood, 0.3)] })
      .expect(200);
    await act('fabricator', p, p.latest, 'submit', { lockVersion: edited.body.lockVersion }).expect(200);
    const asked = (await mailsAbout(p.name))
      .filter((m) => m.subject.startsWith('Machine profile to review'))
      .flatMap((m) => m.to);
    expect(asked).toContain(users.supervisor.email);
    expect(asked).not.toContain(secondSupervisor.email);

    // A supervisor who drafts and submits a version is not asked to review it either.
    const own = (
      await ctx.http
        .post('/api/machine-profiles')
        .set(auth(secondSupervisor))
        .send(profileBody({ name: unique('Own review mail laser') }))
        .expect(201)
    ).body as ProfileBody;
    await act(secondSupervisor, own, own.latest, 'submit', { lockVersion: own.latest.lockVersion }).expect(
      200,
    );
    const askedOwn = (await mailsAbout(own.name))
      .filter((m) => m.subject.startsWith('Machine profile to review'))
      .flatMap((m) => m.to);
    expect(askedOwn).toContain(users.supervisor.email);
    expect(askedOwn).not.toContain(secondSupervisor.email);
  });

  it('needs the lockVersion the caller read to submit, approve or send back (400 without it); retiring takes none', async () => {
    const p = await createProfile();
    const noBody = await ctx.http
      .post(versionPath(p, p.latest, 'submit'))
      .set(auth('fabricator'))
      .expect(400);
    expectErrorBody(noBody.body, 400, 'VALIDATION.FAILED');
    expect(noBody.body.details.map((d: { field: string }) => d.field)).toContain('lockVersion');
    const sub = (
      await act('fabricator', p, p.latest, 'submit', { lockVersion: p.latest.lockVersion }).expect(200)
    ).body as VersionBody;
    for (const [action, body] of [
      ['approve', {}],
      ['approve', { lockVersion: null }],
      ['return', { reason: 'Check the power' }],
    ] as const) {
      const res = await act('supervisor', p, sub, action, body).expect(400);
      expectErrorBody(res.body, 400, 'VALIDATION.FAILED');
      expect(res.body.details.map((d: { field: string }) => d.field)).toContain('lockVersion');
    }
    // A stale one is a conflict: the content changed since the caller read it.
    const stale = await act('supervisor', p, sub, 'approve', { lockVersion: p.latest.lockVersion }).expect(
      409,
    );
    expectErrorBody(stale.body, 409, 'MACHINE_PROFILE.STALE_VERSION');
    const rows: { state: string }[] = await ctx.db.query(
      `SELECT state FROM machine_profile_versions WHERE id = $1`,
      [sub.id],
    );
    expect(rows).toEqual([{ state: 'submitted' }]);
    await act('supervisor', p, sub, 'approve', { lockVersion: sub.lockVersion }).expect(200);
    // Taking a version out of use is never held up.
    const retired = await ctx.http
      .post(versionPath(p, sub, 'retire'))
      .set(auth('supervisor'))
      .expect(200);
    expect(retired.body.state).toBe('retired');
  });

  it('lets exactly one of two supervisors approving the same version at once win; the other gets 409', async () => {
    const { p, v } = await submitted();
    const results = await Promise.all([
      act('supervisor', p, v, 'approve', { lockVersion: v.lockVersion }),
      act(secondSupervisor, p, v, 'approve', { lockVersion: v.lockVersion }),
    ]);
    expect(results.map((r) => r.status).sort()).toEqual([200, 409]);
    const loser = results.find((r) => r.status === 409)!;
    expectErrorBody(loser.body, 409);
    expect(['MACHINE_PROFILE.INVALID_STATE', 'MACHINE_PROFILE.STALE_VERSION']).toContain(loser.body.code);
    const rows: { state: string }[] = await ctx.db.query(
      `SELECT state FROM machine_profile_versions WHERE profile_id = $1`,
      [p.id],
    );
    expect(rows).toEqual([{ state: 'approved' }]);
    const approvals: unknown[] = await ctx.db.query(
      `SELECT 1 FROM audit_events WHERE entity_id = $1 AND action = 'machine-profile-version.approve'`,
      [v.id],
    );
    expect(approvals).toHaveLength(1);
  });

  it('keeps four eyes on a version: its drafter or submitter cannot approve it (403), another supervisor can', async () => {
    // Drafted and submitted by a supervisor.
    const own = await ctx.http.post('/api/machine-profiles').set(auth('supervisor')).send(profileBody());
    expect(own.status).toBe(201);
    const p = own.body as ProfileBody;
    const sub = (
      await act('supervisor', p, p.latest, 'submit', { lockVersion: p.latest.lockVersion }).expect(200)
    ).body as VersionBody;
    const refused = await act('supervisor', p, sub, 'approve', { lockVersion: sub.lockVersion }).expect(403);
    expectErrorBody(refused.body, 403, 'MACHINE_PROFILE.SELF_APPROVAL');
    expect(refused.body.message).toMatch(/another supervisor/);
    const still: { state: string }[] = await ctx.db.query(
      `SELECT state FROM machine_profile_versions WHERE id = $1`,
      [sub.id],
    );
    expect(still).toEqual([{ state: 'submitted' }]);
    const ok = await act(secondSupervisor, p, sub, 'approve', { lockVersion: sub.lockVersion }).expect(200);
    expect(ok.body.state).toBe('approved');
    // Drafted by a fabricator, submitted by a supervisor: that supervisor may not approve it either.
    const q = await createProfile();
    const qs = (
      await act(secondSupervisor, q, q.latest, 'submit', { lockVersion: q.latest.lockVersion }).expect(200)
    ).body as VersionBody;
    await expectOnlyTheOtherApproves(q, qs);
  });

  it('keeps four eyes on edits: a supervisor who edited a draft or adopted a kerf into it cannot approve it (403)', async () => {
    // Drafted and submitted by the fabricator, but a supervisor changed its settings in between.
    const p = await createProfile();
    const edited = await ctx.http
      .patch(versionPath(p, p.latest))
      .set(auth(secondSupervisor))
      .send({ lockVersion: p.latest.lockVersion, settings: [laserSetting(plywood, 0.3)] })
      .expect(200);
    const sub = (
      await act('fabricator', p, p.latest, 'submit', { lockVersion: edited.body.lockVersion }).expect(200)
    ).body as VersionBody;
    const refused = await act(secondSupervisor, p, sub, 'approve', { lockVersion: sub.lockVersion }).expect(
      403,
    );
    expectErrorBody(refused.body, 403, 'MACHINE_PROFILE.SELF_APPROVAL');
    expect(refused.body.message).toMatch(/You edited version 1/);
    const still: { state: string }[] = await ctx.db.query(
      `SELECT state FROM machine_profile_versions WHERE id = $1`,
      [sub.id],
    );
    expect(still).toEqual([{ state: 'submitted' }]);
    // A supervisor who only read it may approve it.
    await act('supervisor', p, sub, 'approve', { lockVersion: sub.lockVersion }).expect(200);

    // A kerf a supervisor adopted into the open draft is an edit too.
    const q = (await approved({ settings: [laserSetting(plywood)] })).p;
    const record = await kerfRecord(q, plywood, 0.17);
    const fabricatorDraft = (
      await ctx.http
        .post(`/api/machine-profiles/${q.id}/versions`)
        .set(auth('fabricator'))
        .send({ notes: 'new batch' })
        .expect(201)
    ).body as VersionBody;
    const adopted = (
      await ctx.http
        .post(`/api/machine-profiles/${q.id}/kerf-records/${record.id}/adopt`)
        .set(auth(secondSupervisor))
        .expect(201)
    ).body as VersionBody;
    expect(adopted.id).toBe(fabricatorDraft.id);
    const qs = (
      await act('fabricator', q, adopted, 'submit', { lockVersion: adopted.lockVersion }).expect(200)
    ).body as VersionBody;
    await expectOnlyTheOtherApproves(q, qs);
  });

  it('mails every active supervisor when a version is submitted, and the submitter when it is sent back', async () => {
    const p = await createProfile({ name: unique('Mail test laser') });
    const sub = (
      await act('fabricator', p, p.latest, 'submit', { lockVersion: p.latest.lockVersion }).expect(200)
    ).body as VersionBody;
    // One message per supervisor, each addressed to that supervisor alone (nobody sees the others' addresses).
    const submittedMails = await mailsAbout(p.name);
    const recipients = submittedMails.flatMap((m) => m.to);
    expect(submittedMails.every((m) => m.to.length === 1)).toBe(true);
    expect(new Set(recipients).size).toBe(recipients.length);
    expect(recipients).toEqual(expect.arrayContaining([users.supervisor.email, secondSupervisor.email]));
    expect(recipients).not.toContain(users.fabricator.email);
    for (const mail of submittedMails) {
      expect(mail.subject).toMatch(/^Machine profile to review/);
      expect(mail.text).toContain(`/machine-profiles/${p.id}`);
      expect(mail.html).toContain('<p>');
    }

    await act('supervisor', p, sub, 'return', {
      lockVersion: sub.lockVersion,
      reason: 'Add the acrylic settings too',
    }).expect(200);
    const all = await mailsAbout(p.name);
    const back = all.find((m) => m.subject.startsWith('Machine profile sent back'))!;
    expect(back.to).toEqual([users.fabricator.email]);
    expect(back.text).toContain('Add the acrylic settings too');
  });

  describe('validation: ranges and kind rules name the field; nothing is written', () => {
    const invalid: [string, () => Record<string, unknown>, string][] = [
      ['bed wider than 5000 mm', () => ({ bedWidthMm: 5001 }), 'bedWidthMm'],
      ['zero rapid speed', () => ({ rapidSpeedMmS: 0 }), 'rapidSpeedMmS'],
      ['negative hourly rate', () => ({ hourlyRate: -1 }), 'hourlyRate'],
      ['unknown kind', () => ({ kind: 'plasma' }), 'kind'],
      ['kerf above 2 mm', () => ({ settings: [laserSetting(plywood, 2.5)] }), 'settings.0.kerfMm'],
      [
        'zero cut speed',
        () => ({ settings: [{ ...laserSetting(plywood), cutSpeedMmS: 0 }] }),
        'settings.0.cutSpeedMmS',
      ],
      [
        'fractional passes',
        () => ({ settings: [{ ...laserSetting(plywood), passes: 1.5 }] }),
        'settings.0.passes',
      ],
      [
        'power above 100 %',
        () => ({ settings: [{ ...laserSetting(plywood), powerPct: 120 }] }),
        'settings.0.powerPct',
      ],
      [
        'material id not a uuid',
        () => ({ settings: [{ ...laserSetting(plywood), materialId: 'ply' }] }),
        'settings.0.materialId',
      ],
      ['laser kerf of 0', () => ({ settings: [laserSetting(plywood, 0)] }), 'settings[0].kerfMm'],
      [
        'laser without power',
        () => ({ settings: [{ ...laserSetting(plywood), powerPct: undefined }] }),
        'settings[0].powerPct',
      ],
      [
        'tool diameter on a laser',
        () => ({ settings: [{ ...laserSetting(plywood), toolDiameterMm: 3 }] }),
        'settings[0].toolDiameterMm',
      ],
      [
        'router without a tool',
        () => ({ kind: 'cnc-router', settings: [{ ...routerSetting(plywood), toolDiameterMm: undefined }] }),
        'settings[0].toolDiameterMm',
      ],
      [
        'tool diameter above 25 mm',
        () => ({ kind: 'cnc-router', settings: [routerSetting(plywood, 30)] }),
        'settings.0.toolDiameterMm',
      ],
      [
        'kerf on a router',
        () => ({ kind: 'cnc-router', settings: [{ ...routerSetting(plywood), kerfMm: 0.2 }] }),
        'settings[0].kerfMm',
      ],
      [
        'a material twice',
        () => ({ settings: [laserSetting(plywood), laserSetting(plywood)] }),
        'settings[1].materialId',
      ],
      ['an unknown material', () => ({ settings: [laserSetting(randomUUID())] }), 'settings[0].materialId'],
    ];
    it.each(invalid)('refuses %s', async (_what, override, field) => {
      const counts = async () =>
        Promise.all(
          ['machine_profiles', 'machine_profile_versions', 'audit_events'].map((t) => countRows(ctx, t)),
        );
      const before = await counts();
      const res = await ctx.http
        .post('/api/machine-profiles')
        .set(auth('fabricator'))
        .send(profileBody(override()))
        .expect(400);
      expectErrorBody(res.body, 400, 'VALIDATION.FAILED');
      expect(res.body.details.map((d: { field: string }) => d.field)).toContain(field);
      expect(await counts()).toEqual(before);
    });

    it('accepts a blade cutter with a zero kerf (a knife removes almost nothing)', async () => {
      const p = await createProfile({
        kind: 'blade-cutter',
        settings: [{ ...laserSetting(felt, 0), powerPct: undefined }],
      });
      expect(p.latest.settings[0]!.kerfMm).toBe(0);
    });

    it('takes an upper-case material id in a body as the material it names, as path ids are taken', async () => {
      const p = await createProfile({ settings: [laserSetting(plywood.toUpperCase())] });
      expect(p.latest.settings[0]!.materialId).toBe(plywood);
      // The same material twice is still twice, whatever the letter case.
      const twice = await ctx.http
        .post('/api/machine-profiles')
        .set(auth('fabricator'))
        .send(profileBody({ settings: [laserSetting(plywood), laserSetting(plywood.toUpperCase())] }))
        .expect(400);
      expect(twice.body.details.map((d: { field: string }) => d.field)).toContain('settings[1].materialId');
      const rec = await kerfRecord(p, plywood.toUpperCase(), 0.16);
      const listed = await ctx.http
        .get(`/api/machine-profiles/${p.id}/kerf-records`)
        .query({ materialId: plywood.toUpperCase() })
        .set(auth('fabricator'))
        .expect(200);
      expect(JSON.stringify(listed.body)).toContain(rec.id);
    });

    it('refuses a duplicate profile name with 409', async () => {
      const p = await createProfile();
      const res = await ctx.http
        .post('/api/machine-profiles')
        .set(auth('fabricator'))
        .send(profileBody({ name: p.name.toUpperCase() }))
        .expect(409);
      expectErrorBody(res.body, 409, 'MACHINE_PROFILE.NAME_TAKEN');
    });
  });

  describe('prohibited materials never get laser settings', () => {
    // PVC gives off hydrochloric acid gas under a laser (common practice; safety/material-hazards.json).
    it.each(['co2-laser', 'diode-laser', 'fibre-laser'])(
      'refuses PVC settings on a %s, writing nothing',
      async (kind) => {
        const before = await countRows(ctx, 'machine_profiles');
        const res = await ctx.http
          .post('/api/machine-profiles')
          .set(auth('fabricator'))
          .send(profileBody({ kind, settings: [laserSetting(pvc)] }))
          .expect(409);
        expectErrorBody(res.body, 409, 'MATERIAL.LASER_PROHIBITED');
        expect(res.body.details).toMatchObject({ field: 'settings[0].materialId', materialId: pvc });
        expect(await countRows(ctx, 'machine_profiles')).toBe(before);
      },
    );

    it('allows PVC on a CNC router (the laser rules concern beams)', async () => {
      await createProfile({ kind: 'cnc-router', settings: [routerSetting(pvc)] });
    });

    it('approves a laser version with materials cut only on a condition once the approver says each was checked', async () => {
      // The hazard table (safety/material-hazards.json): felt, and a material it does not list ("other"), go
      // on a laser only on a condition; plywood outright.
      const unlisted = await material('other');
      const { p, v } = await submitted({
        settings: [laserSetting(plywood), laserSetting(felt, 0.2), laserSetting(unlisted)],
      });
      const conditions = v.settings
        .filter((s: { laserCondition?: string }) => s.laserCondition)
        .map((s: { materialId: string }) => s.materialId);
      expect(conditions).toEqual([felt, unlisted]);
      const refused = await act('supervisor', p, v, 'approve', { lockVersion: v.lockVersion }).expect(409);
      expectErrorBody(refused.body, 409, 'MACHINE_PROFILE.CONDITIONS_UNCHECKED');
      expect(refused.body.details.conditions.map((c: { materialId: string }) => c.materialId)).toEqual([
        felt,
        unlisted,
      ]);
      expect(refused.body.details.conditions[1].condition).toMatch(/safety data sheet/);
      await act('supervisor', p, v, 'approve', {
        lockVersion: v.lockVersion,
        conditionsChecked: null,
      }).expect(400);
      const ok = await act('supervisor', p, v, 'approve', {
        lockVersion: v.lockVersion,
        conditionsChecked: true,
      });
      expect(ok.status).toBe(200);
      // A router's bit has no such conditions: its versions need no confirmation.
      const router = await submitted({ kind: 'cnc-router', settings: [routerSetting(felt)] });
      await act('supervisor', router.p, router.v, 'approve', { lockVersion: router.v.lockVersion }).expect(
        200,
      );
    });

    it('refuses to approve a version whose material was taken off the laser after it was submitted', async () => {
      const { p, v } = await submitted({ settings: [laserSetting(acrylic)] });
      const m = (await ctx.http.get(`/api/materials/${acrylic}`).set(auth('fabricator')).expect(200)).body;
      await ctx.http
        .patch(`/api/materials/${acrylic}`)
        .set(auth('fabricator'))
        .send({
          version: m.version,
          laserAllowed: false,
          hazardNote: 'This batch is extruded with an unknown coating',
        })
        .expect(200);
      const res = await act('supervisor', p, v, 'approve', { lockVersion: v.lockVersion }).expect(409);
      expectErrorBody(res.body, 409, 'MATERIAL.LASER_PROHIBITED');
      const rows: { state: string }[] = await ctx.db.query(
        `SELECT state FROM machine_profile_versions WHERE id = $1`,
        [v.id],
      );
      expect(rows[0]!.state).toBe('submitted');
    });
  });

  it('lists profiles with their approved and latest versions, filtered by kind and latest state, paged', async () => {
    const tag = randomUUID().slice(0, 8);
    const { p: a } = await approved({ name: `List ${tag} a` });
    await ctx.http
      .post(`/api/machine-profiles/${a.id}/versions`)
      .set(auth('fabricator'))
      .send({ hourlyRate: 31 })
      .expect(201);
    const b = await createProfile({
      name: `List ${tag} b`,
      kind: 'cnc-router',
      settings: [routerSetting(plywood)],
    });
    await submitted({ name: `List ${tag} c` });

    const all = await ctx.http
      .get(`/api/machine-profiles?q=${tag}&pageSize=2`)
      .set(auth('hobbyist'))
      .expect(200);
    expect(all.body.total).toBe(3);
    expect(all.body.items.map((p: ProfileBody) => p.name)).toEqual([`List ${tag} a`, `List ${tag} b`]);
    const first = all.body.items[0] as ProfileBody;
    expect(first.currentApproved).toMatchObject({ number: 1, state: 'approved' });
    expect(first.latest).toMatchObject({ number: 2, state: 'draft' });
    const page2 = await ctx.http
      .get(`/api/machine-profiles?q=${tag}&pageSize=2&page=2`)
      .set(auth('hobbyist'))
      .expect(200);
    expect(page2.body.items.map((p: ProfileBody) => p.name)).toEqual([`List ${tag} c`]);
    // Sorted by name descending, and by kind ("cnc-router" sorts before "co2-laser" as text).
    const byNameDesc = await ctx.http
      .get(`/api/machine-profiles?q=${tag}&sort=-name`)
      .set(auth('hobbyist'))
      .expect(200);
    expect(byNameDesc.body.items.map((p: ProfileBody) => p.name)).toEqual([
      `List ${tag} c`,
      `List ${tag} b`,
      `List ${tag} a`,
    ]);
    const byKind = await ctx.http
      .get(`/api/machine-profiles?q=${tag}&sort=kind`)
      .set(auth('hobbyist'))
      .expect(200);
    expect(byKind.body.items[0].id).toBe(b.id);
    await ctx.http.get(`/api/machine-profiles?sort=hourlyRate`).set(auth('hobbyist')).expect(400);

    const routers = await ctx.http
      .get(`/api/machine-profiles?q=${tag}&kind=cnc-router`)
      .set(auth('operator'))
      .expect(200);
    expect(routers.body.items.map((p: ProfileBody) => p.id)).toEqual([b.id]);
    const waiting = await ctx.http
      .get(`/api/machine-profiles?q=${tag}&state=submitted`)
      .set(auth('supervisor'))
      .expect(200);
    expect(waiting.body.items.map((p: ProfileBody) => p.name)).toEqual([`List ${tag} c`]);
    const drafts = await ctx.http
      .get(`/api/machine-profiles?q=${tag}&state=draft`)
      .set(auth('supervisor'))
      .expect(200);
    expect(drafts.body.total).toBe(2);
    const bad = await ctx.http.get('/api/machine-profiles?state=pending').set(auth('supervisor')).expect(400);
    expect(bad.body.details[0].field).toBe('state');
  });

  describe('kerf records', () => {
    it('records measured kerfs, lists the history by material, and adopts one into a new draft', async () => {
      const { p, v } = await approved(
        { settings: [laserSetting(plywood), laserSetting(felt, 0.2)] },
        { conditionsChecked: true },
      );
      const r1 = await kerfRecord(p, plywood, 0.17);
      await kerfRecord(p, felt, 0.25);
      const r3 = await kerfRecord(p, plywood, 0.16);
      expect(r1).toMatchObject({ kerfMm: 0.17, adoptedVersionId: null });

      const hist = await ctx.http
        .get(`/api/machine-profiles/${p.id}/kerf-records?materialId=${plywood}`)
        .set(auth('operator'))
        .expect(200);
      expect(hist.body.items.map((r: { kerfMm: number }) => r.kerfMm)).toEqual([0.17, 0.16]);
      expect(hist.body.items[0].materialName).toMatch(/plywood sheet/);
      const allRecords = await ctx.http
        .get(`/api/machine-profiles/${p.id}/kerf-records`)
        .set(auth('fabricator'))
        .expect(200);
      expect(allRecords.body.total).toBe(3);

      const adopted = (
        await ctx.http
          .post(`/api/machine-profiles/${p.id}/kerf-records/${r1.id}/adopt`)
          .set(auth('fabricator'))
          .expect(201)
      ).body as VersionBody;
      expect(adopted).toMatchObject({ number: 2, state: 'draft', basedOnNumber: 1 });
      expect(adopted.settings.find((s) => s.materialId === plywood)!.kerfMm).toBe(0.17);
      expect(adopted.settings.find((s) => s.materialId === felt)!.kerfMm).toBe(0.2);
      // A second adoption goes into the same open draft.
      const again = (
        await ctx.http
          .post(`/api/machine-profiles/${p.id}/kerf-records/${r3.id}/adopt`)
          .set(auth('fabricator'))
          .expect(201)
      ).body as VersionBody;
      expect(again).toMatchObject({ id: adopted.id, number: 2, lockVersion: adopted.lockVersion + 1 });
      expect(again.settings.find((s) => s.materialId === plywood)!.kerfMm).toBe(0.16);
      const rows: { adopted_version_id: string }[] = await ctx.db.query(
        `SELECT adopted_version_id FROM kerf_records WHERE id = ANY($1) ORDER BY kerf_mm DESC`,
        [[r1.id, r3.id]],
      );
      expect(rows.map((r) => r.adopted_version_id)).toEqual([adopted.id, adopted.id]);
      // The approved version is untouched.
      const approvedNow = await ctx.app.get(MachineProfilesService).currentApprovedVersion(p.id);
      expect(approvedNow.id).toBe(v.id);
      expect(approvedNow.settings.find((s) => s.materialId === plywood)!.kerfMm).toBe(0.15);

      // While the draft awaits approval, nothing more can be adopted.
      await act('fabricator', p, again, 'submit', { lockVersion: again.lockVersion }).expect(200);
      const pending = await ctx.http
        .post(`/api/machine-profiles/${p.id}/kerf-records/${r1.id}/adopt`)
        .set(auth('fabricator'))
        .expect(409);
      expectErrorBody(pending.body, 409, 'MACHINE_PROFILE.VERSION_PENDING');

      const audit: { action: string }[] = await ctx.db.query(
        `SELECT action FROM audit_events WHERE entity_id = ANY($1) ORDER BY id`,
        [[r1.id, r3.id]],
      );
      expect(audit.map((a) => a.action)).toEqual([
        'kerf-record.create',
        'kerf-record.create',
        'kerf-record.adopt',
        'kerf-record.adopt',
      ]);
    });

    it('adopts a router measurement as the tool diameter', async () => {
      const { p } = await approved({ kind: 'cnc-router', settings: [routerSetting(plywood)] });
      const r = await kerfRecord(p, plywood, 3.3);
      const res = await ctx.http
        .post(`/api/machine-profiles/${p.id}/kerf-records/${r.id}/adopt`)
        .set(auth('supervisor'))
        .expect(201);
      expect(res.body.settings[0]).toMatchObject({ toolDiameterMm: 3.3 });
      expect(res.body.settings[0].kerfMm).toBeUndefined();
    });

    it('lets no route put a value into a version that editing refuses: adopt, submit and approve answer as PATCH does', async () => {
      // A router's tool diameter is 0.1–25 mm (MACHINE_PROFILE_LIMITS, the edit route's DTO limits).
      const { p } = await approved({ kind: 'cnc-router', settings: [routerSetting(plywood)] });
      const draft = (
        await ctx.http
          .post(`/api/machine-profiles/${p.id}/versions`)
          .set(auth('fabricator'))
          .send({})
          .expect(201)
      ).body as VersionBody;
      const edit = await ctx.http
        .patch(versionPath(p, draft))
        .set(auth('fabricator'))
        .send({ lockVersion: draft.lockVersion, settings: [routerSetting(plywood, 0.05)] })
        .expect(400);
      expectErrorBody(edit.body, 400, 'VALIDATION.FAILED');
      expect(edit.body.details).toEqual([
        { field: 'settings.0.toolDiameterMm', messages: ['toolDiameterMm must not be less than 0.1'] },
      ]);
      // A kerf record below a router's range, as the cut route used to keep one (written straight to the table).
      const [record] = (await ctx.db.query(
        `INSERT INTO kerf_records (profile_id, material_id, kerf_mm, recorded_by) VALUES ($1, $2, 0.05, $3) RETURNING id`,
        [p.id, plywood, users.operator.id],
      )) as { id: string }[];
      const adopt = await ctx.http
        .post(`/api/machine-profiles/${p.id}/kerf-records/${record!.id}/adopt`)
        .set(auth('fabricator'))
        .expect(400);
      expectErrorBody(adopt.body, 400, 'VALIDATION.FAILED');
      expect(adopt.body.details).toEqual(edit.body.details);
      // The same value in the draft (written straight to the table): it can be neither submitted nor approved.
      await ctx.db.query(`UPDATE machine_profile_versions SET settings = $2 WHERE id = $1`, [
        draft.id,
        JSON.stringify([routerSetting(plywood, 0.05)]),
      ]);
      const submit = await act('fabricator', p, draft, 'submit', { lockVersion: draft.lockVersion }).expect(
        400,
      );
      expectErrorBody(submit.body, 400, 'VALIDATION.FAILED');
      expect(submit.body.details).toEqual(edit.body.details);
      await ctx.db.query(`UPDATE machine_profile_versions SET state = 'submitted' WHERE id = $1`, [draft.id]);
      const approve = await act('supervisor', p, draft, 'approve', { lockVersion: draft.lockVersion }).expect(
        400,
      );
      expectErrorBody(approve.body, 400, 'VALIDATION.FAILED');
      expect(approve.body.details).toEqual(edit.body.details);
      const after = (await ctx.http.get(`/api/machine-profiles/${p.id}`).set(auth('fabricator')).expect(200))
        .body as ProfileBody;
      expect(after.currentApproved!.settings[0]!.toolDiameterMm).toBe(3.175);
      expect(after.latest).toMatchObject({
        id: draft.id,
        state: 'submitted',
        lockVersion: draft.lockVersion,
      });
      const adopted: { adopted_version_id: string | null }[] = await ctx.db.query(
        `SELECT adopted_version_id FROM kerf_records WHERE id = $1`,
        [record!.id],
      );
      expect(adopted).toEqual([{ adopted_version_id: null }]);
    });

    it('refuses to adopt a value for a material the profile has no settings for', async () => {
      const { p } = await approved();
      const r = await kerfRecord(p, felt, 0.3);
      const res = await ctx.http
        .post(`/api/machine-profiles/${p.id}/kerf-records/${r.id}/adopt`)
        .set(auth('fabricator'))
        .expect(409);
      expectErrorBody(res.body, 409, 'MACHINE_PROFILE.NO_SETTING_FOR_MATERIAL');
    });

    it.each([
      ['a laser kerf above 2 mm', { kerfMm: 2.5 }, 'kerfMm'],
      ['a zero kerf', { kerfMm: 0 }, 'kerfMm'],
      ['an unknown material', { materialId: '00000000-0000-4000-8000-000000000000' }, 'materialId'],
      ['an unknown job', { jobId: '00000000-0000-4000-8000-000000000000' }, 'jobId'],
      ['an unknown field', { colour: 'red' }, 'colour'],
    ])('refuses a record with %s, writing nothing', async (_what, override, field) => {
      const p = await createProfile();
      const before = await countRows(ctx, 'kerf_records');
      const res = await ctx.http
        .post(`/api/machine-profiles/${p.id}/kerf-records`)
        .set(auth('operator'))
        .send({ materialId: plywood, kerfMm: 0.16, ...override })
        .expect(400);
      expectErrorBody(res.body, 400, 'VALIDATION.FAILED');
      expect(res.body.details.map((d: { field: string }) => d.field)).toContain(field);
      expect(await countRows(ctx, 'kerf_records')).toBe(before);
    });

    it('answers 404 for a record of another profile', async () => {
      const { p: a } = await approved();
      const { p: b } = await approved();
      const r = await kerfRecord(a, plywood, 0.16);
      const res = await ctx.http
        .post(`/api/machine-profiles/${b.id}/kerf-records/${r.id}/adopt`)
        .set(auth('fabricator'))
        .expect(404);
      expectErrorBody(res.body, 404, 'KERF_RECORD.NOT_FOUND');
    });

    it('refuses a laser kerf for a material that may not be cut on a laser (409, as preparation), writing nothing', async () => {
      // PVC gives off hydrogen chloride under a beam (safety/material-hazards.json).
      const laser = await createProfile();
      const router = await createProfile({ kind: 'cnc-router', settings: [routerSetting(plywood)] });
      const before = await countRows(ctx, 'kerf_records');
      for (const who of ['operator', 'fabricator', 'supervisor'] as const) {
        const res = await ctx.http
          .post(`/api/machine-profiles/${laser.id}/kerf-records`)
          .set(auth(who))
          .send({ materialId: pvc, kerfMm: 0.2 })
          .expect(409);
        expectErrorBody(res.body, 409, 'MATERIAL.LASER_PROHIBITED');
        expect(res.body.message).toMatch(/may not be cut on a laser/);
      }
      expect(await countRows(ctx, 'kerf_records')).toBe(before);
      // A router cuts PVC: its measured cut width is kept.
      await ctx.http
        .post(`/api/machine-profiles/${router.id}/kerf-records`)
        .set(auth('operator'))
        .send({ materialId: pvc, kerfMm: 3.2 })
        .expect(201);
    });
  });

  it('refuses to delete a material a machine profile uses', async () => {
    const m = await material('mdf');
    await createProfile({ settings: [laserSetting(m)] });
    const res = await ctx.http.delete(`/api/materials/${m}`).set(auth('fabricator')).expect(409);
    expectErrorBody(res.body, 409, 'MATERIAL.IN_USE');
    expect(res.body.details).toMatchObject({ profileVersions: 1 });
  });

  it('answers 404 for unknown profiles and versions', async () => {
    const p = await createProfile();
    const other = await createProfile();
    const nf = await ctx.http.get(`/api/machine-profiles/${randomUUID()}`).set(auth('hobbyist')).expect(404);
    expectErrorBody(nf.body, 404, 'MACHINE_PROFILE.NOT_FOUND');
    const wrong = await act('fabricator', p, other.latest, 'submit', { lockVersion: 1 }).expect(404);
    expectErrorBody(wrong.body, 404, 'MACHINE_PROFILE.VERSION_NOT_FOUND');
  });

  it('lists every machine-profile route with its shapes in the OpenAPI document', async () => {
    const doc = await ctx.http.get('/api/docs-json').expect(200);
    const paths = doc.body.paths as Record<string, Record<string, { responses: Record<string, unknown> }>>;
    const expected: [string, string][] = [
      ['/api/machine-profiles', 'get'],
      ['/api/machine-profiles', 'post'],
      ['/api/machine-profiles/{id}', 'get'],
      ['/api/machine-profiles/{id}/versions', 'post'],
      ['/api/machine-profiles/{id}/versions/{versionId}', 'patch'],
      ['/api/machine-profiles/{id}/versions/{versionId}/submit', 'post'],
      ['/api/machine-profiles/{id}/versions/{versionId}/approve', 'post'],
      ['/api/machine-profiles/{id}/versions/{versionId}/return', 'post'],
      ['/api/machine-profiles/{id}/versions/{versionId}/retire', 'post'],
      ['/api/machine-profiles/{id}/kerf-records', 'get'],
      ['/api/machine-profiles/{id}/kerf-records', 'post'],
      ['/api/machine-profiles/{id}/kerf-records/{recordId}/adopt', 'post'],
    ];
    for (const [p, method] of expected) {
      const op = paths[p]?.[method];
      expect(op).toBeDefined();
      const ok = Object.entries(op!.responses).find(([status]) => status.startsWith('2'));
      expect(JSON.stringify(ok)).toMatch(/#\/components\/schemas\//);
    }
    const schemas = doc.body.components.schemas as Record<string, { properties: Record<string, unknown> }>;
    expect(Object.keys(schemas.ProfileSettingDto!.properties)).toEqual(
      expect.arrayContaining([
        'materialId',
        'kerfMm',
        'toolDiameterMm',
        'cutSpeedMmS',
        'passes',
        'pierceTimeS',
      ]),
    );
    expect(Object.keys(schemas.MachineProfileVersionResponse!.properties)).toEqual(
      expect.arrayContaining(['state', 'lockVersion', 'settings', 'returnReason']),
    );
  });
});
