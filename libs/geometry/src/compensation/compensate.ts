import { type Vec2, add2, at, cross2, dot2, normalize2, scale2 } from '../math/vec';
import {
  type Polygon,
  containsPoint,
  ensureCounterClockwise,
  lineIntervals,
  pointSegmentDistance,
  signedArea,
} from '../math/polygon';
import { type Slot, slotInnerCorners, slotRectangle } from '../slots/slots';
import { offsetPolygons, subtractPolygons } from './clipper-adapter';

/** Largest chord error of arcs drawn as polygons, mm (well inside a router's accuracy). */
export const CIRCLE_TOLERANCE_MM = 0.02;

/** A circle as a counter-clockwise polygon whose chords stay within CIRCLE_TOLERANCE_MM of the arc. */
export function circlePolygon(centre: Vec2, r: number): Vec2[] {
  const n = Math.max(16, Math.ceil(Math.PI / Math.acos(Math.max(-1, 1 - CIRCLE_TOLERANCE_MM / r))));
  return Array.from({ length: n }, (_, k) => {
    const a = (2 * Math.PI * k) / n;
    return [centre[0] + r * Math.cos(a), centre[1] + r * Math.sin(a)] as Vec2;
  });
}

/**
 * Centre of a dog-bone relief of radius r in a corner of a cut-out. `walls` are the unit directions of
 * the two walls leaving the corner; φ is the angle between them. The tool fits the corner with its centre
 * r/sin(φ/2) from the corner along the bisector; the relief moves it r(1/sin(φ/2) − 1) toward the corner,
 * so the relief circle passes through the corner.
 */
export function dogBoneCentre(corner: Vec2, walls: readonly [Vec2, Vec2], r: number): Vec2 {
  const [u, v] = walls;
  const bis = normalize2(add2(u, v));
  const phi = Math.acos(Math.max(-1, Math.min(1, dot2(u, v))));
  const fit = r / Math.sin(phi / 2);
  const move = r * (1 / Math.sin(phi / 2) - 1);
  return add2(corner, scale2(bis, fit - move));
}

/**
 * The part of a dog-bone relief that reaches past the cut-out's walls: the sector of the relief circle
 * from where it crosses one wall, through the corner, to where it crosses the other (the rest of the
 * circle lies inside the cut-out). The sector's centre comes first, then the arc, drawn just outside the circle
 * (within CIRCLE_TOLERANCE_MM). `overshootRad` runs the arc that much further at both ends.
 */
export function dogBonePolygon(
  corner: Vec2,
  walls: readonly [Vec2, Vec2],
  r: number,
  overshootRad = 0,
): Vec2[] {
  const c = dogBoneCentre(corner, walls, r);
  const phi = Math.acos(Math.max(-1, Math.min(1, dot2(walls[0], walls[1]))));
  // Angle at the centre between the corner and each wall crossing (plus any overshoot into the slot).
  const half = Math.PI - phi + overshootRad;
  // Unit vector from the centre to the corner; the arc is a fixed fan of angles turned onto it.
  const ux = (corner[0] - c[0]) / r;
  const uy = (corner[1] - c[1]) / r;
  const fan = arcFan(half, r);
  // The arc is drawn from outside: its edges lie along the circle's tangents at the sample angles, meeting
  // halfway between them, so the cut-out holds the whole relief circle and a bit of radius r reaches the
  // corner (chords would leave slivers inside the circle). The two ends and the corner (an even count puts
  // a sample on it) are points of the circle; the edges bulge at most CIRCLE_TOLERANCE_MM beyond it.
  const on = ([cs, sn]: [number, number]): Vec2 => [ux * cs - uy * sn, ux * sn + uy * cs];
  const first = on(fan[0]!);
  const pts: Vec2[] = [c, [c[0] + r * first[0], c[1] + r * first[1]]];
  for (let k = 1; k < fan.length; k++) {
    const a = on(fan[k - 1]!);
    const b = on(fan[k]!);
    // Where the tangents at a and b meet: along a + b, at r / cos(half the angle) = 2r / |a + b|².
    const sx = a[0] + b[0];
    const sy = a[1] + b[1];
    const f = (2 * r) / (sx * sx + sy * sy);
    pts.push([c[0] + f * sx, c[1] + f * sy]);
  }
  const last = on(fan[fan.length - 1]!);
  pts.push([c[0] + r * last[0], c[1] + r * last[1]]);
  return pts;
}

