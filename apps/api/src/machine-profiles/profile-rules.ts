import { plainToInstance } from 'class-transformer';
import { validateSync } from 'class-validator';
import {
  type FieldError,
  isLaserKind,
  kerfRangeMm,
  measuredKerfRangeMm,
  type MachineProfileKind,
  type ProfileSetting,
  type ProfileVersionContent,
} from '@kerfwright/contracts';
import { toFieldErrors } from '../common/pipes/validation.pipe';
import { ProfileVersionContentDto } from './dto/profile-version-content.dto';

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

/** A measured kerf outside its machine kind's range, as the field error the kerf-records and cut routes give. */
export function measuredKerfError(
  kind: MachineProfileKind,
  kerfMm: number,
  field: string,
): FieldError | null {
  const range = measuredKerfRangeMm(kind);
  if (kerfMm >= range.min && kerfMm <= range.max) return null;
  return { field, messages: [`${field} must be between ${range.min} and ${range.max} mm on a ${kind}`] };
}

/**
 * A version's content checked against the limits of the edit route's DTO, with the answers that route gives:
 * content that did not come through it (an adopted kerf record, a stored version) is held to the same limits.
 */
export function contentLimitErrors(content: ProfileVersionContent): FieldError[] {
  const dto = plainToInstance(ProfileVersionContentDto, content);
  return toFieldErrors(validateSync(dto, { whitelist: true, forbidNonWhitelisted: true }));
}
