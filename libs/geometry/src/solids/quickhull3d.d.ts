// Types for the self-contained ESM bundle of quickhull3d 3.1.2 (its package entry imports files without
// extensions, which Node's ESM loader cannot resolve; the bundle has no such imports).
declare module 'quickhull3d/dist/quickhull3d.js' {
  export default function quickhull(
    points: ReadonlyArray<readonly [number, number, number]>,
    options?: { skipTriangulation?: boolean },
  ): number[][];
}
