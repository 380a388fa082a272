import { type MaterialFamily } from '@kerfwright/contracts';

/** How each material family is named on screen. */
export const FAMILY_LABELS: Record<MaterialFamily, string> = {
  card: 'Card',
  paper: 'Paper',
  acrylic: 'Acrylic',
  plywood: 'Plywood',
  mdf: 'MDF',
  felt: 'Felt',
  other: 'Other',
  pvc: 'PVC / vinyl',
  polycarbonate: 'Polycarbonate',
  abs: 'ABS',
  hdpe: 'HDPE',
  foam: 'Foam',
  ptfe: 'PTFE',
  acetal: 'Acetal',
  fibreglass: 'Fibreglass',
  'carbon-fibre': 'Carbon fibre',
  'glue-backed': 'Glue-backed sheet',
  unidentified: 'Unidentified',
};
