/**
 * One sheet as drawn in the cut pack: the cut contours in cut order, the mark strokes (labels and the scale
 * mark) in engraving order, and their estimate. Sheet coordinates: mm, origin at the sheet's lower-left
 * corner, y up.
 */
import { type Vec2 } from '../math/vec';
import { type LabelBox, boxClearOf, boxFitsInside, strokeBounds, strokeText } from '../labels';
import {
  type EstimateMachine,
  type SheetEstimate,
  estimateSheet,
  rotateContour,
  sequenceSheet,
} from '../estimate';

export type Units = 'mm' | 'in';
export const MM_PER_INCH = 25.4;

export interface SheetPart {
  id: string;
  /** Cut outline, sheet coordinates. */
  outline: Vec2[];
  /** Label strokes, sheet coordinates. */
  marks: Vec2[][];
}

export interface ScaleMark {
  /** Length in the file's units and in mm. */
  length: number;
  lengthMm: number;
  label: string;
  from: Vec2;
  to: Vec2;
  /** True when no free place was found on the sheet and the mark sits just below it. */
  offSheet: boolean;
  /** The piece the mark is engraved on, when the sheet has no free place for it but a piece has. */
  onPiece?: string;
}

export interface SheetDrawing {
  /** File name stem, e.g. `sheet-01-saffron`. */
  name: string;
  title: string;
  colourName: string;
  widthMm: number;
  heightMm: number;
  /** Cut contours in cut order, each started at its chosen start vertex; closed (no repeated point). */
  cut: Vec2[][];
  /** Part id of each cut contour. */
  cutIds: string[];
  /** Open polylines to mark, in engraving order. */
  mark: Vec2[][];
  scale: ScaleMark;
  parts: SheetPart[];
  estimate: SheetEstimate;
  warnings: string[];
}

/** Rotates a point about the origin by deg CCW, then translates. */
export function placePoint(p: Vec2, deg: number, x: number, y: number): Vec2 {
  const a = (deg * Math.PI) / 180;
  const c = Math.cos(a);
  const s = Math.sin(a);
  return [p[0] * c - p[1] * s + x, p[0] * s + p[1] * c + y];
}

/** Strokes of a scale mark of `lengthMm` starting at `from`: bar, end ticks and the label above it. */
export function scaleMarkStrokes(mark: Pick<ScaleMark, 'from' | 'lengthMm' | 'label'>): Vec2[][] {
  const [x, y] = mark.from;
  const L = mark.lengthMm;
  const tick = SCALE_TICK_MM;
  const text = strokeText(mark.label, SCALE_TEXT_MM);
  const b = strokeBounds(text);
  const dx = x + L / 2 - (b.x0 + b.x1) / 2;
  const dy = y + tick + 1.5 - b.y0;
  return [
    [
      [x, y + tick],
      [x, y],
      [x + L, y],
      [x + L, y + tick],
    ],
    [
      [x + L / 2, y],
      [x + L / 2, y + tick / 2],
    ],
    ...text.strokes.map((s) => s.map((p) => [p[0] + dx, p[1] + dy] as Vec2)),
  ];
}

const SCALE_TICK_MM = 4;
const SCALE_TEXT_MM = 3.5;
/** Height of the scale mark's box (ticks, gap, label), mm. */
export const SCALE_BOX_HEIGHT_MM = SCALE_TICK_MM + 1.5 + SCALE_TEXT_MM + 0.5;

/** Scale lengths tried, longest first, in the file's units. */
const SCALE_LENGTHS: Record<Units, number[]> = { mm: [100, 50, 20, 10], in: [4, 2, 1, 0.5] };

/**
 * Finds a place for the scale mark, bottom rows first, longest mark first: on free stock inside the sheet's
 * margin, at least `clearMm` from every part and from the sheet's edges (with no margin an engraving on the
 * edge would be half off the stock); else (a sheet filled to its edges, as a fit to sheets can make
 * it) inside a piece, clear of its cut lines by `clearMm` and of its labels; else just below the sheet.
 */