let lastFan: { half: number; r: number; fan: [number, number][] } | null = null;
/** cos/sin of the arc's sample angles from −half to +half (the last one is kept: reliefs share r, φ). */
function arcFan(half: number, r: number): [number, number][] {
  if (lastFan && lastFan.half === half && lastFan.r === r) return lastFan.fan;
  const step = Math.acos(Math.max(-1, 1 - CIRCLE_TOLERANCE_MM / r));
  // An even count puts a sample exactly on the corner, so the corner itself is always cleared.
  const n = 2 * Math.max(2, Math.ceil(half / step));
  const fan = Array.from({ length: n + 1 }, (_, k) => {
    const a = -half + (2 * half * k) / n;
    return [Math.cos(a), Math.sin(a)] as [number, number];
  });
  lastFan = { half, r, fan };
  return fan;
}

export interface OutlineResult {
  /** The largest remaining contour, counter-clockwise. */
  outline: Vec2[];
  /** Number of separate outer contours (more than 1: the piece is cut apart) and holes. */
  parts: number;
  holes: number;
}

function pickLargest(polys: Vec2[][]): OutlineResult {
  const minArea = 1e-6;
  const outers = polys.filter((p) => signedArea(p) > minArea);
  const holes = polys.filter((p) => signedArea(p) < -minArea).length;
  let best: Vec2[] = [];
  let bestArea = -Infinity;
  for (const p of outers) {
    const a = signedArea(p);
    if (a > bestArea) {
      bestArea = a;
      best = p;
    }
  }
  return { outline: ensureCounterClockwise(best), parts: outers.length, holes };
}

/**
 * A slot's cut-out with its two dog-bone reliefs as one counter-clockwise polygon: up one wall, round the
 * first relief through its corner, across the bottom, round the second relief, back down the other wall.
 * When the reliefs would meet (slot narrower than 2·√2·r) or reach past the opening, the rectangle and
 * the two relief sectors are returned separately (their union is the same cut-out).
 */
export function slotCutout(s: Slot, reliefRadius: number): Vec2[][] {
  const rect = ensureCounterClockwise(slotRectangle(s));
  if (!(reliefRadius > 0)) return [rect];
  const r = reliefRadius;
  const reach = r * Math.SQRT2; // 2r·cos(φ/2) at φ = 90°: where the relief circle meets each wall
  const corners = slotInnerCorners(s);
  const [k1, k2] = corners as [Corner, Corner];
  // The arcs bulge up to CIRCLE_TOLERANCE_MM outside the circle (dogBonePolygon): keep them apart by that too.
  const drawnReach = reach + 2 * CIRCLE_TOLERANCE_MM;
  if (2 * drawnReach >= s.width || drawnReach >= s.depth + s.lead) {
    return [rect, ...corners.map((k) => dogBonePolygon(k.corner, k.walls, r))];
  }
  const n: Vec2 = [-s.axis[1], s.axis[0]];
  const h = s.width / 2;
  const a = add2(s.end, scale2(s.axis, -s.lead));
  // slotInnerCorners gives the −n corner first: go up the −n wall, across the bottom, down the +n wall.
  return [
    ensureCounterClockwise([
      add2(a, scale2(n, -h)),
      ...reliefArc(k1, r, add2(k1.corner, scale2(s.axis, -reach))),
      ...reliefArc(k2, r, add2(k2.corner, scale2(n, -reach))),
      add2(a, scale2(n, h)),
    ]),
  ];
}

