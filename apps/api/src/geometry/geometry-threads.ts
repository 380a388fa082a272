import { availableParallelism } from 'node:os';
import { MessageChannel, type TransferListItem } from 'node:worker_threads';
import { HttpStatus, Injectable, Logger, type OnModuleDestroy } from '@nestjs/common';
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
import { AppError } from '../common/errors';

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
 * How long one task may run in a thread (its wait in the queue not counted) before the thread is stopped:
 * KW_GEOMETRY_TASK_MS for what a request waits for (previews, uploads, job preparation; the sample designs
 * take 0.03–1.5 s), KW_GEOMETRY_PACK_MS for a cut pack, built on the queue (about a second for the samples).
 */
export function geometryDeadlines(env: NodeJS.ProcessEnv = process.env): { taskMs: number; packMs: number } {
  return {
    taskMs: env.KW_GEOMETRY_TASK_MS ? Number(env.KW_GEOMETRY_TASK_MS) : 15_000,
    packMs: env.KW_GEOMETRY_PACK_MS ? Number(env.KW_GEOMETRY_PACK_MS) : 120_000,
  };
}

/** A task stopped at its deadline: the design is too heavy to compute in time (422 DESIGN.TOO_HEAVY). */
export function tooSlow(deadlineMs: number): AppError {
  return new AppError(
    HttpStatus.UNPROCESSABLE_ENTITY,
    'DESIGN.TOO_HEAVY',
    `Computing this design took longer than ${deadlineMs / 1000} s, so it was stopped. Make it lighter: a solid ` +
      'with fewer faces, pieces with fewer sides or star points, or a fixed size rather than a fit to sheets',
    { reason: 'deadline', deadlineMs },
  );
}

/**
 * The worker-thread pool (piscina) that runs `@kerfwright/geometry/worker` tasks. Threads start on first use
 * and stop after five idle minutes; engine errors are rethrown here as the engine's own error classes. A task
 * past its deadline is aborted: piscina terminates its thread (a synchronous build cannot be interrupted
 * otherwise) and starts another for the next task.
 */
@Injectable()
export class GeometryThreads implements OnModuleDestroy {
  private readonly logger = new Logger('Geometry');
  private readonly deadlines = geometryDeadlines();
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
      return await this.run<typeof cutPack>(
        'cutPack',
        { input, progress: port2 },
        [port2],
        this.deadlines.packMs,
      );
    } finally {
      port1.close();
    }
  }

  async onModuleDestroy(): Promise<void> {
    await this.pool.destroy();
  }

  /**
   * Runs the named task of the worker module; an engine error comes back as its own class. The deadline starts
   * when a thread takes the task (it says so on the `started` port); past it the task is aborted (tooSlow).
   */
  private async run<F extends (task: never) => Promise<ThreadOutcome<unknown>>>(
    name: string,
    task: Parameters<F>[0],
    transferList: TransferListItem[] = [],
    deadlineMs = this.deadlines.taskMs,
  ): Promise<Extract<Awaited<ReturnType<F>>, { ok: true }>['value']> {
    const { port1, port2 } = new MessageChannel();
    const abort = new AbortController();
    let timer: NodeJS.Timeout | undefined;
    let started = 0;
    port1.once('message', () => {
      started = Date.now();
      timer = setTimeout(() => abort.abort(), deadlineMs);
    });
    try {
      const out = (await this.pool.run(
        { ...(task as object), started: port2 },
        { name, transferList: [...transferList, port2], signal: abort.signal },
      )) as Awaited<ReturnType<F>>;
      if (!out.ok) throw reviveThreadError(out.error);
      return out.value as Extract<Awaited<ReturnType<F>>, { ok: true }>['value'];
    } catch (err) {
      if (!abort.signal.aborted) throw err;
      this.logger.warn(
        `${name} stopped after ${Date.now() - started} ms (deadline ${deadlineMs} ms); thread replaced`,
      );
      throw tooSlow(deadlineMs);
    } finally {
      clearTimeout(timer);
      port1.close();
    }
  }
}
