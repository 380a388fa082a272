import { createHash } from 'node:crypto';
import { type DataSource, type EntityManager, type ValueTransformer } from 'typeorm';

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
export const PG_FEATURE_NOT_SUPPORTED = '0A000';
export const PG_SERIALIZATION_FAILURE = '40001';
export const PG_DEADLOCK_DETECTED = '40P01';

/** Escapes LIKE wildcards so search text is matched literally. */
export function likePattern(q: string): string {
  return `%${q.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
}

const statementNames = new Map<string, string>();
let statementGeneration = 0;

/** PostgreSQL's answer to a prepared statement whose result columns a schema change has altered. */
export function isStalePreparedStatement(err: unknown): boolean {
  return (
    pgError(err)?.code === PG_FEATURE_NOT_SUPPORTED &&
    /cached plan must not change result type/.test(String(err))
  );
}

type Batch = { resolve: (rows: unknown[]) => void; reject: (err: unknown) => void }[];
/** Open batches by data source, statement text and values (as JSON). */
const waiting = new WeakMap<object, Map<string, Map<string, Batch>>>();

/**
 * Runs a read issued on (nearly) every request as a named, server-side prepared statement: PostgreSQL parses
 * and plans it once per connection instead of on every call (planning was a third of the jobs list's database
 * time). The name is derived from the SQL text, which must come from code only; values go in `params`.
 * After a migration changes a column such a statement returns, PostgreSQL refuses the old statement on every
 * connection that prepared it: the statement then gets a new name, so each connection prepares it afresh.
 * Meant for reads outside transactions (inside one, the refused statement would abort the transaction).
 *
 * Identical reads (same text and values, same data source) asked for during one turn of the event loop are
 * sent once, when the turn's I/O has been handled (setImmediate), and every caller gets that result: under
 * load many requests for the same page or the same signed-in user arrive together. Each caller still gets an
 * answer to a query sent after it asked, so no caller sees data older than its own request; the rows are
 * shared, so callers must not change them.
 */
export function preparedQuery<T>(
  m: DataSource | EntityManager,
  text: string,
  params: unknown[],
): Promise<T[]> {
  // A transaction's manager has its own connection and snapshot: its reads are never shared.
  if ((m as EntityManager).queryRunner) return sendPrepared<T>(m, text, params);
  const source = (m as EntityManager).dataSource ?? m;
  let byText = waiting.get(source);
  if (!byText) waiting.set(source, (byText = new Map()));
  // Keyed by the text itself, not text + values: callers pass the same string each time, whose hash is kept.
  let batches = byText.get(text);
  if (!batches) byText.set(text, (batches = new Map()));
  const key = JSON.stringify(params);
  const open = batches.get(key);
  return new Promise<T[]>((resolve, reject) => {
    const waiter = { resolve: resolve as (rows: unknown[]) => void, reject };
    if (open) {
      open.push(waiter);
      return;
    }
    const batch: Batch = [waiter];
    batches.set(key, batch);
    setImmediate(() => {
      batches.delete(key);
      // A map leaves byText only when its last batch is sent, so this is the one byText holds.
      if (batches.size === 0) byText.delete(text);
      sendPrepared<T>(m, text, params).then(
        (rows) => batch.forEach((w) => w.resolve(rows)),
        (err: unknown) => batch.forEach((w) => w.reject(err)),
      );
    });
  });
}

/** preparedQuery without the sharing: sent at once (for callers that batch their reads themselves). */
export async function sendPrepared<T>(
  m: DataSource | EntityManager,
  text: string,
  params: unknown[],
): Promise<T[]> {
  const run = () => {
    let name = statementNames.get(text);
    if (!name) {
      const hash = createHash('sha256').update(text).digest('hex').slice(0, 24);
      name = `kw_${hash}_${statementGeneration}`;
      statementNames.set(text, name);
    }
    // node-postgres takes a query config object in place of the text; TypeORM passes it through unchanged.
    return { name, result: m.query({ name, text } as unknown as string, params) as Promise<T[]> };
  };
  const first = run();
  try {
    return await first.result;
  } catch (err) {
    if (!isStalePreparedStatement(err)) throw err;
    // Renamed once per change, not once per connection that notices it.
    if (statementNames.get(text) === first.name) {
      statementGeneration++;
      statementNames.delete(text);
    }
    return run().result;
  }
}
