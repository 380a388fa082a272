import { type Role } from '@kerfwright/contracts';

/** How each role is named on screen. */
export const ROLE_LABELS: Record<Role, string> = {
  hobbyist: 'Hobbyist',
  fabricator: 'Fabricator',
  operator: 'Operator',
  supervisor: 'Supervisor',
};
