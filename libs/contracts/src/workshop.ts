/**
 * Workshop vocabulary shared by the API, the web client and the content loaders: machine kinds,
 * material families, safety notices and the material hazard table. No I/O here.
 */

/**
 * Kinds of cutting machine a machine profile can describe. (Named apart from the spec's
 * `MACHINE_KINDS`, which only says whether geometry is compensated for a beam or a bit.)
 */
export const MACHINE_PROFILE_KINDS = [
  'co2-laser',
  'diode-laser',
  'fibre-laser',
  'cnc-router',
  'blade-cutter',
] as const;
export type MachineProfileKind = (typeof MACHINE_PROFILE_KINDS)[number];

export const LASER_MACHINE_KINDS = ['co2-laser', 'diode-laser', 'fibre-laser'] as const;
export type LaserMachineKind = (typeof LASER_MACHINE_KINDS)[number];

export function isMachineProfileKind(value: unknown): value is MachineProfileKind {
  return typeof value === 'string' && (MACHINE_PROFILE_KINDS as readonly string[]).includes(value);
}

/** True for the machine kinds that cut with a beam (and so are bound by the laser material rules). */
export function isLaserKind(kind: string): kind is LaserMachineKind {
  return (LASER_MACHINE_KINDS as readonly string[]).includes(kind);
}

/**
 * Families a material can belong to. The first group is stock a workshop commonly cuts; the second
 * group exists so that hazardous sheet kept on file (or brought in by a member) can be named and refused.
 */
export const MATERIAL_FAMILIES = [
  'card',
  'paper',
  'acrylic',
  'plywood',
  'mdf',
  'felt',
  'other',
  'pvc',
  'polycarbonate',
  'abs',
  'hdpe',
  'foam',
  'ptfe',
  'acetal',
  'fibreglass',
  'carbon-fibre',
  'glue-backed',
  'unidentified',
] as const;
export type MaterialFamily = (typeof MATERIAL_FAMILIES)[number];

export function isMaterialFamily(value: unknown): value is MaterialFamily {
  return typeof value === 'string' && (MATERIAL_FAMILIES as readonly string[]).includes(value);
}

/** Whether a material family may go on a laser: always, never, or only under a stated condition. */
export const LASER_ALLOWANCES = ['yes', 'no', 'conditional'] as const;
export type LaserAllowance = (typeof LASER_ALLOWANCES)[number];

/** How serious a notice is, most serious first. */
export const NOTICE_SEVERITIES = ['danger', 'warning', 'caution'] as const;
export type NoticeSeverity = (typeof NOTICE_SEVERITIES)[number];

/** `'*'` in an applies-to list means "every machine kind" or "every material family". */
export const APPLIES_TO_ALL = '*';

export interface NoticeAppliesTo {
  machineKinds: ReadonlyArray<MachineProfileKind | typeof APPLIES_TO_ALL>;
  materialFamilies: ReadonlyArray<MaterialFamily | typeof APPLIES_TO_ALL>;
}

/** One version of a safety notice. A newer version of the same id supersedes the older ones. */
export interface SafetyNotice {
  /** Stable kebab-case id, shared by all versions of the notice. */
  id: string;
  /** Positive integer; the highest version of an id is the current one. */
  version: number;
  title: string;
  appliesTo: NoticeAppliesTo;
  severity: NoticeSeverity;
  /** Markdown. */
  body: string;
  /** The outside sources the notice's facts come from, named in words. */
  sources: string[];
}

/** One row of the material hazard table. */
export interface MaterialHazard {
  family: MaterialFamily;
  /** Everyday names of materials in this family. */
  examples: string[];
  /**
   * Words that, found whole in a material's name (any case; a space and a hyphen alike), say the material is of
   * this family: a sheet named "PVC foam" filed as acrylic is caught by them (see familyNamedIn).
   */
  nameWords?: string[];
  laser: LaserAllowance;
  /** What goes wrong, in a sentence or two. */
  hazard: string;
  /** For `laser: 'conditional'`: what must be true before the material may be cut. */
  condition?: string;
  /** Where the fact comes from, marked "from memory" or "common practice" where it is not checked. */
  source: string;
}

/** The hazard-table row for a family, if the table has one. */
export function findMaterialHazard(
  family: string,
  table: readonly MaterialHazard[],
): MaterialHazard | undefined {
  return table.find((row) => row.family === family);
}

/**
 * Why a material family may not be cut on a laser, or null when it may (possibly under the row's
 * condition). A family missing from the table is refused as if it were unidentified.
 */
