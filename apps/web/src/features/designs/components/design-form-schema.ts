import {
  COLOUR_RULES,
  type DesignSpecInput,
  type DesignView,
  FIT_SCALE_BY,
  MACHINE_KINDS,
  SCALE_BY,
  type UploadedSolid,
} from '@kerfwright/contracts';
import {
  DEFAULT_SHEET_GAP_MM,
  DEFAULT_SHEET_MARGIN_MM,
  MAX_FIT_SHEETS,
  MAX_PIECE_SIDES,
  MAX_PIECE_SIZE,
  MAX_SCALE_MM,
  MAX_SHEET_MM,
} from '@kerfwright/geometry';
import { z } from 'zod';
import { countOf } from '../../../lib/plural';

const num = (label: string) => z.number({ error: `${label}: enter a number` });

/** The most colours of stock a design may use. */
export const MAX_COLOURS = 6;

/**
 * The smallest scale the studio accepts, mm. The library takes any size above 0 (validateSpec: scale.mm
 * greater than 0, at most MAX_SCALE_MM) and reports a model too small for its stock as errors, but below a
 * millimetre its outlines (kept to 0.1 µm) collapse to nothing: no piece of that size can be cut or shown.
 */
export const MIN_SCALE_MM = 1;

/**
 * A design size (× plane distance) as the studio writes it, in its suggestions as in the size it puts into
 * the field: four decimals, so that a size found and the threshold it is found from read alike.
 */
export function formatDesignSize(size: number): string {
  return size.toFixed(4);
}

/** The design studio's form: the spec's fields flattened, plus name, colours and the solid's source. */
export const designFormSchema = z
  .object({
    name: z.string().trim().min(1, 'Give the design a name').max(120, 'At most 120 characters'),
    description: z.string().max(2000, 'At most 2000 characters'),
    solidSource: z.enum(['catalogue', 'upload']),
    solidId: z.string(),
    sides: num('Sides')
      .int('Sides: a whole number')
      .min(3, 'At least 3 sides')
      .max(MAX_PIECE_SIDES, `At most ${MAX_PIECE_SIDES} sides`),
    step: num('Step').int('Step: a whole number').min(1, 'Step is at least 1'),
    rotationDeg: num('Rotation').min(-360, 'Between −360 and 360').max(360, 'Between −360 and 360'),
    size: num('Size')
      .gt(0, 'Size must be more than 0')
      .max(MAX_PIECE_SIZE, `Size is at most ${MAX_PIECE_SIZE}`),
    scaleBy: z.enum([...SCALE_BY, ...FIT_SCALE_BY]),
    scaleMm: num('Scale')
      .min(MIN_SCALE_MM, `At least ${MIN_SCALE_MM} mm: a smaller model cannot be cut`)
      .max(MAX_SCALE_MM, `At most ${MAX_SCALE_MM} mm`),
    fitSheets: num('Sheets')
      .int('Sheets: a whole number')
      .min(1, 'At least 1 sheet')
      .max(MAX_FIT_SHEETS, `At most ${MAX_FIT_SHEETS} sheets`),
    sheetWidthMm: num('Sheet width').gt(0, 'More than 0 mm').max(MAX_SHEET_MM, `At most ${MAX_SHEET_MM} mm`),
    sheetHeightMm: num('Sheet height')
      .gt(0, 'More than 0 mm')
      .max(MAX_SHEET_MM, `At most ${MAX_SHEET_MM} mm`),
    marginMm: num('Margin').min(0, 'Cannot be negative').max(100, 'At most 100 mm'),
    gapMm: num('Gap').min(0, 'Cannot be negative').max(100, 'At most 100 mm'),
    bedWidthMm: num('Bed width').gt(0, 'More than 0 mm').max(MAX_SHEET_MM, `At most ${MAX_SHEET_MM} mm`),
    bedHeightMm: num('Bed height').gt(0, 'More than 0 mm').max(MAX_SHEET_MM, `At most ${MAX_SHEET_MM} mm`),
    thicknessMm: num('Thickness').gt(0, 'Thickness must be more than 0').max(50, 'At most 50 mm'),
    flexible: z.boolean(),
    machineKind: z.enum(MACHINE_KINDS),
    kerfMm: num('Kerf').min(0, 'Kerf cannot be negative').max(2, 'At most 2 mm'),
    toolDiameterMm: num('Tool diameter').gt(0, 'Tool diameter must be more than 0').max(25, 'At most 25 mm'),
    fitMm: num('Fit allowance').min(-2, 'Between −2 and 2 mm').max(2, 'Between −2 and 2 mm'),
    colourCount: num('Colours')
      .int('Colours: a whole number')
      .min(1, 'At least 1')
      .max(MAX_COLOURS, `At most ${MAX_COLOURS}`),
    colourRule: z.enum(COLOUR_RULES),
  })
  .superRefine((v, ctx) => {
    if (Number.isInteger(v.sides) && Number.isInteger(v.step) && v.step * 2 >= v.sides) {
      ctx.addIssue({
        code: 'custom',
        path: ['step'],
        message: `Step must be less than half the sides (below ${v.sides / 2})`,
      });
    }
    // The library cuts each colour from its own sheets, so N sheets hold at most N colours. Both fields are
    // marked, each message naming the other, whichever of the two was changed.
    if (v.scaleBy === 'fitSheets' && Number.isInteger(v.colourCount) && v.fitSheets < v.colourCount) {
      ctx.addIssue({
        code: 'custom',
        path: ['fitSheets'],
        message: `${v.colourCount} colours need at least ${v.colourCount} sheets (one per colour)`,
      });
      ctx.addIssue({
        code: 'custom',
        path: ['colourCount'],
        message: `Fit to ${countOf(v.fitSheets, 'sheet')} takes at most ${countOf(v.fitSheets, 'colour')} (one sheet per colour)`,
      });
    }
    // The library needs room inside the margins (validateSpec: twice the margin below the shorter side).
    if (v.marginMm >= 0 && v.sheetWidthMm > 0 && v.sheetHeightMm > 0) {
      const room = (side: number) => side - 2 * v.marginMm;
      const tooNarrow = room(v.sheetWidthMm) <= 0;
      const tooLow = room(v.sheetHeightMm) <= 0;
      if (tooNarrow || tooLow) {
        ctx.addIssue({
          code: 'custom',
          path: ['marginMm'],
          message: `Two margins of ${v.marginMm} mm leave no room on the sheet: use a smaller margin or a larger sheet`,
        });
        const sideMessage = `Leaves no room inside the ${v.marginMm} mm margins: more than ${2 * v.marginMm} mm`;
        if (tooNarrow) ctx.addIssue({ code: 'custom', path: ['sheetWidthMm'], message: sideMessage });
        if (tooLow) ctx.addIssue({ code: 'custom', path: ['sheetHeightMm'], message: sideMessage });
      }
    }
    if (v.solidSource === 'catalogue' && !v.solidId) {
      ctx.addIssue({ code: 'custom', path: ['solidId'], message: 'Choose a base solid' });
    }
  });

