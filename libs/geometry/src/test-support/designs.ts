import type { DesignSpec } from '@kerfwright/contracts';

/** Design specs of our own used across tests. */
export function design(overrides: Partial<DesignSpec> & Pick<DesignSpec, 'solid' | 'piece'>): DesignSpec {
  return {
    scale: { by: 'planeDistance', mm: 80 },
    stock: { thicknessMm: 3, flexible: false },
    machine: { kind: 'laser', kerfMm: 0.15 },
    fitMm: 0,
    ...overrides,
  };
}

export const octahedronHexagons = (extra: Partial<DesignSpec> = {}) =>
  design({ solid: 'octahedron', piece: { sides: 6, step: 1, rotationDeg: 0, size: 1.3 }, ...extra });
export const cubeSquares45 = (size = 1.5, extra: Partial<DesignSpec> = {}) =>
  design({ solid: 'cube', piece: { sides: 4, rotationDeg: 45, size }, ...extra });
export const cubeStars83 = (extra: Partial<DesignSpec> = {}) =>
  design({ solid: 'cube', piece: { sides: 8, step: 3, rotationDeg: 0, size: 1.6 }, ...extra });
