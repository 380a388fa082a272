import { type MachineProfileVersionView } from '@kerfwright/contracts';
import { describe, expect, it } from 'vitest';
import { versionFixture } from '../../../testing/fixtures';
import { versionChanges, versionRows } from './version-rows';

/** Version `number` of one laser profile: the shared fixture, its acrylic cut with a 0.18 mm kerf. */
function version(
  number: number,
  overrides: Partial<MachineProfileVersionView> = {},
): MachineProfileVersionView {
  const acrylic = versionFixture().settings[0]!;
  return versionFixture({
    id: `v${number}`,
    profileId: 'p',
    number,
    settings: [{ ...acrylic, kerfMm: 0.18 }],
    ...overrides,
  });
}

describe('comparing profile versions', () => {
  it('lists only the changed values, old → new, with added materials as new', () => {
    const approved = version(1);
    const waiting = version(2, {
      state: 'submitted',
      rapidSpeedMmS: 450,
      settings: [
        { ...approved.settings[0]!, kerfMm: 0.16 },
        {
          materialId: 'm-felt',
          materialName: 'Wool felt 2 mm',
          kerfMm: 0.25,
          cutSpeedMmS: 30,
          markSpeedMmS: 300,
          powerPct: 35,
          passes: 1,
          pierceTimeS: 0,
        },
      ],
    });
    const changes = versionChanges(approved, waiting, 'mm');
    expect(changes.find((c) => c.key === 'machine.rapid')).toMatchObject({
      before: '400 mm/s',
      after: '450 mm/s',
    });
    expect(changes.find((c) => c.key === 'm-acrylic.kerfMm')).toMatchObject({
      section: 'Cast acrylic 3 mm',
      before: '0.18 mm',
      after: '0.16 mm',
    });
    expect(changes.find((c) => c.key === 'm-felt.powerPct')).toMatchObject({ before: null, after: '35 %' });
    // Unchanged values (bed, acrylic speeds) are left out.
    expect(changes.some((c) => c.key === 'machine.bed' || c.key === 'm-acrylic.cutSpeedMmS')).toBe(false);
    expect(changes).toHaveLength(1 + 1 + 6);
  });

  it('writes kerfs and tool diameters to two decimals at least, so a column lines up', () => {
    const rows = versionRows(
      [
        version(1, { settings: [{ ...version(1).settings[0]!, kerfMm: 0.2 }] }),
        version(2, { settings: [{ ...version(1).settings[0]!, kerfMm: 0.165 }] }),
        version(3),
      ],
      'mm',
    );
    expect(rows.find((r) => r.key === 'm-acrylic.kerfMm')?.values).toEqual([
      '0.20 mm',
      '0.165 mm',
      '0.18 mm',
    ]);
  });

  it('marks rows whose value differs between versions, and leaves out fields no version uses', () => {
    const rows = versionRows([version(1), version(2, { hourlyRate: 26 })], 'mm');
    expect(rows.find((r) => r.key === 'machine.rate')).toMatchObject({
      values: ['24.00 EUR/h', '26.00 EUR/h'],
      changed: true,
    });
    expect(rows.find((r) => r.key === 'm-acrylic.kerfMm')?.changed).toBe(false);
    expect(rows.some((r) => r.key === 'm-acrylic.toolDiameterMm')).toBe(false);
  });

  it('lists every value as new when nothing is approved yet', () => {
    const changes = versionChanges(null, version(1, { state: 'submitted' }), 'mm');
    expect(changes.every((c) => c.before === null)).toBe(true);
    expect(changes.map((c) => c.key)).toContain('m-acrylic.kerfMm');
    // An empty note is not a change worth listing.
    expect(changes.map((c) => c.key)).not.toContain('machine.notes');
  });
});

// 1 in = 25.4 mm exactly (international yard and pound agreement, 1959).
describe('comparing profile versions in inches', () => {
  it('gives the bed, speeds and kerfs in inches, and the rest as they are', () => {
    const rows = versionRows(
      [version(1, { bedWidthMm: 609.6, bedHeightMm: 406.4, rapidSpeedMmS: 254 })],
      'in',
    );
    const value = (key: string) => rows.find((r) => r.key === key)?.values[0];
    expect(value('machine.bed')).toBe('24.000 × 16.000 in');
    expect(value('machine.rapid')).toBe('10 in/s');
    // 0.18 mm = 0.0070866 in; 0.0071 in is 0.18034 mm, less than half a micrometre off.
    expect(value('m-acrylic.kerfMm')).toBe('0.0071 in');
    expect(value('machine.rate')).toBe('24.00 EUR/h');
  });

  it('tells a change by the stored value, even where the inches shown read alike', () => {
    // 0.1800 and 0.1801 mm both read 0.0071 in (0.18034 mm, less than half a micrometre from either).
    const rows = versionRows(
      [version(1), version(2, { settings: [{ ...version(1).settings[0]!, kerfMm: 0.1801 }] })],
      'in',
    );
    const kerf = rows.find((r) => r.key === 'm-acrylic.kerfMm');
    expect(kerf?.values).toEqual(['0.0071 in', '0.0071 in']);
    expect(kerf?.changed).toBe(true);
  });

  it('groups the thousands of a spindle speed as every page does', () => {
    const router = version(1, {
      settings: [{ ...version(1).settings[0]!, kerfMm: undefined, toolDiameterMm: 6, spindleRpm: 18000 }],
    });
    const rows = versionRows([router], 'mm');
    expect(rows.find((r) => r.key === 'm-acrylic.spindleRpm')?.values).toEqual(['18,000 rpm']);
    expect(rows.find((r) => r.key === 'm-acrylic.toolDiameterMm')?.values).toEqual(['6.00 mm']);
  });
});
