import { describe, expect, it } from 'vitest';
import { navigationFor } from './navigation';

// Roles and what they may use: the roles table in the design notes (supervisor may do everything).
describe('navigationFor', () => {
  it('gives the supervisor every page, People included', () => {
    expect(navigationFor('supervisor').map((i) => i.label)).toEqual([
      'Home',
      'Designs',
      'Jobs',
      'Safety',
      'People',
    ]);
  });

  it.each(['hobbyist', 'fabricator', 'operator'] as const)(
    'gives the %s Home, Designs, Jobs and Safety, not People',
    (role) => {
      expect(navigationFor(role).map((i) => i.label)).toEqual(['Home', 'Designs', 'Jobs', 'Safety']);
    },
  );
});
