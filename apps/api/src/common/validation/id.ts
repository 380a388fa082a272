import { applyDecorators } from '@nestjs/common';
import { Transform } from 'class-transformer';
import { IsUUID } from 'class-validator';

const UUID_SHAPE = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

/** A UUID-shaped string in lower case (the form PostgreSQL gives back); anything else as it came. */
export function canonicalId(value: unknown): unknown {
  return typeof value === 'string' && UUID_SHAPE.test(value) ? value.toLowerCase() : value;
}

/**
 * A UUID given in a body or query, in its canonical lower-case form, as ParseIdPipe gives path ids:
 * PostgreSQL finds the row for `3F2A…` as for `3f2a…`, so an id then compared in code with the stored ones
 * (a profile's material settings with the materials found) must be lower case, or an existing row looks absent.
 */
export const IsId = (): PropertyDecorator =>
  applyDecorators(
    Transform(({ value }: { value: unknown }) => canonicalId(value)),
    IsUUID(),
  );
