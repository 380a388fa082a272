import { describe, expect, it } from 'vitest';
import { countOf } from './plural';

describe('countOf', () => {
  it('uses the singular for one only', () => {
    expect(countOf(1, 'piece')).toBe('1 piece');
    expect(countOf(0, 'error')).toBe('0 errors');
    expect(countOf(12, 'copy', 'copies')).toBe('12 copies');
  });
});