export type DesignFormValues = z.infer<typeof designFormSchema>;

/** The fields' labels: the spec form shows them, and messages shown away from a field name it by them. */
export const DESIGN_FIELD_LABELS: Record<keyof DesignFormValues, string> = {
  name: 'Name',
  description: 'Description',
  solidSource: 'Source',
  solidId: 'Solid',
  sides: 'Sides (n)',
  step: 'Step (k)',
  rotationDeg: 'Rotation (°)',
  size: 'Size',
  scaleBy: 'Scale by',
  scaleMm: 'Scale (mm)',
  fitSheets: 'Sheets',
  sheetWidthMm: 'Sheet width (mm)',
  sheetHeightMm: 'Sheet height (mm)',
  marginMm: 'Margin (mm)',
  gapMm: 'Gap (mm)',
  bedWidthMm: 'Bed width (mm)',
  bedHeightMm: 'Bed height (mm)',
  thicknessMm: 'Thickness (mm)',
  flexible: 'Flexible',
  machineKind: 'Machine kind',
  kerfMm: 'Kerf (mm)',
  toolDiameterMm: 'Tool diameter (mm)',
  fitMm: 'Fit allowance (mm)',
  colourCount: 'Colours',
  colourRule: 'Rule',
};

/**
 * A form issue as said away from its field (the preview, the sheets, a button's reason): the field's label
 * first, unless the message names the field already ("Scale: enter a number").
 */
export function describeFormIssue(issue: { path: readonly PropertyKey[]; message: string }): string {
  const field = issue.path[0];
  const label =
    typeof field === 'string' && field in DESIGN_FIELD_LABELS
      ? DESIGN_FIELD_LABELS[field as keyof DesignFormValues]
      : null;
  if (!label) return issue.message;
  const named = label.replace(/\s*\(.*\)$/, '').toLowerCase();
  if (issue.message.toLowerCase().includes(named)) return issue.message;
  return `${label}: ${issue.message.charAt(0).toLowerCase()}${issue.message.slice(1)}`;
}

export const DEFAULT_DESIGN_VALUES: DesignFormValues = {
  name: 'Untitled design',
  description: '',
  solidSource: 'catalogue',
  solidId: 'octahedron',
  sides: 6,
  step: 1,
  rotationDeg: 0,
  size: 1.3,
  scaleBy: 'diameter',
  scaleMm: 240,
  fitSheets: 2,
  // A common laser-bed stock size (common practice); the fabricator picks the real stock when preparing.
  sheetWidthMm: 600,
  sheetHeightMm: 400,
  marginMm: DEFAULT_SHEET_MARGIN_MM,
  gapMm: DEFAULT_SHEET_GAP_MM,
  bedWidthMm: 600,
  bedHeightMm: 400,
  thicknessMm: 3,
  flexible: false,
  machineKind: 'laser',
  kerfMm: 0.15,
  toolDiameterMm: 3.175,
  fitMm: 0,
  colourCount: 2,
  colourRule: 'neighbour-distinct',
};

