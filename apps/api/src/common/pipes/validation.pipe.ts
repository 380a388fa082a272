import { HttpStatus, ValidationPipe, type ValidationError } from '@nestjs/common';
import { type FieldError } from '@kerfwright/contracts';
import { AppError } from '../errors';

/** Flattens nested class-validator errors into `{ field: 'a.b', messages }`. */
export function toFieldErrors(errors: ValidationError[], prefix = ''): FieldError[] {
  const out: FieldError[] = [];
  for (const e of errors) {
    const field = prefix ? `${prefix}.${e.property}` : e.property;
    if (e.constraints) out.push({ field, messages: Object.values(e.constraints) });
    if (e.children?.length) out.push(...toFieldErrors(e.children, field));
  }
  return out;
}

/** Validation at the edge: unknown fields are refused, types converted, errors name the field. */
export function createValidationPipe(): ValidationPipe {
  return new ValidationPipe({
    whitelist: true,
    forbidNonWhitelisted: true,
    transform: true,
    exceptionFactory: (errors) => {
      const details = toFieldErrors(errors);
      return new AppError(
        HttpStatus.BAD_REQUEST,
        'VALIDATION.FAILED',
        `Invalid request: ${details.map((d) => `${d.field} (${d.messages.join('; ')})`).join(', ')}`,
        details,
      );
    },
  });
}
