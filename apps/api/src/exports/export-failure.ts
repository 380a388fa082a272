import { HttpException } from '@nestjs/common';

/**
 * A failure the export cannot recover from by retrying (the job changed, the profile was retired, the
 * design cannot be built): the export is marked failed at once with this code.
 */
export class ExportFailure extends Error {
  constructor(
    readonly code: string,
    message: string,
  ) {
    super(message);
    this.name = 'ExportFailure';
  }

  /** Keeps the AREA.REASON code of an API error (e.g. MACHINE_PROFILE.NOT_APPROVED), else `fallback`. */
  static from(err: unknown, fallback: string): ExportFailure {
    if (err instanceof ExportFailure) return err;
    if (err instanceof HttpException) {
      const body = err.getResponse() as { code?: unknown; message?: unknown };
      const code = typeof body.code === 'string' ? body.code : fallback;
      return new ExportFailure(code, typeof body.message === 'string' ? body.message : err.message);
    }
    const code = (err as { code?: unknown } | null)?.code;
    const message = err instanceof Error ? err.message : String(err);
    return new ExportFailure(
      typeof code === 'string' && /^[A-Z_]+\.[A-Z_]+$/.test(code) ? code : fallback,
      message,
    );
  }
}
