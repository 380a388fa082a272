import { clashingColourNames, engravedColourName, printableColourName, slug, winAnsiText } from './slug';

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

  it('prints and engraves a colour under a name the fonts hold (WinAnsi for the PDFs, ASCII for the stroke font)', () => {
    expect(printableColourName('Grün', 0)).toBe('Grün'); // ü is in WinAnsi
    expect(engravedColourName('Grün', 0)).toBe('GRUN');
    expect(printableColourName('Łódź', 1)).toBe('Lodz');
    expect(engravedColourName('Straße', 1)).toBe('STRASSE');
    expect(printableColourName('日本', 2)).toBe('colour 3');
    expect(engravedColourName('日本', 2)).toBe('COLOUR 3');
    expect(engravedColourName('Rosé wood', 0)).toBe('ROSE WOOD');
    expect(winAnsiText('Łódź – 日本 € “ok”')).toBe('Lódz – ?? € “ok”');
  });

  it('finds colour names that would engrave or print alike', () => {
    expect(clashingColourNames(['Gr?n', 'Grün'])).toBeNull(); // GR?N and GRUN
    expect(clashingColourNames(['colour 2', '中国'])).toEqual(['colour 2', '中国']);
    expect(clashingColourNames(['日本', '中国'])).toBeNull(); // colour 1 and colour 2
  });
});
