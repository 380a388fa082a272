import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { FakeWorker } from '../testing/fake-worker';
import { createTaskWorkerClient, serveTasks, type TaskRequest, type TaskResponse } from './task-worker';

const start = () => new FakeWorker() as unknown as Worker;

describe('a task worker client that lets a cancelled task finish (discard)', () => {
  beforeEach(() => {
    FakeWorker.made = [];
  });

  it('keeps the worker, passes the cancelled answer on to no one, and runs the next request after it', async () => {
    const client = createTaskWorkerClient<'build'>(start, 'stopped', 'discard');
    const a = client.run('build', ['a']);
    const heard = vi.fn();
    a.promise.then(heard, heard);
    const b = client.run('build', ['b']);
    const c = client.run('build', ['c']);
    b.cancel();
    a.cancel();
    const w = FakeWorker.made[0]!;
    expect(w.terminated).toBe(false);
    expect(w.posted.map((r) => r.args)).toEqual([['a']]);
    w.answer('A');
    // b was dropped before it ran; c runs on the same worker.
    expect(FakeWorker.made).toHaveLength(1);
    expect(w.posted.map((r) => r.args)).toEqual([['a'], ['c']]);
    w.answer('C');
    await expect(c.promise).resolves.toBe('C');
    expect(heard).not.toHaveBeenCalled();
  });

  it('terminates the worker to drop the running task by default', () => {
    const client = createTaskWorkerClient<'build'>(start, 'stopped');
    client.run('build', ['a']).cancel();
    expect(FakeWorker.made[0]!.terminated).toBe(true);
  });
});

describe("the worker's side", () => {
  afterEach(() => vi.restoreAllMocks());

  it("answers a request with its task's value, or with the message of what the task threw", () => {
    const answers: TaskResponse[] = [];
    const scope = {
      onmessage: null as ((event: MessageEvent<TaskRequest>) => void) | null,
      postMessage: (answer: TaskResponse) => answers.push(answer),
    };
    serveTasks(scope, (task, args) => {
      if (task === 'fail') throw new Error('no plan');
      return [task, ...args];
    });
    scope.onmessage?.({ data: { id: 1, task: 'echo', args: [2] } } as MessageEvent<TaskRequest>);
    scope.onmessage?.({ data: { id: 2, task: 'fail', args: [] as unknown[] } } as MessageEvent<TaskRequest>);
    expect(answers).toEqual([
      { id: 1, ok: true, value: ['echo', 2] },
      { id: 2, ok: false, message: 'no plan' },
    ]);
  });
});
