import { type DesignSpecInput } from '@kerfwright/contracts';
import { describe, expect, it } from 'vitest';
import { layOutStudio } from './studio-layout';

describe("the studio's fit to sheets", () => {
  it('says why no size fits before the errors of the last size tried', () => {
    // {5/2} stars on a tetrahedron in 10 mm stock: even the largest model one 600 × 400 sheet could hold has
    // its points cut off by the slots (the engine's own tests find the window in 3 mm stock).
    const spec = {
      solid: 'tetrahedron',
      piece: { sides: 5, step: 2, size: 1.85 },
      scale: { by: 'fitSheets', sheets: 1 },
      stock: { thicknessMm: 10, sheet: { widthMm: 600, heightMm: 400 }, marginMm: 5, gapMm: 3 },
      machine: { kind: 'laser', kerfMm: 0.15 },
    } as unknown as DesignSpecInput;
    const result = layOutStudio(spec, 1, 'neighbour-distinct', null);
    expect(result.sheets).toEqual([]);
    expect(result.sheetsAsked).toBe(1);
    expect(result.failure).toMatch(/^no size fits 1 sheet of 600 × 400 mm: even the largest model/);
    expect(result.failure).toMatch(/10 mm stock/);
  });

  it('says the colour rule cannot be met before what else the upper bound has wrong (no search runs)', () => {
    // Tetrahedron faces all share edges, so "neighbours differ" needs 4 colours (complete graph K4); the
    // small hexagons also miss each other at the upper bound, a design error of its own.
    const spec = {
      solid: 'tetrahedron',
      piece: { sides: 6, step: 1, size: 1.3 },
      scale: { by: 'fitSheets', sheets: 2 },
      stock: { thicknessMm: 3, sheet: { widthMm: 600, heightMm: 400 }, marginMm: 5, gapMm: 3 },
      machine: { kind: 'laser', kerfMm: 0.15 },
    } as unknown as DesignSpecInput;
    const result = layOutStudio(spec, 2, 'neighbour-distinct', null);
    expect(result.sheets).toEqual([]);
    expect(result.failure).toMatch(/^no plan exists: rule "neighbour-distinct" cannot be met with 2 colours/);
  });
});
