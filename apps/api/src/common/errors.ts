import { HttpException, HttpStatus } from '@nestjs/common';
import { type FieldError } from '@kerfwright/contracts';

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

/**
 * 400 VALIDATION.FAILED with the field errors, worded as the global validation pipe words them
 * ("Invalid request: field (message; message), field (message)"), for checks the DTOs cannot make.
 */
export function validationFailed(errors: readonly FieldError[]): AppError {
  return new AppError(
    HttpStatus.BAD_REQUEST,
    'VALIDATION.FAILED',
    `Invalid request: ${errors.map((e) => `${e.field} (${e.messages.join('; ')})`).join(', ')}`,
    errors,
  );
}
