import { InjectQueue } from '@nestjs/bull';
import {
  Inject,
  Injectable,
  Logger,
  type OnApplicationBootstrap,
  type OnApplicationShutdown,
} from '@nestjs/common';
import { type ConfigType } from '@nestjs/config';
import { InjectDataSource } from '@nestjs/typeorm';
import { type Queue } from 'bull';
import { DataSource } from 'typeorm';
import { withDeadline } from '../common/with-deadline';
import { attemptFailureMessage } from './export-failure';
import { EXPORT_JOB, EXPORT_QUEUE, exportJobOptions, exportsConfig } from './exports.config';
import { type ExportJobData } from './exports.processor';
import { ExportsService } from './exports.service';

/** How long one Redis call of the reconciler may take before the round is given up (Redis is down). */
const REDIS_CALL_MS = 3000;

/**
 * PostgreSQL is the record of which exports are owed; Redis only carries the work. When Redis loses its
 * queue (restarted without its append-only file, flushed, or an add that never reached it during an
 * outage), this puts every queued or running export that has no Bull job back on the queue. Adding uses
 * the export id as the Bull job id, so an export that is still on the queue is never added twice, and the
 * processor's "done" guard makes a repeated run a no-op. Runs in every process that works the queue, and
 * there also builds again the packs whose safety notices or rules changed.
 */
@Injectable()
export class ExportsReconciler implements OnApplicationBootstrap, OnApplicationShutdown {
  private readonly logger = new Logger('Exports');
  private timer: NodeJS.Timeout | null = null;
  private round: Promise<number> | null = null;

  constructor(
    @InjectQueue(EXPORT_QUEUE) private readonly queue: Queue<ExportJobData>,
    @InjectDataSource() private readonly dataSource: DataSource,
    @Inject(exportsConfig.KEY) private readonly config: ConfigType<typeof exportsConfig>,
    private readonly exports: ExportsService,
  ) {}

  onApplicationBootstrap(): void {
    // Bull reports a lost Redis connection as an 'error' event; it reconnects by itself. Say so once a
    // minute at most instead of letting an unheard 'error' event end the process.
    let lastSaid = 0;
    this.queue.on('error', (err: Error) => {
      if (Date.now() - lastSaid < 60000) return;
      lastSaid = Date.now();
      this.logger.warn(`the queue lost Redis (${err.message}); it reconnects by itself`);
    });
    if (this.config.workerMode === 'off' || this.config.reconcileMs === 0) return;
    this.timer = setInterval(() => void this.reconcile(), this.config.reconcileMs);
    this.timer.unref();
  }

  async onApplicationShutdown(): Promise<void> {
    if (this.timer) clearInterval(this.timer);
    this.timer = null;
    await this.round?.catch(() => undefined);
  }

  /**
   * One round (never two at once): owed exports back on the queue, then the cut packs of released jobs built
   * again where their safety notices or rules changed (ExportsService.rebuildOutdated). Resolves with the
   * number of exports put back on the queue.
   */
  reconcile(): Promise<number> {
    if (!this.round) {
      this.round = this.requeueMissing()
        .catch((err: unknown) => {
          this.logger.warn(`could not check the queue against the exports table: ${String(err)}`);
          return 0;
        })
        .then(async (added) => {
          await this.exports.rebuildOutdated().catch((err: unknown) => {
            this.logger.warn(`could not check the cut packs against the safety notices: ${String(err)}`);
          });
          return added;
        })
        .finally(() => {
          this.round = null;
        });
    }
    return this.round;
  }

  private async requeueMissing(): Promise<number> {
    // Exports just created are left to the request that created them.
    const owed: { id: string }[] = await this.dataSource.query(
      `SELECT id FROM exports WHERE state IN ('queued', 'running') AND created_at < now() - interval '2 seconds'
        ORDER BY created_at LIMIT 500`,
    );
    let added = 0;
    for (const { id } of owed) {
      const existing = await withDeadline(this.queue.getJob(id), REDIS_CALL_MS, 'reading the queue');
      if (existing) {
        // Bull gave up on it while PostgreSQL could not be told: record the failure now.
        if (await withDeadline(existing.isFailed(), REDIS_CALL_MS, 'reading the queue')) {
          // Bull's reason is the last error's own text: the log gets it, the export's readers plain words.
          this.logger.warn(`export ${id} was given up by the queue: ${String(existing.failedReason)}`);
          await this.dataSource.query(
            `UPDATE exports SET state = 'failed', error_code = COALESCE(error_code, 'EXPORT.ATTEMPT_FAILED'),
                    error_message = COALESCE(error_message, $2), finished_at = now()
              WHERE id = $1 AND state IN ('queued', 'running')`,
            [id, attemptFailureMessage(null, true)],
          );
        }
        continue;
      }
      await withDeadline(
        this.queue.add(EXPORT_JOB, { exportId: id, requestId: null }, exportJobOptions(this.config, id)),
        REDIS_CALL_MS,
        'adding to the queue',
      );
      added++;
    }
    if (added > 0) this.logger.warn(`put ${added} owed export(s) on the queue that it did not hold`);
    return added;
  }
}
