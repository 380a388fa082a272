declare module 'monotone-convex-hull-2d' {
  /** Indices of the hull's vertices (monotone chain), for points as [x, y] pairs. */
  function convexHull(points: readonly (readonly [number, number])[]): number[];
  export = convexHull;
}
