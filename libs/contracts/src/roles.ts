/** The four workshop roles. A supervisor may do everything. */
export const ROLES = ['hobbyist', 'fabricator', 'operator', 'supervisor'] as const;
export type Role = (typeof ROLES)[number];

export function isRole(value: unknown): value is Role {
  return typeof value === 'string' && (ROLES as readonly string[]).includes(value);
}
