import { type Role } from '@kerfwright/contracts';

/** The demo accounts the seed creates, one per role; every browser test signs in through these. */
export const DEMO_PASSWORD = 'kerfwright-demo';

export const DEMO_USERS: readonly { role: Role; email: string }[] = [
  { role: 'supervisor', email: 'supervisor@millbrook-makerspace.example' },
  { role: 'fabricator', email: 'fabricator@millbrook-makerspace.example' },
  { role: 'operator', email: 'operator@millbrook-makerspace.example' },
  { role: 'hobbyist', email: 'hobbyist@millbrook-makerspace.example' },
];

export function demoUser(role: Role): { role: Role; email: string } {
  const user = DEMO_USERS.find((u) => u.role === role);
  if (!user) throw new Error(`no demo user for role ${role}`);
  return user;
}
