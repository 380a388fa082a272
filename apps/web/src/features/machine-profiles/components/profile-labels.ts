import { type MachineProfileKind, type ProfileVersionState } from '@kerfwright/contracts';

/** How each machine kind is named on screen. */
export const KIND_LABELS: Record<MachineProfileKind, string> = {
  'co2-laser': 'CO2 laser',
  'diode-laser': 'Diode laser',
  'fibre-laser': 'Fibre laser',
  'cnc-router': 'CNC router',
  'blade-cutter': 'Blade cutter',
};

/** How each version state is named on screen, and its chip colour. */
export const STATE_LABELS: Record<ProfileVersionState, string> = {
  draft: 'Draft',
  submitted: 'Waiting for approval',
  approved: 'Approved',
  retired: 'Retired',
};

export const STATE_COLOURS: Record<ProfileVersionState, 'default' | 'info' | 'success' | 'warning'> = {
  draft: 'default',
  submitted: 'warning',
  approved: 'success',
  retired: 'default',
};
