import { DESIGN_WORK_LIMIT, designWork } from '@kerfwright/geometry';
import { describe, expect, it } from 'vitest';
import { buildPreview } from './use-built-model';

const spec = (solid: string, sides: number, step: number) => ({
  solid,
  piece: { sides, step, rotationDeg: 0, size: 1.2 },
  scale: { by: 'planeDistance' as const, mm: 60 },
  stock: { thicknessMm: 0.4, flexible: true },
  machine: { kind: 'laser' as const, kerfMm: 0.1 },
});

describe('buildPreview', () => {
  it('says a design too heavy for the API, as the API does, without building it on the page', () => {
    // 120 faces (a disdyakis triacontahedron, the catalogue's largest) × 119 others × 60 sides.
    expect(designWork(120, 60)).toBeGreaterThan(DESIGN_WORK_LIMIT);
    const started = performance.now();
    const heavy = buildPreview(spec('disdyakis-triacontahedron', 60, 29), 1, 'neighbour-distinct');
    expect(performance.now() - started).toBeLessThan(1000);
    expect(heavy.model).toBeNull();
    expect(heavy.failure).toMatch(/^This design is too heavy to compute in time: 120 pieces of 60 sides/);
    expect(heavy.failure).toMatch(/at most 14 sides on this solid/);
  });

  it('builds a design within the limit', () => {
    const cube = buildPreview(spec('cube', 4, 1), 1, 'neighbour-distinct');
    expect(cube.failure).toBeNull();
    expect(cube.model?.pieces).toHaveLength(6);
  });
});
