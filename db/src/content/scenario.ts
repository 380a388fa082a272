import * as fs from 'node:fs';
import * as path from 'node:path';
import {
  isLaserKind,
  JOB_STATES,
  JOB_TRANSITIONS,
  kerfRangeMm,
  laserRefusal,
  MACHINE_PROFILE_KINDS,
  MACHINE_PROFILE_LIMITS,
  MATERIAL_FAMILIES,
  MATERIAL_LIMITS,
  ROLES,
  SCALE_BY,
  SOLID_TEXT_FORMATS,
  toMachineSpec,
  type DesignSpec,
  type JobAction,
  type JobState,
  type MachineProfileKind,
  type MachineSpec,
  type MaterialFamily,
  type MaterialHazard,
  type NoticeVersionRef,
  type ProfileVersionState,
  type Role,
} from '@kerfwright/contracts';
import { ContentError, FieldReader } from './content-error';

/** States that need an approved machine profile. */
const NEEDS_APPROVED_PROFILE: readonly JobState[] = ['prepared', 'approved', 'released', 'cut', 'closed'];

/** The demo seeds one version per profile: approved, or submitted and awaiting a supervisor's approval. */
export const PROFILE_STATUSES = ['approved', 'awaiting-approval'] as const;
export type ProfileStatus = (typeof PROFILE_STATUSES)[number];

/** The profile version state (libs/contracts PROFILE_VERSION_STATES) a scenario status is seeded as. */
export function profileVersionState(status: ProfileStatus): ProfileVersionState {
  return status === 'approved' ? 'approved' : 'submitted';
}

export interface ScenarioUser {
  email: string;
  displayName: string;
  role: Role;
}

export interface ScenarioStockSheet {
  widthMm: number;
  heightMm: number;
  pricePerSheet: number;
  /** ISO 4217 code. */
  currency: string;
}

export interface ScenarioMaterial {
  key: string;
  name: string;
  family: MaterialFamily;
  nominalThicknessMm: number;
  measuredThicknessMm: number;
  flexible: boolean;
  colours: string[];
  stockSheets: ScenarioStockSheet[];
  laserAllowed: boolean;
  hazardNote: string;
  notes: string;
}

/** Settings of one machine profile for one material. Beam and blade machines give a kerf, routers a tool. */
export interface ScenarioProfileSetting {
  material: string;
  kerfMm?: number;
  toolDiameterMm?: number;
  cutSpeedMmS: number;
  markSpeedMmS: number;
  powerPct?: number;
  passes: number;
  pierceTimeS: number;
  spindleRpm?: number;
}

/** A machine profile with the one version the demo seeds. */
export interface ScenarioMachineProfile {
  key: string;
  name: string;
  kind: MachineProfileKind;
  version: number;
  status: ProfileStatus;
  /** The fabricator or supervisor who submitted the version. */
  submittedBy: string;
  /** The supervisor who approved it (approved profiles only). */
  approvedBy?: string;
  bed: { widthMm: number; heightMm: number };
  rapidSpeedMmS: number;
  hourlyRate: number;
  currency: string;
  settings: ScenarioProfileSetting[];
  notes: string;
}

export interface ScenarioDesign {
  key: string;
  title: string;
  description: string;
  owner: string;
  material: string;
  profile: string;
  colours: string[];
  /** Path of the CLI spec file, relative to the scenario folder. */
  specFile: string;
  spec: DesignSpec;
}

/** One step of a job's history; `action` is the JOB_TRANSITIONS action that led to `state` (none for the first draft). */
export interface ScenarioJobEvent {
  state: JobState;
  action: JobAction | null;
  by: string;
  note?: string;
}

export interface ScenarioAcknowledgement {
  by: string;
  notices: NoticeVersionRef[];
}

