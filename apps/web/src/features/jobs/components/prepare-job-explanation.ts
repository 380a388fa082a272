import { isLaserKind, type MachineProfileSummaryView, type MaterialView } from '@kerfwright/contracts';

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
