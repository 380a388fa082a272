import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { FakeWorker } from '../../../testing/fake-worker';

async function client() {
  vi.resetModules();
  return import('./layout-worker');
}

describe('layout worker client', () => {
  beforeEach(() => {
    FakeWorker.made = [];
    vi.stubGlobal('Worker', FakeWorker);
  });
  afterEach(() => vi.unstubAllGlobals());

  it('starts one module worker and runs requests one at a time, in order', async () => {
    const { runInLayoutWorker } = await client();
    const a = runInLayoutWorker('studio', ['a']);
    const b = runInLayoutWorker('job', ['b']);
    expect(FakeWorker.made).toHaveLength(1);
    const w = FakeWorker.made[0]!;
    expect(w.options).toEqual({ type: 'module' });
    expect(String(w.url)).toMatch(/layout\.worker\.ts/);
    expect(w.posted.map((r) => [r.task, r.args])).toEqual([['studio', ['a']]]);
    w.answer('A');
    await expect(a.promise).resolves.toBe('A');
    expect(w.posted.map((r) => r.task)).toEqual(['studio', 'job']);
    w.answer('B');
    await expect(b.promise).resolves.toBe('B');
  });

  it('drops a queued request, and stops the worker to drop the running one', async () => {
    const { runInLayoutWorker } = await client();
    const a = runInLayoutWorker('studio', ['a']);
    const b = runInLayoutWorker('studio', ['b']);
    const c = runInLayoutWorker('studio', ['c']);
    b.cancel();
    a.cancel();
    const first = FakeWorker.made[0]!;
    expect(first.terminated).toBe(true);
    // The next request left (c) runs on a fresh worker; b never reaches one.
    expect(FakeWorker.made).toHaveLength(2);
    const second = FakeWorker.made[1]!;
    expect(second.posted.map((r) => r.args)).toEqual([['c']]);
    second.answer('C');
    await expect(c.promise).resolves.toBe('C');
  });

  it('rejects the running request when the worker fails, and carries on with a new one', async () => {
    const { runInLayoutWorker } = await client();
    const a = runInLayoutWorker('job', ['a']);
    const b = runInLayoutWorker('job', ['b']);
    FakeWorker.made[0]!.fail('out of memory');
    await expect(a.promise).rejects.toThrow('out of memory');
    expect(FakeWorker.made[0]!.terminated).toBe(true);
    const next = FakeWorker.made[1]!;
    expect(next.posted.map((r) => r.args)).toEqual([['b']]);
    next.answer('B');
    await expect(b.promise).resolves.toBe('B');
  });

  it('passes a task failure on as an error with its message', async () => {
    const { runInLayoutWorker } = await client();
    const a = runInLayoutWorker('studio', ['a']);
    const w = FakeWorker.made[0]!;
    w.onmessage?.({ data: { id: w.posted[0]!.id, ok: false, message: 'no colour plan' } } as MessageEvent);
    await expect(a.promise).rejects.toThrow('no colour plan');
  });
});
