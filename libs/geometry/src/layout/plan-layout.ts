import type { BuiltModel } from '../build';
import { solveColourPlan, type ColourPlan, type ColourRule } from '../colour';
import { compensateKerf } from '../compensation/compensate';
import {
  nestFits,
  nestParts,
  type NestInput,
  type NestResult,
  type NestSheetResult,
  type NestTotals,
} from '../nest';
import { type LengthUnits, lengthText, unitLengthText } from '../math/length-text';

/** How a built model is laid out on stock: sheet size, margin, gap, colours and copies. Lengths in mm. */
export interface LayoutOptions {
  sheet: { widthMm: number; heightMm: number };
  marginMm: number;
  gapMm: number;
  /** Number of stock colours (≥ 1) and the rule that assigns pieces to them (needed when count > 1). */
  colours: { count: number; rule?: ColourRule };
  /** Copies of the whole model. Default 1. */
  quantity?: number;
  /** A colour plan already solved for this model (skips solving it again). */
  colourPlan?: ColourPlan;
}

export type ModelLayout =
  | {
      ok: true;
      /** Null when there is one colour. */
      colourPlan: ColourPlan | null;
      /** Colour index (0-based) per piece id. */
      pieceColour: Record<string, number>;
      sheets: NestSheetResult[];
      totals: NestTotals;
      /** The gap the pieces were laid out with: the one asked for, or the cutter's width if that is wider. */
      gapMm: number;
      /** The margin the pieces were laid out with: the one asked for, or more to keep the cut on the stock. */
      marginMm: number;
    }
  | {
      ok: false;
      code: 'LAYOUT.NO_COLOUR_PLAN' | 'LAYOUT.PIECE_TOO_LARGE' | 'LAYOUT.INVALID';
      message: string;
      pieces: string[];
    };

/** How far apart (mm) the tool paths of two neighbouring router-cut pieces lie at the least. */
export const ROUTER_PATH_SEPARATION_MM = 1;

/**
 * The narrowest gap between pieces the cutter allows:
 *  - laser: the files carry the compensated outline and the beam burns half its kerf on each side of it, so
 *    two neighbours need one kerf between their outlines or the beam cuts into the neighbour;
 *  - router: the files carry the nominal outline and the machine's tool offset puts the bit's whole width
 *    outside it, so two neighbours need a bit diameter, and a little more: at exactly one diameter the two
 *    tool paths coincide and one is traced twice (the time estimate counting it twice). With the paths
 *    ROUTER_PATH_SEPARATION_MM apart, the second only trims the strip between them. (Two diameters would keep
 *    the cuts apart altogether, at half as many sheets again on a model of ours: 6 → 9.)
 */
export function cutterClearanceMm(machine: BuiltModel['spec']['machine']): number {
  return machine.kind === 'router' ? machine.toolDiameterMm + ROUTER_PATH_SEPARATION_MM : machine.kerfMm;
}

/**
 * The narrowest margin the cutter allows. A router's files carry the nominal outline and the tool offset puts
 * the bit's whole width outside it: a margin under one bit diameter runs the bit off the stock's edge and its
 * centre off a bed no larger than the sheet. A laser's files carry the beam path itself (0: the beam may run
 * to the edge, burning half a kerf beyond it, as with any cut at a sheet's edge).
 */
export function cutterMarginMm(machine: BuiltModel['spec']['machine']): number {
  return machine.kind === 'router' ? machine.toolDiameterMm : 0;
}

/**
 * Pieces that fit the sheet inside its margins at no turn, said for the workshop with what would help (the
 * nesting's own message names parts and rotations).
 */
export function pieceTooLargeMessage(
  pieceIds: readonly string[],
  sheet: { widthMm: number; heightMm: number },
  marginMm: number,
): string {
  const shown = pieceIds.slice(0, 4).join(', ');
  const named = pieceIds.length > 4 ? `${shown} and ${pieceIds.length - 4} more` : shown;
  const subject = pieceIds.length === 1 ? `Piece ${named} does` : `Pieces ${named} do`;
  return (
    `${subject} not fit a ${lengthText(sheet.widthMm)} × ${lengthText(sheet.heightMm)} mm sheet inside its ${lengthText(marginMm)} mm margins, ` +
    'however turned: make the model smaller, choose a larger sheet, or fit the size to the sheets'
  );
}

/**
 * What to tell the operator when the cutter's width, not the margin asked for, set the margin (else null).
 * Lengths in the document's units (an inch pack says "0.394 in (10 mm)").
 */
export function marginRaisedNote(
  machine: BuiltModel['spec']['machine'],
  askedMarginMm: number,
  usedMarginMm: number,
  units: LengthUnits = 'mm',
): string | null {
  if (!(usedMarginMm > askedMarginMm) || machine.kind !== 'router') return null;
  const len = (mm: number) => unitLengthText(mm, units);
  return (
    `pieces keep ${len(usedMarginMm)} from the sheet's edges, not ${len(askedMarginMm)}: the ` +
    `${len(machine.toolDiameterMm ?? 0)} bit passes outside each piece and must stay on the stock`
  );
}

