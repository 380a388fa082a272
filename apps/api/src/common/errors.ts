import { HttpException, HttpStatus } from '@nestjs/common';

/**
 * An HTTP error with a stable AREA.REASON code, rendered by the global filter as the one error body.
 */
export class AppError extends HttpException {
  constructor(status: HttpStatus, code: string, message: string, details?: unknown) {
    super({ code, message, details }, status);
  }
}

export const notFound = (area: string, what = 'not found'): AppError =>
  new AppError(HttpStatus.NOT_FOUND, `${area}.NOT_FOUND`, what);
