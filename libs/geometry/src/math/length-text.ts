/**
 * A length (or any setting) in a message, as a person would write it: at most four decimals, no trailing zeros.
 * A sheet given in inches (24 in = 609.5999999999999 mm in binary floating point) reads 609.6 mm; a bit of
 * 1/8 in reads 3.175 mm, not 3.18 — what the operator types into the machine.
 */
export function lengthText(x: number): string {
  return String(Math.round(x * 10000) / 10000);
}

/** The units a document prints lengths in: millimetres, or inches with the millimetres beside them. */
export type LengthUnits = 'mm' | 'in';

/** Millimetres in an inch, exactly (the international inch of 1959; NIST: 1 in = 25.4 mm). */
export const MM_PER_INCH = 25.4;

/**
 * A length given in mm, written in inches (number only). Precision (common practice in inch shops: lengths to
 * the thou, small settings to the ten-thousandth): 3 decimals (0.001 in = 0.0254 mm, the step inch machine
 * software and calipers show) from 0.1 in to under 10 in, such as thickness, bit, gap and margin; 4 decimals
 * below 0.1 in (a laser kerf of 0.08 mm is 0.0031 in, where a thou would be a third of it off; a 1/8 in bit's
 * radius reads 0.0625 in); 2 decimals from 10 in (sheet and bed sizes); 1 decimal from 100 in (total cut,
 * mark and travel lengths). Trailing zeros are kept (0.120 in), so a column of settings reads to the same
 * place. The bounds apply to the rounded value (9.9996 in reads 10.00 in, not 10.000 in).
 */
export function inchText(mm: number): string {
  const inches = mm / MM_PER_INCH;
  const size = Math.abs(inches);
  const decimals = size >= 99.995 ? 1 : size >= 9.9995 ? 2 : size >= 0.09995 ? 3 : 4;
  return inches.toFixed(decimals);
}

/**
 * A length given in mm, with its unit, for a document in `units`: "3 mm" in mm; "0.118 in (3 mm)" in inches,
 * the mm beside it written as the mm document writes it (`mmText`, default {@link lengthText}).
 */
export function unitLengthText(
  mm: number,
  units: LengthUnits,
  mmText: (mm: number) => string = lengthText,
): string {
  return units === 'in' ? `${inchText(mm)} in (${mmText(mm)} mm)` : `${mmText(mm)} mm`;
}

/**
 * A width × height given in mm, for a document in `units`: "600 x 400 mm"; in inches
 * "23.62 x 15.75 in (600 x 400 mm)". Rounded as {@link unitLengthText}.
 */
export function unitSizeText(
  widthMm: number,
  heightMm: number,
  units: LengthUnits,
  mmText: (mm: number) => string = lengthText,
): string {
  const mm = `${mmText(widthMm)} x ${mmText(heightMm)} mm`;
  return units === 'in' ? `${inchText(widthMm)} x ${inchText(heightMm)} in (${mm})` : mm;
}
