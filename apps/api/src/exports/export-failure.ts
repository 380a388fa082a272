import { HttpException } from '@nestjs/common';

/**
 * A failure the export cannot recover from by retrying (the job changed, the profile was retired, the
 * design cannot be built): the export is marked failed at once with this code. `message` is what the job's
 * people read (GET /api/exports/:id); `detail`, when set, is the underlying error's own text for the server
 * log only.
 */
export class ExportFailure extends Error {
  constructor(
    readonly code: string,
    message: string,
    readonly detail?: string,
  ) {
    super(message);
    this.name = 'ExportFailure';
  }

  /**
   * Keeps the AREA.REASON code and sentence of an API error (e.g. MACHINE_PROFILE.NOT_APPROVED) or of an engine
   * error (e.g. PACK.LAYOUT_FAILED), which are written for the user. Anything else (a bug, a thread that died)
   * gets `fallback` and a plain sentence; its own text stays in `detail`.
   */
  static from(err: unknown, fallback: string): ExportFailure {
    if (err instanceof ExportFailure) return err;
    if (err instanceof HttpException) {
      const body = err.getResponse() as { code?: unknown; message?: unknown };
      const code = typeof body.code === 'string' ? body.code : fallback;
      return new ExportFailure(code, typeof body.message === 'string' ? body.message : err.message);
    }
    const code = (err as { code?: unknown } | null)?.code;
    const raw = err instanceof Error ? err.message : String(err);
    if (typeof code === 'string' && /^[A-Z_]+\.[A-Z_]+$/.test(code)) return new ExportFailure(code, raw);
    return new ExportFailure(
      fallback,
      'The cut pack could not be built because of a fault on the server; it must be prepared again (by a fabricator or a supervisor)',
      raw,
    );
  }
}

/** The object storage failed (unreachable, or refused a file) while an export was being stored. */
export class ExportStorageError extends Error {
  constructor(readonly underlying: unknown) {
    super(underlying instanceof Error ? underlying.message : String(underlying));
    this.name = 'ExportStorageError';
  }
}

/**
 * What the job's people read about an attempt that failed for a passing reason (storage or database down, a
 * worker stopped): plain words, never the underlying error's text, which may name hosts and ports and goes to
 * the server log instead. `final`: no attempt is left.
 */
export function attemptFailureMessage(err: unknown, final: boolean): string {
  const what =
    err instanceof ExportStorageError
      ? 'The file storage could not be reached, so the cut pack could not be stored'
      : 'The cut pack could not be built and stored because of a passing fault on the server';
  return final
    ? `${what}; every attempt failed, so it must be prepared again (by a fabricator or a supervisor)`
    : `${what}; it is tried again by itself shortly`;
}

/** What the job's people read about an export the queue gave up on (its workers kept stopping). */
export const EXPORT_GAVE_UP_MESSAGE =
  'The workers building this cut pack stopped before it was done; it must be prepared again (by a fabricator or a supervisor)';
