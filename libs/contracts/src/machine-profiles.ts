/**
 * Machine profiles, their numbered versions and measured kerf records: request and response shapes of
 * /api/machine-profiles, limits, and the mapping from a profile to the geometry engine's machine spec.
 * Lengths in mm, speeds in mm/s, times in seconds.
 */
import type { MachineSpec } from './spec';
import { isLaserKind, type MachineProfileKind } from './workshop';

/**
 * Life of a profile version: a fabricator drafts and submits it, a supervisor approves it or returns it
 * to draft with a reason; approving a newer version retires the one approved before. Only an approved
 * version may be used for a job, and a version is never changed once submitted (jobs keep its id).
 */
export const PROFILE_VERSION_STATES = ['draft', 'submitted', 'approved', 'retired'] as const;
export type ProfileVersionState = (typeof PROFILE_VERSION_STATES)[number];

/** Sane ranges for the numbers of a machine profile (inclusive). */
export const MACHINE_PROFILE_LIMITS = {
  bedSideMm: { min: 1, max: 5000 },
  /** Beam kerf of a laser. A blade cutter's kerf may be 0 (see kerfRangeMm). */
  kerfMm: { min: 0.01, max: 2 },
  toolDiameterMm: { min: 0.1, max: 25 },
  speedMmS: { min: 0.1, max: 5000 },
  powerPct: { min: 1, max: 100 },
  passes: { min: 1, max: 50 },
  pierceTimeS: { min: 0, max: 60 },
  spindleRpm: { min: 1000, max: 60000 },
  hourlyRate: { min: 0, max: 10000 },
  nameLength: 120,
  notesLength: 4000,
  reasonLength: 2000,
  maxSettings: 100,
} as const;

/** Settings of one profile version for one material. Beam and blade machines give a kerf, routers a tool. */
export interface ProfileSetting {
  materialId: string;
  /** Lasers and blade cutters: width of material removed by the cut. */
  kerfMm?: number;
  /** CNC routers: diameter of the cutting tool. */
  toolDiameterMm?: number;
  cutSpeedMmS: number;
  markSpeedMmS: number;
  /** Lasers: power in percent of the tube or diode's rating. */
  powerPct?: number;
  passes: number;
  /** Time to pierce before each contour, s. */
  pierceTimeS: number;
  /** CNC routers: spindle speed. */
  spindleRpm?: number;
}

export interface ProfileSettingView extends ProfileSetting {
  /** Name of the material, for display (empty when the material was removed). */
  materialName: string;
  /**
   * The hazard table's condition on the material's family when a laser may cut it only on a condition (felt,
   * an unlisted material): a supervisor approving a laser profile version confirms it was checked.
   */
  laserCondition?: string;
}

export interface MachineProfileVersionView {
  id: string;
  profileId: string;
  /** 1, 2, 3 … per profile. */
  number: number;
  state: ProfileVersionState;
  bedWidthMm: number;
  bedHeightMm: number;
  rapidSpeedMmS: number;
  hourlyRate: number;
  /** ISO 4217 code of the hourly rate. */
  currency: string;
  settings: ProfileSettingView[];
  notes: string;
  /** The supervisor's reason when the version was sent back to draft. */
  returnReason: string | null;
  /** The version this one was started from (null for version 1). */
  basedOnNumber: number | null;
  createdBy: string | null;
  submittedBy: string | null;
  submittedAt: string | null;
  approvedBy: string | null;
  approvedAt: string | null;
  retiredAt: string | null;
  /** Why a supervisor took the version out of use; null when a newer approved version replaced it. */
  retireReason: string | null;
  /** Optimistic-locking counter: send it back with PATCH and the state changes. */
  lockVersion: number;
  createdAt: string;
  updatedAt: string;
}

/** One row of GET /api/machine-profiles. */
export interface MachineProfileSummaryView {
  id: string;
  name: string;
  kind: MachineProfileKind;
  /** The version jobs may use now, if any. */
  currentApproved: MachineProfileVersionView | null;
  /** The highest-numbered version (may be the approved one). */
  latest: MachineProfileVersionView;
  createdAt: string;
}

/** GET /api/machine-profiles/:id: the profile with every version, newest first. */
export interface MachineProfileDetailView extends MachineProfileSummaryView {
  versions: MachineProfileVersionView[];
}

/** The editable content of a version. */
export interface ProfileVersionContent {
  bedWidthMm: number;
  bedHeightMm: number;
  rapidSpeedMmS: number;
  hourlyRate: number;
  currency?: string;
  settings: ProfileSetting[];
  notes?: string;
}

/** Body of POST /api/machine-profiles: the profile and its version 1 (a draft). */
export interface CreateMachineProfileRequest extends ProfileVersionContent {
  name: string;
  kind: MachineProfileKind;
}

/** Body of POST /api/machine-profiles/:id/versions: changes applied to a copy of the latest version. */
export type CreateProfileVersionRequest = Partial<ProfileVersionContent>;

/** Body of PATCH /api/machine-profiles/:id/versions/:versionId (drafts only). */
export interface UpdateProfileVersionRequest extends Partial<ProfileVersionContent> {
  lockVersion: number;
}

/** Body of retire: optionally the lockVersion the client read (stale → 409). */
export interface ProfileTransitionRequest {
  lockVersion?: number;
}

/**
 * Body of POST …/versions/:versionId/retire: optionally the lockVersion the client read, and why the version is
 * taken out of use (kept on the version; when it is the approved one, mailed to fabricators and operators).
 */
