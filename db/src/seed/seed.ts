import { randomUUID } from 'node:crypto';
import bcrypt from 'bcryptjs';
import { type DataSource, type EntityManager } from 'typeorm';
import {
  layoutChoiceOf,
  type MaterialHazard,
  type SafetyNotice,
  toEstimateMachine,
} from '@kerfwright/contracts';
import { designPreview, buildModel, prepareCut } from '@kerfwright/geometry';
import { preparationEstimate } from '@kerfwright/geometry/pack';
import { jobSpec, type Scenario, type ScenarioJob } from '../content';

/** bcrypt cost for seeded passwords (the API uses the same). */
export const PASSWORD_HASH_COST = 12;

export interface SeedInput {
  /** In production no demo data is written and existing demo accounts are deactivated. */
  production: boolean;
  notices: readonly SafetyNotice[];
  hazards: readonly MaterialHazard[];
  scenario: Scenario;
}

export interface SeedResult {
  noticesAdded: number;
  usersCreated: number;
  materialsCreated: number;
  profilesCreated: number;
  designsCreated: number;
  jobsCreated: number;
}

export async function runMigrations(ds: DataSource): Promise<string[]> {
  const ran = await ds.runMigrations({ transaction: 'each' });
  return ran.map((m) => m.name);
}

/**
 * Writes the safety content and (outside production) the demo workshop. Idempotent: every row is keyed by a
 * natural key (notice id + version, hazard family, e-mail, scenario keys) and existing rows are left alone,
 * so a second run inserts nothing and never touches what users changed.
 */
export async function seedDatabase(ds: DataSource, input: SeedInput): Promise<SeedResult> {
  return ds.transaction(async (m) => {
    const result: SeedResult = {
      noticesAdded: 0,
      usersCreated: 0,
      materialsCreated: 0,
      profilesCreated: 0,
      designsCreated: 0,
      jobsCreated: 0,
    };
    await m.query(`SELECT pg_advisory_xact_lock(7302001)`); // one seeder at a time
    result.noticesAdded = await seedSafety(m, input.notices, input.hazards);
    if (input.production) {
      await m.query(`UPDATE users SET active = false WHERE is_demo AND active`);
      return result;
    }
    const s = input.scenario;
    const users = await seedUsers(m, s, result);
    const supervisor = s.users.find((u) => u.role === 'supervisor')?.email;
    const rules: unknown[] = await m.query(`SELECT 1 FROM local_rules LIMIT 1`);
    if (rules.length === 0) {
      await m.query(`INSERT INTO local_rules (version, body, author_id) VALUES (1, $1, $2)`, [
        s.workshop.localRules,
        supervisor ? (users.get(supervisor) ?? null) : null,
      ]);
    }
    const materials = await seedMaterials(m, s, result);
    const versions = await seedProfiles(m, s, users, materials, result);
    const designs = await seedDesigns(m, s, users, result);
    for (const job of s.jobs)
      await seedJob(m, s, job, { users, materials, versions, designs }, input.notices, result);
    return result;
  });
}

async function seedSafety(
  m: EntityManager,
  notices: readonly SafetyNotice[],
  hazards: readonly MaterialHazard[],
): Promise<number> {
  let added = 0;
  for (const n of notices) {
    const rows: unknown[] = await m.query(
      `INSERT INTO safety_notices (notice_key, version, title, severity, machine_kinds, material_families, body, sources, current)
       VALUES ($1, $2, $3, $4, $5, $6, $7, $8, false)
       ON CONFLICT (notice_key, version) DO NOTHING RETURNING id`,
      [
        n.id,
        n.version,
        n.title,
        n.severity,
        JSON.stringify(n.appliesTo.machineKinds),
        JSON.stringify(n.appliesTo.materialFamilies),
        n.body,
        JSON.stringify(n.sources),
      ],
    );
    added += rows.length;
  }
  // The highest version of each notice is the current one; older versions stay for acknowledgements.
  await m.query(`UPDATE safety_notices SET current = false WHERE current`);
  await m.query(
    `UPDATE safety_notices s SET current = true
       FROM (SELECT notice_key, max(version) AS v FROM safety_notices GROUP BY notice_key) latest
      WHERE s.notice_key = latest.notice_key AND s.version = latest.v`,
  );
  for (const h of hazards) {
    await m.query(
      `INSERT INTO material_hazards (family, examples, name_words, laser, hazard, condition, source)
       VALUES ($1, $2, $3, $4, $5, $6, $7)
       ON CONFLICT (family) DO UPDATE SET examples = EXCLUDED.examples, name_words = EXCLUDED.name_words,
         laser = EXCLUDED.laser, hazard = EXCLUDED.hazard, condition = EXCLUDED.condition, source = EXCLUDED.source,
         updated_at = now()`,
      [
        h.family,
        JSON.stringify(h.examples),
        JSON.stringify(h.nameWords ?? []),
        h.laser,
        h.hazard,
        h.condition ?? null,
        h.source,
      ],
    );
  }
  return added;
}

