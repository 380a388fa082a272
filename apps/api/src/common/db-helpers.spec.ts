import { type DataSource, type EntityManager } from 'typeorm';
import { preparedQuery } from './db-helpers';

/** A data source whose query() records what it was asked and answers after a few milliseconds. */
function fakeSource(fail = false) {
  const calls: { name: string; params: unknown[] }[] = [];
  const source = {
    query: (config: { name: string; text: string }, params: unknown[]) => {
      const n = calls.push({ name: config.name, params });
      return new Promise((resolve, reject) =>
        setTimeout(() => (fail ? reject(new Error('down')) : resolve([{ n, params }])), 5),
      );
    },
  };
  return { source: source as unknown as DataSource, calls };
}

const SQL = 'SELECT $1::int AS n';

describe('preparedQuery', () => {
  it('sends identical reads asked for in one turn of the event loop once, and answers every caller', async () => {
    const { source, calls } = fakeSource();
    const results = await Promise.all([1, 2, 3, 4, 5].map(() => preparedQuery(source, SQL, [7])));
    expect(calls).toHaveLength(1);
    for (const rows of results) expect(rows).toBe(results[0]);
  });

  it('sends reads with other values separately', async () => {
    const { source, calls } = fakeSource();
    await Promise.all([
      preparedQuery(source, SQL, [1]),
      preparedQuery(source, SQL, [2]),
      preparedQuery(source, SQL, [1]),
    ]);
    expect(calls.map((c) => c.params)).toEqual([[1], [2]]);
  });

  it('never answers a caller with a query sent before it asked', async () => {
    const { source, calls } = fakeSource();
    const first = preparedQuery<{ n: number }>(source, SQL, [3]);
    // Asked while the first query is already on its way: it must get a query of its own.
    await new Promise((r) => setImmediate(r));
    const second = preparedQuery<{ n: number }>(source, SQL, [3]);
    const [a, b] = await Promise.all([first, second]);
    expect(calls).toHaveLength(2);
    expect(a[0]!.n).toBe(1);
    expect(b[0]!.n).toBe(2);
  });

  it('passes a failure to every caller of the shared read', async () => {
    const { source } = fakeSource(true);
    const results = await Promise.allSettled([
      preparedQuery(source, SQL, [9]),
      preparedQuery(source, SQL, [9]),
    ]);
    expect(results.map((r) => r.status)).toEqual(['rejected', 'rejected']);
  });

  it('does not share reads made inside a transaction', async () => {
    const { source, calls } = fakeSource();
    const inTransaction = Object.assign(Object.create(source as object), {
      queryRunner: {},
    }) as EntityManager;
    await Promise.all([preparedQuery(inTransaction, SQL, [4]), preparedQuery(inTransaction, SQL, [4])]);
    expect(calls).toHaveLength(2);
  });
});
