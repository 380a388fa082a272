import { type ValueTransformer } from 'typeorm';

/** PostgreSQL returns numeric columns as strings: read them as numbers (null stays null). */
export const numericColumn: ValueTransformer = {
  to: (value: number | null | undefined) => value,
  from: (value: string | null) => (value === null ? null : Number(value)),
};

/** The SQLSTATE and constraint name of a PostgreSQL error raised through TypeORM, if it is one. */
export function pgError(err: unknown): { code: string; constraint: string } | null {
  const e = err as {
    code?: unknown;
    constraint?: unknown;
    driverError?: { code?: unknown; constraint?: unknown };
  };
  const code = typeof e?.code === 'string' ? e.code : e?.driverError?.code;
  const constraint = typeof e?.constraint === 'string' ? e.constraint : e?.driverError?.constraint;
  return typeof code === 'string'
    ? { code, constraint: typeof constraint === 'string' ? constraint : '' }
    : null;
}

export const PG_UNIQUE_VIOLATION = '23505';
export const PG_FOREIGN_KEY_VIOLATION = '23503';

/** Escapes LIKE wildcards so search text is matched literally. */
export function likePattern(q: string): string {
  return `%${q.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
}