async function seedUsers(m: EntityManager, s: Scenario, result: SeedResult): Promise<Map<string, string>> {
  const hash = await bcrypt.hash(s.demoPassword, PASSWORD_HASH_COST);
  for (const u of s.users) {
    const rows: unknown[] = await m.query(
      `INSERT INTO users (email, display_name, password_hash, role, is_demo) VALUES ($1, $2, $3, $4, true)
       ON CONFLICT ((lower(email))) DO NOTHING RETURNING id`,
      [u.email, u.displayName, hash, u.role],
    );
    result.usersCreated += rows.length;
  }
  const rows: { id: string; email: string }[] = await m.query(
    `SELECT id, lower(email) AS email FROM users WHERE lower(email) = ANY($1)`,
    [s.users.map((u) => u.email.toLowerCase())],
  );
  return new Map(rows.map((r) => [r.email, r.id]));
}

const idOf = (map: Map<string, string>, key: string, what: string): string => {
  const id = map.get(key.toLowerCase()) ?? map.get(key);
  if (!id) throw new Error(`seed: unknown ${what} "${key}"`);
  return id;
};

async function keyed(m: EntityManager, table: string): Promise<Map<string, string>> {
  const rows: { id: string; seed_key: string }[] = await m.query(
    `SELECT id, seed_key FROM ${table} WHERE seed_key IS NOT NULL`,
  );
  return new Map(rows.map((r) => [r.seed_key, r.id]));
}

async function seedMaterials(
  m: EntityManager,
  s: Scenario,
  result: SeedResult,
): Promise<Map<string, string>> {
  const existing = await keyed(m, 'materials');
  for (const mat of s.materials) {
    if (existing.has(mat.key)) continue;
    const rows: unknown[] = await m.query(
      `INSERT INTO materials (seed_key, name, family, nominal_thickness_mm, measured_thickness_mm, flexible, colours, stock_sheets,
         laser_allowed, hazard_note, notes)
       VALUES ($1, $2, $3, $4, $5, $6, $7, $8, $9, $10, $11) ON CONFLICT DO NOTHING RETURNING id`,
      [
        mat.key,
        mat.name,
        mat.family,
        mat.nominalThicknessMm,
        mat.measuredThicknessMm,
        mat.flexible,
        JSON.stringify(mat.colours),
        JSON.stringify(mat.stockSheets),
        mat.laserAllowed,
        mat.hazardNote,
        mat.notes,
      ],
    );
    result.materialsCreated += rows.length;
  }
  return keyed(m, 'materials');
}

