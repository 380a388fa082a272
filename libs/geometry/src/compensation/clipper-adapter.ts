/**
 * The one adapter between our millimetre polygons and Clipper's integer coordinates. Clipper works on
 * integers: every coordinate is multiplied by CLIPPER_SCALE on the way in and divided on the way out.
 */
import * as ClipperLib from 'clipper-lib';
import { type Vec2 } from '../math/vec';

/** Clipper units per millimetre: 0.1 µm resolution, exact integer arithmetic up to ±100 m. */
export const CLIPPER_SCALE = 1e4;

const toPath = (poly: readonly Vec2[]): ClipperLib.Path =>
  poly.map((p) => ({ X: Math.round(p[0] * CLIPPER_SCALE), Y: Math.round(p[1] * CLIPPER_SCALE) }));
const fromPath = (path: ClipperLib.Path): Vec2[] =>
  path.map((p) => [p.X / CLIPPER_SCALE, p.Y / CLIPPER_SCALE]);

/** subject minus the union of `cuts` (non-zero fill), as separate polygons (outer contours CCW, holes CW). */
export function subtractPolygons(subject: readonly Vec2[], cuts: readonly (readonly Vec2[])[]): Vec2[][] {
  const c = new ClipperLib.Clipper();
  c.AddPaths([toPath(subject)], ClipperLib.PolyType.ptSubject, true);
  if (cuts.length) c.AddPaths(cuts.map(toPath), ClipperLib.PolyType.ptClip, true);
  const out: ClipperLib.Paths = [];
  c.Execute(
    ClipperLib.ClipType.ctDifference,
    out,
    ClipperLib.PolyFillType.pftNonZero,
    ClipperLib.PolyFillType.pftNonZero,
  );
  return out.map(fromPath);
}

export type JoinKind = 'miter' | 'round';

/**
 * Offsets closed polygons by `deltaMm` (positive grows). Mitred joins keep sharp corners (squared off
 * beyond `miterLimit` × delta); round joins follow arcs within `arcToleranceMm`.
 */
export function offsetPolygons(
  polys: readonly (readonly Vec2[])[],
  deltaMm: number,
  join: JoinKind = 'miter',
  miterLimit = 20,
  arcToleranceMm = 0.002,
): Vec2[][] {
  const co = new ClipperLib.ClipperOffset(miterLimit, arcToleranceMm * CLIPPER_SCALE);
  co.AddPaths(
    polys.map(toPath),
    join === 'miter' ? ClipperLib.JoinType.jtMiter : ClipperLib.JoinType.jtRound,
    ClipperLib.EndType.etClosedPolygon,
  );
  const out: ClipperLib.Paths = [];
  co.Execute(out, deltaMm * CLIPPER_SCALE);
  return out.map(fromPath);
}
