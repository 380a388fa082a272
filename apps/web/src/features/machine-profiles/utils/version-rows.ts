import { type MachineProfileVersionView, type ProfileSettingView } from '@kerfwright/contracts';
import { formatHourlyRate } from '../../../lib/units';

/** One line of a side-by-side comparison: a machine value or one material's value, per version. */
export interface VersionRow {
  key: string;
  /** "Machine" or the material's name. */
  section: string;
  label: string;
  /** One entry per version, in the order given; null where the version does not hold the value. */
  values: (string | null)[];
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

const SETTING_FIELDS: { field: keyof ProfileSettingView; label: string; unit: string }[] = [
  { field: 'kerfMm', label: 'Kerf', unit: 'mm' },
  { field: 'toolDiameterMm', label: 'Tool diameter', unit: 'mm' },
  { field: 'cutSpeedMmS', label: 'Cut speed', unit: 'mm/s' },
  { field: 'markSpeedMmS', label: 'Mark speed', unit: 'mm/s' },
  { field: 'powerPct', label: 'Power', unit: '%' },
  { field: 'passes', label: 'Passes', unit: '' },
  { field: 'pierceTimeS', label: 'Pierce time', unit: 's' },
  { field: 'spindleRpm', label: 'Spindle speed', unit: 'rpm' },
];

/**
 * A value with its unit. Kerfs and tool diameters (mm) keep at least two decimals, so a column reads
 * 0.20, 0.18, 0.25 mm, not 0.2 beside 0.18; a value recorded to the thousandth keeps its third.
 */
const withUnit = (n: number, unit: string) => {
  if (unit === 'mm') {
    const decimals = Math.min(3, Math.max(2, (String(n).split('.')[1] ?? '').length));
    return `${n.toFixed(decimals)} mm`;
  }
  return unit ? `${n} ${unit}` : String(n);
};

function machineValues(v: MachineProfileVersionView): { key: string; label: string; value: string }[] {
  return [
    { key: 'bed', label: 'Bed', value: `${v.bedWidthMm} × ${v.bedHeightMm} mm` },
    { key: 'rapid', label: 'Rapid speed', value: withUnit(v.rapidSpeedMmS, 'mm/s') },
    { key: 'rate', label: 'Hourly rate', value: formatHourlyRate(v.hourlyRate, v.currency) },
    { key: 'notes', label: 'Notes', value: v.notes },
  ];
}

/**
 * The rows of a side-by-side comparison of versions (columns = versions): the machine values, then each
 * material any version holds settings for, with only the setting fields some version uses.
 */
export function versionRows(versions: readonly MachineProfileVersionView[]): VersionRow[] {
  const rows: VersionRow[] = [];
  const push = (key: string, section: string, label: string, values: (string | null)[]) =>
    rows.push({ key, section, label, values, changed: new Set(values).size > 1 });

  const machine = versions.map(machineValues);
  for (const [i, item] of (machine[0] ?? []).entries()) {
    push(
      `machine.${item.key}`,
      'Machine',
      item.label,
      machine.map((m) => m[i]?.value ?? null),
    );
  }

  const materials = new Map<string, string>();
  for (const v of versions) {
    for (const s of v.settings) if (!materials.has(s.materialId)) materials.set(s.materialId, s.materialName);
  }
  for (const [materialId, name] of materials) {
    const settings = versions.map((v) => v.settings.find((s) => s.materialId === materialId));
    for (const { field, label, unit } of SETTING_FIELDS) {
      const values = settings.map((s) => {
        const value = s?.[field];
        return typeof value === 'number' ? withUnit(value, unit) : null;
      });
      if (values.every((x) => x === null)) continue;
      push(`${materialId}.${field}`, name || 'Removed material', label, values);
    }
  }
  return rows;
}

/** What changes from `before` (the approved version, or none) to `after`: only the values that differ. */
export function versionChanges(
  before: MachineProfileVersionView | null,
  after: MachineProfileVersionView,
): VersionChange[] {
  if (before === null) {
    return versionRows([after])
      .filter((r) => r.values[0])
      .map((r) => ({
        key: r.key,
        section: r.section,
        label: r.label,
        before: null,
        after: r.values[0] ?? null,
      }));
  }
  return versionRows([before, after])
    .filter((r) => r.changed)
    .map((r) => ({
      key: r.key,
      section: r.section,
      label: r.label,
      before: r.values[0] ?? null,
      after: r.values[1] ?? null,
    }));
}
