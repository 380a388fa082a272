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
