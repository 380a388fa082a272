import { clashingColourNames, slug } from './slug';

describe('slug', () => {
  it('keeps letters and digits, drops accents and turns everything else into single dashes', () => {
    expect(slug('Grün', 'x')).toBe('grun');
    expect(slug('Blå', 'x')).toBe('bla');
    expect(slug('Amber #2', 'x')).toBe('amber-2');
    expect(slug('../../evil', 'x')).toBe('evil');
    expect(slug('???', 'colour-3')).toBe('colour-3');
  });

  it('finds colour names a pack could not tell apart', () => {
    expect(clashingColourNames(['Opal', 'opal'])).toEqual(['Opal', 'opal']);
    expect(clashingColourNames(['Grün', 'Grun'])).toEqual(['Grün', 'Grun']);
    expect(clashingColourNames(['Red', 'Blue'])).toBeNull();
  });
});
