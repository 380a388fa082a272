import { type Role, type UserView } from '@kerfwright/contracts';

export function userFixture(role: Role, overrides: Partial<UserView> = {}): UserView {
  return {
    id: `00000000-0000-4000-8000-00000000000${['hobbyist', 'fabricator', 'operator', 'supervisor'].indexOf(role)}`,
    email: `${role}@workshop.example`,
    displayName: `${role.charAt(0).toUpperCase()}${role.slice(1)} Person`,
    role,
    active: true,
    createdAt: '2026-01-15T09:30:00.000Z',
    ...overrides,
  };
}
