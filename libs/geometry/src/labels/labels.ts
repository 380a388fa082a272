/**
 * Assembly labels on the mark layer: each piece's id and colour, and beside each slot the id of the piece
 * that goes into it, in single-stroke text. Everything is in the piece's own 2D frame (mm, y up); a label
 * is placed only where its box, grown by the clearance, lies wholly inside the cut outline, so no stroke
 * crosses or touches a cut line (slots are notches of the outline, so slots are kept clear too). Text is
 * shrunk until it fits; a label that fits nowhere is skipped with a warning.
 */
import { type Vec2 } from '../math/vec';
import { containsPoint, pointSegmentDistance } from '../math/polygon';
import { type LabelBox, boxFitsInside, boxesOverlap } from './fit';
import { strokeBounds, strokeText } from './stroke-font';

/** What labelling needs of a piece (a BuiltPiece has all of it). */
export interface LabelPieceInput {
  id: string;
  /** The cut outline (compensated), counter-clockwise, mm. */
  outline: readonly Vec2[];
  slots: readonly { partner: string; end: Vec2; axis: Vec2; depthMm: number; widthMm: number }[];
}

export interface LabelOptions {
  /** Colour name printed after the id (omit for one-colour jobs). */
  colourName?: string;
  /** Least distance from any stroke to the cut outline, mm. Default 1. */
  clearanceMm?: number;
  /** Largest and smallest cap height of the piece label, mm. Defaults 8 and 1.5. */
  maxHeightMm?: number;
  minHeightMm?: number;
  /** Largest cap height of a slot label, mm. Default 5. */
  maxSlotHeightMm?: number;
}

export interface PlacedLabel {
  kind: 'piece' | 'slot';
  text: string;
  heightMm: number;
  /** The text's box (ink extent) in the piece frame. */
  box: LabelBox;
  /** Open polylines to engrave, piece frame, mm. */
  strokes: Vec2[][];
}

export interface PieceLabels {
  pieceId: string;
  labels: PlacedLabel[];
  warnings: string[];
}

const SHRINK = 0.85;

/** Text strokes centred on the origin, with their half extents. */
function centredText(text: string, h: number): { strokes: Vec2[][]; halfW: number; halfH: number } {
  const t = strokeText(text, h);
  const b = strokeBounds(t);
  const cx = (b.x0 + b.x1) / 2;
  const cy = (b.y0 + b.y1) / 2;
  return {
    strokes: t.strokes.map((s) => s.map((p) => [p[0] - cx, p[1] - cy] as Vec2)),
    halfW: Math.max((b.x1 - b.x0) / 2, 1e-3),
    halfH: Math.max((b.y1 - b.y0) / 2, 1e-3),
  };
}

function place(strokes: readonly (readonly Vec2[])[], box: LabelBox): Vec2[][] {
  const a = (box.angleDeg * Math.PI) / 180;
  const c = Math.cos(a);
  const s = Math.sin(a);
  return strokes.map((st) =>
    st.map((p) => [box.centre[0] + p[0] * c - p[1] * s, box.centre[1] + p[0] * s + p[1] * c] as Vec2),
  );
}

/** Distance from q to the polygon's boundary. */
function edgeDistance(poly: readonly Vec2[], q: Vec2): number {
  let best = Infinity;
  for (let i = 0; i < poly.length; i++) {
    best = Math.min(best, pointSegmentDistance(q, poly[i] as Vec2, poly[(i + 1) % poly.length] as Vec2));
  }
  return best;
}

/** Candidate centres for the piece label: a grid over the outline, deepest inside first. */
function pieceCandidates(poly: readonly Vec2[]): Vec2[] {
  const xs = poly.map((p) => p[0]);
  const ys = poly.map((p) => p[1]);
  const [x0, x1, y0, y1] = [Math.min(...xs), Math.max(...xs), Math.min(...ys), Math.max(...ys)];
  const n = 20;
  const pts: { p: Vec2; d: number }[] = [];
  for (let i = 1; i < n; i++)
    for (let j = 1; j < n; j++) {
      const p: Vec2 = [x0 + ((x1 - x0) * i) / n, y0 + ((y1 - y0) * j) / n];
      if (containsPoint(poly, p)) pts.push({ p, d: edgeDistance(poly, p) });
    }
  pts.sort((a, b) => b.d - a.d || a.p[0] - b.p[0] || a.p[1] - b.p[1]);
  return pts.map((x) => x.p);
}

/** Reading angle: text never upside down. */
function readable(angleDeg: number): number {
  let a = ((angleDeg % 360) + 360) % 360;
  if (a > 90 && a <= 270) a -= 180;
  if (a > 270) a -= 360;
  return a;
}

/**
 * A label's strokes (piece frame) for a piece that will be turned by `turnDeg` on the sheet: as they are, or
 * given a half turn about the box's centre when the turn would leave the text upside down. The box is
 * symmetric about its centre, so the half-turned text stays inside it and keeps its clearances.
 */
