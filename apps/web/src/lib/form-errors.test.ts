import { describe, expect, it } from 'vitest';
import { ApiError } from './api-client';
import { applyServerFieldErrors } from './form-errors';

describe('applyServerFieldErrors', () => {
  const apply = (details: unknown, fields: string[]) => {
    const set: Record<string, string> = {};
    const applied = applyServerFieldErrors(
      new ApiError(400, 'VALIDATION.FAILED', 'Invalid request', details),
      (field, error) => {
        set[field] = error.message ?? '';
      },
      fields,
    );
    return { applied, set };
  };

  it('puts each message under its field as a sentence, without the API’s name for the field', () => {
    const { applied, set } = apply(
      [
        { field: 'displayName', messages: ['displayName must not contain control characters'] },
        { field: 'stock.thicknessMm', messages: ['thicknessMm must be at most 50'] },
        { field: 'email', messages: ['already registered'] },
      ],
      ['displayName', 'stock.thicknessMm', 'email'],
    );
    expect(applied).toBe(true);
    expect(set).toEqual({
      displayName: 'Must not contain control characters',
      'stock.thicknessMm': 'Must be at most 50',
      email: 'Already registered',
    });
  });

  it('leaves to the form as a whole what names no field of the form', () => {
    expect(apply([{ field: 'other', messages: ['other is wrong'] }], ['name']).applied).toBe(false);
  });
});
