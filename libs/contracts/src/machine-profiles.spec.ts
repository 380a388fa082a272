import { geometryMachineKind, kerfRangeMm, MACHINE_PROFILE_LIMITS, toMachineSpec } from './machine-profiles';
import { effectiveThicknessMm } from './materials';
import { MACHINE_KINDS } from './spec';
import { MACHINE_PROFILE_KINDS } from './workshop';

describe('machine profile kinds and the geometry engine', () => {
  it('maps every profile kind onto one of the engine kinds: routers cut with a bit, the rest like a beam', () => {
    for (const kind of MACHINE_PROFILE_KINDS) expect(MACHINE_KINDS).toContain(geometryMachineKind(kind));
    expect(geometryMachineKind('cnc-router')).toBe('router');
    expect(geometryMachineKind('co2-laser')).toBe('laser');
    expect(geometryMachineKind('blade-cutter')).toBe('laser');
  });

  it('builds the engine machine spec from a setting', () => {
    // 1/8 inch = 3.175 mm (exact by the definition 1 in = 25.4 mm, NIST SP 811).
    expect(toMachineSpec('cnc-router', { toolDiameterMm: 25.4 / 8 })).toEqual({
      kind: 'router',
      toolDiameterMm: 3.175,
    });
    expect(toMachineSpec('diode-laser', { kerfMm: 0.08 })).toEqual({ kind: 'laser', kerfMm: 0.08 });
    expect(toMachineSpec('blade-cutter', {})).toEqual({ kind: 'laser', kerfMm: 0 });
    expect(() => toMachineSpec('fibre-laser', {})).toThrow(/kerfMm/);
    expect(() => toMachineSpec('cnc-router', { kerfMm: 0.2 })).toThrow(/toolDiameterMm/);
  });

  it('lets only a blade cutter have a zero kerf', () => {
    expect(kerfRangeMm('blade-cutter').min).toBe(0);
    expect(kerfRangeMm('co2-laser')).toEqual(MACHINE_PROFILE_LIMITS.kerfMm);
    expect(MACHINE_PROFILE_LIMITS.kerfMm.min).toBeGreaterThan(0);
  });
});

describe('material thickness', () => {
  it('designs with the measured thickness when there is one', () => {
    expect(effectiveThicknessMm({ nominalThicknessMm: 3, measuredThicknessMm: 2.8 })).toBe(2.8);
    expect(effectiveThicknessMm({ nominalThicknessMm: 3, measuredThicknessMm: null })).toBe(3);
  });
});