export interface ScenarioJob {
  key: string;
  design: string;
  material: string;
  profile: string;
  colours: string[];
  quantity: number;
  /** E-mail of the user who requested the job (its owner). */
  owner: string;
  title: string;
  state: JobState;
  history: ScenarioJobEvent[];
  returnReason?: string;
  acknowledgements: ScenarioAcknowledgement[];
  cutRecord?: { actualMinutes: number; sheetsUsed?: number; measuredKerfMm?: number; note?: string };
}

export interface Scenario {
  scenario: string;
  workshop: { name: string; place: string; localRules: string; notes: string };
  project: { title: string; client: string; description: string };
  demoPassword: string;
  users: ScenarioUser[];
  materials: ScenarioMaterial[];
  machineProfiles: ScenarioMachineProfile[];
  designs: ScenarioDesign[];
  jobs: ScenarioJob[];
}

export interface LoadScenarioOptions {
  /** When given, materials, profiles and laser jobs are checked against the hazard table too. */
  hazards?: readonly MaterialHazard[];
}

const EMAIL = /^[^\s@]+@[^\s@]+\.[^\s@]+$/;
const CURRENCY = /^[A-Z]{3}$/;
/** Two lengths are the same when they differ by less than this (mm). */
const SAME_MM = 1e-9;

function uniqueKeys<T>(r: FieldReader, items: readonly T[], field: string, keyOf: (item: T) => string): void {
  const seen = new Set<string>();
  items.forEach((item, i) => {
    const k = keyOf(item).toLowerCase();
    if (seen.has(k)) r.fail(`${field}[${i}]`, `"${keyOf(item)}" appears more than once`);
    seen.add(k);
  });
}

function colourList(r: FieldReader, value: unknown, field: string, offered: readonly string[]): string[] {
  const colours = r.texts(value, field);
  colours.forEach((c, i) => {
    if (!offered.includes(c)) r.fail(`${field}[${i}]`, `"${c}" is not a colour the material offers`);
  });
  return colours;
}

function readUser(r: FieldReader, raw: unknown, at: string): ScenarioUser {
  const u = r.record(raw, at);
  const email = r.text(u.email, `${at}.email`);
  if (!EMAIL.test(email)) r.fail(`${at}.email`, `"${email}" is not an e-mail address`);
  return {
    email,
    displayName: r.text(u.displayName, `${at}.displayName`),
    role: r.oneOf(u.role, `${at}.role`, ROLES),
  };
}

function readMaterial(r: FieldReader, raw: unknown, at: string): ScenarioMaterial {
  const m = r.record(raw, at);
  const colours = r.texts(m.colours, `${at}.colours`);
  return {
    key: r.key(m.key, `${at}.key`),
    name: r.text(m.name, `${at}.name`),
    family: r.oneOf(m.family, `${at}.family`, MATERIAL_FAMILIES),
    nominalThicknessMm: r.num(m.nominalThicknessMm, `${at}.nominalThicknessMm`, MATERIAL_LIMITS.thicknessMm),
    measuredThicknessMm: r.num(
      m.measuredThicknessMm,
      `${at}.measuredThicknessMm`,
      MATERIAL_LIMITS.thicknessMm,
    ),
    flexible: r.bool(m.flexible, `${at}.flexible`),
    colours,
    stockSheets: r.list(m.stockSheets, `${at}.stockSheets`, { nonEmpty: true }).map((rawSheet, j) => {
      const sat = `${at}.stockSheets[${j}]`;
      const s = r.record(rawSheet, sat);
      const currency = r.text(s.currency, `${sat}.currency`);
      if (!CURRENCY.test(currency))
        r.fail(`${sat}.currency`, `must be a three-letter code (got "${currency}")`);
      return {
        widthMm: r.num(s.widthMm, `${sat}.widthMm`, MATERIAL_LIMITS.sheetSideMm),
        heightMm: r.num(s.heightMm, `${sat}.heightMm`, MATERIAL_LIMITS.sheetSideMm),
        pricePerSheet: r.num(s.pricePerSheet, `${sat}.pricePerSheet`, MATERIAL_LIMITS.pricePerSheet),
        currency,
      };
    }),
    laserAllowed: r.bool(m.laserAllowed, `${at}.laserAllowed`),
    hazardNote: r.text(m.hazardNote, `${at}.hazardNote`),
    notes: r.text(m.notes, `${at}.notes`),
  };
}

