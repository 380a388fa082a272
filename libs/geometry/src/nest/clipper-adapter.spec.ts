import * as polygonClipping from 'polygon-clipping';
import {
  ACROSS_MIN_MM,
  areaUnits,
  differenceAcross,
  differencePaths,
  SCALE_PER_MM,
  toIntPath,
  type IntPaths,
} from './clipper-adapter';
import { mpArea, regular, type P } from '../test-support/polygons';

const toMm = (paths: IntPaths): polygonClipping.MultiPolygon =>
  paths.map((p) => [p.map((q) => [q.X / SCALE_PER_MM, q.Y / SCALE_PER_MM] as P)]);

/** Area (mm²) of the region a Clipper result bounds: outer contours count, holes take away (non-zero fill). */
const regionOf = (paths: IntPaths) => {
  const outer = paths.filter((p) => areaUnits(p) > 0);
  const holes = paths.filter((p) => areaUnits(p) < 0);
  const plus = polygonClipping.union([], ...toMm(outer).map((p) => [p]));
  return holes.length > 0 ? polygonClipping.difference(plus, ...toMm(holes).map((p) => [p])) : plus;
};

describe('differenceAcross', () => {
  it('gives the region differencePaths gives along a 10 m strip, outer contours counter-clockwise (checked with polygon-clipping)', () => {
    // A 10,000 × 600 mm strip less 300 seeded hexagons along it, some overlapping: wide enough to be clipped
    // across (the sheet's long side over ACROSS_MIN_MM).
    expect(10_000).toBeGreaterThan(ACROSS_MIN_MM);
    const strip = [
      toIntPath([
        [0, 0],
        [10_000, 0],
        [10_000, 600],
        [0, 600],
      ]),
    ];
    let seed = 5;
    const rnd = () => (seed = (seed * 1664525 + 1013904223) % 4294967296) / 4294967296;
    const clips: IntPaths = Array.from({ length: 300 }, () => {
      const [cx, cy] = [rnd() * 10_000, rnd() * 600];
      return toIntPath(
        regular(6, 20 + rnd() * 40, rnd() * 60).map(([x, y]) => [x + cx, y + cy] as [number, number]),
      );
    });
    const across = differenceAcross(strip, clips);
    const along = differencePaths(strip, clips);
    expect(across.some((p) => areaUnits(p) > 0)).toBe(true);
    // Outer contours keep their turn: the largest path is the outer one, and counter-clockwise.
    const largest = across.reduce((a, b) => (Math.abs(areaUnits(b)) > Math.abs(areaUnits(a)) ? b : a));
    expect(areaUnits(largest)).toBeGreaterThan(0);
    const a = regionOf(across);
    const b = regionOf(along);
    const total = mpArea(b);
    expect(total).toBeGreaterThan(1e6);
    // The same region up to intersection points rounded to the other neighbouring micrometre.
    expect(mpArea(polygonClipping.xor(a, b))).toBeLessThan(1e-3 * 300);
  });

  it('clips a region no longer than a stock sheet exactly as differencePaths does', () => {
    const sheet = [
      toIntPath([
        [0, 0],
        [2440, 0],
        [2440, 300],
        [0, 300],
      ]),
    ];
    const clips = [toIntPath(regular(7, 90).map(([x, y]) => [x + 400, y + 150] as [number, number]))];
    expect(differenceAcross(sheet, clips)).toEqual(differencePaths(sheet, clips));
  });
});