async function seedProfiles(
  m: EntityManager,
  s: Scenario,
  users: Map<string, string>,
  materials: Map<string, string>,
  result: SeedResult,
): Promise<Map<string, string>> {
  const existing = await keyed(m, 'machine_profiles');
  const fabricator = s.users.find((u) => u.role === 'fabricator')?.email;
  for (const p of s.machineProfiles) {
    if (existing.has(p.key)) continue;
    const rows: { id: string }[] = await m.query(
      `INSERT INTO machine_profiles (seed_key, name, kind, created_by) VALUES ($1, $2, $3, $4) ON CONFLICT DO NOTHING RETURNING id`,
      [p.key, p.name, p.kind, fabricator ? (users.get(fabricator.toLowerCase()) ?? null) : null],
    );
    const profileId = rows[0]?.id;
    if (!profileId) continue;
    result.profilesCreated++;
    const settings = p.settings.map(({ material, ...rest }) => ({
      materialId: idOf(materials, material, 'material'),
      ...rest,
    }));
    const approved = p.status === 'approved';
    const creator = fabricator ? (users.get(fabricator.toLowerCase()) ?? null) : null;
    await m.query(
      `INSERT INTO machine_profile_versions (profile_id, number, state, bed_width_mm, bed_height_mm, rapid_speed_mm_s, hourly_rate, currency,
         settings, notes, created_by, submitted_by, submitted_at, approved_by, approved_at)
       VALUES ($1, $2, $3, $4, $5, $6, $7, $8, $9, $10, $11, $11, now(), $12, $13)`,
      [
        profileId,
        p.version,
        approved ? 'approved' : 'submitted',
        p.bed.widthMm,
        p.bed.heightMm,
        p.rapidSpeedMmS,
        p.hourlyRate,
        p.currency,
        JSON.stringify(settings),
        p.notes,
        creator,
        approved && p.approvedBy ? idOf(users, p.approvedBy, 'user') : null,
        approved ? new Date() : null,
      ],
    );
  }
  const rows: { seed_key: string; id: string }[] = await m.query(
    `SELECT p.seed_key, v.id FROM machine_profile_versions v JOIN machine_profiles p ON p.id = v.profile_id
      WHERE p.seed_key IS NOT NULL ORDER BY v.number`,
  );
  return new Map(rows.map((r) => [r.seed_key, r.id])); // the highest version of each seeded profile
}

async function seedDesigns(
  m: EntityManager,
  s: Scenario,
  users: Map<string, string>,
  result: SeedResult,
): Promise<Map<string, string>> {
  const existing = await keyed(m, 'designs');
  for (const d of s.designs) {
    if (existing.has(d.key)) continue;
    const preview = designPreview(buildModel(d.spec).report);
    const rows: unknown[] = await m.query(
      `INSERT INTO designs (seed_key, owner_id, name, description, spec, preview) VALUES ($1, $2, $3, $4, $5, $6)
       ON CONFLICT DO NOTHING RETURNING id`,
      [
        d.key,
        idOf(users, d.owner, 'user'),
        d.title,
        d.description,
        JSON.stringify(d.spec),
        JSON.stringify(preview),
      ],
    );
    result.designsCreated += rows.length;
  }
  return keyed(m, 'designs');
}

const PREPARED_STATES = new Set(['prepared', 'approved', 'released', 'cut', 'closed']);

function designOf(s: Scenario, job: ScenarioJob): Scenario['designs'][number] {
  const design = s.designs.find((d) => d.key === job.design);
  if (!design) throw new Error(`job "${job.key}" refers to a missing design`);
  return design;
}