function supervisorOrFabricator(
  r: FieldReader,
  value: unknown,
  field: string,
  users: ReadonlyMap<string, ScenarioUser>,
  roles: readonly Role[],
): string {
  const email = r.text(value, field);
  const role = users.get(email.toLowerCase())?.role;
  if (role === undefined || !roles.includes(role)) {
    r.fail(field, `"${email}" is not a ${roles.join(' or ')} of the scenario`);
  }
  return email;
}

function readProfile(
  r: FieldReader,
  raw: unknown,
  at: string,
  materials: ReadonlyMap<string, ScenarioMaterial>,
  users: ReadonlyMap<string, ScenarioUser>,
): ScenarioMachineProfile {
  const L = MACHINE_PROFILE_LIMITS;
  const p = r.record(raw, at);
  const kind = r.oneOf(p.kind, `${at}.kind`, MACHINE_PROFILE_KINDS);
  const status = r.oneOf(p.status, `${at}.status`, PROFILE_STATUSES);
  const approved = status === 'approved';
  if (!approved && p.approvedBy !== undefined) {
    r.fail(`${at}.approvedBy`, 'a profile awaiting approval has no approver');
  }
  const submittedBy = supervisorOrFabricator(r, p.submittedBy, `${at}.submittedBy`, users, [
    'fabricator',
    'supervisor',
  ]);
  const approvedBy = approved
    ? supervisorOrFabricator(r, p.approvedBy, `${at}.approvedBy`, users, ['supervisor'])
    : undefined;
  const bed = r.record(p.bed, `${at}.bed`);
  const currency = r.text(p.currency, `${at}.currency`);
  if (!CURRENCY.test(currency)) r.fail(`${at}.currency`, `must be a three-letter code (got "${currency}")`);
  const settings = r.list(p.settings, `${at}.settings`, { nonEmpty: true }).map((rawSetting, j) => {
    const sat = `${at}.settings[${j}]`;
    const s = r.record(rawSetting, sat);
    const material = r.text(s.material, `${sat}.material`);
    if (!materials.has(material)) r.fail(`${sat}.material`, `no material "${material}" in the scenario`);
    const setting: ScenarioProfileSetting = {
      material,
      cutSpeedMmS: r.num(s.cutSpeedMmS, `${sat}.cutSpeedMmS`, L.speedMmS),
      markSpeedMmS: r.num(s.markSpeedMmS, `${sat}.markSpeedMmS`, L.speedMmS),
      passes: r.integer(s.passes, `${sat}.passes`, L.passes.min),
      pierceTimeS: r.num(s.pierceTimeS, `${sat}.pierceTimeS`, L.pierceTimeS),
    };
    if (setting.passes > L.passes.max) r.fail(`${sat}.passes`, `must be at most ${L.passes.max}`);
    if (kind === 'cnc-router') {
      setting.toolDiameterMm = r.num(s.toolDiameterMm, `${sat}.toolDiameterMm`, L.toolDiameterMm);
      if (s.spindleRpm !== undefined)
        setting.spindleRpm = r.num(s.spindleRpm, `${sat}.spindleRpm`, L.spindleRpm);
      if (s.kerfMm !== undefined)
        r.fail(`${sat}.kerfMm`, 'a router setting gives toolDiameterMm, not kerfMm');
    } else {
      setting.kerfMm = r.num(s.kerfMm, `${sat}.kerfMm`, kerfRangeMm(kind));
      if (s.toolDiameterMm !== undefined) r.fail(`${sat}.toolDiameterMm`, 'only router settings have a tool');
    }
    if (isLaserKind(kind)) setting.powerPct = r.num(s.powerPct, `${sat}.powerPct`, L.powerPct);
    return setting;
  });
  uniqueKeys(r, settings, `${at}.settings`, (s) => s.material);
  return {
    key: r.key(p.key, `${at}.key`),
    name: r.text(p.name, `${at}.name`),
    kind,
    version: r.integer(p.version, `${at}.version`, 1),
    status,
    submittedBy,
    ...(approvedBy === undefined ? {} : { approvedBy }),
    bed: {
      widthMm: r.num(bed.widthMm, `${at}.bed.widthMm`, L.bedSideMm),
      heightMm: r.num(bed.heightMm, `${at}.bed.heightMm`, L.bedSideMm),
    },
    rapidSpeedMmS: r.num(p.rapidSpeedMmS, `${at}.rapidSpeedMmS`, L.speedMmS),
    hourlyRate: r.num(p.hourlyRate, `${at}.hourlyRate`, L.hourlyRate),
    currency,
    settings,
    notes: r.text(p.notes, `${at}.notes`),
  };
}

