import { describe, expect, it } from 'vitest';
import { formatKerf, KERF_INCH_DECIMALS } from '../../lib/units';
import { inchLabel, inchesText, inchesToMm, messageInInches } from './length-field';

// 1 in = 25.4 mm exactly (international yard and pound agreement, 1959; NIST SP 811).
describe('inch fields over millimetre values', () => {
  it('shows millimetres as inches to four decimals, without trailing zeros', () => {
    expect(inchesText(25.4)).toBe('1');
    expect(inchesText(6.35)).toBe('0.25');
    expect(inchesText(144.4625)).toBe('5.6875');
    expect(inchesText(600)).toBe('23.622');
    expect(inchesText(Number.NaN)).toBe('');
    expect(inchesText(undefined)).toBe('');
  });

  it('shows a kerf in inches that, typed back as shown, is the kerf stored within half a micrometre', () => {
    // 0.08 mm = 0.0031496 in: to four decimals it would read 0.0031 in, typed back 0.07874 mm.
    expect(inchesText(0.08)).toBe('0.0031');
    expect(inchesToMm(inchesText(0.08))).toBe(0.07874);
    expect(inchesText(0.08, KERF_INCH_DECIMALS)).toBe('0.00315');
    // Every kerf of a laser or width of a router cut (0.01–12 mm) to the thousandth, as profiles record them.
    for (let um = 10; um <= 12_000; um += 1) {
      const mm = um / 1000;
      const back = inchesToMm(inchesText(mm, KERF_INCH_DECIMALS));
      expect(Math.abs(back - mm)).toBeLessThanOrEqual(0.0005);
    }
  });

  it('shows a kerf or tool diameter in its field as the pages show it, so the field reads what the page said', () => {
    // A 1/8 in bit (3.175 mm, common practice) reads 0.125 in on the page and in the field, not 0.12500.
    expect(inchesText(3.175, KERF_INCH_DECIMALS)).toBe('0.125');
    for (let um = 10; um <= 25_000; um += 7) {
      const mm = um / 1000;
      expect(`${inchesText(mm, KERF_INCH_DECIMALS)} in`).toBe(formatKerf(mm, 'in'));
    }
  });

  it('takes typed inches as millimetres to the nanometre, and anything else as no number', () => {
    expect(inchesToMm('0.25')).toBe(6.35);
    expect(inchesToMm('24')).toBe(609.6);
    expect(inchesToMm('5.6875')).toBe(144.4625);
    expect(inchesToMm('0.125')).toBe(3.175);
    expect(inchesToMm('')).toBeNaN();
    expect(inchesToMm('  ')).toBeNaN();
    expect(inchesToMm('1e')).toBeNaN();
  });

  it('labels a field in inches, a speed in inches per second', () => {
    expect(inchLabel('Margin (mm)')).toBe('Margin (in)');
    expect(inchLabel('Kerf (mm, optional)')).toBe('Kerf (in, optional)');
    expect(inchLabel('Cut speed (mm/s)')).toBe('Cut speed (in/s)');
    expect(inchLabel('Hourly rate')).toBe('Hourly rate');
  });

  it("says a check's limits in inches to a reader typing inches", () => {
    expect(messageInInches('At most 100 mm')).toBe('At most 3.937 in');
    expect(messageInInches('At least 1 mm: a smaller model cannot be cut')).toBe(
      'At least 0.0394 in: a smaller model cannot be cut',
    );
    expect(messageInInches('Between −2 and 2 mm')).toBe('Between −0.0787 and 0.0787 in');
    expect(messageInInches('Leaves no room inside the 5 mm margins: more than 10 mm')).toBe(
      'Leaves no room inside the 0.1969 in margins: more than 0.3938 in',
    );
    expect(messageInInches('Enter the sheet width')).toBe('Enter the sheet width');
    // A speed's limit: 1,000 mm/s = 39.37 in/s.
    expect(messageInInches('At most 1000 mm/s')).toBe('At most 39.37 in/s');
  });

  it('rounds a limit inward, so that the value it says is taken: a maximum down, a minimum up', () => {
    // 10,000 mm = 393.70079 in: "393.7008" would be 10,000.0003 mm, over the limit.
    expect(messageInInches('At most 10000 mm')).toBe('At most 393.7007 in');
    expect(inchesToMm('393.7007')).toBeLessThanOrEqual(10_000);
    expect(messageInInches('At most 25 mm')).toBe('At most 0.9842 in');
    // 0.1 mm = 0.003937 in: "0.0039" would be 0.09906 mm, under it.
    expect(messageInInches('At least 0.1 mm; leave it empty if it was not measured')).toBe(
      'At least 0.004 in; leave it empty if it was not measured',
    );
    expect(inchesToMm('0.004')).toBeGreaterThanOrEqual(0.1);
    expect(messageInInches('More than 0 mm')).toBe('More than 0 in');
  });
});
