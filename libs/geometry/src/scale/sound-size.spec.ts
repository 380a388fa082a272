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
    expect(found.builds).toBeLessThanOrEqual(2 * (Math.ceil(Math.log(3) / Math.log(1.03)) + 6 + 1));
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
});
