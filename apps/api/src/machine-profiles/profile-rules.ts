import {
  type FieldError,
  isLaserKind,
  kerfRangeMm,
  MACHINE_PROFILE_LIMITS as L,
  type MachineProfileKind,
  type ProfileSetting,
} from '@kerfwright/contracts';

/**
 * Which setting fields a machine kind needs and which it must not carry. Lasers: kerf and power;
 * blade cutters: a kerf (0 allowed: a knife removes almost nothing); routers: a tool diameter.
 * Ranges common to all kinds are checked by the DTO; this adds the kind-specific ones.
 */
export function settingErrors(kind: MachineProfileKind, settings: readonly ProfileSetting[]): FieldError[] {
  const errors: FieldError[] = [];
  const seen = new Set<string>();
  const add = (field: string, message: string): void => {
    errors.push({ field, messages: [message] });
  };
  settings.forEach((s, i) => {
    const at = `settings[${i}]`;
    if (seen.has(s.materialId))
      add(`${at}.materialId`, 'a material may appear only once in a profile version');
    seen.add(s.materialId);
    if (kind === 'cnc-router') {
      if (s.toolDiameterMm === undefined)
        add(`${at}.toolDiameterMm`, 'a CNC router setting needs toolDiameterMm');
      if (s.kerfMm !== undefined)
        add(`${at}.kerfMm`, 'a CNC router setting gives toolDiameterMm, not kerfMm');
      if (s.powerPct !== undefined) add(`${at}.powerPct`, 'powerPct applies to lasers only');
      return;
    }
    const range = kerfRangeMm(kind);
    if (s.kerfMm === undefined) add(`${at}.kerfMm`, `a ${kind} setting needs kerfMm`);
    else if (s.kerfMm < range.min || s.kerfMm > range.max) {
      add(`${at}.kerfMm`, `kerfMm must be between ${range.min} and ${range.max} mm on a ${kind}`);
    }
    if (s.toolDiameterMm !== undefined)
      add(`${at}.toolDiameterMm`, 'toolDiameterMm applies to CNC routers only');
    if (s.spindleRpm !== undefined) add(`${at}.spindleRpm`, 'spindleRpm applies to CNC routers only');
    if (isLaserKind(kind) && s.powerPct === undefined)
      add(`${at}.powerPct`, 'a laser setting needs powerPct');
  });
  return errors;
}

/** The range a measured kerf record may take on a machine kind (a router's is the width of its cut). */
export function measuredKerfRangeMm(kind: MachineProfileKind): { min: number; max: number } {
  return kind === 'cnc-router' ? L.toolDiameterMm : L.kerfMm;
}
