/** Lengths are millimetres everywhere in Kerfwright; screens may show inches (25.4 mm, exact by definition). */
export type LengthUnit = 'mm' | 'in';

export const MM_PER_INCH = 25.4;

export function formatLength(mm: number, unit: LengthUnit): string {
  if (!Number.isFinite(mm)) return '—';
  if (unit === 'in') return `${(mm / MM_PER_INCH).toFixed(3)} in`;
  return `${mm.toFixed(Math.abs(mm) >= 100 ? 1 : 2)} mm`;
}

/**
 * A sheet's size, the unit said once: "600 × 400 mm", "23.622 × 15.748 in" (millimetres to a tenth without a
 * trailing zero, as stock is listed; inches to three places, as formatLength gives them).
 */
export function formatSheetSize(sheet: { widthMm: number; heightMm: number }, unit: LengthUnit): string {
  const { widthMm, heightMm } = sheet;
  if (!Number.isFinite(widthMm) || !Number.isFinite(heightMm)) return '—';
  if (unit === 'in')
    return `${(widthMm / MM_PER_INCH).toFixed(3)} × ${(heightMm / MM_PER_INCH).toFixed(3)} in`;
  const mm = (x: number) => String(Math.round(x * 10) / 10);
  return `${mm(widthMm)} × ${mm(heightMm)} mm`;
}

/**
 * A total length along the cuts, to a tenth with thousands grouped, so that a job's cut length reads at a
 * glance and alike on every page: millimetres (inches) up to 10 m (100 ft), then metres (feet)
 * ("7,029.4 mm", "1,238.8 m"; "636.9 in", "4,064.5 ft"), not "1238848.2 mm" or "636.906 in".
 */
export function formatRunLength(mm: number, unit: LengthUnit): string {
  if (!Number.isFinite(mm)) return '—';
  const grouped = (x: number) =>
    x.toLocaleString('en', { minimumFractionDigits: 1, maximumFractionDigits: 1 });
  if (unit === 'in') {
    const inches = mm / MM_PER_INCH;
    return Math.abs(inches) >= 1200 ? `${grouped(inches / 12)} ft` : `${grouped(inches)} in`;
  }
  return Math.abs(mm) >= 10_000 ? `${grouped(mm / 1000)} m` : `${grouped(mm)} mm`;
}

/** Machine time: minutes with one decimal under an hour, else hours and whole minutes ("28 h 44 min"). */
export function formatMinutes(minutes: number): string {
  if (!Number.isFinite(minutes)) return '—';
  if (minutes < 60) return `${minutes.toFixed(1)} min`;
  const whole = Math.round(minutes);
  return `${Math.floor(whole / 60).toLocaleString('en')} h ${whole % 60} min`;
}

/** An amount of money with two decimals and thousands grouped, then the currency code ("9,389.52 EUR"). */
export function formatMoney(amount: number, currency: string): string {
  const n = amount.toLocaleString('en', { minimumFractionDigits: 2, maximumFractionDigits: 2 });
  return `${n} ${currency}`;
}

/** A machine's rate per hour: an amount of money per hour of machine time ("24.00 EUR/h"). */
export function formatHourlyRate(amount: number, currency: string): string {
  return `${formatMoney(amount, currency)}/h`;
}