type Corner = ReturnType<typeof slotInnerCorners>[number];

/** A relief's arc (without the sector's centre), starting at the end nearer `from`. */
function reliefArc(k: Corner, r: number, from: Vec2): Vec2[] {
  const pts = dogBonePolygon(k.corner, k.walls, r).slice(1);
  const first = pts[0] as Vec2;
  const last = pts[pts.length - 1] as Vec2;
  const d = (p: Vec2) => Math.hypot(p[0] - from[0], p[1] - from[1]);
  return d(first) <= d(last) ? pts : pts.reverse();
}

type CornerKey = string;

/**
 * Inserts dog-bone arcs at the slot bottom corners of an already notched outline, replacing each corner
 * vertex by the relief arc from the wall to the bottom. A corner is done this way only where it is safe:
 * the corner is a vertex of the outline, both neighbours lie beyond the arc's ends, and no other edge
 * comes within r of the relief circle's centre. Corners in `skip` are left alone; the keys
 * (`slot:corner`) of the other corners that could not be done are returned in `rest`.
 */
function insertDogBones(
  outline: readonly Vec2[],
  slots: readonly Slot[],
  r: number,
  shape: Polygon,
  skip: ReadonlySet<CornerKey> = new Set(),
): { outline: Vec2[]; rest: CornerKey[] } {
  // The arcs bulge up to CIRCLE_TOLERANCE_MM outside the relief circle (dogBonePolygon).
  const reach = r * Math.SQRT2 + 2 * CIRCLE_TOLERANCE_MM;
  const m = outline.length;
  const replace = new Map<number, Vec2[]>();
  const rest: CornerKey[] = [];
  const tol = 1e-3;
  // Outline vertices by position (a 1 µm grid; a miss falls back to a scan).
  const cell = (x: number, y: number) => Math.round(x * 1e3) * 1e8 + Math.round(y * 1e3);
  const byPosition = new Map<number, number>();
  outline.forEach((p, i) => byPosition.set(cell(p[0], p[1]), i));
  slots.forEach((s, si) => {
    const roomy = 2 * reach < s.width - tol && reach < s.depth - tol;
    slotInnerCorners(s).forEach((k, ci) => {
      const key = `${si}:${ci}`;
      // A corner outside the piece shape has no material to relieve (the slot runs out of a tip).
      if (skip.has(key) || !containsPoint(shape, k.corner)) return;
      let idx = roomy ? (byPosition.get(cell(k.corner[0], k.corner[1])) ?? -1) : -1;
      for (let i = 0; roomy && idx < 0 && i < m; i++) {
        const p = outline[i] as Vec2;
        if (Math.abs(p[0] - k.corner[0]) < tol && Math.abs(p[1] - k.corner[1]) < tol) {
          idx = i;
          break;
        }
      }
      const prev = outline[(idx + m - 1) % m] as Vec2;
      const next = outline[(idx + 1) % m] as Vec2;
      const far = (q: Vec2) => Math.hypot(q[0] - k.corner[0], q[1] - k.corner[1]) > reach + tol;
      let safe = idx >= 0 && !replace.has(idx) && far(prev) && far(next);
      const centre = dogBoneCentre(k.corner, k.walls, r);
      const lim = r + CIRCLE_TOLERANCE_MM + tol;
      for (let i = 0; safe && i < m; i++) {
        if (i === idx || (i + 1) % m === idx) continue;
        const a = outline[i] as Vec2;
        const b = outline[(i + 1) % m] as Vec2;
        // Cheap box test first: most edges are far from the relief.
        if (Math.min(a[0], b[0]) > centre[0] + lim || Math.max(a[0], b[0]) < centre[0] - lim) continue;
        if (Math.min(a[1], b[1]) > centre[1] + lim || Math.max(a[1], b[1]) < centre[1] - lim) continue;
        if (pointSegmentDistance(centre, a, b) < lim) safe = false;
      }
      if (!safe) {
        rest.push(key);
        return;
      }
      replace.set(idx, reliefArc(k, r, prev));
    });
  });
  const out: Vec2[] = [];
  for (let i = 0; i < m; i++) {
    const arc = replace.get(i);
    if (arc) out.push(...arc);
    else out.push(outline[i] as Vec2);
  }
  return { outline: out, rest };
}