export function laserRefusal(family: string, table: readonly MaterialHazard[]): string | null {
  const row = findMaterialHazard(family, table);
  if (row === undefined) {
    return `Material family "${family}" is not in the hazard table; an unlisted material is treated as unidentified and is not cut on a laser.`;
  }
  if (row.laser === 'no') {
    // Named by its examples, as people know it ("PVC, vinyl…"), not by the table's family code.
    return `${row.examples.join(', ')} must not be cut on a laser: ${row.hazard}`;
  }
  return null;
}

/**
 * The first row of a family refused on the laser, other than `ownFamily`, whose name words `name` contains
 * whole (case-insensitive, a space and a hyphen alike, compatibility forms folded by NFKC), with the word found;
 * undefined when there is none.
 */
export function familyNamedIn(
  name: string,
  ownFamily: string,
  table: readonly MaterialHazard[],
): { row: MaterialHazard; word: string } | undefined {
  // Compatibility forms folded (NFKC): full-width "ＰＶＣ" reads as "PVC".
  const text = name.normalize('NFKC');
  for (const row of table) {
    if (row.laser !== 'no' || row.family === ownFamily) continue;
    for (const word of row.nameWords ?? []) {
      if (!word.trim()) continue;
      const parts = word
        .trim()
        .split(/[\s-]+/u)
        .map((p) => p.replace(/[.*+?^${}()|[\]\\]/gu, '\\$&'));
      const whole = new RegExp(`(?<![\\p{L}\\p{N}])${parts.join('[\\s-]+')}(?![\\p{L}\\p{N}])`, 'iu');
      if (whole.test(text)) return { row, word };
    }
  }
  return undefined;
}

/**
 * The condition a laser may cut a material family on, when the table allows it only on one (felt, a material
 * not listed): `{ laserCondition }`, else `{}` (allowed outright, or refused: see laserRefusal).
 */
export function laserConditionOf(
  family: string,
  table: readonly MaterialHazard[],
): { laserCondition?: string } {
  const row = findMaterialHazard(family, table);
  return row?.laser === 'conditional' && row.condition ? { laserCondition: row.condition } : {};
}

/** True when a notice concerns the given machine kind and material family. */
export function noticeApplies(
  notice: Pick<SafetyNotice, 'appliesTo'>,
  machineKind: MachineProfileKind,
  materialFamily: MaterialFamily,
): boolean {
  const { machineKinds, materialFamilies } = notice.appliesTo;
  const machineMatches = machineKinds.includes(APPLIES_TO_ALL) || machineKinds.includes(machineKind);
  const materialMatches =
    materialFamilies.includes(APPLIES_TO_ALL) || materialFamilies.includes(materialFamily);
  return machineMatches && materialMatches;
}

/** The current version of every notice: for each id, the one with the highest version. */
export function currentNotices<T extends Pick<SafetyNotice, 'id' | 'version'>>(notices: readonly T[]): T[] {
  const byId = new Map<string, T>();
  for (const notice of notices) {
    const held = byId.get(notice.id);
    if (held === undefined || notice.version > held.version) byId.set(notice.id, notice);
  }
  return [...byId.values()].sort((a, b) => a.id.localeCompare(b.id));
}

/** A reference to one notice version, as an operator's acknowledgement records it. */
export interface NoticeVersionRef {
  id: string;
  version: number;
}

/** The workshop's own rules, shown with every notice; each edit is a new version. */
export interface LocalRulesView {
  version: number;
  body: string;
  authorName: string | null;
  updatedAt: string;
}

/** What an operator must acknowledge before a job's files can be downloaded. */
export interface JobSafetyView {
  jobId: string;
  machineKind: MachineProfileKind | null;
  materialFamily: MaterialFamily | null;
  notices: SafetyNotice[];
  localRules: LocalRulesView | null;
  /**
   * The job's preparation in effect (its latest `prepare`), as an opaque id: the notices are for the material
   * and machine it chose, and an acknowledgement names it. Null before the job is first prepared.
   */
  preparationId: string | null;
  /** Whether the caller has acknowledged exactly these notice versions and local rules for this preparation. */
  acknowledged: boolean;
  acknowledgedAt: string | null;
}

export interface AcknowledgeSafetyRequest {
  notices: NoticeVersionRef[];
  localRulesVersion: number | null;
  /**
   * The `preparationId` of the view that was read: a job prepared again since gets 409
   * SAFETY.PREPARATION_CHANGED (its material, machine or kerf may differ), never an acknowledgement it did not see.
   */
  preparationId: string;
}
