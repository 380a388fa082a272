import * as fs from 'node:fs';
import * as path from 'node:path';
import { randomUUID } from 'node:crypto';
import { type MaterialHazard, type Role } from '@kerfwright/contracts';
import {
  countRows,
  createUser,
  expectErrorBody,
  startTestApp,
  type TestContext,
  type TestUser,
} from './support/test-app';
import { octahedronHexagons } from './support/workshop-fixtures';

/** The workshop's hazard table as shipped in safety/ (the file the seed loads into material_hazards). */
const HAZARD_FILE = path.join(__dirname, '..', '..', '..', 'safety', 'material-hazards.json');
const HAZARDS = (JSON.parse(fs.readFileSync(HAZARD_FILE, 'utf8')) as { rows: MaterialHazard[] }).rows;

/** Makes sure the hazard table is in the database (idempotent; same rows as the seed). */
async function ensureHazardTable(ctx: TestContext): Promise<void> {
  for (const r of HAZARDS) {
    await ctx.db.query(
      `INSERT INTO material_hazards (family, examples, laser, hazard, condition, source) VALUES ($1, $2, $3, $4, $5, $6)
       ON CONFLICT (family) DO NOTHING`,
      [r.family, JSON.stringify(r.examples), r.laser, r.hazard, r.condition ?? null, r.source],
    );
  }
}

/** The hazard-table row the API reads (the database copy, which the seed or another suite may have written). */
async function hazardRow(
  ctx: TestContext,
  family: string,
): Promise<{ laser: string; hazard: string; condition: string | null; nameWords: string[] }> {
  const rows: { laser: string; hazard: string; condition: string | null; nameWords: string[] }[] =
    await ctx.db.query(
      `SELECT laser, hazard, condition, name_words AS "nameWords" FROM material_hazards WHERE family = $1`,
      [family],
    );
  return rows[0]!;
}

const unique = (prefix: string): string => `${prefix} ${randomUUID().slice(0, 8)}`;

function materialBody(overrides: Record<string, unknown> = {}): Record<string, unknown> {
  return {
    name: unique('Birch plywood 3 mm'),
    family: 'plywood',
    nominalThicknessMm: 3,
    measuredThicknessMm: 2.85,
    flexible: false,
    colours: ['natural'],
    stockSheets: [{ widthMm: 600, heightMm: 400, pricePerSheet: 6.5, currency: 'EUR' }],
    notes: 'test stock',
    ...overrides,
  };
}

