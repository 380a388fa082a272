import { MM_PER_INCH, inchText, lengthText, unitLengthText, unitSizeText } from './length-text';

describe('lengths in a document’s units', () => {
  it('converts with 1 in = 25.4 mm exactly (NIST SP 811, appendix B)', () => {
    expect(MM_PER_INCH).toBe(25.4);
    // 3 / 25.4 = 0.118110… (NIST factor): a thou is the printed step between 0.1 and 10 in.
    expect(unitLengthText(3, 'in')).toBe('0.118 in (3 mm)');
    // 5 / 25.4 = 0.196850… rounds up at the third decimal.
    expect(inchText(5)).toBe('0.197');
  });

  it('prints fractional-inch tooling as the inch shop names it (common practice: 1/8 in bit, 3.175 mm)', () => {
    expect(unitLengthText(3.175, 'in')).toBe('0.125 in (3.175 mm)');
    // Its radius, 1/16 in, is below 0.1 in: four decimals, so the offset to type in is exact.
    expect(unitLengthText(3.175 / 2, 'in')).toBe('0.0625 in (1.5875 mm)');
    // A thin laser kerf of 0.15 mm = 0.0059055 in (NIST factor): four decimals keep it to 1 %.
    expect(inchText(0.15)).toBe('0.0059');
  });

  it('prints fewer decimals for long lengths: 2 from 10 in, 1 from 100 in', () => {
    // A 24 × 18 in sheet (from memory: a common laser sheet size) is 609.6 × 457.2 mm.
    expect(unitSizeText(609.6, 457.2, 'in')).toBe('24.00 x 18.00 in (609.6 x 457.2 mm)');
    // 200 in of cut = 5080 mm (NIST factor).
    expect(inchText(5080)).toBe('200.0');
    // The bounds apply to the rounded value: 9.99996 in would read 10.000 at three decimals.
    expect(inchText(253.999)).toBe('10.00');
    expect(inchText(2539.99)).toBe('100.0');
    // 2.538 mm = 0.099921 in, 2.539 mm = 0.099961 in (NIST factor): the latter rounds to 0.1000, so a thou.
    expect(inchText(2.538)).toBe('0.0999');
    expect(inchText(2.539)).toBe('0.100');
  });

  it('writes the mm beside the inches as the mm document writes it, and leaves mm documents as they were', () => {
    const f1 = (x: number) => x.toFixed(1);
    expect(unitLengthText(7029.37, 'in', f1)).toBe('276.7 in (7029.4 mm)');
    expect(unitLengthText(7029.37, 'mm', f1)).toBe('7029.4 mm');
    expect(unitLengthText(0.075, 'mm')).toBe(`${lengthText(0.075)} mm`);
    expect(unitSizeText(600, 400, 'mm')).toBe('600 x 400 mm');
    expect(unitSizeText(600, 400, 'mm', f1)).toBe('600.0 x 400.0 mm');
  });
});
