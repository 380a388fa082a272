import { DESIGN_WORK_LIMIT, designWork } from '@kerfwright/geometry';
import { describe, expect, it } from 'vitest';
import { buildPreview, previewKey, runPreviewTask } from './build-preview';

const spec = (solid: string, sides: number, step: number) => ({
  solid,
  piece: { sides, step, rotationDeg: 0, size: 1.2 },
  scale: { by: 'planeDistance' as const, mm: 60 },
  stock: { thicknessMm: 0.4, flexible: true },
  machine: { kind: 'laser' as const, kerfMm: 0.1 },
});

describe('buildPreview', () => {
  it('says a design too heavy for the API, as the API does, without building it', () => {
    // 120 faces (a disdyakis triacontahedron, the catalogue's largest) × 119 others × 60 sides.
    expect(designWork(120, 60)).toBeGreaterThan(DESIGN_WORK_LIMIT);
    const heavy = buildPreview(spec('disdyakis-triacontahedron', 60, 29), 1, 'neighbour-distinct');
    // Refused, not built: no report.
    expect(heavy.report).toBeNull();
    expect(heavy.failure).toMatch(/^This design is too heavy to compute in time: 120 pieces of 60 sides/);
    expect(heavy.failure).toMatch(/at most 14 sides on this solid, or a solid with fewer faces\.$/);
  });

  it('says why a spec does not validate, as a sentence', () => {
    const bad = buildPreview(
      { ...spec('cube', 4, 1), stock: { thicknessMm: -1, flexible: true } },
      1,
      'neighbour-distinct',
    );
    expect(bad.report).toBeNull();
    expect(bad.failure).toMatch(/^[A-Z].*thickness/i);
  });

  it('builds a design within the limit, with its colour plan', () => {
    const cube = buildPreview(spec('cube', 4, 1), 3, 'opposite-match');
    expect(cube.failure).toBeNull();
    expect(cube.report?.pieces).toHaveLength(6);
    expect(cube.colourPlan?.feasible).toBe(true);
    expect(Object.keys(cube.pieceColour).sort()).toEqual(cube.report?.pieces.map((p) => p.id).sort());
    expect(cube.key).toBe(previewKey(spec('cube', 4, 1), 3, 'opposite-match'));
  });

  it('answers with plain data that crosses to the page unchanged (structured clone)', () => {
    // What the preview worker posts is copied by the structured clone algorithm: functions, class instances
    // and Maps would be refused or lose what they are. The preview keeps the report, not the built model.
    const answer = runPreviewTask('preview', [spec('octahedron', 6, 1), 2, 'neighbour-distinct']);
    expect(answer).toHaveProperty('report.pieces');
    expect(answer).not.toHaveProperty('model');
    expect(structuredClone(answer)).toStrictEqual(answer);
    expect(hasOnlyPlainData(answer)).toBe(true);
  });
});

/** True when the value holds nothing but JSON-like data: plain objects, arrays, strings, numbers, booleans, null. */
function hasOnlyPlainData(value: unknown): boolean {
  if (value === null || ['string', 'number', 'boolean'].includes(typeof value)) return true;
  if (Array.isArray(value)) return value.every(hasOnlyPlainData);
  if (typeof value !== 'object') return false;
  if (Object.getPrototypeOf(value) !== Object.prototype) return false;
  return Object.values(value as object).every(hasOnlyPlainData);
}
