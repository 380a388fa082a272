/**
 * Dates and times as every page shows them: the reader's own locale, a medium date ("4 Dec 2026") and the time
 * to the minute, so that one moment reads the same on the jobs board, the job page, Approvals and the release
 * desk. The audit trail adds seconds, where the order of quick writes matters.
 */
const dateTime = new Intl.DateTimeFormat(undefined, { dateStyle: 'medium', timeStyle: 'short' });
const dateTimeSeconds = new Intl.DateTimeFormat(undefined, { dateStyle: 'medium', timeStyle: 'medium' });
const dateOnly = new Intl.DateTimeFormat(undefined, { dateStyle: 'medium' });

function valid(value: string | number | Date): Date | null {
  const d = value instanceof Date ? value : new Date(value);
  return Number.isNaN(d.getTime()) ? null : d;
}

/** A moment to the minute; "—" for a value that is no date. */
export function formatDateTime(value: string | number | Date, options: { seconds?: boolean } = {}): string {
  const d = valid(value);
  if (!d) return '—';
  return (options.seconds ? dateTimeSeconds : dateTime).format(d);
}

/** A day; "—" for a value that is no date. */
export function formatDate(value: string | number | Date): string {
  const d = valid(value);
  return d ? dateOnly.format(d) : '—';
}