export function placeScaleMark(
  sheet: { widthMm: number; heightMm: number },
  marginMm: number,
  parts: readonly (Pick<SheetPart, 'outline'> & Partial<Pick<SheetPart, 'id' | 'marks'>>)[],
  units: Units,
  clearMm: number,
): ScaleMark {
  const bounds = (pts: readonly Vec2[]) => {
    const xs = pts.map((q) => q[0]);
    const ys = pts.map((q) => q[1]);
    return [Math.min(...xs), Math.min(...ys), Math.max(...xs), Math.max(...ys)] as const;
  };
  const boxes = parts.map((p) => bounds(p.outline));
  const labelOf = (length: number) => (units === 'in' ? `${length} IN` : `${length} MM`);
  const mmOf = (length: number) => (units === 'in' ? length * MM_PER_INCH : length);
  /**
   * The mark's box width: the bar or its label, whichever is wider ("10 MM" is wider than its bar), and 1 mm to
   * spare; scaleMarkStrokes centres both on the bar, so the bar is centred in the box.
   */
  const boxWidth = (length: number) => {
    const b = strokeBounds(strokeText(labelOf(length), SCALE_TEXT_MM));
    return Math.max(mmOf(length), b.x1 - b.x0) + 1;
  };
  /** The bar's left end for a box with its lower-left corner at (x, y). */
  const barAt = (length: number, x: number, y: number): Vec2 => [
    x + (boxWidth(length) - mmOf(length)) / 2,
    y,
  ];
  const mark = (length: number, from: Vec2, extra: Partial<ScaleMark> = {}): ScaleMark => {
    const lengthMm = mmOf(length);
    return {
      length,
      lengthMm,
      label: labelOf(length),
      from,
      to: [from[0] + lengthMm, from[1]],
      offSheet: false,
      ...extra,
    };
  };
  const h = SCALE_BOX_HEIGHT_MM;
  /** The mark's box with its lower-left corner at (x, y). */
  const boxAt = (x: number, y: number, w: number): LabelBox => ({
    centre: [x + w / 2, y + h / 2],
    angleDeg: 0,
    halfW: w / 2,
    halfH: h / 2,
  });
  const step = 5;
  const inset = Math.max(marginMm, clearMm);
  for (const length of SCALE_LENGTHS[units]) {
    const w = boxWidth(length);
    for (let y = inset; y + h <= sheet.heightMm - inset + 1e-9; y += step) {
      for (let x = inset; x + w <= sheet.widthMm - inset + 1e-9; x += step) {
        const box = boxAt(x, y, w);
        const clear = parts.every((p, i) => {
          const b = boxes[i]!;
          if (b[0] > x + w + clearMm || b[2] < x - clearMm || b[1] > y + h + clearMm || b[3] < y - clearMm) {
            return true;
          }
          return boxClearOf(p.outline, box, clearMm);
        });
        if (clear) return mark(length, barAt(length, x, y));
      }
    }
  }
  // Inside a piece: away from its cut lines and from every label stroke (grown by a millimetre).
  const strokeBoxes = parts.flatMap((p) => (p.marks ?? []).map(bounds));
  const order = parts.map((_, i) => i).sort((a, b) => area(boxes[b]!) - area(boxes[a]!));
  const fine = 2.5;
  for (const length of SCALE_LENGTHS[units]) {
    const w = boxWidth(length);
    for (const i of order) {
      const [x0, y0, x1, y1] = boxes[i]!;
      for (let y = y0; y + h <= y1 + 1e-9; y += fine)
        for (let x = x0; x + w <= x1 + 1e-9; x += fine) {
          if (!boxFitsInside(parts[i]!.outline, boxAt(x, y, w), clearMm)) continue;
          const hitsLabel = strokeBoxes.some(
            (b) => b[0] < x + w + 1 && b[2] > x - 1 && b[1] < y + h + 1 && b[3] > y - 1,
          );
          if (!hitsLabel) return mark(length, barAt(length, x, y), { onPiece: parts[i]!.id ?? `#${i + 1}` });
        }
    }
  }
  return mark(SCALE_LENGTHS[units][1]!, [marginMm, -SCALE_BOX_HEIGHT_MM - 2], { offSheet: true });
}

function area(b: readonly [number, number, number, number]): number {
  return (b[2] - b[0]) * (b[3] - b[1]);
}

/** Assembles a sheet: scale mark, working order (marks first, then cuts inner-first) and the estimate. */
export function drawSheet(args: {
  name: string;
  title: string;
  colourName: string;
  sheet: { widthMm: number; heightMm: number };
  marginMm: number;
  clearMm: number;
  parts: SheetPart[];
  units: Units;
  machine: EstimateMachine;
}): SheetDrawing {
  const warnings: string[] = [];
  const scale = placeScaleMark(args.sheet, args.marginMm, args.parts, args.units, args.clearMm);
  if (scale.offSheet)
    warnings.push(`${args.name}: no free place on the sheet for the scale mark; it lies below the sheet`);
  else if (scale.onPiece)
    warnings.push(
      `${args.name}: no free stock for the scale mark; it is engraved on piece ${scale.onPiece} instead`,
    );
  const cutAll = args.parts.map((p) => p.outline);
  const markAll = [...scaleMarkStrokes(scale), ...args.parts.flatMap((p) => p.marks)].filter(
    (s) => s.length >= 2,
  );
  const seq = sequenceSheet({ cut: cutAll, mark: markAll });
  const cut = seq.cut.order.map((i) => rotateContour(cutAll[i]!, seq.cut.startIndex[i]!));
  const cutIds = seq.cut.order.map((i) => args.parts[i]!.id);
  const mark = seq.marks.map((m) => {
    const s = markAll[m.index]!;
    return m.reversed ? [...s].reverse() : s;
  });
  const estimate = estimateSheet({ cut, mark }, args.machine);
  return {
    name: args.name,
    title: args.title,
    colourName: args.colourName,
    widthMm: args.sheet.widthMm,
    heightMm: args.sheet.heightMm,
    cut,
    cutIds,
    mark,
    scale,
    parts: args.parts,
    estimate,
    warnings,
  };
}
