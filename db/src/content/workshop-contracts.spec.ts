import {
  currentNotices,
  isLaserKind,
  isMachineProfileKind,
  isMaterialFamily,
  laserRefusal,
  MACHINE_PROFILE_KINDS,
  noticeApplies,
  type MaterialHazard,
} from '@kerfwright/contracts';

const row = (family: MaterialHazard['family'], laser: MaterialHazard['laser']): MaterialHazard => ({
  family,
  examples: [family],
  laser,
  hazard: `${family} hazard`,
  ...(laser === 'conditional' ? { condition: 'checked first' } : {}),
  source: 'common practice',
});

describe('workshop contracts', () => {
  it('counts only the beam machines as lasers', () => {
    expect(MACHINE_PROFILE_KINDS.filter((k) => isLaserKind(k))).toEqual([
      'co2-laser',
      'diode-laser',
      'fibre-laser',
    ]);
    expect(isLaserKind('cnc-router')).toBe(false);
    expect(isMachineProfileKind('plasma-cutter')).toBe(false);
    expect(isMaterialFamily('pvc')).toBe(true);
    expect(isMaterialFamily('PVC')).toBe(false);
  });

  it('refuses "no" rows and unlisted families, and lets "yes" and "conditional" rows through', () => {
    const table = [row('pvc', 'no'), row('card', 'yes'), row('felt', 'conditional')];
    expect(laserRefusal('pvc', table)).toContain('pvc hazard');
    expect(laserRefusal('card', table)).toBeNull();
    expect(laserRefusal('felt', table)).toBeNull();
    expect(laserRefusal('acrylic', table)).toMatch(/not in the hazard table/);
  });

  it("matches a notice by machine kind and material family, with '*' for all", () => {
    const laserOnly = {
      appliesTo: { machineKinds: ['co2-laser' as const], materialFamilies: ['*' as const] },
    };
    const cardOnly = { appliesTo: { machineKinds: ['*' as const], materialFamilies: ['card' as const] } };
    expect(noticeApplies(laserOnly, 'co2-laser', 'acrylic')).toBe(true);
    expect(noticeApplies(laserOnly, 'diode-laser', 'acrylic')).toBe(false);
    expect(noticeApplies(cardOnly, 'blade-cutter', 'card')).toBe(true);
    expect(noticeApplies(cardOnly, 'blade-cutter', 'felt')).toBe(false);
  });

  it('keeps the highest version of each notice id', () => {
    const all = [
      { id: 'b', version: 1 },
      { id: 'a', version: 3 },
      { id: 'b', version: 2 },
      { id: 'a', version: 1 },
    ];
    expect(currentNotices(all)).toEqual([
      { id: 'a', version: 3 },
      { id: 'b', version: 2 },
    ]);
  });
});
