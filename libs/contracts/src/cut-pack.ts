/**
 * The cut pack: the files of a job. Built by the geometry library's pack entry
 * (`@kerfwright/geometry/pack`, Node only) and stored by the API's export queue. Lengths in mm.
 */
import type { DesignSpec } from './spec';
import type { ColourRuleName, JobState } from './jobs';

export const CUT_PACK_FILE_ROLES = [
  'sheet-dxf',
  'sheet-svg',
  'setup-sheet',
  'assembly-guide',
  'coupon-dxf',
  'coupon-svg',
  'manifest',
  'archive',
] as const;
export type CutPackFileRole = (typeof CUT_PACK_FILE_ROLES)[number];

/** The files of a cut pack its requester (a hobbyist) may download: the assembly guide only. */
export const CUT_PACK_ROLES_FOR_REQUESTER: readonly CutPackFileRole[] = ['assembly-guide'];

/** Job states whose cut-pack files may be downloaded: released to the machines, or cut and closed since. */
export const CUT_PACK_DOWNLOADABLE_STATES: readonly JobState[] = ['released', 'cut', 'closed'];

/** Files that print the safety notices (the setup sheet, and the ZIP holding it): out of date once those change. */
export const CUT_PACK_ROLES_PRINTING_SAFETY: readonly CutPackFileRole[] = ['setup-sheet', 'archive'];

export interface CutPackFile {
  /** File name inside the pack: lower-case letters, digits, dots and dashes only (e.g. `sheet-01-saffron.dxf`). */
  name: string;
  role: CutPackFileRole;
  contentType: string;
  data: Uint8Array;
}

/** Machine settings the estimates and the setup sheet use (from the approved profile version). */
export interface CutPackMachine {
  profileName: string;
  profileVersion: number;
  kind: string;
  bedWidthMm: number;
  bedHeightMm: number;
  cutSpeedMmS: number;
  markSpeedMmS: number;
  pierceTimeS: number;
  rapidSpeedMmS: number;
  passes: number;
  /** Beam power, % (lasers). */
  powerPct?: number;
  /** Spindle speed, revolutions per minute (routers). */
  spindleRpm?: number;
  hourlyRate: number;
  currency: string;
}

export interface CutPackInput {
  /** The spec with the real stock and machine (as a prepared job keeps it). */
  spec: DesignSpec;
  sheet: { widthMm: number; heightMm: number };
  marginMm: number;
  gapMm: number;
  /** Colour names in order; their count is the number of colours. */
  colours: string[];
  colourRule?: ColourRuleName;
  quantity: number;
  machine: CutPackMachine;
  material: {
    name: string;
    family: string;
    thicknessMm: number;
    /** Price of one sheet in `currency`; null when the sheet has no price (the material cost is then unknown). */
    pricePerSheet: number | null;
    currency: string;
  };
  job: { id: string; title: string; requester: string };
  /** Notices that apply, for the setup sheet. */
  notices: { id: string; version: number; title: string; severity: string }[];
  localRulesVersion: number | null;
  units: 'mm' | 'in';
  /** Also write one ZIP of every file. */
  archive: boolean;
  /** Time stamp printed in the files (the library itself reads no clock). */
  createdAt: string;
}

export interface CutPackEstimate {
  cutLengthMm: number;
  markLengthMm: number;
  pierces: number;
  travelMm: number;
  minutes: number;
  machineCost: number;
  /** Null when the sheet has no price. */
  materialCost: number | null;
  currency: string;
}

export interface CutPackManifestEntry {
  name: string;
  role: CutPackFileRole;
  contentType: string;
  bytes: number;
  sha256: string;
}

export interface CutPackManifest {
  jobId: string;
  createdAt: string;
  units: 'mm' | 'in';
  sheetCount: number;
  estimate: CutPackEstimate;
  files: CutPackManifestEntry[];
  /** Labels that found no room, a scale mark placed off the sheet, and similar notes. */
  warnings?: string[];
  /**
   * The safety notices (id and version) and the workshop rules version the setup sheet prints (cut packs
   * only): when they change, the printed sheet is out of date and the pack is built again.
   */
  safety?: { notices: { id: string; version: number }[]; localRulesVersion: number | null };
}

export interface CutPackResult {
  files: CutPackFile[];
  manifest: CutPackManifest;
}

/** Export records of the cut-pack queue. */
export const EXPORT_STATES = ['queued', 'running', 'done', 'failed'] as const;
export type ExportState = (typeof EXPORT_STATES)[number];

export interface ExportView {
  id: string;
  jobId: string;
  state: ExportState;
  /** 0–100. */
  progress: number;
  attempts: number;
  errorCode: string | null;
  errorMessage: string | null;
  files: { name: string; role: CutPackFileRole; contentType: string; bytes: number; sha256: string }[];
  createdAt: string;
  finishedAt: string | null;
  /**
   * The pack was built for a preparation the job has replaced since (returned and prepared again: another
   * material, kerf or layout may apply): its files are not served (EXPORT.PREPARATION_REPLACED). The job's list
   * of exports holds only the packs of its preparation in effect, so this is true only of a pack read by its id.
   */
  replaced: boolean;
  /**
   * Staff only, done exports: the safety notices or workshop rules changed since the pack was built, so its
   * setup sheet (and ZIP) are out of date and are not served (EXPORT.SAFETY_CHANGED); build it again.
   */
  safetyChanged?: boolean;
}
