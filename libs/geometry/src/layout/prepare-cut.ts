import type { DesignSpec, JobPreparation } from '@kerfwright/contracts';
import { buildModel, type BuiltModel } from '../build';
import {
  gapRaisedNote,
  layoutModel,
  marginRaisedNote,
  type LayoutOptions,
  type ModelLayout,
} from './plan-layout';

export interface CutPreparation {
  model: BuiltModel;
  layout: ModelLayout;
  /** Present when the model has no errors and the layout succeeded. */
  summary: JobPreparation | null;
}

const round = (x: number, digits = 2): number => Math.round(x * 10 ** digits) / 10 ** digits;

/**
 * Builds a spec that already names the real stock and machine, and lays it out on sheets: the figures a
 * job keeps from preparation. Throws what buildModel throws for a malformed spec.
 */
export function prepareCut(spec: DesignSpec, options: LayoutOptions): CutPreparation {
  const model = buildModel(spec);
  if (model.report.errors.length > 0) {
    return {
      model,
      layout: { ok: false, code: 'LAYOUT.INVALID', message: 'the design has errors', pieces: [] },
      summary: null,
    };
  }
  const layout = layoutModel(model, options);
  if (!layout.ok) return { model, layout, summary: null };
  const machine = model.spec.machine;
  const quantity = Math.max(1, Math.floor(options.quantity ?? 1));
  return {
    model,
    layout,
    summary: {
      thicknessMm: model.spec.stock.thicknessMm,
      machineKind: machine.kind,
      ...(machine.kind === 'laser' ? { kerfMm: machine.kerfMm } : { toolDiameterMm: machine.toolDiameterMm }),
      pieceCount: model.pieces.length * quantity,
      crossingCount: model.crossings.length,
      diameterMm: round(model.report.diameterMm),
      sheetCount: layout.totals.sheetCount,
      sheet: { widthMm: options.sheet.widthMm, heightMm: options.sheet.heightMm },
      marginMm: layout.marginMm,
      gapMm: layout.gapMm,
      ...(options.colours.rule ? { colourRule: options.colours.rule } : {}),
      utilisation: round(layout.totals.utilisation, 4),
      warnings: [
        ...model.report.warnings.map((w) => w.message),
        ...[
          gapRaisedNote(machine, options.gapMm, layout.gapMm),
          marginRaisedNote(machine, options.marginMm, layout.marginMm),
        ].filter((w): w is string => w !== null),
      ],
    },
  };
}
