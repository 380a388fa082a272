import {
  isLaserKind,
  kerfRangeMm,
  MACHINE_PROFILE_KINDS,
  MACHINE_PROFILE_LIMITS as L,
  type MachineProfileKind,
  type MachineProfileVersionView,
  type MaterialView,
  type ProfileSetting,
  type ProfileVersionContent,
} from '@kerfwright/contracts';
import { z } from 'zod';
import { EMPTY_NUMBER, isBlankNumber, optionalNumberField } from '../../../lib/form-numbers';

const ranged = (label: string, range: { min: number; max: number }, unit: string) =>
  z
    .number({ error: `Enter the ${label}` })
    .min(range.min, `At least ${range.min}${unit}`)
    .max(range.max, `At most ${range.max}${unit}`);

/** May be left empty; the kind decides whether the field is needed (checked in superRefine). */
const optionalNumber = optionalNumberField();

const settingSchema = z.object({
  materialId: z.string().min(1, 'Choose a material'),
  kerfMm: optionalNumber,
  toolDiameterMm: optionalNumber,
  cutSpeedMmS: ranged('cut speed', L.speedMmS, ' mm/s'),
  markSpeedMmS: ranged('mark speed', L.speedMmS, ' mm/s'),
  powerPct: optionalNumber,
  passes: ranged('passes', L.passes, '').int('A whole number of passes'),
  pierceTimeS: ranged('pierce time', L.pierceTimeS, ' s'),
  spindleRpm: optionalNumber,
});

export type SettingFormValues = z.infer<typeof settingSchema>;

/**
 * The profile version form's rules, mirroring the API: the ranges of MACHINE_PROFILE_LIMITS, and per machine
 * kind what a setting must hold — lasers a kerf and a power, blade cutters a kerf (0 allowed), routers a
 * tool diameter — each material once, and on a laser only materials that may be cut on one.
 */
export function profileFormSchema(materials: readonly MaterialView[] | undefined) {
  return z
    .object({
      name: z
        .string()
        .trim()
        .min(1, 'Give the profile a name')
        .max(L.nameLength, `At most ${L.nameLength} characters`),
      kind: z.enum(MACHINE_PROFILE_KINDS, { error: 'Choose the kind of machine' }),
      bedWidthMm: ranged('bed width', L.bedSideMm, ' mm'),
      bedHeightMm: ranged('bed height', L.bedSideMm, ' mm'),
      rapidSpeedMmS: ranged('rapid speed', L.speedMmS, ' mm/s'),
      hourlyRate: ranged('hourly rate', L.hourlyRate, ''),
      currency: z
        .string()
        .trim()
        // A code typed in lower case ("usd") is the same code; the API takes it in capitals (ISO 4217).
        .toUpperCase()
        .regex(/^[A-Z]{3}$/, 'A three-letter currency code such as EUR'),
      settings: z.array(settingSchema).max(L.maxSettings, `At most ${L.maxSettings} materials`),
      notes: z.string().max(L.notesLength, `At most ${L.notesLength} characters`),
    })
    .superRefine(
      (v, ctx) => {
        const seen = new Set<string>();
        v.settings.forEach((s, i) => {
          const at = (field: keyof SettingFormValues, message: string) =>
            ctx.addIssue({ code: 'custom', path: ['settings', i, field], message });
          if (s.materialId && seen.has(s.materialId)) at('materialId', 'This material already has settings');
          seen.add(s.materialId);
          const material = materials?.find((m) => m.id === s.materialId);
          if (material && isLaserKind(v.kind) && !material.laserAllowed) {
            at('materialId', `${material.name} is kept off the laser`);
          }
          if (v.kind === 'cnc-router') {
            if (isBlankNumber(s.toolDiameterMm)) at('toolDiameterMm', 'Enter the tool diameter');
            else if (s.toolDiameterMm < L.toolDiameterMm.min || s.toolDiameterMm > L.toolDiameterMm.max) {
              at('toolDiameterMm', `Between ${L.toolDiameterMm.min} and ${L.toolDiameterMm.max} mm`);
            }
            if (
              !isBlankNumber(s.spindleRpm) &&
              (!Number.isInteger(s.spindleRpm) ||
                s.spindleRpm < L.spindleRpm.min ||
                s.spindleRpm > L.spindleRpm.max)
            ) {
              at('spindleRpm', `A whole number between ${L.spindleRpm.min} and ${L.spindleRpm.max}`);
            }
            return;
          }
          const range = kerfRangeMm(v.kind);
          if (isBlankNumber(s.kerfMm)) at('kerfMm', 'Enter the kerf');
          else if (s.kerfMm < range.min || s.kerfMm > range.max) {
            at('kerfMm', `Between ${range.min} and ${range.max} mm`);
          }
          if (isBlankNumber(s.powerPct)) {
            if (isLaserKind(v.kind)) at('powerPct', 'Enter the power');
          } else if (s.powerPct < L.powerPct.min || s.powerPct > L.powerPct.max) {
            at('powerPct', `Between ${L.powerPct.min} and ${L.powerPct.max} %`);
          }
        });
        // Run even when other fields are wrong, so every missing value is named at the first try.
      },
      { when: () => true },
    );
}

