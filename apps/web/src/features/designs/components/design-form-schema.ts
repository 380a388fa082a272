import {
  COLOUR_RULES,
  type DesignSpec,
  type DesignView,
  MACHINE_KINDS,
  SCALE_BY,
  type UploadedSolid,
} from '@kerfwright/contracts';
import { MAX_PIECE_SIDES, MAX_PIECE_SIZE, MAX_SCALE_MM } from '@kerfwright/geometry';
import { z } from 'zod';

const num = (label: string) => z.number({ error: `${label}: enter a number` });

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
    scaleBy: z.enum(SCALE_BY),
    scaleMm: num('Scale')
      .gt(0, 'Scale must be more than 0 mm')
      .max(MAX_SCALE_MM, `At most ${MAX_SCALE_MM} mm`),
    thicknessMm: num('Thickness').gt(0, 'Thickness must be more than 0').max(50, 'At most 50 mm'),
    flexible: z.boolean(),
    machineKind: z.enum(MACHINE_KINDS),
    kerfMm: num('Kerf').min(0, 'Kerf cannot be negative').max(2, 'At most 2 mm'),
    toolDiameterMm: num('Tool diameter').gt(0, 'Tool diameter must be more than 0').max(25, 'At most 25 mm'),
    fitMm: num('Fit allowance').min(-2, 'Between −2 and 2 mm').max(2, 'Between −2 and 2 mm'),
    colourCount: num('Colours').int('Colours: a whole number').min(1, 'At least 1').max(6, 'At most 6'),
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
    if (v.solidSource === 'catalogue' && !v.solidId) {
      ctx.addIssue({ code: 'custom', path: ['solidId'], message: 'Choose a base solid' });
    }
  });

export type DesignFormValues = z.infer<typeof designFormSchema>;

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
  thicknessMm: 3,
  flexible: false,
  machineKind: 'laser',
  kerfMm: 0.15,
  toolDiameterMm: 3.175,
  fitMm: 0,
  colourCount: 2,
  colourRule: 'neighbour-distinct',
};

/** The spec the geometry library and the API take, from valid form values (and an uploaded solid). */
export function toDesignSpec(v: DesignFormValues, upload: UploadedSolid | null): DesignSpec | null {
  const solid = v.solidSource === 'upload' ? upload : v.solidId;
  if (!solid) return null;
  return {
    solid,
    piece: { sides: v.sides, step: v.step, rotationDeg: v.rotationDeg, size: v.size },
    scale: { by: v.scaleBy, mm: v.scaleMm },
    stock: { thicknessMm: v.thicknessMm, flexible: v.flexible },
    machine:
      v.machineKind === 'laser'
        ? { kind: 'laser', kerfMm: v.kerfMm }
        : { kind: 'router', toolDiameterMm: v.toolDiameterMm },
    fitMm: v.fitMm,
  };
}

/** Form values for a saved design (colours are the studio's own choice; they start from the defaults). */
export function fromDesign(design: DesignView): { values: DesignFormValues; upload: UploadedSolid | null } {
  const s = design.spec;
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
      scaleBy: s.scale.by,
      scaleMm: s.scale.mm,
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