/**
 * The nominal outline: the piece shape minus its slots (and, for a router, the dog-bone reliefs). The
 * reliefs are inserted as arcs at the slot corners where that is safe (fast and exact). Corners whose
 * wall leaves the piece within the relief's reach, or that the insertion finds unsafe, are subtracted
 * with Clipper as circle sectors together with the slots. A piece the slots cut apart keeps its plain
 * notches (it is reported as an error and gets no files).
 */
export function notchOutline(shape: Polygon, slots: readonly Slot[], reliefRadius = 0): OutlineResult {
  const base = ensureCounterClockwise(shape);
  const rects = slots.map((s) => ensureCounterClockwise(slotRectangle(s)));
  if (!(reliefRadius > 0) || slots.length === 0) return pickLargest(subtractPolygons(base, rects));
  const reach = reliefRadius * Math.SQRT2;
  // Cut-outs for the corners left to the boolean: the slots plus those corners' relief sectors, each
  // sector's arc run a little past the walls so no vertex lies exactly on a slot edge.
  const cutsFor = (keys: readonly CornerKey[]) => [
    ...rects,
    ...keys.map((key) => {
      const [si, ci] = key.split(':').map(Number) as [number, number];
      const k = at(slotInnerCorners(at(slots, si)), ci);
      return dogBonePolygon(k.corner, k.walls, reliefRadius, 0.05);
    }),
  ];
  let skip: CornerKey[] = [];
  slots.forEach((s, si) =>
    slotInnerCorners(s).forEach((k, ci) => {
      if (!containsPoint(base, k.corner)) return;
      const run = lineIntervals(base, k.corner, k.walls[0]).find((iv) => iv[0] <= 1e-9 && iv[1] > 1e-9);
      if (!run || run[1] < reach + 1e-3) skip.push(`${si}:${ci}`);
    }),
  );
  for (let pass = 0; pass < 2; pass++) {
    const notched = pickLargest(subtractPolygons(base, cutsFor(skip)));
    if (notched.parts !== 1 || notched.holes !== 0) return notched;
    const done = insertDogBones(notched.outline, slots, reliefRadius, base, new Set(skip));
    if (done.rest.length === 0) return { ...notched, outline: done.outline };
    skip = [...skip, ...done.rest];
  }
  return pickLargest(
    subtractPolygons(
      base,
      slots.flatMap((s) => slotCutout(s, reliefRadius)),
    ),
  );
}

/** Laser compensation: the whole outline offset outward by kerf/2 (slots narrow by the kerf), mitred corners. */
export function compensateKerf(outline: Polygon, kerfMm: number): OutlineResult {
  if (kerfMm === 0) return { outline: [...outline], parts: 1, holes: 0 };
  return pickLargest(offsetPolygons([outline], kerfMm / 2, 'miter'));
}

/** Sum of tan(α/2) over the exterior angles α of a polygon (the mitred term of Steiner's formula). */
export function mitreTerm(poly: Polygon): number {
  let s = 0;
  const n = poly.length;
  for (let i = 0; i < n; i++) {
    const a = at(poly, (i + n - 1) % n);
    const b = at(poly, i);
    const c = at(poly, (i + 1) % n);
    const u = normalize2([b[0] - a[0], b[1] - a[1]]);
    const v = normalize2([c[0] - b[0], c[1] - b[1]]);
    const ext = Math.atan2(cross2(u, v), dot2(u, v));
    s += Math.tan(ext / 2);
  }
  return s;
}