export type ProfileFormValues = z.infer<ReturnType<typeof profileFormSchema>>;

export const EMPTY_SETTING: SettingFormValues = {
  materialId: '',
  kerfMm: EMPTY_NUMBER,
  toolDiameterMm: EMPTY_NUMBER,
  cutSpeedMmS: EMPTY_NUMBER,
  markSpeedMmS: EMPTY_NUMBER,
  powerPct: EMPTY_NUMBER,
  passes: 1,
  pierceTimeS: 0,
  spindleRpm: EMPTY_NUMBER,
};

/** Form values from a version (to start a new version from it, or to change a draft). */
export function versionToFormValues(
  profile: { name: string; kind: MachineProfileKind },
  v: MachineProfileVersionView,
): ProfileFormValues {
  return {
    name: profile.name,
    kind: profile.kind,
    bedWidthMm: v.bedWidthMm,
    bedHeightMm: v.bedHeightMm,
    rapidSpeedMmS: v.rapidSpeedMmS,
    hourlyRate: v.hourlyRate,
    currency: v.currency,
    notes: v.notes,
    settings: v.settings.map((s) => ({
      materialId: s.materialId,
      kerfMm: s.kerfMm,
      toolDiameterMm: s.toolDiameterMm,
      cutSpeedMmS: s.cutSpeedMmS,
      markSpeedMmS: s.markSpeedMmS,
      powerPct: s.powerPct,
      passes: s.passes,
      pierceTimeS: s.pierceTimeS,
      spindleRpm: s.spindleRpm,
    })),
  };
}

export const EMPTY_PROFILE: ProfileFormValues = {
  name: '',
  kind: 'co2-laser',
  bedWidthMm: EMPTY_NUMBER,
  bedHeightMm: EMPTY_NUMBER,
  rapidSpeedMmS: EMPTY_NUMBER,
  hourlyRate: EMPTY_NUMBER,
  currency: 'EUR',
  notes: '',
  settings: [{ ...EMPTY_SETTING }],
};

/** The content the API takes: only the fields the machine kind uses, empty optional fields left out. */
export function toVersionContent(v: ProfileFormValues): ProfileVersionContent {
  const router = v.kind === 'cnc-router';
  return {
    bedWidthMm: v.bedWidthMm,
    bedHeightMm: v.bedHeightMm,
    rapidSpeedMmS: v.rapidSpeedMmS,
    hourlyRate: v.hourlyRate,
    currency: v.currency.trim(),
    notes: v.notes.trim(),
    settings: v.settings.map((s) => {
      const out: ProfileSetting = {
        materialId: s.materialId,
        cutSpeedMmS: s.cutSpeedMmS,
        markSpeedMmS: s.markSpeedMmS,
        passes: s.passes,
        pierceTimeS: s.pierceTimeS,
      };
      if (router) {
        out.toolDiameterMm = s.toolDiameterMm;
        if (!isBlankNumber(s.spindleRpm)) out.spindleRpm = s.spindleRpm;
      } else {
        out.kerfMm = s.kerfMm;
        if (!isBlankNumber(s.powerPct)) out.powerPct = s.powerPct;
      }
      return out;
    }),
  };
}