export function uprightStrokes(label: PlacedLabel, turnDeg: number): Vec2[][] {
  const a = (((label.box.angleDeg + turnDeg) % 360) + 360) % 360;
  if (!(a > 90 && a <= 270)) return label.strokes; // the rule of readable()
  const [cx, cy] = label.box.centre;
  return label.strokes.map((st) => st.map((p) => [2 * cx - p[0], 2 * cy - p[1]] as Vec2));
}

/**
 * Places a piece's labels: first its own (id and colour), then one per slot with the partner's id near
 * the slot's mouth, beside the slot, reading along it. Deterministic.
 */
export function labelPiece(piece: LabelPieceInput, options: LabelOptions = {}): PieceLabels {
  const clearance = options.clearanceMm ?? 1;
  const maxH = options.maxHeightMm ?? 8;
  const minH = options.minHeightMm ?? 1.5;
  const maxSlotH = options.maxSlotHeightMm ?? 5;
  const poly = piece.outline;
  const labels: PlacedLabel[] = [];
  const warnings: string[] = [];
  const free = (box: LabelBox) =>
    boxFitsInside(poly, box, clearance) && labels.every((l) => !boxesOverlap(l.box, box, clearance));

  const pieceText = options.colourName ? `${piece.id} ${options.colourName}` : piece.id;
  const centres = pieceCandidates(poly);
  let placed: PlacedLabel | null = null;
  for (let h = maxH; h >= minH - 1e-9 && !placed; h *= SHRINK) {
    const t = centredText(pieceText, h);
    for (const centre of centres) {
      for (const angleDeg of [0, 90]) {
        const box: LabelBox = { centre, angleDeg, halfW: t.halfW, halfH: t.halfH };
        if (free(box)) {
          placed = { kind: 'piece', text: pieceText, heightMm: h, box, strokes: place(t.strokes, box) };
          break;
        }
      }
      if (placed) break;
    }
  }
  if (placed) labels.push(placed);
  else {
    // A partner's id alone on the piece would be read as the piece's own: leave them off too.
    const partners = piece.slots.length > 0 ? '; its slot labels are left off so none is read as its id' : '';
    warnings.push(`no room for the label "${pieceText}" on ${piece.id}${partners}`);
    return { pieceId: piece.id, labels, warnings };
  }

  // A star crossing a star can hold several slots for one partner: one note per partner, with a count.
  const unlabelled = new Map<string, number>();
  for (const s of piece.slots) {
    const found = labelSlot(s, maxSlotH, minH, clearance, free);
    if (found) labels.push(found);
    else unlabelled.set(s.partner, (unlabelled.get(s.partner) ?? 0) + 1);
  }
  for (const [partner, n] of unlabelled) {
    const of = piece.slots.filter((s) => s.partner === partner).length;
    const which =
      of === 1
        ? `${piece.id}'s slot`
        : n === of
          ? `${piece.id}'s ${n} slots`
          : `${n} of ${piece.id}'s ${of} slots`;
    warnings.push(`no room for the label "${partner}" beside ${which} for ${partner}`);
  }
  return { pieceId: piece.id, labels, warnings };
}

/** Extra distance (mm) of a slot label from the slot beyond the clearance. */
const SLOT_SLACK_MM = 0.01;

function labelSlot(
  s: LabelPieceInput['slots'][number],
  maxH: number,
  minH: number,
  clearance: number,
  free: (box: LabelBox) => boolean,
): PlacedLabel | null {
  const [ax, ay] = s.axis;
  const n: Vec2 = [-ay, ax];
  const angleDeg = readable((Math.atan2(ay, ax) * 180) / Math.PI);
  for (let h = maxH; h >= minH - 1e-9; h *= SHRINK) {
    const t = centredText(s.partner, h);
    // Reading along the slot: the box's x runs along the axis, its y across.
    // A hair more than the clearance from the slot's walls and bottom: a router's slot is drawn at its full
    // width, so a box exactly at the clearance would be accepted or refused by rounding.
    const across = s.widthMm / 2 + clearance + SLOT_SLACK_MM + t.halfH;
    const candidates: Vec2[] = [];
    for (const f of [0.5, 0.3, 0.7, 0.15, 0.9]) {
      const along = Math.max(t.halfW + clearance, s.depthMm * f);
      for (const side of [1, -1]) {
        candidates.push([
          s.end[0] + ax * along + n[0] * side * across,
          s.end[1] + ay * along + n[1] * side * across,
        ]);
      }
    }
    // Past the slot's bottom, on its axis.
    const beyond = s.depthMm + clearance + SLOT_SLACK_MM + t.halfW;
    candidates.push([s.end[0] + ax * beyond, s.end[1] + ay * beyond]);
    for (const centre of candidates) {
      const box: LabelBox = { centre, angleDeg, halfW: t.halfW, halfH: t.halfH };
      if (free(box))
        return { kind: 'slot', text: s.partner, heightMm: h, box, strokes: place(t.strokes, box) };
    }
  }
  return null;
}
