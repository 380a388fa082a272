import { isRole, ROLES } from './roles';
import { isErrorBody } from './errors';

describe('roles', () => {
  it('lists the four workshop roles', () => {
    expect([...ROLES].sort()).toEqual(['fabricator', 'hobbyist', 'operator', 'supervisor']);
  });
  it('recognises a role and rejects anything else', () => {
    expect(isRole('operator')).toBe(true);
    expect(isRole('admin')).toBe(false);
    expect(isRole(3)).toBe(false);
  });
});

describe('error body', () => {
  it('accepts the full shape and rejects a partial one', () => {
    expect(isErrorBody({ statusCode: 400, code: 'X.Y', message: 'm', requestId: 'r' })).toBe(true);
    expect(isErrorBody({ statusCode: 400, message: 'm' })).toBe(false);
  });
});
