/** Lengths are millimetres everywhere in Kerfwright; screens may show inches (25.4 mm, exact by definition). */
export type LengthUnit = 'mm' | 'in';

export const MM_PER_INCH = 25.4;

export function formatLength(mm: number, unit: LengthUnit): string {
  if (!Number.isFinite(mm)) return '—';
  if (unit === 'in') return `${(mm / MM_PER_INCH).toFixed(3)} in`;
  return `${mm.toFixed(Math.abs(mm) >= 100 ? 1 : 2)} mm`;
}

/**
 * Inch decimals of a kerf, a tool diameter or a fit, shown and typed, at most: five, so that the inches shown,
 * typed back, are the millimetres stored within 0.13 µm (half of 0.00001 in); four would be up to 1.27 µm off, and a
 * 0.08 mm kerf read as 0.0031 in and retyped would be saved as 0.0787 mm.
 */
export const KERF_INCH_DECIMALS = 5;

/**
 * Inches shown, typed back, are the millimetres stored to less than this: half a micrometre, so that a value
 * kept to the micrometre rounds back to itself (exactly half a micrometre off would be a tie).
 */
export const INCH_ROUND_TRIP_MM = 0.0005;

/**
 * Millimetres as a number of inches to type or read: the fewest decimals, up to `maxDecimals`, whose inches are
 * the millimetres to less than half a micrometre (INCH_ROUND_TRIP_MM), so no trailing zeros ("0.125" for 3.175 mm,
 * "0.00315" for 0.08 mm); where even `maxDecimals` are not that close, the inches to `maxDecimals` ("0.0031").
 */
export function inchNumber(mm: number, maxDecimals: number): string {
  const inches = mm / MM_PER_INCH;
  for (let decimals = 0; decimals < maxDecimals; decimals++) {
    const shown = Number(inches.toFixed(decimals));
    // Floating point puts a tie a hair either side of the half micrometre: a tie is not within it.
    if (Math.abs(shown * MM_PER_INCH - mm) < INCH_ROUND_TRIP_MM - 1e-12) return String(shown);
  }
  return String(Number(inches.toFixed(maxDecimals)));
}

/**
 * A kerf, a tool diameter or a measured cut width: millimetres with two decimals, a third where the value was
 * recorded to the thousandth ("0.20 mm", "0.165 mm"); inches as the forms show and take them back, to at most
 * KERF_INCH_DECIMALS and without trailing zeros ("0.125 in", "0.00315 in").
 */
export function formatKerf(mm: number, unit: LengthUnit): string {
  if (!Number.isFinite(mm)) return '—';
  if (unit === 'in') return `${inchNumber(mm, KERF_INCH_DECIMALS)} in`;
  const thousandths = Math.round(mm * 1000);
  return `${(thousandths / 1000).toFixed(thousandths % 10 === 0 ? 2 : 3)} mm`;
}

/**
 * A feed or rapid speed in the reader's unit per second, thousands grouped and no trailing zeros: millimetres
 * to a tenth ("1,200 mm/s", "12.5 mm/s"), inches to a hundredth ("47.24 in/s").
 */
export function formatSpeed(mmPerS: number, unit: LengthUnit): string {
  if (!Number.isFinite(mmPerS)) return '—';
  if (unit === 'in') return `${grouped(mmPerS / MM_PER_INCH, 0, 2)} in/s`;
  return `${grouped(mmPerS, 0, 1)} mm/s`;
}

/** A plain quantity with thousands grouped and its unit, if any ("18,000 rpm", "0.5 s", "80 %"). */
export function formatQuantity(n: number, unit: string): string {
  if (!Number.isFinite(n)) return '—';
  return `${grouped(n, 0, 3)} ${unit}`.trimEnd();
}

/** A share as a percentage to a tenth ("87.5 %"), as utilisation is given on every page. */
export function formatPercent(fraction: number): string {
  if (!Number.isFinite(fraction)) return '—';
  return `${grouped(fraction * 100, 1, 1)} %`;
}

/** A number with thousands grouped the way every page groups them ("1,234.5"). */
function grouped(x: number, minDecimals: number, maxDecimals: number): string {
  return x.toLocaleString('en', { minimumFractionDigits: minDecimals, maximumFractionDigits: maxDecimals });
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
 * A stock thickness as stock is listed: millimetres as given, to a hundredth without trailing zeros ("3 mm",
 * "2.9 mm"); inches to three places, as formatLength gives them ("0.118 in").
 */
export function formatStockThickness(mm: number, unit: LengthUnit): string {
  if (!Number.isFinite(mm)) return '—';
  if (unit === 'in') return formatLength(mm, unit);
  return `${Math.round(mm * 100) / 100} mm`;
}

/**
 * A total length along the cuts, to a tenth with thousands grouped, so that a job's cut length reads at a
 * glance and alike on every page: millimetres (inches) up to 10 m (100 ft), then metres (feet)
 * ("7,029.4 mm", "1,238.8 m"; "636.9 in", "4,064.5 ft"), not "1238848.2 mm" or "636.906 in".
 */
export function formatRunLength(mm: number, unit: LengthUnit): string {
  if (!Number.isFinite(mm)) return '—';
  const tenths = (x: number) => grouped(x, 1, 1);
  if (unit === 'in') {
    const inches = mm / MM_PER_INCH;
    return Math.abs(inches) >= 1200 ? `${tenths(inches / 12)} ft` : `${tenths(inches)} in`;
  }
  return Math.abs(mm) >= 10_000 ? `${tenths(mm / 1000)} m` : `${tenths(mm)} mm`;
}

/** Machine time: minutes with one decimal under an hour, else hours and whole minutes ("28 h 44 min"). */
export function formatMinutes(minutes: number): string {
  if (!Number.isFinite(minutes)) return '—';
  if (minutes < 60) return `${minutes.toFixed(1)} min`;
  const whole = Math.round(minutes);
  return `${grouped(Math.floor(whole / 60), 0, 0)} h ${whole % 60} min`;
}

/** An amount of money with two decimals and thousands grouped, then the currency code ("9,389.52 EUR"). */
export function formatMoney(amount: number, currency: string): string {
  return `${grouped(amount, 2, 2)} ${currency}`;
}

/** A machine's rate per hour: an amount of money per hour of machine time ("24.00 EUR/h"). */
export function formatHourlyRate(amount: number, currency: string): string {
  return `${formatMoney(amount, currency)}/h`;
}
