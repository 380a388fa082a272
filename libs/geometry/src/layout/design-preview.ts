import type { DesignPreview, DesignReport } from '@kerfwright/contracts';

const round = (x: number): number => Math.round(x * 100) / 100;

/** The figures a design keeps for lists and cards: validity, counts and size, from a build report. */
export function designPreview(report: DesignReport): DesignPreview {
  return {
    valid: report.errors.length === 0,
    pieceCount: report.pieces.length,
    crossingCount: report.crossings.length,
    diameterMm: round(report.diameterMm),
    planeDistanceMm: round(report.planeDistanceMm),
    errors: report.errors,
    warnings: report.warnings,
  };
}
