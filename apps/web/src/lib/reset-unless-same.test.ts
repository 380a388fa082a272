import { describe, expect, it, vi } from 'vitest';
import { resetUnlessSame } from './reset-unless-same';

describe('resetUnlessSame', () => {
  it('leaves a form holding the values (in any key order) alone, and resets one that does not', () => {
    const reset = vi.fn();
    resetUnlessSame({ getValues: () => ({ quantity: 1, notes: '' }), reset }, { notes: '', quantity: 1 });
    expect(reset).not.toHaveBeenCalled();
    resetUnlessSame({ getValues: () => ({ quantity: 12, notes: '' }), reset }, { notes: '', quantity: 1 });
    expect(reset).toHaveBeenCalledWith({ notes: '', quantity: 1 });
    // Nested values count too.
    reset.mockClear();
    resetUnlessSame({ getValues: () => ({ s: [{ a: 1, b: 2 }] }), reset }, { s: [{ b: 2, a: 1 }] });
    expect(reset).not.toHaveBeenCalled();
  });
});
