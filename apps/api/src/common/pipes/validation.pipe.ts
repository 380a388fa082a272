import { type ArgumentMetadata, HttpStatus, ValidationPipe, type ValidationError } from '@nestjs/common';
import { type FieldError } from '@kerfwright/contracts';
import { AppError, validationFailed } from '../errors';

/** Deepest nesting of objects and arrays accepted in a body, query or path (designs need about 5). */
export const MAX_INPUT_DEPTH = 32;
/** Keys that reach an object's prototype when copied onto another object (OWASP: prototype pollution). */
const FORBIDDEN_KEYS = new Set(['__proto__', 'constructor', 'prototype']);

/**
 * Flattens nested class-validator errors into `{ field: 'a.b', messages }`. A required field that is missing
 * gets the one message that helps ("is required"), not every rule its absent value breaks ("must not be less
 * than 1; must be an integer number").
 */
export function toFieldErrors(errors: ValidationError[], prefix = ''): FieldError[] {
  const out: FieldError[] = [];
  for (const e of errors) {
    const field = prefix ? `${prefix}.${e.property}` : e.property;
    const missing = e.value === undefined && e.constraints && !('whitelistValidation' in e.constraints);
    if (missing) out.push({ field, messages: [`${e.property} is required`] });
    else if (e.constraints) out.push({ field, messages: Object.values(e.constraints) });
    if (e.children?.length) out.push(...toFieldErrors(e.children, field));
  }
  return out;
}

const refuse = (code: string, field: string, message: string) =>
  new AppError(HttpStatus.BAD_REQUEST, code, `Invalid request: ${field || 'body'} ${message}`, [
    { field, messages: [message] },
  ]);

/**
 * Walks a request value without recursion and refuses what no route accepts and what would break further
 * down: nesting deeper than MAX_INPUT_DEPTH (a recursive transformer runs out of stack), keys that reach a
 * prototype, and NUL characters (PostgreSQL text and jsonb cannot hold them).
 */
export function assertCleanInput(value: unknown, root = ''): void {
  const stack: { v: unknown; path: string; depth: number }[] = [{ v: value, path: root, depth: 0 }];
  while (stack.length > 0) {
    const { v, path, depth } = stack.pop()!;
    if (typeof v === 'string') {
      if (v.includes('\u0000')) throw refuse('REQUEST.INVALID_CHARACTERS', path, 'contains a NUL character');
      continue;
    }
    if (typeof v !== 'object' || v === null || Buffer.isBuffer(v)) continue;
    if (depth >= MAX_INPUT_DEPTH) {
      throw refuse('REQUEST.TOO_DEEP', path, `is nested deeper than ${MAX_INPUT_DEPTH} levels`);
    }
    for (const key of Object.keys(v)) {
      const child = path ? `${path}.${key}` : key;
      if (FORBIDDEN_KEYS.has(key)) throw refuse('REQUEST.FORBIDDEN_KEY', child, 'is not an accepted name');
      if (key.includes('\u0000'))
        throw refuse('REQUEST.INVALID_CHARACTERS', child, 'contains a NUL character');
      stack.push({ v: (v as Record<string, unknown>)[key], path: child, depth: depth + 1 });
    }
  }
}

/** The global pipe: every body, query and path value is checked as above, then validated by its DTO. */
class EdgeValidationPipe extends ValidationPipe {
  override async transform(value: unknown, metadata: ArgumentMetadata): Promise<unknown> {
    if (metadata.type === 'body' || metadata.type === 'query' || metadata.type === 'param') {
      assertCleanInput(value, metadata.type === 'param' ? (metadata.data ?? '') : '');
    }
    return super.transform(value, metadata);
  }
}

/** Validation at the edge: unknown fields are refused, types converted, errors name the field. */
export function createValidationPipe(): ValidationPipe {
  return new EdgeValidationPipe({
    whitelist: true,
    forbidNonWhitelisted: true,
    transform: true,
    exceptionFactory: (errors) => {
      return validationFailed(toFieldErrors(errors));
    },
  });
}
