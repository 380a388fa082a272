import { type ArgumentMetadata, Injectable, ParseUUIDPipe } from '@nestjs/common';

/**
 * A path id: a UUID (400 otherwise, as ParseUUIDPipe answers) in its canonical lower-case form. PostgreSQL
 * reads `3F2A…` and `3f2a…` as the same uuid, so an id compared in code (the signed-in user's own id, say)
 * must be normalised first, or upper case would slip past the comparison.
 */
@Injectable()
export class ParseIdPipe extends ParseUUIDPipe {
  override async transform(value: string, metadata: ArgumentMetadata): Promise<string | null | undefined> {
    const id = await super.transform(value, metadata);
    return typeof id === 'string' ? id.toLowerCase() : id;
  }
}

/** Two UUIDs name the same row (case does not matter to PostgreSQL, so it must not matter here). */
export function sameId(a: string | null | undefined, b: string | null | undefined): boolean {
  return typeof a === 'string' && typeof b === 'string' && a.toLowerCase() === b.toLowerCase();
}
