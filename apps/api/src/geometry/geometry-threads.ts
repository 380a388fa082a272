import { availableParallelism } from 'node:os';
import { MessageChannel, type TransferListItem } from 'node:worker_threads';
import { Injectable, type OnModuleDestroy } from '@nestjs/common';
import type { CutPackInput, CutPackResult, DesignPreview, SolidTextFormat } from '@kerfwright/contracts';
import {
  reviveThreadError,
  type checkSolid,
  type cutPack,
  type PreparedJob,
  type PrepareJobTask,
  type prepareJob,
  type previewDesign,
  type ThreadOutcome,
} from '@kerfwright/geometry/worker';
import { Piscina } from 'piscina';

/**
 * Threads for the engine's heavy work: KW_GEOMETRY_THREADS (its range is checked at boot, env.validation.ts),
 * default one fewer than the cores (at least 1, at most 4), so a request never waits behind a fit search or a
 * cut pack on the event loop.
 */
function geometryThreadCount(env: NodeJS.ProcessEnv = process.env): number {
  const raw = env.KW_GEOMETRY_THREADS;
  return raw ? Number(raw) : Math.max(1, Math.min(4, availableParallelism() - 1));
}

/**
 * The worker-thread pool (piscina) that runs `@kerfwright/geometry/worker` tasks. Threads start on first use
 * and stop after five idle minutes; engine errors are rethrown here as the engine's own error classes.
 */
@Injectable()
export class GeometryThreads implements OnModuleDestroy {
  private readonly pool = new Piscina({
    filename: require.resolve('@kerfwright/geometry/worker'),
    minThreads: 0,
    maxThreads: geometryThreadCount(),
    idleTimeout: 5 * 60_000,
  });

  /** Fit (when asked) and lay out a job's design: see prepareJob in the geometry library. */
  prepareJob(task: PrepareJobTask): Promise<PreparedJob> {
    return this.run<typeof prepareJob>('prepareJob', task);
  }

  /** A design's preview figures (the spec checked and built). */
  previewDesign(spec: unknown): Promise<DesignPreview> {
    return this.run<typeof previewDesign>('previewDesign', { spec });
  }

  /** Uploaded solid text checked by the engine: hull, merged faces, limits. */
  checkSolid(
    format: SolidTextFormat,
    text: string,
    name: string,
  ): Promise<{ name: string; vertexCount: number; faceCount: number }> {
    return this.run<typeof checkSolid>('checkSolid', { format, text, name });
  }

  /** Builds a cut pack in a thread; progress fractions arrive on the main thread as they are made. */
  async cutPack(input: CutPackInput, onProgress?: (fraction: number) => void): Promise<CutPackResult> {
    const { port1, port2 } = new MessageChannel();
    port1.on('message', (f: number) => onProgress?.(f));
    try {
      return await this.run<typeof cutPack>('cutPack', { input, progress: port2 }, [port2]);
    } finally {
      port1.close();
    }
  }

  async onModuleDestroy(): Promise<void> {
    await this.pool.destroy();
  }

  /** Runs the named task of the worker module; an engine error comes back as its own class. */
  private async run<F extends (task: never) => Promise<ThreadOutcome<unknown>>>(
    name: string,
    task: Parameters<F>[0],
    transferList?: TransferListItem[],
  ): Promise<Extract<Awaited<ReturnType<F>>, { ok: true }>['value']> {
    const out = (await this.pool.run(task, { name, transferList })) as Awaited<ReturnType<F>>;
    if (!out.ok) throw reviveThreadError(out.error);
    return out.value as Extract<Awaited<ReturnType<F>>, { ok: true }>['value'];
  }
}
