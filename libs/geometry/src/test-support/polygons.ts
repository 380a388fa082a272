import type * as polygonClipping from 'polygon-clipping';

/** Plain polygon helpers for the tests' independent checks (no code of the library under test). */
export type P = [number, number];

/** Regular {n/k} polygon (k = 1) or star outline of circumradius R, first vertex at angle startDeg. */
export function regular(n: number, R: number, startDeg = 90): P[] {
  return Array.from({ length: n }, (_, i) => {
    const a = ((startDeg + (360 * i) / n) * Math.PI) / 180;
    return [R * Math.cos(a), R * Math.sin(a)] as P;
  });
}

/** Outline of the star {n/k}: 2n vertices alternating between the tips and the inner crossing points. */
export function star(n: number, k: number, R: number): P[] {
  const inner = (R * Math.cos((Math.PI * k) / n)) / Math.cos((Math.PI * (k - 1)) / n);
  return Array.from({ length: 2 * n }, (_, i) => {
    const r = i % 2 === 0 ? R : inner;
    const a = Math.PI / 2 + (Math.PI * i) / n;
    return [r * Math.cos(a), r * Math.sin(a)] as P;
  });
}

export function area(poly: P[]): number {
  let s = 0;
  for (let i = 0; i < poly.length; i++) {
    const a = poly[i]!;
    const b = poly[(i + 1) % poly.length]!;
    s += a[0] * b[1] - b[0] * a[1];
  }
  return Math.abs(s) / 2;
}

export function placed(outline: P[], x: number, y: number, deg: number): P[] {
  const t = (deg * Math.PI) / 180;
  return outline.map(([px, py]) => [
    px * Math.cos(t) - py * Math.sin(t) + x,
    px * Math.sin(t) + py * Math.cos(t) + y,
  ]);
}

export function mpArea(mp: polygonClipping.MultiPolygon): number {
  let s = 0;
  for (const poly of mp) poly.forEach((ring, i) => (s += (i === 0 ? 1 : -1) * area(ring as P[])));
  return s;
}

export function segDist(p: P, q: P, a: P, b: P): number {
  const pd = (pt: P, s: P, e: P) => {
    const dx = e[0] - s[0];
    const dy = e[1] - s[1];
    const l2 = dx * dx + dy * dy;
    const t = l2 === 0 ? 0 : Math.max(0, Math.min(1, ((pt[0] - s[0]) * dx + (pt[1] - s[1]) * dy) / l2));
    return Math.hypot(pt[0] - s[0] - t * dx, pt[1] - s[1] - t * dy);
  };
  return Math.min(pd(p, a, b), pd(q, a, b), pd(a, p, q), pd(b, p, q));
}

export function boundaryDistance(A: P[], B: P[]): number {
  let d = Infinity;
  for (let i = 0; i < A.length; i++)
    for (let j = 0; j < B.length; j++)
      d = Math.min(d, segDist(A[i]!, A[(i + 1) % A.length]!, B[j]!, B[(j + 1) % B.length]!));
  return d;
}

export function box(p: P[]) {
  const xs = p.map((q) => q[0]);
  const ys = p.map((q) => q[1]);
  return { minX: Math.min(...xs), maxX: Math.max(...xs), minY: Math.min(...ys), maxY: Math.max(...ys) };
}
