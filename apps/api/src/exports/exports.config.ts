import { registerAs } from '@nestjs/config';

export const WORKER_MODES = ['inline', 'off', 'worker'] as const;
export type WorkerMode = (typeof WORKER_MODES)[number];

function int(name: string, fallback: number, min: number): number {
  const raw = process.env[name];
  if (raw === undefined || raw === '') return fallback;
  const n = Number(raw);
  if (!Number.isInteger(n) || n < min)
    throw new Error(`Invalid configuration: ${name} must be an integer ≥ ${min}`);
  return n;
}

/**
 * The cut-pack queue. KW_WORKER_MODE: `inline` (default) — the API process also works the queue; `off` —
 * the API only enqueues and separate `npm run worker` processes do the work (`worker` is what worker.ts sets).
 * KW_EXPORT_STEP_DELAY_MS is a test and bench knob only: a pause after each stored file.
 */
export const exportsConfig = registerAs('exports', () => {
  const mode = (process.env.KW_WORKER_MODE ?? 'inline') as WorkerMode;
  if (!WORKER_MODES.includes(mode)) {
    throw new Error(`Invalid configuration: KW_WORKER_MODE must be one of ${WORKER_MODES.join(', ')}`);
  }
  return {
    workerMode: mode,
    queuePrefix: process.env.KW_QUEUE_PREFIX ?? 'kw',
    concurrency: int('KW_EXPORT_CONCURRENCY', 1, 1),
    attempts: int('KW_EXPORT_ATTEMPTS', 4, 1),
    backoffMs: int('KW_EXPORT_BACKOFF_MS', 2000, 0),
    /** A worker's lock on a running export; a killed worker's export is taken over after about this long. */
    lockMs: int('KW_EXPORT_LOCK_MS', 15000, 1000),
    stalledCheckMs: int('KW_EXPORT_STALLED_CHECK_MS', 5000, 500),
    stepDelayMs: int('KW_EXPORT_STEP_DELAY_MS', 0, 0),
    /**
     * How often a worker compares the queue with the exports owed in PostgreSQL (see exports.reconciler.ts);
     * 0 turns it off (the API test suites, which share one database between several queue prefixes).
     */
    reconcileMs: int('KW_EXPORT_RECONCILE_MS', 10000, 0),
  };
});
export type ExportsConfig = ReturnType<typeof exportsConfig>;

export const EXPORT_QUEUE = 'cut-packs';
export const EXPORT_JOB = 'build';

/** Bull job options: the export id is the job id, so adding it twice is a no-op. */
export function exportJobOptions(config: Pick<ExportsConfig, 'attempts' | 'backoffMs'>, exportId: string) {
  return {
    jobId: exportId,
    attempts: config.attempts,
    backoff: { type: 'exponential', delay: config.backoffMs },
    removeOnComplete: true,
    removeOnFail: 1000,
  };
}
