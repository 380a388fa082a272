/**
 * Fit-test coupon: two strips of the job's stock. C1 tests the design's steepest crossing angle, C2 its
 * shallowest. Each strip has, opening from its top edge, a graded series of slots around the computed
 * width for its angle (default −0.15 … +0.15 mm in 0.05 mm steps), each width engraved beside its slot,
 * and, opening from its bottom edge near the right end, one key slot at the computed width for the other
 * strip's angle. To test C1: slide C2's key slot into each of C1's graded slots at C1's angle (and the
 * reverse for C2); the best fit tells the operator which allowance to use. Slot widths follow the design:
 * nominal t·cot(θ/2) (or t + fit for flexible stock) plus the fit allowance, then the machine compensation.
 * Piece frame: mm, strip's lower-left corner at the origin, y up.
 */
import { type Vec2 } from '../math/vec';
import { type BuiltModel } from '../build';
import { MIN_DRAWN_SLOT_MM, type Slot, nominalSlotWidth, slotCuttable, slotRectangle } from '../slots/slots';
import { compensateKerf, notchOutline } from '../compensation/compensate';
import { labelPiece } from '../labels';
import { type EstimateMachine } from '../estimate';
import {
  SCALE_BOX_HEIGHT_MM,
  type SheetDrawing,
  type SheetPart,
  type Units,
  drawSheet,
  placePoint,
} from './sheet-drawing';
import { cutterClearanceMm, cutterMarginMm } from '../layout/plan-layout';
import { lengthText, unitSizeText } from '../math/length-text';

export interface CouponOptions {
  /** Offsets from the computed width, mm. Default −0.15 … +0.15 in 0.05 steps. */
  offsetsMm?: readonly number[];
  /**
   * The machine's bed, mm. A coupon larger than the bed either way round loses its outermost graded slots (the
   * offsets farthest from the computed width) until it fits, with a warning; one that still does not fit is
   * warned about.
   */
  bed?: { widthMm: number; heightMm: number };
}

export interface CouponStrip {
  id: string;
  angleDeg: number;
  /** Computed slot width (nominal + fit) for the angle, mm. */
  widthMm: number;
  /** Graded slot widths as engraved (before machine compensation), left to right. */
  seriesMm: number[];
  /** Width of the key slot (the other strip's computed width). */
  keyWidthMm: number;
  outline: Vec2[];
  marks: Vec2[][];
  lengthMm: number;
  heightMm: number;
}

export interface Coupon {
  strips: [CouponStrip, CouponStrip];
  drawing: SheetDrawing;
  warnings: string[];
}

export const DEFAULT_COUPON_OFFSETS = [-0.15, -0.1, -0.05, 0, 0.05, 0.1, 0.15];

const r2 = (x: number) => Math.round(x * 100) / 100;

function makeSlot(end: Vec2, axis: Vec2, depth: number, width: number): Slot {
  const s: Slot = {
    crossing: -1,
    piece: 0,
    partner: 0,
    end,
    axis,
    depth,
    width,
    lead: 1,
    inner: [],
    bounds: { cx: end[0] + (axis[0] * depth) / 2, cy: end[1] + (axis[1] * depth) / 2, r: depth + width },
  };
  s.inner = slotRectangle(s, false);
  return s;
}

/** Whether a drawing of w × h fits the bed one way round or the other. */
const fitsBed = (w: number, h: number, bed: { widthMm: number; heightMm: number }) =>
  (w <= bed.widthMm + 1e-9 && h <= bed.heightMm + 1e-9) ||
  (h <= bed.widthMm + 1e-9 && w <= bed.heightMm + 1e-9);

/**
 * Builds the coupon for a built model (its stock, fit allowance and machine), laid out on a small sheet that
 * fits the machine's bed when one is given (see CouponOptions.bed).
 */
