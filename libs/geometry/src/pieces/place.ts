import { type Vec2, type Vec3, add3, at, cross3, dot3, length3, normalize3, scale3, sub3 } from '../math/vec';
import { lineIntervals, intersectIntervals } from '../math/polygon';
import { type Solid } from '../solids/polyhedron';
import { type PieceShape, starOutline, tipDirections } from './shape';

/**
 * A piece's plane and 2D frame. The frame's origin is the piece centre (the foot of the perpendicular
 * from the solid's centre to the face plane); its x axis points from the centre toward the face's first
 * vertex; its y axis is normal × x. Seen from outside the solid (normal toward the viewer), x points
 * right and y up, so counter-clockwise in the frame is counter-clockwise seen from outside.
 */
export interface PieceFrame {
  face: number;
  normal: Vec3;
  /** Distance from the centre to the plane. */
  distance: number;
  centre: Vec3;
  x: Vec3;
  y: Vec3;
}

export function pieceFrames(solid: Solid, mmPerUnit = 1): PieceFrame[] {
  return solid.faces.map((f, face) => {
    const distance = f.distance * mmPerUnit;
    const centre = scale3(f.normal, distance);
    let x: Vec3 = [0, 0, 0];
    for (const vi of f.vertices) {
      const d = sub3(scale3(at(solid.vertices, vi), mmPerUnit), centre);
      if (length3(d) > 1e-9 * distance) {
        x = normalize3(sub3(d, scale3(f.normal, dot3(d, f.normal))));
        break;
      }
    }
    if (length3(x) === 0)
      x = normalize3(cross3(f.normal, Math.abs(f.normal[0]) < 0.6 ? [1, 0, 0] : [0, 1, 0]));
    return { face, normal: f.normal, distance, centre, x, y: cross3(f.normal, x) };
  });
}

export const toFrame = (fr: PieceFrame, p: Vec3): Vec2 => {
  const d = sub3(p, fr.centre);
  return [dot3(d, fr.x), dot3(d, fr.y)];
};
export const dirToFrame = (fr: PieceFrame, d: Vec3): Vec2 => [dot3(d, fr.x), dot3(d, fr.y)];
export const fromFrame = (fr: PieceFrame, p: Vec2): Vec3 =>
  add3(fr.centre, add3(scale3(fr.x, p[0]), scale3(fr.y, p[1])));

/** The line where two non-parallel planes meet: a point on it and a unit direction nA × nB. */
export function planeLine(a: PieceFrame, b: PieceFrame): { point: Vec3; dir: Vec3 } | null {
  const c = cross3(a.normal, b.normal);
  const l2 = dot3(c, c);
  if (l2 < 1e-18) return null;
  // Point = (dA (nB × c) + dB (c × nA)) / |c|², the point of the line nearest the origin.
  const point = scale3(
    add3(scale3(cross3(b.normal, c), a.distance), scale3(cross3(c, a.normal), b.distance)),
    1 / l2,
  );
  return { point, dir: normalize3(c) };
}

export interface SuggestedSizes {
  /** Smallest size at which a piece tip reaches another piece's plane. */
  touch: number | null;
  /** Smallest size at which two pieces overlap along their planes' line (a crossing appears). */
  overlap: number | null;
}

/** Suggested sizes for a piece shape on a solid (scale-free; rotation matters, size is ignored). */
export function suggestSizes(solid: Solid, shape: Omit<PieceShape, 'size'>): SuggestedSizes {
  const frames = pieceFrames(solid);
  const tips = tipDirections(shape.sides, shape.rotationDeg);
  let touch = Infinity;
  for (const f of frames) {
    for (const g of frames) {
      if (f === g) continue;
      const need = g.distance - f.distance * dot3(f.normal, g.normal);
      let w = -Infinity;
      for (const t of tips) w = Math.max(w, t[0] * dot3(g.normal, f.x) + t[1] * dot3(g.normal, f.y));
      if (w > 1e-12 && need > 0) touch = Math.min(touch, need / (f.distance * w));
    }
  }
  const unit = starOutline(shape.sides, shape.step, 1, shape.rotationDeg);
  const pairs: { a: PieceFrame; b: PieceFrame; pa: Vec2; da: Vec2; pb: Vec2; db: Vec2; reach: number }[] = [];
  for (let i = 0; i < frames.length; i++) {
    for (let j = i + 1; j < frames.length; j++) {
      const a = at(frames, i);
      const b = at(frames, j);
      const line = planeLine(a, b);
      if (!line) continue;
      const pa = toFrame(a, line.point);
      const da = dirToFrame(a, line.dir);
      const pb = toFrame(b, line.point);
      const db = dirToFrame(b, line.dir);
      // A piece of size s lies within s·distance of its centre: the line is out of reach below this size.
      const ha = Math.abs(pa[0] * da[1] - pa[1] * da[0]) / a.distance;
      const hb = Math.abs(pb[0] * db[1] - pb[1] * db[0]) / b.distance;
      pairs.push({ a, b, pa, da, pb, db, reach: Math.max(ha, hb) });
    }
  }
  pairs.sort((x, y) => x.reach - y.reach);
  const overlapsAt = (s: number): boolean => {
    for (const p of pairs) {
      if (p.reach > s) return false;
      const ka = 1 / (s * p.a.distance);
      const kb = 1 / (s * p.b.distance);
      const ia = lineIntervals(unit, [p.pa[0] * ka, p.pa[1] * ka], [p.da[0] * ka, p.da[1] * ka]);
      if (ia.length === 0) continue;
      const ib = lineIntervals(unit, [p.pb[0] * kb, p.pb[1] * kb], [p.db[0] * kb, p.db[1] * kb]);
      if (intersectIntervals(ia, ib).some(([lo, hi]) => hi - lo > 1e-9 * s * p.a.distance)) return true;
    }
    return false;
  };
  let lo = Number.isFinite(touch) ? touch * 0.999 : 1e-3;
  let hi = Math.max(lo * 2, 1e-3);
  let overlap: number | null = null;
  while (hi < 1e4 && !overlapsAt(hi)) {
    lo = hi;
    hi *= 2;
  }
  if (hi < 1e4) {
    if (overlapsAt(lo)) lo = 0;
    for (let k = 0; k < 44; k++) {
      const mid = (lo + hi) / 2;
      if (overlapsAt(mid)) hi = mid;
      else lo = mid;
    }
    overlap = hi;
  }
  return { touch: Number.isFinite(touch) ? touch : null, overlap };
}
