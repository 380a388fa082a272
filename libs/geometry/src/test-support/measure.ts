import type { Vec2 } from '../math/vec';

export type Segment = readonly [Vec2, Vec2];

export const segmentsOf = (poly: readonly Vec2[]): Segment[] =>
  poly.map((p, i) => [p, poly[(i + 1) % poly.length] as Vec2] as const);

/**
 * Measures a slot's width from drawn geometry: among the segments parallel to the slot's axis that lie
 * within the slot's band (opening to bottom), the spread of their offsets across the axis.
 */
export function measureSlotWidth(
  segments: readonly Segment[],
  slot: { end: Vec2; axis: Vec2; depthMm: number; widthMm: number },
): number | null {
  const [ax, ay] = slot.axis;
  const nx = -ay;
  const ny = ax;
  const offsets: number[] = [];
  for (const [p, q] of segments) {
    const dx = q[0] - p[0];
    const dy = q[1] - p[1];
    const len = Math.hypot(dx, dy);
    // Walls only: long segments parallel to the axis (short chords of relief arcs can be parallel too).
    if (len < Math.min(0.5, slot.depthMm / 4) || Math.abs(dx * ay - dy * ax) > 3e-4) continue;
    const mx = (p[0] + q[0]) / 2 - slot.end[0];
    const my = (p[1] + q[1]) / 2 - slot.end[1];
    const along = mx * ax + my * ay;
    const across = mx * nx + my * ny;
    if (along > 0 && along < slot.depthMm && Math.abs(across) <= slot.widthMm) offsets.push(across);
  }
  if (offsets.length < 2) return null;
  return Math.max(...offsets) - Math.min(...offsets);
}