export function buildCoupon(
  model: BuiltModel,
  units: Units,
  machine: EstimateMachine,
  options: CouponOptions = {},
): Coupon {
  const offsets = [...(options.offsetsMm ?? DEFAULT_COUPON_OFFSETS)];
  let coupon = couponWith(model, units, machine, offsets);
  const bed = options.bed;
  if (!bed || !(bed.widthMm > 0 && bed.heightMm > 0)) return coupon;
  const fits = () => fitsBed(coupon.drawing.widthMm, coupon.drawing.heightMm, bed);
  const dropped: number[] = [];
  while (!fits() && offsets.length > 1) {
    // The offset farthest from the computed width goes first (the wider one when two are as far).
    let k = 0;
    offsets.forEach((o, i) => {
      const far = Math.abs(o) - Math.abs(offsets[k]!);
      if (far > 1e-9 || (Math.abs(far) <= 1e-9 && o > offsets[k]!)) k = i;
    });
    dropped.push(...offsets.splice(k, 1));
    coupon = couponWith(model, units, machine, offsets);
  }
  const size = (w: number, h: number) => unitSizeText(w, h, units).replace(/ x /g, ' × ');
  const bedText = size(bed.widthMm, bed.heightMm);
  const notes: string[] = [];
  if (!fits()) {
    // Nothing is gained by leaving slots out: the coupon keeps its whole series.
    coupon = couponWith(model, units, machine, options.offsetsMm ?? DEFAULT_COUPON_OFFSETS);
    notes.push(
      `the coupon is ${size(coupon.drawing.widthMm, coupon.drawing.heightMm)}, larger than the machine's ` +
        `${bedText} bed, and would be even with one graded slot per strip: test the fit on a larger machine`,
    );
  } else if (dropped.length > 0)
    notes.push(
      `coupon: the graded slot${dropped.length > 1 ? 's' : ''} at ${dropped
        .sort((a, b) => a - b)
        .map((o) => `${o > 0 ? '+' : ''}${o.toFixed(2)}`)
        .join(
          ', ',
        )} mm from the computed width ${dropped.length > 1 ? 'are' : 'is'} left out so that the coupon ` +
        `fits the machine's ${bedText} bed`,
    );
  return { ...coupon, warnings: [...notes, ...coupon.warnings] };
}