/** Structural check of a CLI design spec (the geometry library validates it in full when it builds). */
export function readDesignSpec(value: unknown, file: string): DesignSpec {
  const r = new FieldReader(file);
  const s = r.record(value, 'spec');
  let solid: DesignSpec['solid'];
  if (typeof s.solid === 'string') {
    solid = r.text(s.solid, 'solid');
  } else {
    const u = r.record(s.solid, 'solid');
    solid = {
      format: r.oneOf(u.format, 'solid.format', SOLID_TEXT_FORMATS),
      text: r.text(u.text, 'solid.text'),
      ...(u.name === undefined ? {} : { name: r.text(u.name, 'solid.name') }),
    };
  }
  const piece = r.record(s.piece, 'piece');
  const scale = r.record(s.scale, 'scale');
  const stock = r.record(s.stock, 'stock');
  const machine = r.record(s.machine, 'machine');
  const kind = r.oneOf(machine.kind, 'machine.kind', ['laser', 'router'] as const);
  const machineSpec: MachineSpec =
    kind === 'laser'
      ? { kind, kerfMm: r.num(machine.kerfMm, 'machine.kerfMm', { min: 0 }) }
      : { kind, toolDiameterMm: r.positive(machine.toolDiameterMm, 'machine.toolDiameterMm') };
  const spec: DesignSpec = {
    solid,
    piece: {
      sides: r.integer(piece.sides, 'piece.sides', 3),
      ...(piece.step === undefined ? {} : { step: r.integer(piece.step, 'piece.step', 1) }),
      ...(piece.rotationDeg === undefined
        ? {}
        : { rotationDeg: r.num(piece.rotationDeg, 'piece.rotationDeg') }),
      size: r.positive(piece.size, 'piece.size'),
    },
    scale: { by: r.oneOf(scale.by, 'scale.by', SCALE_BY), mm: r.positive(scale.mm, 'scale.mm') },
    stock: {
      thicknessMm: r.positive(stock.thicknessMm, 'stock.thicknessMm'),
      ...(stock.flexible === undefined ? {} : { flexible: r.bool(stock.flexible, 'stock.flexible') }),
    },
    machine: machineSpec,
  };
  if (s.fitMm !== undefined) spec.fitMm = r.num(s.fitMm, 'fitMm');
  if (s.depthClearanceMm !== undefined) spec.depthClearanceMm = r.num(s.depthClearanceMm, 'depthClearanceMm');
  if (s.minWebMm !== undefined) spec.minWebMm = r.num(s.minWebMm, 'minWebMm', { min: 0 });
  if (s.bed !== undefined) {
    const bed = r.record(s.bed, 'bed');
    spec.bed = {
      widthMm: r.positive(bed.widthMm, 'bed.widthMm'),
      heightMm: r.positive(bed.heightMm, 'bed.heightMm'),
    };
  }
  return spec;
}

