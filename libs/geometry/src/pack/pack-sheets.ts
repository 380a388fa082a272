/**
 * The sheets of a cut pack as drawn (pieces placed, labels engraved, scale mark, working order) and the job's
 * estimate from them. Shared by the cut pack and by job preparation, so the time and cost a job is approved on
 * are the figures its setup sheet prints.
 */
import type { CutPackEstimate, CutPackInput, JobPreparation } from '@kerfwright/contracts';
import { type BuiltModel } from '../build';
import { type EstimateMachine, estimateJob, withCutter } from '../estimate';
import { type PieceLabels, labelPiece, uprightStrokes } from '../labels';
import { type ModelLayout } from '../layout/plan-layout';
import { type Vec2 } from '../math/vec';
import { type SheetDrawing, drawSheet, placePoint } from './sheet-drawing';
import { engravedColourName, printableColourName, slug } from './slug';

/** Thrown when the layout and the model disagree (a placement names a piece the model lacks). */
export class PackSheetsError extends Error {}

export type LaidOutModel = Extract<ModelLayout, { ok: true }>;

export interface PackSheetsOptions {
  /** Colour names in order, as the pack prints them (printableColourName). */
  colours: readonly string[];
  sheet: { widthMm: number; heightMm: number };
  units: CutPackInput['units'];
  machine: EstimateMachine;
}

/** Labels of every piece (in its own frame), keyed by piece id. */
function labelPieces(
  model: BuiltModel,
  colourNames: Record<string, string>,
  removedMm: number,
): Map<string, PieceLabels> {
  const out = new Map<string, PieceLabels>();
  for (const p of model.pieces) {
    out.set(
      p.id,
      labelPiece(
        { id: p.id, outline: p.outline, slots: p.slots.map((s) => ({ ...s, widthMm: s.widthMm })) },
        { colourName: colourNames[p.id], clearanceMm: 1 + removedMm / 2 },
      ),
    );
  }
  return out;
}

/**
 * Every sheet of a laid-out model as the pack draws it: each piece's outline and labels placed, the scale
 * mark, marks first and cuts inner-first. `labelWarnings` are the labeller's notes (text that did not fit).
 */
export function drawPackSheets(
  model: BuiltModel,
  layout: LaidOutModel,
  opts: PackSheetsOptions,
): { sheets: SheetDrawing[]; labelWarnings: string[] } {
  const colourName = (i: number) => opts.colours[i] ?? `colour ${i + 1}`;
  const multiColour = opts.colours.length > 1;
  const pieceColourName = Object.fromEntries(
    model.pieces.map((p) => [
      p.id,
      multiColour
        ? engravedColourName(colourName(layout.pieceColour[p.id] ?? 0), layout.pieceColour[p.id] ?? 0)
        : '',
    ]),
  );
  const removed = model.spec.machine.kind === 'laser' ? model.spec.machine.kerfMm : 0;
  const labels = labelPieces(model, pieceColourName, removed);
  const byId = new Map(model.pieces.map((p) => [p.id, p]));
  const count = layout.sheets.length;
  const width = String(count).length < 2 ? 2 : String(count).length;
  const sheets = layout.sheets.map((s, i) => {
    const colour = colourName(Number(s.group));
    const parts = s.placements.map((pl) => {
      const piece = byId.get(pl.part);
      if (!piece) throw new PackSheetsError(`layout names an unknown piece ${pl.part}`);
      const place = (p: Vec2) => placePoint(p, pl.rotationDeg, pl.x, pl.y);
      return {
        id: pl.part,
        outline: piece.outline.map(place),
        marks: (labels.get(pl.part)?.labels ?? []).flatMap((l) =>
          uprightStrokes(l, pl.rotationDeg).map((st) => st.map(place)),
        ),
      };
    });
    const num = String(i + 1).padStart(width, '0');
    return drawSheet({
      name: `sheet-${num}-${slug(colour, `colour-${Number(s.group) + 1}`)}`,
      title: `Sheet ${i + 1} of ${count}: ${colour}`,
      colourName: colour,
      sheet: opts.sheet,
      marginMm: layout.marginMm,
      clearMm: Math.max(2, layout.gapMm),
      parts,
      units: opts.units,
      machine: opts.machine,
    });
  });
  return { sheets, labelWarnings: [...labels.values()].flatMap((l) => l.warnings) };
}

/** The job's estimate over its drawn sheets, rounded as the manifest and setup sheet give it. */
export function sheetsEstimate(
  sheets: readonly SheetDrawing[],
  machine: EstimateMachine,
  /** Null when the sheet has no price: the material cost is then unknown, not nought. */
  pricePerSheet: number | null,
  currency: string,
): CutPackEstimate {
  const job = estimateJob(
    sheets.map((s) => ({ cut: s.cut, mark: s.mark })),
    machine,
    pricePerSheet ?? 0,
  );
  const r = (x: number, d: number) => Math.round(x * 10 ** d) / 10 ** d;
  return {
    cutLengthMm: r(job.cutLengthMm, 2),
    markLengthMm: r(job.markLengthMm, 2),
    pierces: job.pierces,
    travelMm: r(job.travelMm, 2),
    minutes: r(job.minutes, 2),
    machineCost: r(job.machineCost, 2),
    materialCost: pricePerSheet === null ? null : r(job.materialCost, 2),
    currency,
  };
}

export interface PreparationEstimateOptions {
  /** Colour names in order, as the job has them. */
  colours: readonly string[];
  sheet: { widthMm: number; heightMm: number };
  machine: EstimateMachine;
  /** Null when the sheet has no price: the material cost is then unknown, not nought. */
  pricePerSheet: number | null;
  currency: string;
}

/**
 * The estimate a job keeps from preparation: what a cut pack of this laid-out model would carry (sheets drawn
 * in millimetres, labels and scale marks included), so the job is approved on the setup sheet's figures.
 */
export function preparationEstimate(
  model: BuiltModel,
  layout: LaidOutModel,
  opts: PreparationEstimateOptions,
): NonNullable<JobPreparation['estimate']> {
  const machine = withCutter(opts.machine, model.spec.machine);
  const { sheets } = drawPackSheets(model, layout, {
    colours: opts.colours.map(printableColourName),
    sheet: opts.sheet,
    units: 'mm',
    machine,
  });
  return sheetsEstimate(sheets, machine, opts.pricePerSheet, opts.currency);
}