/**
 * What to tell the operator when the cutter's width, not the gap asked for, set the spacing (else null).
 * Lengths in the document's units.
 */
export function gapRaisedNote(
  machine: BuiltModel['spec']['machine'],
  askedGapMm: number,
  usedGapMm: number,
  units: LengthUnits = 'mm',
): string | null {
  if (!(usedGapMm > askedGapMm)) return null;
  const len = (mm: number) => unitLengthText(mm, units);
  const cutter =
    machine.kind === 'router'
      ? `the ${len(machine.toolDiameterMm ?? 0)} bit, passing outside both neighbours on separate paths,`
      : `the ${len(machine.kerfMm ?? 0)} kerf`;
  return (
    `pieces are laid out ${len(usedGapMm)} apart, not ${len(askedGapMm)}: ${cutter} needs that much room ` +
    `between neighbours`
  );
}

function envelopeOf(model: BuiltModel, shape: BuiltModel['pieces'][number]['shape']) {
  const machine = model.spec.machine;
  return machine.kind === 'laser' ? compensateKerf(shape, machine.kerfMm).outline : shape;
}

/**
 * Lays a built model's compensated piece outlines onto sheets: solves the colour plan, then nests each
 * colour on its own sheets (true shape, see nest/). Sheet groups are named by colour index ("0", "1", …).
 * Pieces are never laid closer than the cutter's width (cutterClearanceMm), whatever gap is asked for.
 */
export function layoutModel(model: BuiltModel, options: LayoutOptions): ModelLayout {
  const nest = nestingOf(model, options);
  if ('ok' in nest) return nest;
  const { input, colourPlan, pieceColour, gapMm, marginMm } = nest;
  const result: NestResult = nestParts(input);
  if (!result.ok) {
    const tooLarge = result.error.code === 'PART_DOES_NOT_FIT';
    return {
      ok: false,
      code: tooLarge ? 'LAYOUT.PIECE_TOO_LARGE' : 'LAYOUT.INVALID',
      message: tooLarge
        ? pieceTooLargeMessage(result.error.partIds, options.sheet, marginMm)
        : result.error.message,
      pieces: result.error.partIds,
    };
  }
  return { ok: true, colourPlan, pieceColour, sheets: result.sheets, totals: result.totals, gapMm, marginMm };
}

/**
 * Whether layoutModel(model, options) succeeds on at most maxSheets sheets: the same answer, found with
 * less work (nestFits). For searches over the model's size that need the layout only at the size chosen.
 */
export function layoutFits(model: BuiltModel, options: LayoutOptions, maxSheets: number): boolean {
  const nest = nestingOf(model, options);
  return !('ok' in nest) && nestFits(nest.input, maxSheets);
}

/** The nesting layoutModel runs: colour plan, gap, margin and parts; or the layout's error. */
function nestingOf(
  model: BuiltModel,
  options: LayoutOptions,
):
  | Extract<ModelLayout, { ok: false }>
  | {
      input: NestInput;
      colourPlan: ColourPlan | null;
      pieceColour: Record<string, number>;
      gapMm: number;
      marginMm: number;
    } {
  const count = Math.max(1, Math.floor(options.colours.count));
  const ids = model.pieces.map((p) => p.id);
  let colourPlan: ColourPlan | null = null;
  let pieceColour: Record<string, number> = Object.fromEntries(ids.map((id) => [id, 0]));
  if (count > 1) {
    colourPlan =
      options.colourPlan ??
      solveColourPlan({
        faceCount: model.solid.faces.length,
        faceVertices: model.solid.faces.map((f) => f.vertices),
        normals: model.solid.faces.map((f) => f.normal),
        opposite: model.solid.oppositeFaces,
        rule: options.colours.rule ?? 'neighbour-distinct',
        count,
        pieceIds: model.pieces.map((p) => p.id),
        countCap: 0,
      });
    if (!colourPlan.feasible) {
      return {
        ok: false,
        code: 'LAYOUT.NO_COLOUR_PLAN',
        message: colourPlan.message ?? `no plan exists for rule ${colourPlan.rule} with ${count} colours`,
        pieces: [],
      };
    }
    pieceColour = colourPlan.assignment;
  }
  const quantity = Math.max(1, Math.floor(options.quantity ?? 1));
  const gapMm = Math.max(options.gapMm, cutterClearanceMm(model.spec.machine));
  const marginMm = Math.max(options.marginMm, cutterMarginMm(model.spec.machine));
  const input: NestInput = {
    sheet: options.sheet,
    marginMm,
    gapMm,
    parts: model.pieces.map((p) => ({
      id: p.id,
      outline: p.outline,
      quantity,
      group: String(pieceColour[p.id] ?? 0),
      // The piece before slotting, compensated like its outline: pieces that differ only in their slots
      // can then share one lattice pattern.
      envelope: envelopeOf(model, p.shape),
    })),
  };
  return { input, colourPlan, pieceColour, gapMm, marginMm };
}
