import {
  type DesignSpecInput,
  geometryMachineKind,
  isLaserKind,
  type MachineProfileSummaryView,
  type MaterialView,
} from '@kerfwright/contracts';

export interface PrepareExplanation {
  severity: 'error' | 'warning';
  /** One or two sentences: why, then what would work. */
  lines: string[];
}

const names = (items: readonly { name: string }[]) => items.map((i) => i.name).join(', ');

/** Why a material is kept off lasers, from the material's own record (filled from the hazard table). */
export function laserHazard(material: MaterialView): string {
  const note = material.hazardNote.trim();
  return note || 'The material hazard table keeps it off every laser.';
}

/**
 * The approved profiles that can prepare a job in the material: their approved version holds settings for it,
 * and none is a laser when the material is kept off lasers. Without a material, every approved profile.
 */
export function profilesFor(
  profiles: readonly MachineProfileSummaryView[],
  material: MaterialView | undefined,
): MachineProfileSummaryView[] {
  return profiles.filter((p) => {
    if (!p.currentApproved) return false;
    if (!material) return true;
    if (!material.laserAllowed && isLaserKind(p.kind)) return false;
    return p.currentApproved.settings.some((s) => s.materialId === material.id);
  });
}

/**
 * What the prepare dialog says when the chosen material and machine do not go together, or when no machine can
 * cut the material: the reason (a material kept off lasers names its hazard) and the profiles or materials that
 * would work. Null when there is nothing to explain.
 *
 * `intended` is the profile the fabricator chose, kept when the material change took it off the list.
 */
export function explainMaterialAndMachine({
  material,
  intended,
  profiles,
  materials,
}: {
  material: MaterialView | undefined;
  intended: MachineProfileSummaryView | undefined;
  profiles: readonly MachineProfileSummaryView[];
  materials: readonly MaterialView[];
}): PrepareExplanation | null {
  if (!material) return null;
  const able = profilesFor(profiles, material);
  const fits = intended !== undefined && able.includes(intended);
  const instead = (): string[] => {
    const lines: string[] = [];
    lines.push(
      able.length
        ? `Profiles that can cut ${material.name}: ${names(able)}.`
        : `No approved machine profile can cut ${material.name}; choose another material.`,
    );
    if (intended?.currentApproved) {
      const own = materials.filter((m) =>
        intended.currentApproved?.settings.some((s) => s.materialId === m.id),
      );
      if (own.length) lines.push(`Materials ${intended.name} can cut: ${names(own)}.`);
    }
    return lines;
  };

  if (intended && !fits) {
    if (!material.laserAllowed && isLaserKind(intended.kind)) {
      return {
        severity: 'error',
        lines: [
          `${material.name} is never cut on a laser, and ${intended.name} is a laser (${intended.kind}): ${laserHazard(material)}`,
          ...instead(),
        ],
      };
    }
    return {
      severity: 'warning',
      lines: [
        `${intended.name} has no settings for ${material.name} in its approved version v${intended.currentApproved?.number ?? '?'}, so it cannot prepare this job.`,
        ...instead(),
      ],
    };
  }
  if (!material.laserAllowed) {
    return {
      severity: able.length ? 'warning' : 'error',
      lines: [
        `${material.name} is never cut on a laser: ${laserHazard(material)}`,
        able.length
          ? `Only profiles that are not lasers and hold settings for it are offered: ${names(able)}.`
          : `No approved machine profile that may cut it has settings for it; choose another material.`,
      ],
    };
  }
  if (!able.length) {
    return {
      severity: 'warning',
      lines: [
        `No approved machine profile has settings for ${material.name} yet. Choose another material, or ask for a profile version with settings for it.`,
      ],
    };
  }
  return null;
}

/** Lengths the same within 0.003 mm (the studio's test for stock: see stock-sheet-picker's sameLength). */
const sameLength = (a: number, b: number) => Math.abs(a - b) < 0.003;

/** What the design's stock tells a first preparation (see {@link stockOfDesign}). */
export type StockOfDesign =
  | { kind: 'chosen'; material: MaterialView; sheetIndex: number; profile: MachineProfileSummaryView | null }
  /**
   * Several materials keep the stock, and the job's colours do not tell them apart: the fabricator chooses.
   * `stockColours`: each of them also stocks every colour the job asks for (and the job asks for some).
   */
  | { kind: 'several'; materials: MaterialView[]; stockColours: boolean }
  /** No material on the list keeps the stock (thickness, sheet, a laser's allowed materials). */
  | { kind: 'none' };

/**
 * What a job's first preparation starts from, read off its design: the material that keeps the design's sheet
 * (either way round) at the thickness its slots were drawn for, usable on the design's kind of machine (among
 * several, the one that stocks every colour the job asks for); that sheet's place in its stock list; and the
 * approved profile of the design's kind that holds settings for it, when there is exactly one. When no single
 * material fits, which ones do (or that none does): the fabricator chooses.
 */
export function stockOfDesign(
  spec: Pick<DesignSpecInput, 'stock' | 'machine'>,
  materials: readonly MaterialView[],
  profiles: readonly MachineProfileSummaryView[],
  jobColours: readonly string[],
): StockOfDesign {
  const sheet = spec.stock.sheet;
  const sheetIndexOf = (m: MaterialView) =>
    sheet
      ? m.stockSheets.findIndex(
          (s) =>
            (sameLength(s.widthMm, sheet.widthMm) && sameLength(s.heightMm, sheet.heightMm)) ||
            (sameLength(s.widthMm, sheet.heightMm) && sameLength(s.heightMm, sheet.widthMm)),
        )
      : 0;
  const fits = materials.filter(
    (m) =>
      (spec.machine.kind !== 'laser' || m.laserAllowed) &&
      [m.nominalThicknessMm, m.measuredThicknessMm].some(
        (t) => t != null && sameLength(t, spec.stock.thicknessMm),
      ) &&
      m.stockSheets.length > 0 &&
      sheetIndexOf(m) >= 0,
  );
  const stocksAll = (m: MaterialView) =>
    jobColours.every((c) => m.colours.some((k) => k.trim().toLowerCase() === c.trim().toLowerCase()));
  const stocking = fits.filter(stocksAll);
  const material = fits.length === 1 ? fits[0] : stocking.length === 1 ? stocking[0] : undefined;
  if (!material) {
    if (fits.length === 0) return { kind: 'none' };
    // Those that stock the colours asked, when some do; else every one that keeps the stock.
    return stocking.length > 1
      ? { kind: 'several', materials: stocking, stockColours: jobColours.length > 0 }
      : { kind: 'several', materials: fits, stockColours: false };
  }
  const ofKind = profilesFor(profiles, material).filter(
    (p) => geometryMachineKind(p.kind) === spec.machine.kind,
  );
  return {
    kind: 'chosen',
    material,
    sheetIndex: sheetIndexOf(material),
    profile: ofKind.length === 1 ? ofKind[0]! : null,
  };
}
