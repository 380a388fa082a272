import { type MachineProfileVersionView, type ProfileSettingView } from '@kerfwright/contracts';
import {
  formatHourlyRate,
  formatKerf,
  formatQuantity,
  formatSheetSize,
  formatSpeed,
  type LengthUnit,
} from '../../../lib/units';

/** One line of a side-by-side comparison: a machine value or one material's value, per version. */
export interface VersionRow {
  key: string;
  /** "Machine" or the material's name. */
  section: string;
  label: string;
  /** One entry per version, in the order given; null where the version does not hold the value. */
  values: (string | null)[];
  /** The same values as stored (millimetres), by which a change is told: shown ones may round alike. */
  stored: unknown[];
  /** True when the versions do not all hold the same value. */
  changed: boolean;
}

/** One change of a version against another: old → new (null = not there). */
export interface VersionChange {
  key: string;
  section: string;
  label: string;
  before: string | null;
  after: string | null;
}

type Format = (n: number, unit: LengthUnit) => string;

const kerf: Format = formatKerf;
const speed: Format = formatSpeed;
const plain =
  (quantity: string): Format =>
  (n) =>
    formatQuantity(n, quantity);

/** The setting fields as shown: lengths and speeds in the reader's unit, the rest as they are. */
const SETTING_FIELDS: { field: keyof ProfileSettingView; label: string; format: Format }[] = [
  { field: 'kerfMm', label: 'Kerf', format: kerf },
  { field: 'toolDiameterMm', label: 'Tool diameter', format: kerf },
  { field: 'cutSpeedMmS', label: 'Cut speed', format: speed },
  { field: 'markSpeedMmS', label: 'Mark speed', format: speed },
  { field: 'powerPct', label: 'Power', format: plain('%') },
  { field: 'passes', label: 'Passes', format: plain('') },
  { field: 'pierceTimeS', label: 'Pierce time', format: plain('s') },
  { field: 'spindleRpm', label: 'Spindle speed', format: plain('rpm') },
];

function machineValues(
  v: MachineProfileVersionView,
  unit: LengthUnit,
): { key: string; label: string; value: string; raw: unknown }[] {
  return [
    {
      key: 'bed',
      label: 'Bed',
      value: formatSheetSize({ widthMm: v.bedWidthMm, heightMm: v.bedHeightMm }, unit),
      raw: `${v.bedWidthMm}×${v.bedHeightMm}`,
    },
    { key: 'rapid', label: 'Rapid speed', value: formatSpeed(v.rapidSpeedMmS, unit), raw: v.rapidSpeedMmS },
    {
      key: 'rate',
      label: 'Hourly rate',
      value: formatHourlyRate(v.hourlyRate, v.currency),
      raw: `${v.hourlyRate} ${v.currency}`,
    },
    { key: 'notes', label: 'Notes', value: v.notes, raw: v.notes },
  ];
}

/**
 * The rows of a side-by-side comparison of versions (columns = versions): the machine values, then each
 * material any version holds settings for, with only the setting fields some version uses.
 */
export function versionRows(versions: readonly MachineProfileVersionView[], unit: LengthUnit): VersionRow[] {
  const rows: VersionRow[] = [];
  // Changed is told from the values as stored, not as shown: two kerfs a thousandth of a millimetre apart
  // may read alike in inches, and are still a change.
  const push = (key: string, section: string, label: string, values: (string | null)[], raw: unknown[]) =>
    rows.push({ key, section, label, values, stored: raw, changed: new Set(raw).size > 1 });

  const machine = versions.map((v) => machineValues(v, unit));
  for (const [i, item] of (machine[0] ?? []).entries()) {
    push(
      `machine.${item.key}`,
      'Machine',
      item.label,
      machine.map((m) => m[i]?.value ?? null),
      machine.map((m) => m[i]?.raw ?? null),
    );
  }

  const materials = new Map<string, string>();
  for (const v of versions) {
    for (const s of v.settings) if (!materials.has(s.materialId)) materials.set(s.materialId, s.materialName);
  }
  for (const [materialId, name] of materials) {
    const settings = versions.map((v) => v.settings.find((s) => s.materialId === materialId));
    for (const { field, label, format } of SETTING_FIELDS) {
      const raw = settings.map((s) => {
        const value = s?.[field];
        return typeof value === 'number' ? value : null;
      });
      if (raw.every((x) => x === null)) continue;
      const values = raw.map((n) => (n === null ? null : format(n, unit)));
      push(`${materialId}.${field}`, name || 'Removed material', label, values, raw);
    }
  }
  return rows;
}

/** What changes from `before` (the approved version, or none) to `after`: only the values that differ. */
export function versionChanges(
  before: MachineProfileVersionView | null,
  after: MachineProfileVersionView,
  unit: LengthUnit,
): VersionChange[] {
  if (before === null) {
    return versionRows([after], unit)
      .filter((r) => r.values[0])
      .map((r) => ({
        key: r.key,
        section: r.section,
        label: r.label,
        before: null,
        after: r.values[0] ?? null,
      }));
  }
  return versionRows([before, after], unit)
    .filter((r) => r.changed)
    .map((r) => ({
      key: r.key,
      section: r.section,
      label: r.label,
      before: r.values[0] ?? null,
      after: r.values[1] ?? null,
    }));
}