export interface RetireProfileVersionRequest extends ProfileTransitionRequest {
  reason?: string;
}

/**
 * Body of submit / approve: the lockVersion of the content the caller read, required so nobody decides on
 * content they never saw (400 without it, 409 when stale).
 */
export interface ProfileDecisionRequest {
  lockVersion: number;
}

/** Body of POST …/versions/:versionId/approve. */
export interface ApproveProfileVersionRequest extends ProfileDecisionRequest {
  /**
   * A laser version holding settings for materials with a laser condition (ProfileSettingView.laserCondition)
   * is approved only with this set: the supervisor has checked every condition (409 otherwise).
   */
  conditionsChecked?: boolean;
}

/** Body of POST …/versions/:versionId/return. */
export interface ReturnProfileVersionRequest extends ProfileDecisionRequest {
  reason: string;
}

/** Query of GET /api/machine-profiles. */
export interface ListMachineProfilesQuery {
  page?: number;
  pageSize?: number;
  kind?: MachineProfileKind;
  /** Profiles whose latest version is in this state. */
  state?: ProfileVersionState;
  q?: string;
  /** A field of PROFILE_SORT_FIELDS; prefix with '-' for descending order. Default "name". */
  sort?: ProfileSortField | `-${ProfileSortField}`;
}

/** Fields GET /api/machine-profiles can sort by; prefix with '-' for descending order. */
export const PROFILE_SORT_FIELDS = ['name', 'kind', 'createdAt'] as const;
export type ProfileSortField = (typeof PROFILE_SORT_FIELDS)[number];

/** A kerf measured on a test cut (or a job) for a machine and a material. */
export interface KerfRecordView {
  id: string;
  profileId: string;
  materialId: string;
  materialName: string;
  kerfMm: number;
  jobId: string | null;
  notes: string;
  recordedBy: string | null;
  /** The draft version the value was adopted into, if it was. */
  adoptedVersionId: string | null;
  createdAt: string;
}

/** Body of POST /api/machine-profiles/:id/kerf-records. */
export interface CreateKerfRecordRequest {
  materialId: string;
  /** For a router, the measured width of the cut (adopting it sets the tool diameter). */
  kerfMm: number;
  jobId?: string;
  notes?: string;
}

/**
 * The geometry engine's machine kind for a profile kind: lasers cut with a beam and routers with a bit.
 * A blade cutter (drag or oscillating knife) removes almost no material, so it is treated like a beam
 * with its own, usually zero, kerf.
 */
export function geometryMachineKind(kind: MachineProfileKind): 'laser' | 'router' {
  return kind === 'cnc-router' ? 'router' : 'laser';
}

/** The range a kerf value may take on a machine kind: a blade may remove nothing at all. */
export function kerfRangeMm(kind: MachineProfileKind): { min: number; max: number } {
  return kind === 'blade-cutter'
    ? { min: 0, max: MACHINE_PROFILE_LIMITS.kerfMm.max }
    : MACHINE_PROFILE_LIMITS.kerfMm;
}

/**
 * The range a kerf measured on a cut may take (a kerf record, a recorded cut): on a router it is the width of
 * the cut, a bit's diameter or a little more; on beam and blade machines the kerf. Takes a profile's kind or
 * the geometry's ('router' | 'laser', as a job's preparation keeps it).
 */
export function measuredKerfRangeMm(kind: MachineProfileKind | 'laser' | 'router'): {
  min: number;
  max: number;
} {
  return kind === 'cnc-router' || kind === 'router'
    ? MACHINE_PROFILE_LIMITS.toolDiameterMm
    : MACHINE_PROFILE_LIMITS.kerfMm;
}

/** The machine part of a design spec for one setting of a profile of the given kind. */
export function toMachineSpec(
  kind: MachineProfileKind,
  setting: Pick<ProfileSetting, 'kerfMm' | 'toolDiameterMm'>,
): MachineSpec {
  if (geometryMachineKind(kind) === 'router') {
    if (setting.toolDiameterMm === undefined) throw new Error('a router setting needs toolDiameterMm');
    return { kind: 'router', toolDiameterMm: setting.toolDiameterMm };
  }
  if (setting.kerfMm === undefined) {
    if (isLaserKind(kind)) throw new Error('a laser setting needs kerfMm');
    return { kind: 'laser', kerfMm: 0 };
  }
  return { kind: 'laser', kerfMm: setting.kerfMm };
}

/**
 * The speeds and rate a time-and-cost estimate needs (the geometry library's EstimateMachine): the version's
 * rapid speed and hourly rate, with the setting's cut and mark speeds, pierce time and passes.
 */
export function toEstimateMachine(
  version: { rapidSpeedMmS: number; hourlyRate: number },
  setting: Pick<ProfileSetting, 'cutSpeedMmS' | 'markSpeedMmS' | 'pierceTimeS' | 'passes'>,
): {
  cutSpeedMmS: number;
  markSpeedMmS: number;
  pierceTimeS: number;
  rapidSpeedMmS: number;
  passes: number;
  hourlyRate: number;
} {
  return {
    cutSpeedMmS: setting.cutSpeedMmS,
    markSpeedMmS: setting.markSpeedMmS,
    pierceTimeS: setting.pierceTimeS,
    rapidSpeedMmS: version.rapidSpeedMmS,
    passes: setting.passes,
    hourlyRate: version.hourlyRate,
  };
}
