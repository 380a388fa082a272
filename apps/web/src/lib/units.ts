/** Lengths are millimetres everywhere in Kerfwright; screens may show inches (25.4 mm, exact by definition). */
export type LengthUnit = 'mm' | 'in';

export const MM_PER_INCH = 25.4;

export function formatLength(mm: number, unit: LengthUnit): string {
  if (!Number.isFinite(mm)) return '—';
  if (unit === 'in') return `${(mm / MM_PER_INCH).toFixed(3)} in`;
  return `${mm.toFixed(Math.abs(mm) >= 100 ? 1 : 2)} mm`;
}