describe('materials library', () => {
  let ctx: TestContext;
  const users = {} as Record<Role, TestUser>;
  const auth = (role: Role) => ({ Authorization: `Bearer ${users[role].token}` });

  beforeAll(async () => {
    ctx = await startTestApp();
    await ensureHazardTable(ctx);
    for (const role of ['hobbyist', 'fabricator', 'operator', 'supervisor'] as const) {
      users[role] = await createUser(ctx, role);
    }
  });
  afterAll(async () => {
    await ctx.app.close();
  });

  async function createMaterial(
    overrides: Record<string, unknown> = {},
  ): Promise<{ id: string; version: number }> {
    const res = await ctx.http.post('/api/materials').set(auth('fabricator')).send(materialBody(overrides));
    expect(res.status).toBe(201);
    return res.body as { id: string; version: number };
  }

  it('creates a material, records it in the audit trail and reads it back', async () => {
    const body = materialBody({ colours: ['natural', 'black'] });
    const res = await ctx.http.post('/api/materials').set(auth('fabricator')).send(body).expect(201);
    expect(res.body).toMatchObject({
      name: body.name,
      family: 'plywood',
      nominalThicknessMm: 3,
      measuredThicknessMm: 2.85,
      colours: ['natural', 'black'],
      stockSheets: [{ widthMm: 600, heightMm: 400, pricePerSheet: 6.5, currency: 'EUR' }],
      laserAllowed: true,
      hazardNote: '',
      version: 1,
    });
    const got = await ctx.http.get(`/api/materials/${res.body.id}`).set(auth('hobbyist')).expect(200);
    expect(got.body).toEqual(res.body);
    const audit: { action: string; actor_id: string; after: { name: string } }[] = await ctx.db.query(
      `SELECT action, actor_id, after FROM audit_events WHERE entity_id = $1`,
      [res.body.id],
    );
    expect(audit).toEqual([
      expect.objectContaining({
        action: 'material.create',
        actor_id: users.fabricator.id,
        after: expect.objectContaining({ name: body.name }),
      }),
    ]);
  });

  it('pages, sorts and filters the list', async () => {
    const tag = randomUUID().slice(0, 8);
    const made = [];
    for (const [i, t] of [6, 2, 4].entries()) {
      made.push(
        await createMaterial({
          name: `Sort ${tag} ${i}`,
          nominalThicknessMm: t,
          family: 'mdf',
          notes: `batch ${tag}`,
        }),
      );
    }
    await createMaterial({
      name: `Sort ${tag} card`,
      family: 'card',
      nominalThicknessMm: 0.5,
      flexible: true,
      notes: `batch ${tag}`,
    });
    const q = encodeURIComponent(tag);

    const page1 = await ctx.http
      .get(`/api/materials?q=${q}&family=mdf&sort=-nominalThicknessMm&page=1&pageSize=2`)
      .set(auth('operator'))
      .expect(200);
    expect(page1.body.total).toBe(3);
    expect(page1.body.page).toBe(1);
    expect(page1.body.pageSize).toBe(2);
    expect(page1.body.items.map((m: { nominalThicknessMm: number }) => m.nominalThicknessMm)).toEqual([6, 4]);
    const page2 = await ctx.http
      .get(`/api/materials?q=${q}&family=mdf&sort=-nominalThicknessMm&page=2&pageSize=2`)
      .set(auth('operator'))
      .expect(200);
    expect(page2.body.items.map((m: { nominalThicknessMm: number }) => m.nominalThicknessMm)).toEqual([2]);

    const byName = await ctx.http.get(`/api/materials?q=${q}&sort=name`).set(auth('hobbyist')).expect(200);
    const names = byName.body.items.map((m: { name: string }) => m.name);
    expect(names).toEqual(
      [...names].sort((a: string, b: string) => a.toLowerCase().localeCompare(b.toLowerCase())),
    );
    expect(names).toHaveLength(4);

    const cardOnly = await ctx.http
      .get(`/api/materials?q=${q}&family=card`)
      .set(auth('hobbyist'))
      .expect(200);
    expect(cardOnly.body.items).toHaveLength(1);

    const pvc = await createMaterial({ name: `Sort ${tag} pvc`, family: 'pvc', notes: `batch ${tag}` });
    const noLaser = await ctx.http
      .get(`/api/materials?q=${q}&laserAllowed=false`)
      .set(auth('hobbyist'))
      .expect(200);
    expect(noLaser.body.items.map((m: { id: string }) => m.id)).toEqual([pvc.id]);
    const laser = await ctx.http
      .get(`/api/materials?q=${q}&laserAllowed=true`)
      .set(auth('hobbyist'))
      .expect(200);
    expect(laser.body.total).toBe(4);

    for (const bad of [
      'sort=password',
      'family=unobtainium',
      'pageSize=0',
      'pageSize=500',
      'laserAllowed=maybe',
    ]) {
      const res = await ctx.http.get(`/api/materials?${bad}`).set(auth('hobbyist')).expect(400);
      expectErrorBody(res.body, 400, 'VALIDATION.FAILED');
      expect(res.body.details[0].field).toBe(bad.split('=')[0]);
    }
    const sql = await ctx.http
      .get(`/api/materials?q=${encodeURIComponent("' OR 1=1 --")}`)
      .set(auth('hobbyist'))
      .expect(200);
    expect(sql.body.total).toBe(0);
  });

  describe('validation at the edge, naming the field and writing nothing', () => {
    const invalid: [string, Record<string, unknown>, string][] = [
      ['thickness below 0.05 mm', { nominalThicknessMm: 0.01 }, 'nominalThicknessMm'],
      ['thickness above 50 mm', { nominalThicknessMm: 51 }, 'nominalThicknessMm'],
      ['measured thickness negative', { measuredThicknessMm: -1 }, 'measuredThicknessMm'],
      ['thickness as text', { nominalThicknessMm: '3' }, 'nominalThicknessMm'],
      ['unknown family', { family: 'granite' }, 'family'],
      ['empty name', { name: '   ' }, 'name'],
      ['name too long', { name: 'x'.repeat(121) }, 'name'],
      [
        'sheet wider than 5000 mm',
        { stockSheets: [{ widthMm: 6000, heightMm: 400, pricePerSheet: 1, currency: 'EUR' }] },
        'stockSheets.0.widthMm',
      ],
      [
        'negative sheet price',
        { stockSheets: [{ widthMm: 600, heightMm: 400, pricePerSheet: -1, currency: 'EUR' }] },
        'stockSheets.0.pricePerSheet',
      ],
      [
        'bad currency',
        { stockSheets: [{ widthMm: 600, heightMm: 400, pricePerSheet: 1, currency: 'euro' }] },
        'stockSheets.0.currency',
      ],
      ['duplicate colours', { colours: ['red', 'red'] }, 'colours'],
      ['null flag', { flexible: null }, 'flexible'],
      ['unknown field', { density: 0.7 }, 'density'],
      ['laser off without a reason', { laserAllowed: false, hazardNote: '' }, 'hazardNote'],
    ];
    it.each(invalid)('refuses %s', async (_what, override, field) => {
      const materials = await countRows(ctx, 'materials');
      const audit = await countRows(ctx, 'audit_events');
      const res = await ctx.http
        .post('/api/materials')
        .set(auth('fabricator'))
        .send(materialBody(override))
        .expect(400);
      expectErrorBody(res.body, 400, 'VALIDATION.FAILED');
      expect(res.body.details.map((d: { field: string }) => d.field)).toContain(field);
      expect(await countRows(ctx, 'materials')).toBe(materials);
      expect(await countRows(ctx, 'audit_events')).toBe(audit);
    });

    it('refuses a duplicate name (case-insensitive) with 409', async () => {
      const body = materialBody();
      await ctx.http.post('/api/materials').set(auth('fabricator')).send(body).expect(201);
      const res = await ctx.http
        .post('/api/materials')
        .set(auth('fabricator'))
        .send({ ...body, name: String(body.name).toUpperCase() })
        .expect(409);
      expectErrorBody(res.body, 409, 'MATERIAL.NAME_TAKEN');
    });
  });

  describe('laser use follows the hazard table', () => {
    // Chlorinated plastics (PVC, vinyl) give off hydrochloric acid gas when laser cut — the reason every
    // university laser-safety guide bans them (common practice; the table's own sources are in its rows).
    it('stores PVC as not laser-allowed with the table reason, and refuses laserAllowed: true', async () => {
      const ok = await ctx.http
        .post('/api/materials')
        .set(auth('fabricator'))
        .send(materialBody({ family: 'pvc', name: unique('Grey PVC sheet') }))
        .expect(201);
      expect(ok.body.laserAllowed).toBe(false);
      expect(ok.body.hazardNote).toMatch(/must not be cut on a laser/);
      expect(ok.body.hazardNote).toContain((await hazardRow(ctx, 'pvc')).hazard);

      const before = await countRows(ctx, 'materials');
      const refused = await ctx.http
        .post('/api/materials')
        .set(auth('fabricator'))
        .send(materialBody({ family: 'pvc', laserAllowed: true }))
        .expect(409);
      expectErrorBody(refused.body, 409, 'MATERIAL.LASER_PROHIBITED');
      expect(refused.body.details).toMatchObject({ field: 'laserAllowed', family: 'pvc' });
      expect(await countRows(ctx, 'materials')).toBe(before);
    });

    it.each(HAZARDS.map((h) => h.family))(
      'family %s may be laser-allowed only when the hazard table does not say laser "no"',
      async (family) => {
        const row = await hazardRow(ctx, family);
        const res = await ctx.http
          .post('/api/materials')
          .set(auth('fabricator'))
          .send(materialBody({ family, laserAllowed: true }));
        if (row.laser === 'no') {
          expect(res.status).toBe(409);
          expectErrorBody(res.body, 409, 'MATERIAL.LASER_PROHIBITED');
        } else {
          expect(res.status).toBe(201);
          expect(res.body.laserAllowed).toBe(true);
        }
      },
    );

    it('agrees with the shipped hazard table on the chlorinated and the common sheet materials', async () => {
      // PVC and vinyl release hydrogen chloride under a laser (common practice; every university laser
      // guide bans them); plywood, MDF, acrylic and card are the usual laser stock (common practice).
      expect((await hazardRow(ctx, 'pvc')).laser).toBe('no');
      for (const family of ['plywood', 'mdf', 'acrylic', 'card'])
        expect((await hazardRow(ctx, family)).laser).toBe('yes');
    });

    it('turns laser use off when a material is changed to a prohibited family, and refuses turning it back on', async () => {
      const m = await createMaterial({ family: 'acrylic', name: unique('Clear sheet') });
      const moved = await ctx.http
        .patch(`/api/materials/${m.id}`)
        .set(auth('fabricator'))
        .send({ version: m.version, family: 'polycarbonate' })
        .expect(200);
      expect(moved.body).toMatchObject({
        family: 'polycarbonate',
        laserAllowed: false,
        version: m.version + 1,
      });
      expect(moved.body.hazardNote).toContain((await hazardRow(ctx, 'polycarbonate')).hazard);
      const res = await ctx.http
        .patch(`/api/materials/${m.id}`)
        .set(auth('supervisor'))
        .send({ version: moved.body.version, laserAllowed: true })
        .expect(409);
      expectErrorBody(res.body, 409, 'MATERIAL.LASER_PROHIBITED');
    });

    it('lets only a supervisor put a material kept off the laser back on it, by its flag or a new family', async () => {
      const pvc = await createMaterial({ family: 'pvc', name: unique('Grey sheet') });
      const mdf = await createMaterial({
        family: 'mdf',
        laserAllowed: false,
        hazardNote: 'Binder unknown',
        name: unique('Brown board'),
      });
      // A fabricator reclassifying PVC as acrylic and switching the laser on is refused, changing nothing.
      for (const [m, family, change] of [
        [pvc, 'pvc', { family: 'acrylic', laserAllowed: true }],
        // Reclassifying alone (the laser switched on later, by anyone allowed to) is the same decision.
        [pvc, 'pvc', { family: 'acrylic' }],
        [mdf, 'mdf', { laserAllowed: true }],
      ] as const) {
        const res = await ctx.http
          .patch(`/api/materials/${m.id}`)
          .set(auth('fabricator'))
          .send({ version: m.version, ...change })
          .expect(403);
        expectErrorBody(res.body, 403, 'MATERIAL.LASER_RELEASE_NEEDS_SUPERVISOR');
        const same = await ctx.http.get(`/api/materials/${m.id}`).set(auth('operator')).expect(200);
        expect(same.body).toMatchObject({ family, laserAllowed: false, version: m.version });
      }
      // Other changes stay the fabricator's, and the laser stays off.
      const renamed = await ctx.http
        .patch(`/api/materials/${mdf.id}`)
        .set(auth('fabricator'))
        .send({ version: mdf.version, notes: 'Second batch' })
        .expect(200);
      expect(renamed.body).toMatchObject({ notes: 'Second batch', laserAllowed: false });
      // A supervisor may decide it (audited as any change).
      const released = await ctx.http
        .patch(`/api/materials/${pvc.id}`)
        .set(auth('supervisor'))
        .send({ version: pvc.version, family: 'acrylic', laserAllowed: true, hazardNote: '' })
        .expect(200);
      expect(released.body).toMatchObject({ family: 'acrylic', laserAllowed: true });
      // The MDF kept off for its binder, allowed again by a supervisor: the reason it was kept off goes.
      const mdfAgain = await ctx.http
        .patch(`/api/materials/${mdf.id}`)
        .set(auth('supervisor'))
        .send({ version: renamed.body.version, laserAllowed: true })
        .expect(200);
      expect(mdfAgain.body).toMatchObject({ laserAllowed: true, hazardNote: '' });
    });

    it('lets only a supervisor move a laser-usable material into a family cut only on a condition', async () => {
      const felt = await hazardRow(ctx, 'felt');
      const other = await hazardRow(ctx, 'other');
      expect([felt.laser, other.laser]).toEqual(['conditional', 'conditional']);
      const m = await createMaterial({ family: 'acrylic', name: unique('Clear sheet') });
      // Machine versions approved for it were checked as acrylic: the felt condition was never accepted.
      for (const family of ['felt', 'other']) {
        const res = await ctx.http
          .patch(`/api/materials/${m.id}`)
          .set(auth('fabricator'))
          .send({ version: m.version, family })
          .expect(403);
        expectErrorBody(res.body, 403, 'MATERIAL.LASER_RELEASE_NEEDS_SUPERVISOR');
        expect(res.body.message).toContain(
          (family === 'felt' ? felt.condition : other.condition)!.replace(/\.$/, ''),
        );
        expect(res.body.message).not.toContain('.)');
        expect(res.body.details).toMatchObject({ field: 'family' });
      }
      const same = await ctx.http.get(`/api/materials/${m.id}`).set(auth('operator')).expect(200);
      expect(same.body).toMatchObject({ family: 'acrylic', laserAllowed: true, version: m.version });
      // A supervisor accepts it; the note is the new family's condition, and follows a later move.
      const toOther = await ctx.http
        .patch(`/api/materials/${m.id}`)
        .set(auth('supervisor'))
        .send({ version: m.version, family: 'other' })
        .expect(200);
      expect(toOther.body).toMatchObject({
        laserAllowed: true,
        hazardNote: `Laser only when: ${other.condition}`,
      });
      const toFelt = await ctx.http
        .patch(`/api/materials/${m.id}`)
        .set(auth('supervisor'))
        .send({ version: toOther.body.version, family: 'felt' })
        .expect(200);
      expect(toFelt.body.hazardNote).toBe(`Laser only when: ${felt.condition}`);
      // Back into a family cut outright is no new risk: the fabricator's, and the condition note goes.
      const back = await ctx.http
        .patch(`/api/materials/${m.id}`)
        .set(auth('fabricator'))
        .send({ version: toFelt.body.version, family: 'acrylic' })
        .expect(200);
      expect(back.body).toMatchObject({ family: 'acrylic', laserAllowed: true, hazardNote: '' });
      // A material kept off the laser may be reclassified by a fabricator: it stays off.
      const off = await createMaterial({ family: 'mdf', laserAllowed: false, hazardNote: 'Binder unknown' });
      const offMoved = await ctx.http
        .patch(`/api/materials/${off.id}`)
        .set(auth('fabricator'))
        .send({ version: off.version, family: 'felt' })
        .expect(200);
      expect(offMoved.body).toMatchObject({
        family: 'felt',
        laserAllowed: false,
        hazardNote: 'Binder unknown',
      });
    });

    it('keeps a material named as a refused plastic off the laser, whatever family it is filed under', async () => {
      expect((await hazardRow(ctx, 'pvc')).nameWords).toEqual(expect.arrayContaining(['PVC', 'vinyl']));
      // Filed as acrylic, named as PVC: refused with the name marked, and nothing stored.
      const before = await countRows(ctx, 'materials');
      for (const name of [
        unique('Grey PVC sheet'),
        unique('Expanded pvc board'),
        unique('Vinyl sheet 1 mm'),
      ]) {
        const res = await ctx.http
          .post('/api/materials')
          .set(auth('fabricator'))
          .send(materialBody({ family: 'acrylic', name }))
          .expect(409);
        expectErrorBody(res.body, 409, 'MATERIAL.NAME_NAMES_REFUSED_FAMILY');
        expect(res.body.details).toMatchObject({ field: 'name', family: 'pvc' });
      }
      expect(await countRows(ctx, 'materials')).toBe(before);
      // Filed as what it is, or kept off the laser with a reason (for the router): stored.
      const pvc = await createMaterial({ family: 'pvc', name: unique('Grey PVC sheet') });
      const router = await createMaterial({
        family: 'acrylic',
        name: unique('PVC-backed acrylic'),
        laserAllowed: false,
        hazardNote: 'PVC backing: router only',
      });
      for (const m of [pvc, router]) {
        const got = await ctx.http.get(`/api/materials/${m.id}`).set(auth('operator')).expect(200);
        expect(got.body.laserAllowed).toBe(false);
      }
      // A word inside another word is not the word; a rename that names a refused plastic is refused.
      const clear = await createMaterial({ family: 'acrylic', name: unique('Clear sheet (absorbent-free)') });
      const renamed = await ctx.http
        .patch(`/api/materials/${clear.id}`)
        .set(auth('supervisor'))
        .send({ version: clear.version, name: unique('Lexan clear') })
        .expect(409);
      expectErrorBody(renamed.body, 409, 'MATERIAL.NAME_NAMES_REFUSED_FAMILY');
      expect(renamed.body.details).toMatchObject({ field: 'name', family: 'polycarbonate' });
    });

    it('stores the condition of a conditionally allowed family (felt) as the hazard note', async () => {
      const row = await hazardRow(ctx, 'felt');
      expect(row.laser).toBe('conditional');
      const m = await createMaterial({ family: 'felt', name: unique('Wool felt 3 mm') });
      const got = await ctx.http.get(`/api/materials/${m.id}`).set(auth('operator')).expect(200);
      expect(got.body).toMatchObject({ laserAllowed: true, hazardNote: `Laser only when: ${row.condition}` });
    });

    it('lets a workshop keep an allowed family off the laser when it says why', async () => {
      const m = await createMaterial({
        family: 'mdf',
        laserAllowed: false,
        hazardNote: 'Our MDF has an unknown binder',
      });
      const got = await ctx.http.get(`/api/materials/${m.id}`).set(auth('operator')).expect(200);
      expect(got.body).toMatchObject({ laserAllowed: false, hazardNote: 'Our MDF has an unknown binder' });
    });
  });

  it('changes a material with optimistic locking: a stale version gets 409 and changes nothing', async () => {
    const m = await createMaterial();
    const a = await ctx.http
      .patch(`/api/materials/${m.id}`)
      .set(auth('fabricator'))
      .send({ version: m.version, measuredThicknessMm: 2.9, colours: ['natural', 'white'] })
      .expect(200);
    expect(a.body).toMatchObject({
      measuredThicknessMm: 2.9,
      colours: ['natural', 'white'],
      version: m.version + 1,
    });
    const before = await countRows(ctx, 'audit_events');
    const b = await ctx.http
      .patch(`/api/materials/${m.id}`)
      .set(auth('supervisor'))
      .send({ version: m.version, notes: 'written on a stale copy' })
      .expect(409);
    expectErrorBody(b.body, 409, 'MATERIAL.STALE_VERSION');
    expect(b.body.details).toEqual({ currentVersion: m.version + 1 });
    expect(await countRows(ctx, 'audit_events')).toBe(before);
    const got = await ctx.http.get(`/api/materials/${m.id}`).set(auth('fabricator')).expect(200);
    expect(got.body.notes).toBe('test stock');

    const cleared = await ctx.http
      .patch(`/api/materials/${m.id}`)
      .set(auth('fabricator'))
      .send({ version: got.body.version, measuredThicknessMm: null })
      .expect(200);
    expect(cleared.body.measuredThicknessMm).toBeNull();
    const nulled = await ctx.http
      .patch(`/api/materials/${m.id}`)
      .set(auth('fabricator'))
      .send({ version: cleared.body.version, name: null })
      .expect(400);
    expect(nulled.body.details[0].field).toBe('name');
    const noVersion = await ctx.http
      .patch(`/api/materials/${m.id}`)
      .set(auth('fabricator'))
      .send({ notes: 'x' })
      .expect(400);
    expect(noVersion.body.details[0].field).toBe('version');

    const audit: { action: string; before: { version: number }; after: { version: number } }[] =
      await ctx.db.query(
        `SELECT action, before, after FROM audit_events WHERE entity_id = $1 AND action = 'material.update' ORDER BY id`,
        [m.id],
      );
    expect(audit.map((e) => [e.before.version, e.after.version])).toEqual([
      [1, 2],
      [2, 3],
    ]);
  });

  it('deletes an unused material (audited), and refuses one used by a job with 409', async () => {
    const unused = await createMaterial();
    await ctx.http.delete(`/api/materials/${unused.id}`).set(auth('fabricator')).expect(204);
    await ctx.http.get(`/api/materials/${unused.id}`).set(auth('fabricator')).expect(404);
    const audit: { action: string }[] = await ctx.db.query(
      `SELECT action FROM audit_events WHERE entity_id = $1 ORDER BY id`,
      [unused.id],
    );
    expect(audit.map((a) => a.action)).toEqual(['material.create', 'material.delete']);

    const used = await createMaterial();
    // A design and a job that uses the material, written straight to the database (with a real spec, as
    // every other reader of these tables expects one).
    const spec = JSON.stringify(octahedronHexagons());
    const design: { id: string }[] = await ctx.db.query(
      `INSERT INTO designs (owner_id, name, spec) VALUES ($1, 'delete test', $2) RETURNING id`,
      [users.hobbyist.id, spec],
    );
    await ctx.db.query(
      `INSERT INTO jobs (design_id, requester_id, spec, material_id) VALUES ($1, $2, $3, $4)`,
      [design[0]!.id, users.hobbyist.id, spec, used.id],
    );
    const before = await countRows(ctx, 'audit_events');
    const res = await ctx.http.delete(`/api/materials/${used.id}`).set(auth('supervisor')).expect(409);
    expectErrorBody(res.body, 409, 'MATERIAL.IN_USE');
    expect(res.body.details).toMatchObject({ jobs: 1 });
    expect(await countRows(ctx, 'audit_events')).toBe(before);
    await ctx.http.get(`/api/materials/${used.id}`).set(auth('fabricator')).expect(200);
  });

  it('answers 404 for an unknown material and 400 for a malformed id', async () => {
    const nf = await ctx.http
      .get('/api/materials/00000000-0000-4000-8000-000000000000')
      .set(auth('hobbyist'))
      .expect(404);
    expectErrorBody(nf.body, 404, 'MATERIAL.NOT_FOUND');
    await ctx.http.get('/api/materials/not-a-uuid').set(auth('hobbyist')).expect(400);
  });

  it('lists every materials route with its shapes in the OpenAPI document', async () => {
    const doc = await ctx.http.get('/api/docs-json').expect(200);
    const paths = doc.body.paths as Record<string, Record<string, unknown>>;
    expect(Object.keys(paths['/api/materials']!).sort()).toEqual(['get', 'post']);
    expect(Object.keys(paths['/api/materials/{id}']!).sort()).toEqual(['delete', 'get', 'patch']);
    const schemas = doc.body.components.schemas as Record<string, { properties: Record<string, unknown> }>;
    expect(Object.keys(schemas.CreateMaterialDto!.properties)).toEqual(
      expect.arrayContaining([
        'name',
        'family',
        'nominalThicknessMm',
        'stockSheets',
        'laserAllowed',
        'hazardNote',
      ]),
    );
    expect(Object.keys(schemas.MaterialResponse!.properties)).toEqual(
      expect.arrayContaining(['id', 'version']),
    );
    expect(Object.keys(schemas.UpdateMaterialDto!.properties)).toContain('version');
  });
});
