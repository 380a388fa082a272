import { describe, expect, it } from 'vitest';
import { navigationFor } from './navigation';

// Roles and what they may use: the roles table in the design notes (supervisor may do everything).
describe('navigationFor', () => {
  it('gives the supervisor every page, People, Approvals and the audit trail included', () => {
    expect(navigationFor('supervisor').map((i) => i.label)).toEqual([
      'Home',
      'Designs',
      'Jobs',
      'Release desk',
      'Safety',
      'Materials',
      'Machine profiles',
      'Approvals',
      'People',
      'Audit trail',
    ]);
  });

  it('gives the fabricator the materials library and machine profiles, not the supervisor pages', () => {
    expect(navigationFor('fabricator').map((i) => i.label)).toEqual([
      'Home',
      'Designs',
      'Jobs',
      'Safety',
      'Materials',
      'Machine profiles',
    ]);
  });

  it('gives the hobbyist Home, Designs, Jobs and Safety, not People', () => {
    expect(navigationFor('hobbyist').map((i) => i.label)).toEqual(['Home', 'Designs', 'Jobs', 'Safety']);
  });

  it('gives the operator the release desk besides Home, Designs, Jobs and Safety', () => {
    expect(navigationFor('operator').map((i) => i.label)).toEqual([
      'Home',
      'Designs',
      'Jobs',
      'Release desk',
      'Safety',
    ]);
  });
});