function couponWith(
  model: BuiltModel,
  units: Units,
  machine: EstimateMachine,
  offsets: readonly number[],
): Coupon {
  const spec = model.spec;
  const t = spec.stock.thicknessMm;
  const angles = model.crossings.map((c) => c.angleDeg);
  const steep = angles.length ? Math.max(...angles) : 90;
  const shallow = angles.length ? Math.min(...angles) : 90;
  const widthFor = (deg: number) => nominalSlotWidth(t, deg, spec.stock.flexible) + spec.fitMm;
  // Widths are engraved to 0.01 mm: cut exactly what is engraved.
  const wSteep = r2(widthFor(steep));
  const wShallow = r2(widthFor(shallow));
  const removed = spec.machine.kind === 'laser' ? spec.machine.kerfMm : 0;
  const toolMm = spec.machine.kind === 'router' ? spec.machine.toolDiameterMm : 0;
  const reliefR = toolMm / 2;
  const maxW = Math.max(wSteep, wShallow) + Math.max(0, ...offsets);
  const height = Math.max(30, 2 * (maxW + 10), 6 * t);
  const depth = height / 2;
  const pitch = maxW + 11;
  const margin = 6;
  const warnings: string[] = [];

  const strip = (id: string, angleDeg: number, w: number, keyW: number): CouponStrip => {
    // A laser slot must stay wider than the kerf; a router cannot cut a slot narrower than its bit.
    const all = offsets.map((o) => r2(w + o));
    const series = all.filter((x) => slotCuttable(x, spec.machine));
    if (series.length < all.length)
      warnings.push(
        `coupon ${id}: slots ${toolMm > 0 ? `narrower than the ${lengthText(toolMm)} mm bit` : `not wider than the ${lengthText(removed)} mm kerf by ${MIN_DRAWN_SLOT_MM} mm`} are left out (` +
          all
            .filter((x) => !series.includes(x))
            .map((x) => x.toFixed(2))
            .join(', ') +
          ' mm)',
      );
    const length = 2 * margin + (series.length + 1) * pitch + keyW;
    const slots = series.map((sw, i) => makeSlot([margin + pitch * (i + 0.5), height], [0, -1], depth, sw));
    const key = makeSlot([length - margin - pitch / 2, 0], [0, 1], depth, keyW);
    const shape: Vec2[] = [
      [0, 0],
      [length, 0],
      [length, height],
      [0, height],
    ];
    const notched = notchOutline(shape, [...slots, key], reliefR);
    const outline =
      spec.machine.kind === 'laser'
        ? compensateKerf(notched.outline, spec.machine.kerfMm).outline
        : notched.outline;
    const labelled = labelPiece(
      {
        // Widths are in mm whatever the drawing units (the fit record takes mm): the label says so.
        id: `${id} ${r2(angleDeg).toFixed(1)} DEG, MM`,
        outline,
        slots: [
          ...series.map((sw, i) => ({
            partner: sw.toFixed(2),
            end: slots[i]!.end,
            axis: slots[i]!.axis,
            depthMm: depth,
            widthMm: sw,
          })),
          {
            partner: `KEY ${r2(keyW).toFixed(2)}`,
            end: key.end,
            axis: key.axis,
            depthMm: depth,
            widthMm: keyW,
          },
        ],
      },
      { clearanceMm: 0.8 + removed / 2, maxHeightMm: 4, maxSlotHeightMm: 3, minHeightMm: 1.2 },
    );
    warnings.push(...labelled.warnings.map((x) => `coupon: ${x}`));
    return {
      id,
      angleDeg,
      widthMm: w,
      seriesMm: series,
      keyWidthMm: keyW,
      outline,
      marks: labelled.labels.flatMap((l) => l.strokes),
      lengthMm: length,
      heightMm: height,
    };
  };
  const c1 = strip('C1', steep, wSteep, wShallow);
  const c2 = strip('C2', shallow, wShallow, wSteep);
  const sheetMargin = 5;
  // Spaced as a sheet's pieces are (layout/plan-layout): a router's files carry the nominal outline and its bit
  // runs outside it, so the strips keep a bit diameter and 1 mm apart, a bit diameter from the coupon's edges,
  // and the scale mark as far from them as the pieces of a sheet keep from each other. A beam needs less than
  // the 6 mm (gap) and 2 mm (scale mark) a laser coupon keeps.
  const clearMm = Math.max(2, cutterClearanceMm(spec.machine));
  const gap = Math.max(6, clearMm);
  const inset = Math.max(sheetMargin + 1, cutterMarginMm(spec.machine));
  // The scale mark sits in a band below the strips: from max(margin, clearance) up, then clear of C1.
  // (1 mm to spare: the mark's places are tried on a 5 mm grid and a box exactly at the clearance counts as touching).
  const stripBottom = Math.max(
    sheetMargin + 19,
    Math.max(sheetMargin, clearMm) + SCALE_BOX_HEIGHT_MM + clearMm + 1,
  );
  const shortestMarkMm = units === 'in' ? 2 * 25.4 + 2 : 52;
  const widthMm = Math.max(
    Math.max(c1.lengthMm, c2.lengthMm) + 2 * inset,
    shortestMarkMm + 2 * Math.max(sheetMargin, clearMm) + 2,
  );
  const heightMm = stripBottom + 2 * height + gap + inset;
  const parts: SheetPart[] = [c1, c2].map((s, i) => {
    const dy = stripBottom + i * (height + gap);
    return {
      id: s.id,
      outline: s.outline.map((p) => placePoint(p, 0, inset, dy)),
      marks: s.marks.map((m) => m.map((p) => placePoint(p, 0, inset, dy))),
    };
  });
  const drawing = drawSheet({
    name: 'coupon',
    title: `Fit-test coupon: C1 ${r2(steep)} deg, C2 ${r2(shallow)} deg`,
    colourName: '',
    sheet: { widthMm, heightMm },
    marginMm: sheetMargin,
    clearMm,
    parts,
    units,
    machine,
  });
  return { strips: [c1, c2], drawing, warnings: [...warnings, ...drawing.warnings] };
}
