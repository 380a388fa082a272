import { type MachineProfileKind, type MaterialFamily } from '@kerfwright/contracts';
import { FAMILY_LABELS } from '../features/materials/components/material-labels';
import { KIND_LABELS } from '../features/machine-profiles/components/profile-labels';

/** A machine kind as people read it ("CO2 laser"); "*" in a notice's scope reads "any machine". */
export function kindLabel(kind: MachineProfileKind | '*' | string): string {
  if (kind === '*') return 'any machine';
  return KIND_LABELS[kind as MachineProfileKind] ?? kind;
}

/** A material family as people read it ("Cast acrylic"); "*" in a notice's scope reads "any material". */
export function familyLabel(family: MaterialFamily | '*' | string): string {
  if (family === '*') return 'any material';
  return FAMILY_LABELS[family as MaterialFamily] ?? family;
}