async function seedJob(
  m: EntityManager,
  s: Scenario,
  job: ScenarioJob,
  ids: {
    users: Map<string, string>;
    materials: Map<string, string>;
    versions: Map<string, string>;
    designs: Map<string, string>;
  },
  notices: readonly SafetyNotice[],
  result: SeedResult,
): Promise<void> {
  const exists: unknown[] = await m.query(`SELECT 1 FROM jobs WHERE seed_key = $1`, [job.key]);
  if (exists.length > 0) return;
  const spec = jobSpec(s, job);
  const material = s.materials.find((x) => x.key === job.material);
  const reached = job.history.map((h) => h.state);
  let preparation = null;
  const stock = material?.stockSheets[0];
  if (reached.some((st) => PREPARED_STATES.has(st)) && stock) {
    const prepared = prepareCut(spec, {
      sheet: stock,
      marginMm: 5,
      gapMm: 3,
      colours: { count: job.colours.length, ...(spec.colours?.rule ? { rule: spec.colours.rule } : {}) },
      quantity: job.quantity,
    });
    // A demo job that went through preparation must carry what preparation produces.
    if (!prepared.summary) {
      const why = prepared.layout.ok ? 'the design has errors' : prepared.layout.message;
      throw new Error(`seed job "${job.key}" reached preparation but cannot be prepared: ${why}`);
    }
    preparation = prepared.summary;
    // With the time and cost preparation keeps, at the profile's speeds and the stock's price.
    const profile = s.machineProfiles.find((p) => p.key === job.profile);
    const setting = profile?.settings.find((st) => st.material === job.material);
    if (profile && setting && prepared.layout.ok) {
      preparation.estimate = preparationEstimate(prepared.model, prepared.layout, {
        colours: job.colours,
        sheet: stock,
        machine: toEstimateMachine(profile, setting),
        pricePerSheet: stock.currency === profile.currency ? stock.pricePerSheet : null,
        currency: profile.currency,
      });
    }
  }
  const hasMachine = reached.some((st) => PREPARED_STATES.has(st)) || job.state === 'returned';
  const rows: { id: string }[] = await m.query(
    `INSERT INTO jobs (seed_key, design_id, requester_id, state, spec, material_id, colours, profile_version_id, quantity, notes,
       return_reason, preparation, layout_choice, actual_minutes, sheets_used, measured_kerf_mm, requested_spec)
     VALUES ($1, $2, $3, $4, $5, $6, $7, $8, $9, $10, $11, $12, $13, $14, $15, $16, $17) RETURNING id`,
    [
      job.key,
      idOf(ids.designs, job.design, 'design'),
      idOf(ids.users, job.owner, 'user'),
      job.state,
      JSON.stringify(spec),
      hasMachine ? idOf(ids.materials, job.material, 'material') : null,
      JSON.stringify(job.colours),
      hasMachine ? idOf(ids.versions, job.profile, 'machine profile') : null,
      job.quantity,
      job.title,
      job.returnReason ?? null,
      preparation ? JSON.stringify(preparation) : null,
      preparation ? JSON.stringify(layoutChoiceOf(preparation)) : null,
      job.cutRecord?.actualMinutes ?? null,
      job.cutRecord ? (preparation?.sheetCount ?? null) : null,
      job.cutRecord?.measuredKerfMm ?? null,
      // The design as requested, which a preparation starts from (a draft has not been requested yet).
      reached.includes('requested') ? JSON.stringify(designOf(s, job).spec) : null,
    ],
  );
  const jobId = rows[0]!.id;
  let from: string | null = null;
  for (const [i, h] of job.history.entries()) {
    const action = i === 0 ? 'create' : (ACTION_FOR[h.state] ?? h.state);
    await m.query(
      `INSERT INTO job_transitions (job_id, from_state, to_state, action, actor_id, reason, created_at)
       VALUES ($1, $2, $3, $4, $5, $6, now() - make_interval(mins => $7))`,
      [
        jobId,
        from,
        h.state,
        action,
        idOf(ids.users, h.by, 'user'),
        h.note ?? (h.state === 'returned' ? (job.returnReason ?? null) : null),
        (job.history.length - i) * 90,
      ],
    );
    from = h.state;
  }
  // A released job has a cut pack. The seed only records that it is owed (queued); the first API or worker
  // process that works the queue builds it (its reconciler finds exports owed in PostgreSQL), so the demo's
  // released jobs come with real files and no job is released without one. A job already cut or closed gets
  // none: the queue builds no pack for a job done with the machine (it would only record a failed export).
  const release = job.history.find((h) => h.state === 'released');
  if (release && job.state === 'released') {
    const exportId = randomUUID();
    await m.query(
      `INSERT INTO exports (id, job_id, state, requested_by, storage_prefix, preparation_id)
       VALUES ($1, $2, 'queued', $3, $4,
               (SELECT max(t.id) FROM job_transitions t WHERE t.job_id = $2 AND t.action = 'prepare'))`,
      [exportId, jobId, idOf(ids.users, release.by, 'user'), `jobs/${jobId}/exports/${exportId}/`],
    );
  }
  for (const ack of job.acknowledgements) {
    const versions =
      ack.notices.length > 0 ? ack.notices : notices.map((n) => ({ id: n.id, version: n.version }));
    await m.query(
      // For the job's preparation in effect (its latest prepare), as the API records one.
      `INSERT INTO safety_acknowledgements (job_id, user_id, notice_versions, local_rules_version, preparation_id)
       VALUES ($1, $2, $3, 1,
               (SELECT max(t.id) FROM job_transitions t WHERE t.job_id = $1 AND t.action = 'prepare'))`,
      [jobId, idOf(ids.users, ack.by, 'user'), JSON.stringify(versions)],
    );
  }
  result.jobsCreated++;
}

const ACTION_FOR: Record<string, string> = {
  requested: 'request',
  prepared: 'prepare',
  approved: 'approve',
  released: 'release',
  cut: 'cut',
  closed: 'close',
  returned: 'return',
  draft: 'reopen',
};