/**
 * The spec a design becomes when cut from a material on a machine profile: the design's solid, piece,
 * scale and fit, with the material's measured thickness, the profile's kerf or tool and its bed.
 * Throws when the profile has no setting for the material.
 */
export function specFor(
  spec: DesignSpec,
  material: ScenarioMaterial,
  profile: ScenarioMachineProfile,
): DesignSpec {
  const setting = profile.settings.find((s) => s.material === material.key);
  if (setting === undefined) {
    throw new Error(`machine profile "${profile.key}" has no setting for material "${material.key}"`);
  }
  const machine = toMachineSpec(profile.kind, setting);
  return {
    ...spec,
    stock: { thicknessMm: material.measuredThicknessMm, flexible: material.flexible },
    machine,
    bed: { ...profile.bed },
  };
}

/** The spec a scenario job is built from (see specFor). */
export function jobSpec(scenario: Scenario, job: ScenarioJob): DesignSpec {
  const design = scenario.designs.find((d) => d.key === job.design);
  const material = scenario.materials.find((m) => m.key === job.material);
  const profile = scenario.machineProfiles.find((p) => p.key === job.profile);
  if (!design || !material || !profile)
    throw new Error(`job "${job.key}" refers to a missing design, material or profile`);
  return specFor(design.spec, material, profile);
}

function sameMachine(a: MachineSpec, b: MachineSpec): boolean {
  if (a.kind === 'laser' && b.kind === 'laser') return Math.abs(a.kerfMm - b.kerfMm) < SAME_MM;
  if (a.kind === 'router' && b.kind === 'router')
    return Math.abs(a.toolDiameterMm - b.toolDiameterMm) < SAME_MM;
  return false;
}

interface Lookup {
  users: ReadonlyMap<string, ScenarioUser>;
  materials: ReadonlyMap<string, ScenarioMaterial>;
  profiles: ReadonlyMap<string, ScenarioMachineProfile>;
  designs: ReadonlyMap<string, ScenarioDesign>;
}

function userRef(r: FieldReader, value: unknown, field: string, users: Lookup['users']): ScenarioUser {
  const email = r.text(value, field);
  const user = users.get(email.toLowerCase());
  if (user === undefined) r.fail(field, `no user "${email}" in the scenario`);
  return user;
}

function refOf<T>(
  r: FieldReader,
  value: unknown,
  field: string,
  map: ReadonlyMap<string, T>,
  what: string,
): T {
  const key = r.text(value, field);
  const found = map.get(key);
  if (found === undefined) r.fail(field, `no ${what} "${key}" in the scenario`);
  return found;
}

function laserCheck(
  r: FieldReader,
  field: string,
  material: ScenarioMaterial,
  hazards: readonly MaterialHazard[] | undefined,
): void {
  if (!material.laserAllowed) r.fail(field, `material "${material.key}" is not allowed on a laser`);
  const refusal = hazards === undefined ? null : laserRefusal(material.family, hazards);
  if (refusal !== null) r.fail(field, refusal);
}

