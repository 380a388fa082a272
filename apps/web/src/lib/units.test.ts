import { describe, expect, it } from 'vitest';
import { formatHourlyRate, formatMinutes, formatMoney, formatRunLength, formatSheetSize } from './units';

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
});
