import { buildModel } from '../build';
import { octahedronHexagons } from '../test-support/designs';
import { SpecValidationError, validateSpec } from './validate-spec';

const fields = (input: unknown) => {
  const v = validateSpec(input);
  return v.ok ? [] : v.errors.map((e) => e.field).sort();
};

describe('validateSpec', () => {
  it('accepts a complete spec and fills in defaults', () => {
    const v = validateSpec({
      solid: 'cube',
      piece: { sides: 4, size: 1.5 },
      scale: { by: 'diameter', mm: 200 },
      stock: { thicknessMm: 3 },
      machine: { kind: 'router', toolDiameterMm: 3.175 },
    });
    expect(v.ok).toBe(true);
    if (v.ok) {
      expect(v.spec.piece).toEqual({ sides: 4, step: 1, rotationDeg: 0, size: 1.5 });
      expect(v.spec.minWebMm).toBe(6);
      expect(v.spec.fitMm).toBe(0);
      expect(v.spec.stock.flexible).toBe(false);
    }
  });

  it('names each bad field', () => {
    expect(fields({ ...octahedronHexagons(), solid: 'prism-40' })).toEqual(['solid']);
    expect(fields({ ...octahedronHexagons(), piece: { sides: 6, step: 2, size: 1 } })).toEqual([
      'piece.step',
    ]);
    expect(fields({ ...octahedronHexagons(), piece: { sides: 2.5, size: -1 } })).toEqual([
      'piece.sides',
      'piece.size',
    ]);
    expect(fields({ ...octahedronHexagons(), scale: { by: 'height', mm: 0 } })).toEqual([
      'scale.by',
      'scale.mm',
    ]);
    expect(fields({ ...octahedronHexagons(), machine: { kind: 'plasma' } })).toEqual(['machine.kind']);
    expect(fields({ ...octahedronHexagons(), machine: { kind: 'laser', kerfMm: 'thin' } })).toEqual([
      'machine.kerfMm',
    ]);
    expect(fields({ ...octahedronHexagons(), stock: { thicknessMm: 3, flexible: 'yes' } })).toEqual([
      'stock.flexible',
    ]);
    expect(fields({ ...octahedronHexagons(), fitMm: Number.NaN })).toEqual(['fitMm']);
    expect(fields({ ...octahedronHexagons(), colour: 'red' })).toEqual(['colour']);
    expect(fields({ ...octahedronHexagons(), solid: { format: 'stl', text: '' } })).toEqual([
      'solid.format',
      'solid.text',
    ]);
    expect(fields({ ...octahedronHexagons(), bed: { widthMm: 600 } })).toEqual(['bed.heightMm']);
    expect(fields('cube')).toEqual(['']);
    expect(fields({})).toEqual(['machine', 'piece', 'scale', 'solid', 'stock']);
  });

  it('accepts stock sheet, margin, gap, colours and the fit scales, with defaults', () => {
    const v = validateSpec({
      ...octahedronHexagons(),
      scale: { by: 'fitSheets', sheets: 3 },
      stock: { thicknessMm: 3, sheet: { widthMm: 600, heightMm: 400 } },
      colours: { count: 2 },
    });
    expect(v.ok).toBe(true);
    if (v.ok) {
      expect(v.spec.sheet).toEqual({ widthMm: 600, heightMm: 400, marginMm: 5, gapMm: 3 });
      expect(v.spec.colours).toEqual({ count: 2, rule: 'neighbour-distinct' });
      expect(v.spec.scale).toEqual({ by: 'fitSheets', sheets: 3 });
    }
    // One colour and no rule: nothing to plan. One colour with a rule asked for keeps it (and may fail it).
    const one = validateSpec({ ...octahedronHexagons(), colours: { count: 1 } });
    expect(one.ok && one.spec.colours).toBeNull();
    const oneRule = validateSpec({ ...octahedronHexagons(), colours: { count: 1, rule: 'opposite-match' } });
    expect(oneRule.ok && oneRule.spec.colours).toEqual({ count: 1, rule: 'opposite-match' });
    const bed = validateSpec({
      ...octahedronHexagons(),
      scale: { by: 'fitBed' },
      bed: { widthMm: 300, heightMm: 200 },
      colours: { names: ['Saffron', 'Teal'], rule: 'opposite-match' },
    });
    expect(bed.ok && bed.spec.colours).toEqual({
      count: 2,
      rule: 'opposite-match',
      names: ['Saffron', 'Teal'],
    });
  });

  it('names each bad stock, colour and fit-scale field', () => {
    const sheet = { widthMm: 600, heightMm: 400 };
    const o = octahedronHexagons();
    expect(fields({ ...o, stock: { thicknessMm: 3, sheet: { widthMm: -1, heightMm: 400 } } })).toEqual([
      'stock.sheet.widthMm',
    ]);
    expect(fields({ ...o, stock: { thicknessMm: 3, sheet: { widthMm: 600 } } })).toEqual([
      'stock.sheet.heightMm',
    ]);
    expect(fields({ ...o, stock: { thicknessMm: 3, sheet, marginMm: -2, gapMm: 'x' } })).toEqual([
      'stock.gapMm',
      'stock.marginMm',
    ]);
    expect(fields({ ...o, stock: { thicknessMm: 3, sheet, marginMm: 200 } })).toEqual(['stock.marginMm']);
    expect(fields({ ...o, stock: { thicknessMm: 3, gapMm: 2 } })).toEqual(['stock.gapMm']);
    expect(fields({ ...o, colours: { count: 0 } })).toEqual(['colours.count']);
    expect(fields({ ...o, colours: { count: 13 } })).toEqual(['colours.count']);
    expect(fields({ ...o, colours: { count: 2, rule: 'rainbow' } })).toEqual(['colours.rule']);
    expect(fields({ ...o, colours: { count: 3, names: ['a', 'b'] } })).toEqual(['colours.names']);
    expect(fields({ ...o, colours: 4 })).toEqual(['colours']);
    expect(fields({ ...o, scale: { by: 'fitSheets', sheets: 2 } })).toEqual(['stock.sheet']);
    expect(fields({ ...o, scale: { by: 'fitSheets' }, stock: { thicknessMm: 3, sheet } })).toEqual([
      'scale.sheets',
    ]);
    expect(
      fields({ ...o, scale: { by: 'fitSheets', sheets: 0.5 }, stock: { thicknessMm: 3, sheet } }),
    ).toEqual(['scale.sheets']);
    expect(
      fields({
        ...o,
        scale: { by: 'fitSheets', sheets: 2 },
        stock: { thicknessMm: 3, sheet },
        colours: { count: 3 },
      }),
    ).toEqual(['scale.sheets']);
    expect(fields({ ...o, scale: { by: 'fitBed' } })).toEqual(['bed']);
    expect(fields({ ...o, scale: { by: 'fitBed', mm: 100 }, bed: sheet })).toEqual(['scale.mm']);
  });

  it('refuses compounds such as {6/2} with a message', () => {
    const v = validateSpec({ ...octahedronHexagons(), piece: { sides: 6, step: 2, size: 1 } });
    expect(v.ok ? '' : v.errors[0]?.messages.join()).toMatch(/compound/);
  });

  it('makes buildModel throw a SpecValidationError carrying the field errors', () => {
    expect(() => buildModel({ ...octahedronHexagons(), piece: { sides: 6, size: 0 } })).toThrow(
      SpecValidationError,
    );
    try {
      buildModel({ ...octahedronHexagons(), piece: { sides: 6, size: 0 } });
    } catch (e) {
      expect((e as SpecValidationError).fieldErrors[0]?.field).toBe('piece.size');
    }
  });
});