function readDesign(r: FieldReader, raw: unknown, at: string, dir: string, look: Lookup): ScenarioDesign {
  const d = r.record(raw, at);
  const owner = userRef(r, d.owner, `${at}.owner`, look.users);
  const material = refOf(r, d.material, `${at}.material`, look.materials, 'material');
  const profile = refOf(r, d.profile, `${at}.profile`, look.profiles, 'machine profile');
  const specFile = r.text(d.spec, `${at}.spec`);
  const specPath = path.join(dir, specFile);
  let specJson: unknown;
  try {
    specJson = JSON.parse(fs.readFileSync(specPath, 'utf8'));
  } catch (err) {
    r.fail(`${at}.spec`, `cannot read ${specFile}: ${err instanceof Error ? err.message : String(err)}`);
  }
  const spec = readDesignSpec(specJson, specPath);
  if (!profile.settings.some((s) => s.material === material.key)) {
    r.fail(`${at}.profile`, `profile "${profile.key}" has no setting for material "${material.key}"`);
  }
  const expected = specFor(spec, material, profile);
  const sr = new FieldReader(specPath);
  if (Math.abs(spec.stock.thicknessMm - expected.stock.thicknessMm) >= SAME_MM) {
    sr.fail(
      'stock.thicknessMm',
      `must be the measured thickness of "${material.key}", ${material.measuredThicknessMm} mm`,
    );
  }
  if ((spec.stock.flexible ?? false) !== material.flexible) {
    sr.fail('stock.flexible', `must be ${material.flexible}, as for material "${material.key}"`);
  }
  if (!sameMachine(spec.machine, expected.machine)) {
    sr.fail(
      'machine',
      `must match profile "${profile.key}" for "${material.key}": ${JSON.stringify(expected.machine)}`,
    );
  }
  if (spec.bed && (spec.bed.widthMm !== profile.bed.widthMm || spec.bed.heightMm !== profile.bed.heightMm)) {
    sr.fail('bed', `must be the bed of profile "${profile.key}"`);
  }
  return {
    key: r.key(d.key, `${at}.key`),
    title: r.text(d.title, `${at}.title`),
    description: r.text(d.description, `${at}.description`),
    owner: owner.email,
    material: material.key,
    profile: profile.key,
    colours: colourList(r, d.colours, `${at}.colours`, material.colours),
    specFile,
    spec,
  };
}

/** The JOB_TRANSITIONS rule that moves a job from one state to the next, if the user may take it. */
function transitionRule(from: JobState, to: JobState) {
  return JOB_TRANSITIONS.find((t) => t.from.includes(from) && t.to === to);
}

function mayTake(user: ScenarioUser, roles: readonly (Role | 'owner')[], ownerEmail: string): boolean {
  if (user.role === 'supervisor') return true;
  return roles.some((a) => (a === 'owner' ? user.email === ownerEmail : a === user.role));
}

