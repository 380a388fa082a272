import { buildModel } from '../build';
import { cubeSquares45, cubeStars83, octahedronHexagons } from '../test-support/designs';
import { smallestSoundSize } from './sound-size';

const errorsAt = (spec: ReturnType<typeof octahedronHexagons>, size: number) =>
  buildModel({ ...spec, piece: { ...spec.piece, size } }).report.errors.map((e) => e.code);

describe('the smallest sound piece size', () => {
  it.each([
    ['octahedron of hexagons', octahedronHexagons()],
    ['cube of squares turned 45°', cubeSquares45()],
    ['cube of {8/3} stars', cubeStars83()],
  ])('%s: builds without errors, where the thresholds it starts from do not', (_name, spec) => {
    const found = smallestSoundSize(spec);
    expect(found.size).not.toBeNull();
    expect(found.crossingsFrom).not.toBeNull();
    const size = found.size!;
    expect(errorsAt(spec, size)).toEqual([]);
    // Where crossings begin they have no length yet: no slot holds anything there.
    expect(errorsAt(spec, found.crossingsFrom!).length).toBeGreaterThan(0);
    expect(size).toBeGreaterThan(found.crossingsFrom!);
    // Shown with 4 decimals, so stored with at most 4.
    expect(Math.round(size * 1e4) / 1e4).toBe(size);
    // Sound: no slot breaking through a tip, no pieces colliding through the stock, no thin webs unless said.
    const warnings = buildModel({ ...spec, piece: { ...spec.piece, size } }).report.warnings.map(
      (w) => w.code,
    );
    expect(warnings).not.toContain('CROSSING.SHORTER_THAN_SLOT');
    expect(warnings).not.toContain('PIECE.THICKNESS_CLASH');
    expect(warnings.includes('SLOT.THIN_WEB')).toBe(found.thinWebs);
    // The search is bounded: twice at most the upward steps, the narrowing and the rounding check.
    expect(found.builds).toBeLessThanOrEqual(2 * (Math.ceil(Math.log(3) / Math.log(1.01)) + 5 + 1));
  });

  it('gives the same answer whatever size the spec held', () => {
    const a = smallestSoundSize(octahedronHexagons());
    const b = smallestSoundSize({
      ...octahedronHexagons(),
      piece: { sides: 6, step: 1, rotationDeg: 0, size: 2.4 },
    });
    expect(b.size).toBe(a.size);
  });

  it('finds none when the stock is too thick for any size within reach to hold together', () => {
    // 40 mm stock on a model whose planes are 20 mm from its centre: every slot is wider than the pieces.
    const thick = octahedronHexagons({
      scale: { by: 'planeDistance', mm: 20 },
      stock: { thicknessMm: 40, flexible: false },
    });
    const found = smallestSoundSize(thick);
    expect(found.size).toBeNull();
    expect(found.crossingsFrom).not.toBeNull();
  });

  it('finds a sound window narrower than 3 % that a coarser search stepped over', () => {
    // Found by an independent scan in 0.1–0.25 % steps (diameter 300, 3 mm stock, kerf 0.15): an icosahedron of
    // {7/2} stars builds with no errors and only thin webs near size 0.50, where a 3 % step first found 0.6246.
    const spec = {
      solid: 'icosahedron',
      piece: { sides: 7, step: 2, rotationDeg: 0, size: 1 },
      scale: { by: 'diameter', mm: 300 },
      stock: { thicknessMm: 3, flexible: false },
      machine: { kind: 'laser', kerfMm: 0.15 },
      fitMm: 0,
    } as const;
    const found = smallestSoundSize(spec);
    expect(found.size).not.toBeNull();
    expect(found.size!).toBeLessThan(0.52);
    expect(buildModel({ ...spec, piece: { ...spec.piece, size: found.size! } }).report.errors).toEqual([]);
  });
});
