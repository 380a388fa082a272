import { describe, expect, it } from 'vitest';
import {
  formatHourlyRate,
  formatKerf,
  formatMinutes,
  formatMoney,
  formatPercent,
  formatQuantity,
  formatRunLength,
  formatSheetSize,
  formatSpeed,
  formatStockThickness,
} from './units';

describe('figures a workshop reads at a glance', () => {
  it('gives a sheet size with its unit once, as stock is listed (1 in = 25.4 mm exactly)', () => {
    expect(formatSheetSize({ widthMm: 600, heightMm: 400 }, 'mm')).toBe('600 × 400 mm');
    expect(formatSheetSize({ widthMm: 1220, heightMm: 2440.25 }, 'mm')).toBe('1220 × 2440.3 mm');
    // A 24 × 16 in sheet is 609.6 × 406.4 mm.
    expect(formatSheetSize({ widthMm: 609.6, heightMm: 406.4 }, 'in')).toBe('24.000 × 16.000 in');
    expect(formatSheetSize({ widthMm: 609.6, heightMm: 406.4 }, 'mm')).toBe('609.6 × 406.4 mm');
  });

  it('gives long cut lengths in metres or feet, short ones as before (1 in = 25.4 mm exactly, 1 ft = 12 in)', () => {
    expect(formatRunLength(4321, 'mm')).toBe('4,321.0 mm');
    expect(formatRunLength(7029.43, 'mm')).toBe('7,029.4 mm');
    expect(formatRunLength(1_238_848.2, 'mm')).toBe('1,238.8 m');
    expect(formatRunLength(10_000, 'mm')).toBe('10.0 m');
    expect(formatRunLength(254, 'in')).toBe('10.0 in');
    // 16,177.4 mm = 636.9 in, to a tenth as every run length is.
    expect(formatRunLength(16_177.4, 'in')).toBe('636.9 in');
    // 1,238,848.2 mm = 48,773.6 in = 4,064.5 ft.
    expect(formatRunLength(1_238_848.2, 'in')).toBe('4,064.5 ft');
  });

  it('gives machine time in hours and minutes from an hour on', () => {
    expect(formatMinutes(12.34)).toBe('12.3 min');
    expect(formatMinutes(1723.8)).toBe('28 h 44 min');
    expect(formatMinutes(60)).toBe('1 h 0 min');
  });

  it('groups thousands in money', () => {
    expect(formatMoney(9389.52, 'EUR')).toBe('9,389.52 EUR');
    expect(formatMoney(23.5, 'GBP')).toBe('23.50 GBP');
  });

  it('gives an hourly rate per hour', () => {
    expect(formatHourlyRate(24, 'EUR')).toBe('24.00 EUR/h');
    expect(formatHourlyRate(1250, 'GBP')).toBe('1,250.00 GBP/h');
  });

  it('gives a kerf to two decimals, three where it was recorded to the thousandth, or in inches without trailing zeros', () => {
    expect(formatKerf(0.2, 'mm')).toBe('0.20 mm');
    expect(formatKerf(0.165, 'mm')).toBe('0.165 mm');
    expect(formatKerf(0.09, 'mm')).toBe('0.09 mm');
    expect(formatKerf(6, 'mm')).toBe('6.00 mm');
    // Floating point noise is not a thousandth recorded.
    expect(formatKerf(0.1 + 0.2, 'mm')).toBe('0.30 mm');
    // 1 in = 25.4 mm exactly (international yard and pound agreement, 1959; NIST SP 811). Router bits are sold in
    // fractions of an inch (common practice): a 1/8 in bit is 3.175 mm, a 1/4 in bit 6.35 mm, a 1/2 in one 12.7 mm.
    expect(formatKerf(3.175, 'in')).toBe('0.125 in');
    expect(formatKerf(6.35, 'in')).toBe('0.25 in');
    expect(formatKerf(12.7, 'in')).toBe('0.5 in');
    expect(formatKerf(25.4, 'in')).toBe('1 in');
    // 0.15 and 0.16 mm: 0.005906 and 0.006299 in; 0.0059 in is 0.14986 mm and 0.0063 in 0.16002 mm, less than
    // half a micrometre off, so a fifth decimal is not needed.
    // 0.0025 in is 0.0635 mm: exactly half a micrometre from 0.064 mm, a tie, so 0.064 mm takes a fifth decimal.
    expect(formatKerf(0.064, 'in')).toBe('0.00252 in');
    expect(formatKerf(0.15, 'in')).toBe('0.0059 in');
    expect(formatKerf(0.16, 'in')).toBe('0.0063 in');
    // 0.08 mm is 0.0031496 in: to four decimals, 0.0031 in would read back as 0.0787 mm.
    expect(formatKerf(0.08, 'in')).toBe('0.00315 in');
    expect(formatKerf(Number.NaN, 'mm')).toBe('—');
  });

  it('gives every kerf and tool diameter in inches that read back to less than half a micrometre, with no digit to spare', () => {
    // Every kerf and tool diameter a profile takes (0.01–25 mm, MACHINE_PROFILE_LIMITS) to the micrometre.
    for (let um = 10; um <= 25_000; um += 1) {
      const mm = um / 1000;
      const shown = formatKerf(mm, 'in');
      const digits = /^(\d+)(?:\.(\d+))? in$/.exec(shown);
      expect(digits, shown).not.toBeNull();
      const decimals = digits?.[2] ?? '';
      expect(decimals.endsWith('0'), shown).toBe(false);
      expect(Math.abs(Number.parseFloat(shown) * 25.4 - mm), shown).toBeLessThan(0.0005);
      // One decimal fewer would be half a micrometre off or more.
      if (decimals.length > 0) {
        const shorter = Number((mm / 25.4).toFixed(decimals.length - 1));
        expect(Math.abs(shorter * 25.4 - mm), shown).toBeGreaterThan(0.0005 - 1e-12);
      }
    }
  });

  it('gives a speed per second in the unit chosen, thousands grouped and no trailing zeros', () => {
    expect(formatSpeed(1200, 'mm')).toBe('1,200 mm/s');
    expect(formatSpeed(12.5, 'mm')).toBe('12.5 mm/s');
    expect(formatSpeed(254, 'in')).toBe('10 in/s');
    // 1,200 mm/s = 47.244 in/s.
    expect(formatSpeed(1200, 'in')).toBe('47.24 in/s');
  });

  it('gives a share as a percentage to a tenth, as utilisation reads on every page', () => {
    expect(formatPercent(0.875)).toBe('87.5 %');
    expect(formatPercent(0.5)).toBe('50.0 %');
    expect(formatPercent(Number.NaN)).toBe('—');
  });

  it('groups the thousands of any other quantity, and writes a bare count bare', () => {
    expect(formatQuantity(18000, 'rpm')).toBe('18,000 rpm');
    expect(formatQuantity(0.5, 's')).toBe('0.5 s');
    expect(formatQuantity(80, '%')).toBe('80 %');
    expect(formatQuantity(2, '')).toBe('2');
  });

  it('gives a stock thickness as stock is listed, or in inches to three places', () => {
    expect(formatStockThickness(3, 'mm')).toBe('3 mm');
    expect(formatStockThickness(2.9, 'mm')).toBe('2.9 mm');
    expect(formatStockThickness(0.42, 'mm')).toBe('0.42 mm');
    // 3 mm = 0.1181 in (1 in = 25.4 mm exactly).
    expect(formatStockThickness(3, 'in')).toBe('0.118 in');
  });
});
