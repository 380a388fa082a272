import { describe, expect, it } from 'vitest';
import { formatDate, formatDateTime } from './dates';

describe('dates as every page shows them', () => {
  const at = '2026-12-04T14:29:51.000Z';

  it('gives one moment the same text wherever it is shown: the Intl medium date and short time', () => {
    const expected = new Intl.DateTimeFormat(undefined, { dateStyle: 'medium', timeStyle: 'short' }).format(
      new Date(at),
    );
    expect(formatDateTime(at)).toBe(expected);
    expect(formatDateTime(new Date(at))).toBe(expected);
    expect(formatDateTime(at)).not.toMatch(/:51/);
    expect(formatDateTime(at, { seconds: true })).toMatch(/:51/);
    expect(formatDate(at)).toBe(
      new Intl.DateTimeFormat(undefined, { dateStyle: 'medium' }).format(new Date(at)),
    );
  });

  it('shows a dash for a value that is no date, rather than "Invalid Date"', () => {
    expect(formatDateTime('not a date')).toBe('—');
    expect(formatDate('')).toBe('—');
  });
});
