import { type Vec2, toRad } from '../math/vec';
import { type Polygon, convexHull2 } from '../math/polygon';

/** Sweep step and refinement of bestFitRatio, degrees. */
export const FIT_SWEEP_STEP_DEG = 0.5;

/** max(w/W, h/H) of the points' bounding box after turning them by `deg` counter-clockwise. */
function ratioAt(hull: readonly Vec2[], widthMm: number, heightMm: number, deg: number): number {
  const a = toRad(deg);
  const c = Math.cos(a);
  const s = Math.sin(a);
  let x0 = Infinity;
  let x1 = -Infinity;
  let y0 = Infinity;
  let y1 = -Infinity;
  for (const p of hull) {
    const x = p[0] * c - p[1] * s;
    const y = p[0] * s + p[1] * c;
    if (x < x0) x0 = x;
    if (x > x1) x1 = x;
    if (y < y0) y0 = y;
    if (y > y1) y1 = y;
  }
  return Math.max((x1 - x0) / widthMm, (y1 - y0) / heightMm);
}

/**
 * How tightly a contour fits a width × height rectangle at its best orientation: the least, over turns θ
 * (degrees, counter-clockwise), of max(bounding-box width ÷ widthMm, height ÷ heightMm). The contour fits
 * when the ratio is ≤ 1; scaling the contour by 1/ratio makes it just fit. Method: every 0.5° over half a
 * turn (a half turn gives the same box), then a golden-section search within ±0.5° of the four best
 * samples (to 1e-7°). Works on the convex hull (the box of a contour is the box of its hull).
 */
export function bestFitRatio(
  outline: Polygon,
  widthMm: number,
  heightMm: number,
): { ratio: number; angleDeg: number } {
  const hull = convexHull2(outline);
  if (hull.length === 0) return { ratio: 0, angleDeg: 0 };
  // An empty rectangle (a bed no wider than a router's bit, less the bit) holds nothing: without this the
  // ratios of a negative width came out negative, and a piece "fitted" it.
  if (!(widthMm > 0 && heightMm > 0)) return { ratio: Infinity, angleDeg: 0 };
  const samples: { deg: number; r: number }[] = [];
  for (let k = 0; k * FIT_SWEEP_STEP_DEG < 180; k++) {
    const deg = k * FIT_SWEEP_STEP_DEG;
    samples.push({ deg, r: ratioAt(hull, widthMm, heightMm, deg) });
  }
  samples.sort((p, q) => p.r - q.r);
  let best = samples[0] as { deg: number; r: number };
  const g = (Math.sqrt(5) - 1) / 2;
  for (const s of samples.slice(0, 4)) {
    let a = s.deg - FIT_SWEEP_STEP_DEG;
    let b = s.deg + FIT_SWEEP_STEP_DEG;
    let c = b - g * (b - a);
    let d = a + g * (b - a);
    let fc = ratioAt(hull, widthMm, heightMm, c);
    let fd = ratioAt(hull, widthMm, heightMm, d);
    while (b - a > 1e-7) {
      if (fc < fd) {
        b = d;
        d = c;
        fd = fc;
        c = b - g * (b - a);
        fc = ratioAt(hull, widthMm, heightMm, c);
      } else {
        a = c;
        c = d;
        fc = fd;
        d = a + g * (b - a);
        fd = ratioAt(hull, widthMm, heightMm, d);
      }
    }
    const deg = (a + b) / 2;
    const r = ratioAt(hull, widthMm, heightMm, deg);
    if (r < best.r) best = { deg, r };
  }
  return { ratio: best.r, angleDeg: ((best.deg % 180) + 180) % 180 };
}