function readJob(
  r: FieldReader,
  raw: unknown,
  at: string,
  look: Lookup,
  hazards: readonly MaterialHazard[] | undefined,
): ScenarioJob {
  const j = r.record(raw, at);
  const design = refOf(r, j.design, `${at}.design`, look.designs, 'design');
  const material = refOf(r, j.material, `${at}.material`, look.materials, 'material');
  const profile = refOf(r, j.profile, `${at}.profile`, look.profiles, 'machine profile');
  const owner = userRef(r, j.owner, `${at}.owner`, look.users);
  const state = r.oneOf(j.state, `${at}.state`, JOB_STATES);
  // The API lets a hobbyist open only their own designs: a demo job of theirs on another's design would link
  // to a page they cannot see.
  if (owner.role === 'hobbyist' && design.owner.toLowerCase() !== owner.email.toLowerCase()) {
    r.fail(
      `${at}.design`,
      `a hobbyist's job uses one of their own designs ("${design.key}" is ${design.owner}'s)`,
    );
  }
  if (!profile.settings.some((s) => s.material === material.key)) {
    r.fail(`${at}.profile`, `profile "${profile.key}" has no setting for material "${material.key}"`);
  }
  if (isLaserKind(profile.kind)) laserCheck(r, `${at}.material`, material, hazards);
  if (NEEDS_APPROVED_PROFILE.includes(state) && profile.status !== 'approved') {
    r.fail(
      `${at}.profile`,
      `a ${state} job needs an approved machine profile ("${profile.key}" is ${profile.status})`,
    );
  }
  const history: ScenarioJobEvent[] = [];
  r.list(j.history, `${at}.history`, { nonEmpty: true }).forEach((rawEvent, k) => {
    const eat = `${at}.history[${k}]`;
    const e = r.record(rawEvent, eat);
    const eventState = r.oneOf(e.state, `${eat}.state`, JOB_STATES);
    const by = userRef(r, e.by, `${eat}.by`, look.users);
    const prev = history[k - 1];
    let action: JobAction | null = null;
    if (prev === undefined) {
      if (eventState !== 'draft') r.fail(`${eat}.state`, 'a job starts as a draft');
      if (!mayTake(by, ['owner'], owner.email)) r.fail(`${eat}.by`, 'a draft is started by its requester');
    } else {
      const rule = transitionRule(prev.state, eventState);
      if (rule === undefined) r.fail(`${eat}.state`, `a job cannot go from ${prev.state} to ${eventState}`);
      if (!mayTake(by, rule.roles, owner.email)) {
        r.fail(`${eat}.by`, `a ${by.role} may not ${rule.action} a job`);
      }
      action = rule.action;
    }
    const note = r.optionalText(e.note, `${eat}.note`);
    history.push({ state: eventState, action, by: by.email, ...(note === undefined ? {} : { note }) });
  });
  if (history[history.length - 1]?.state !== state)
    r.fail(`${at}.state`, 'must be the last state of the history');
  const returnReason = r.optionalText(j.returnReason, `${at}.returnReason`);
  if (state === 'returned' && returnReason === undefined)
    r.fail(`${at}.returnReason`, 'a returned job says why');
  if (state !== 'returned' && returnReason !== undefined)
    r.fail(`${at}.returnReason`, 'only returned jobs have one');
  const acknowledgements = (
    j.acknowledgements === undefined ? [] : r.list(j.acknowledgements, `${at}.acknowledgements`)
  ).map((rawAck, k): ScenarioAcknowledgement => {
    const aat = `${at}.acknowledgements[${k}]`;
    const a = r.record(rawAck, aat);
    return {
      by: userRef(r, a.by, `${aat}.by`, look.users).email,
      notices: r.list(a.notices, `${aat}.notices`, { nonEmpty: true }).map((rawRef, m) => {
        const nat = `${aat}.notices[${m}]`;
        const n = r.record(rawRef, nat);
        return { id: r.key(n.notice, `${nat}.notice`), version: r.integer(n.version, `${nat}.version`, 1) };
      }),
    };
  });
  let cutRecord: ScenarioJob['cutRecord'];
  if (state === 'cut' || state === 'closed') {
    if (acknowledgements.length === 0) {
      r.fail(`${at}.acknowledgements`, `a ${state} job records the notices acknowledged before the cut`);
    }
    const c = r.record(j.cutRecord, `${at}.cutRecord`);
    const note = r.optionalText(c.note, `${at}.cutRecord.note`);
    cutRecord = {
      actualMinutes: r.positive(c.actualMinutes, `${at}.cutRecord.actualMinutes`),
      ...(c.sheetsUsed === undefined
        ? {}
        : { sheetsUsed: r.integer(c.sheetsUsed, `${at}.cutRecord.sheetsUsed`, 1) }),
      ...(c.measuredKerfMm === undefined
        ? {}
        : { measuredKerfMm: r.num(c.measuredKerfMm, `${at}.cutRecord.measuredKerfMm`, { min: 0 }) }),
      ...(note === undefined ? {} : { note }),
    };
  } else if (j.cutRecord !== undefined) {
    r.fail(`${at}.cutRecord`, 'only cut or closed jobs have a cut record');
  }
  return {
    key: r.key(j.key, `${at}.key`),
    design: design.key,
    material: material.key,
    profile: profile.key,
    colours: colourList(r, j.colours, `${at}.colours`, material.colours),
    quantity: r.integer(j.quantity, `${at}.quantity`, 1),
    owner: owner.email,
    title: r.text(j.title, `${at}.title`),
    state,
    history,
    ...(returnReason === undefined ? {} : { returnReason }),
    acknowledgements,
    ...(cutRecord === undefined ? {} : { cutRecord }),
  };
}

