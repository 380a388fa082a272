/**
 * A length (or any setting) in a message, as a person would write it: at most four decimals, no trailing zeros.
 * A sheet given in inches (24 in = 609.5999999999999 mm in binary floating point) reads 609.6 mm; a bit of
 * 1/8 in reads 3.175 mm, not 3.18 — what the operator types into the machine.
 */
export function lengthText(x: number): string {
  return String(Math.round(x * 10000) / 10000);
}
