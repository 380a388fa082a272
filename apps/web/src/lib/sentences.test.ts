import { describe, expect, it } from 'vitest';
import { withFullStop } from './sentences';

describe('withFullStop', () => {
  it('adds a full stop to a reason typed without one', () => {
    expect(withFullStop('Wrong acrylic batch on the bed')).toBe('Wrong acrylic batch on the bed.');
  });

  it('keeps the stop, question or exclamation mark a reason already ends with, inside quotes too', () => {
    expect(withFullStop('Wait for the new delivery.')).toBe('Wait for the new delivery.');
    expect(withFullStop('Is this the right batch?')).toBe('Is this the right batch?');
    expect(withFullStop('Do not cut!')).toBe('Do not cut!');
    expect(withFullStop('Marked “do not use.”')).toBe('Marked “do not use.”');
  });

  it('ends the reason, not the spaces after it', () => {
    expect(withFullStop('  Wrong stock  ')).toBe('Wrong stock.');
  });
});
