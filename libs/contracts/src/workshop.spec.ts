import { familyNamedIn, type MaterialHazard } from './workshop';

const row = (family: string, laser: MaterialHazard['laser'], nameWords?: string[]): MaterialHazard =>
  ({
    family,
    examples: [],
    laser,
    hazard: 'h',
    source: 's',
    ...(nameWords ? { nameWords } : {}),
  }) as MaterialHazard;

// A small table of our own: PVC and glass-fibre board refused, acrylic allowed (the shipped table is checked
// against the API in the materials e2e tests).
const table = [
  row('acrylic', 'yes', ['acrylic']),
  row('pvc', 'no', ['PVC', 'uPVC', 'vinyl']),
  row('fibreglass', 'no', ['glass fibre', 'FR-4']),
  row('unidentified', 'no'),
];

describe('familyNamedIn', () => {
  it('finds a refused family named whole in a material name, in any case', () => {
    expect(familyNamedIn('Expanded PVC board 3 mm', 'acrylic', table)).toMatchObject({
      row: { family: 'pvc' },
      word: 'PVC',
    });
    expect(familyNamedIn('grey pvc sheet', 'plywood', table)?.row.family).toBe('pvc');
    expect(familyNamedIn('Vinyl offcut', 'card', table)?.word).toBe('vinyl');
    expect(familyNamedIn('uPVC window trim', 'acrylic', table)?.word).toBe('uPVC');
    // Full-width letters (as some keyboards type them) fold to the same word (Unicode NFKC, UAX #15).
    expect(familyNamedIn('ＰＶＣ sheet', 'acrylic', table)?.word).toBe('PVC');
  });

  it('takes a space and a hyphen alike inside a name word', () => {
    for (const name of ['Glass-fibre panel', 'glass  fibre panel', 'FR 4 board', 'FR-4 board'])
      expect(familyNamedIn(name, 'plywood', table)?.row.family).toBe('fibreglass');
    expect(familyNamedIn('FR4 board', 'plywood', table)).toBeUndefined();
  });

  it('ignores words inside other words, the material’s own family and allowed families', () => {
    expect(familyNamedIn('PVCX sample', 'acrylic', table)).toBeUndefined();
    expect(familyNamedIn('Antivinyl board', 'acrylic', table)).toBeUndefined();
    expect(familyNamedIn('Expanded PVC board', 'pvc', table)).toBeUndefined();
    expect(familyNamedIn('Cast acrylic 3 mm', 'plywood', table)).toBeUndefined();
    expect(familyNamedIn('Birch plywood 3 mm', 'plywood', table)).toBeUndefined();
  });
});
