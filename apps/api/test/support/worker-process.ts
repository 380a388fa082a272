import { type ChildProcess, spawn } from 'node:child_process';
import * as path from 'node:path';

const WORKER_JS = path.resolve(__dirname, '..', '..', 'dist', 'worker.js');

/** A real `npm run worker` process (the built apps/api/dist/worker.js) with the given extra environment. */
export interface WorkerProcess {
  child: ChildProcess;
  output: () => string;
  /** Resolves once the worker works the queue. */
  ready: Promise<void>;
  exited: Promise<number | null>;
}

export function startWorker(env: Record<string, string>): WorkerProcess {
  const child = spawn(process.execPath, [WORKER_JS], {
    env: { ...process.env, ...env },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let out = '';
  const exited = new Promise<number | null>((resolve) => child.once('exit', (code) => resolve(code)));
  const ready = new Promise<void>((resolve, reject) => {
    const onData = (chunk: Buffer) => {
      out += chunk.toString();
      if (/working the cut-packs queue/.test(out)) resolve();
    };
    child.stdout!.on('data', onData);
    child.stderr!.on('data', onData);
    void exited.then((code) => reject(new Error(`worker exited (${code}) before it was ready:\n${out}`)));
  });
  ready.catch(() => undefined);
  return { child, output: () => out, ready, exited };
}

export async function stopWorker(
  w: WorkerProcess | undefined,
  signal: NodeJS.Signals = 'SIGTERM',
): Promise<void> {
  if (!w || w.child.exitCode !== null || w.child.signalCode !== null) return;
  w.child.kill(signal);
  await w.exited;
}