/** True for the scales that search the largest model fitting the stock (sheets or bed). */
export function isFitScale(scaleBy: DesignFormValues['scaleBy']): scaleBy is 'fitSheets' | 'fitBed' {
  return scaleBy === 'fitSheets' || scaleBy === 'fitBed';
}

/**
 * The spec the geometry library builds for the preview, from valid form values (and an uploaded solid):
 * the stock sheet (for the layout and the fitSheets search) and, for fitBed, the bed. Colours stay out: the
 * preview solves the colour plan itself, once per solid (see use-built-model).
 */
export function toDesignSpec(v: DesignFormValues, upload: UploadedSolid | null): DesignSpecInput | null {
  const solid = v.solidSource === 'upload' ? upload : v.solidId;
  if (!solid) return null;
  return {
    solid,
    piece: { sides: v.sides, step: v.step, rotationDeg: v.rotationDeg, size: v.size },
    scale:
      v.scaleBy === 'fitSheets'
        ? { by: 'fitSheets', sheets: v.fitSheets }
        : v.scaleBy === 'fitBed'
          ? { by: 'fitBed' }
          : { by: v.scaleBy, mm: v.scaleMm },
    stock: {
      thicknessMm: v.thicknessMm,
      flexible: v.flexible,
      sheet: { widthMm: v.sheetWidthMm, heightMm: v.sheetHeightMm },
      marginMm: v.marginMm,
      gapMm: v.gapMm,
    },
    machine:
      v.machineKind === 'laser'
        ? { kind: 'laser', kerfMm: v.kerfMm }
        : { kind: 'router', toolDiameterMm: v.toolDiameterMm },
    fitMm: v.fitMm,
    ...(v.scaleBy === 'fitBed' ? { bed: { widthMm: v.bedWidthMm, heightMm: v.bedHeightMm } } : {}),
  };
}

/** The spec a design is saved with: the preview's spec plus the colours (count and rule). */
export function toSavedSpec(v: DesignFormValues, upload: UploadedSolid | null): DesignSpecInput | null {
  const spec = toDesignSpec(v, upload);
  if (!spec) return null;
  return v.colourCount > 1 ? { ...spec, colours: { count: v.colourCount, rule: v.colourRule } } : spec;
}

/** Form values for a saved design. */
export function fromDesign(design: DesignView): { values: DesignFormValues; upload: UploadedSolid | null } {
  // A saved spec may carry a fit scale, stock sheet, bed and colours (DesignSpecInput) even where typed fixed.
  const s = design.spec as DesignSpecInput;
  const sc = s.scale;
  const upload = typeof s.solid === 'string' ? null : s.solid;
  return {
    upload,
    values: {
      ...DEFAULT_DESIGN_VALUES,
      name: design.name,
      description: design.description,
      solidSource: upload ? 'upload' : 'catalogue',
      solidId: typeof s.solid === 'string' ? s.solid : DEFAULT_DESIGN_VALUES.solidId,
      sides: s.piece.sides,
      step: s.piece.step ?? 1,
      rotationDeg: s.piece.rotationDeg ?? 0,
      size: s.piece.size,
      scaleBy: sc.by,
      scaleMm: 'mm' in sc ? sc.mm : DEFAULT_DESIGN_VALUES.scaleMm,
      fitSheets: sc.by === 'fitSheets' ? sc.sheets : DEFAULT_DESIGN_VALUES.fitSheets,
      sheetWidthMm: s.stock.sheet?.widthMm ?? DEFAULT_DESIGN_VALUES.sheetWidthMm,
      sheetHeightMm: s.stock.sheet?.heightMm ?? DEFAULT_DESIGN_VALUES.sheetHeightMm,
      marginMm: s.stock.marginMm ?? DEFAULT_DESIGN_VALUES.marginMm,
      gapMm: s.stock.gapMm ?? DEFAULT_DESIGN_VALUES.gapMm,
      bedWidthMm: s.bed?.widthMm ?? DEFAULT_DESIGN_VALUES.bedWidthMm,
      bedHeightMm: s.bed?.heightMm ?? DEFAULT_DESIGN_VALUES.bedHeightMm,
      // A design saved without colours is cut from one colour of stock: toSavedSpec saves one colour as none,
      // and preparing its job counts none as one. Only a new design starts from the default.
      colourCount: s.colours?.count ?? (s.colours?.names?.length || 1),
      colourRule: s.colours?.rule ?? DEFAULT_DESIGN_VALUES.colourRule,
      thicknessMm: s.stock.thicknessMm,
      flexible: s.stock.flexible ?? false,
      machineKind: s.machine.kind,
      kerfMm: s.machine.kind === 'laser' ? s.machine.kerfMm : DEFAULT_DESIGN_VALUES.kerfMm,
      toolDiameterMm:
        s.machine.kind === 'router' ? s.machine.toolDiameterMm : DEFAULT_DESIGN_VALUES.toolDiameterMm,
      fitMm: s.fitMm ?? 0,
    },
  };
}