/** Parses and checks a scenario object; `dir` is where its spec files are read from. */
export function parseScenario(
  value: unknown,
  file: string,
  dir: string,
  options: LoadScenarioOptions = {},
): Scenario {
  const r = new FieldReader(file);
  const top = r.record(value, 'scenario file');
  const workshop = r.record(top.workshop, 'workshop');
  const project = r.record(top.project, 'project');

  const users = r.list(top.users, 'users', { nonEmpty: true }).map((u, i) => readUser(r, u, `users[${i}]`));
  uniqueKeys(r, users, 'users', (u) => u.email);
  const missingRoles = ROLES.filter((role) => !users.some((u) => u.role === role));
  if (missingRoles.length > 0) r.fail('users', `no demo user for ${missingRoles.join(', ')}`);
  const userMap = new Map(users.map((u) => [u.email.toLowerCase(), u]));

  const materials = r
    .list(top.materials, 'materials', { nonEmpty: true })
    .map((m, i) => readMaterial(r, m, `materials[${i}]`));
  uniqueKeys(r, materials, 'materials', (m) => m.key);
  if (options.hazards) {
    const hazards = options.hazards;
    materials.forEach((m, i) => {
      const refusal = laserRefusal(m.family, hazards);
      if (refusal !== null && m.laserAllowed)
        r.fail(`materials[${i}].laserAllowed`, `must be false: ${refusal}`);
    });
  }
  const materialMap = new Map(materials.map((m) => [m.key, m]));

  const profiles = r
    .list(top.machineProfiles, 'machineProfiles', { nonEmpty: true })
    .map((p, i) => readProfile(r, p, `machineProfiles[${i}]`, materialMap, userMap));
  uniqueKeys(r, profiles, 'machineProfiles', (p) => p.key);
  profiles.forEach((p, i) => {
    if (!isLaserKind(p.kind)) return;
    p.settings.forEach((s, j) => {
      const material = materialMap.get(s.material);
      if (material) laserCheck(r, `machineProfiles[${i}].settings[${j}].material`, material, options.hazards);
    });
  });
  const profileMap = new Map(profiles.map((p) => [p.key, p]));

  const partial: Lookup = {
    users: userMap,
    materials: materialMap,
    profiles: profileMap,
    designs: new Map(),
  };
  const designs = r
    .list(top.designs, 'designs', { nonEmpty: true })
    .map((d, i) => readDesign(r, d, `designs[${i}]`, dir, partial));
  uniqueKeys(r, designs, 'designs', (d) => d.key);
  const look: Lookup = { ...partial, designs: new Map(designs.map((d) => [d.key, d])) };

  const jobs = r.list(top.jobs, 'jobs').map((j, i) => readJob(r, j, `jobs[${i}]`, look, options.hazards));
  uniqueKeys(r, jobs, 'jobs', (j) => j.key);

  return {
    scenario: r.text(top.scenario, 'scenario'),
    workshop: {
      name: r.text(workshop.name, 'workshop.name'),
      place: r.text(workshop.place, 'workshop.place'),
      localRules: r.text(workshop.localRules, 'workshop.localRules'),
      notes: r.text(workshop.notes, 'workshop.notes'),
    },
    project: {
      title: r.text(project.title, 'project.title'),
      client: r.text(project.client, 'project.client'),
      description: r.text(project.description, 'project.description'),
    },
    demoPassword: r.text(top.demoPassword, 'demoPassword'),
    users,
    materials,
    machineProfiles: profiles,
    designs,
    jobs,
  };
}

/**
 * Reads `scenario.json` and the spec files it names from a samples folder, and checks every
 * reference. Throws a ContentError naming the file and field of the first problem.
 */
export function loadScenario(dir: string, options: LoadScenarioOptions = {}): Scenario {
  const file = path.join(dir, 'scenario.json');
  let value: unknown;
  try {
    value = JSON.parse(fs.readFileSync(file, 'utf8'));
  } catch (err) {
    throw new ContentError(file, 'scenario file', err instanceof Error ? err.message : String(err));
  }
  return parseScenario(value, file, dir, options);
}
