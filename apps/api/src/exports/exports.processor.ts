import { createHash } from 'node:crypto';
import { setTimeout as sleep } from 'node:timers/promises';
import { InjectQueue } from '@nestjs/bull';
import { Inject, Injectable, Logger, type OnApplicationBootstrap } from '@nestjs/common';
import { type ConfigType } from '@nestjs/config';
import { InjectDataSource } from '@nestjs/typeorm';
import { type Job as BullJob, type Queue } from 'bull';
import { DataSource, type EntityManager } from 'typeorm';
import {
  type CutPackFile,
  type CutPackInput,
  type CutPackManifest,
  type CutPackResult,
} from '@kerfwright/contracts';
import { AuditService } from '../audit/audit.service';
import { Job } from '../jobs/job.entity';
import { JobPreparationService } from '../jobs/job-preparation.service';
import { JobsService } from '../jobs/jobs.service';
import { OBJECT_STORAGE, type ObjectStorage } from '../storage/object-storage';
import { assertJobExportable, CutPackInputService } from './cut-pack-input';
import { fileKey, isSafeFileName } from './export-keys';
import {
  attemptFailureMessage,
  EXPORT_GAVE_UP_MESSAGE,
  ExportFailure,
  ExportStorageError,
} from './export-failure';
import { Export, ExportFile } from './export.entity';
import { EXPORT_JOB, EXPORT_QUEUE, exportsConfig } from './exports.config';

/** The geometry library's pack builder (provided by the module; see build-pack.ts). */
export type PackBuilder = (
  input: CutPackInput,
  onProgress?: (fraction: number) => void,
) => Promise<CutPackResult>;
export const PACK_BUILDER = Symbol('PACK_BUILDER');

export interface ExportJobData {
  exportId: string;
  requestId: string | null;
}

/** Share of the progress bar the pack build takes; storing the files takes the rest. */
const BUILD_SHARE = 60;
const UPLOADS_AT_ONCE = 4;

/**
 * Works the cut-pack queue (in the API process unless KW_WORKER_MODE=off, and in every `npm run worker`).
 * Each attempt rebuilds the pack and overwrites the export's objects under its job-scoped prefix; one final
 * transaction marks the export done, records the files and releases the job. A retry after done is a no-op,
 * so an export killed half-way is completed exactly once and files are never listed before they all exist.
 */
@Injectable()
export class ExportsProcessor implements OnApplicationBootstrap {
  private readonly logger = new Logger('Exports');

  constructor(
    @InjectQueue(EXPORT_QUEUE) private readonly queue: Queue<ExportJobData>,
    @InjectDataSource() private readonly dataSource: DataSource,
    @Inject(OBJECT_STORAGE) private readonly storage: ObjectStorage,
    @Inject(exportsConfig.KEY) private readonly config: ConfigType<typeof exportsConfig>,
    @Inject(PACK_BUILDER) private readonly buildPack: PackBuilder,
    private readonly inputs: CutPackInputService,
    private readonly jobs: JobsService,
    private readonly preparation: JobPreparationService,
    private readonly audit: AuditService,
  ) {}

  onApplicationBootstrap(): void {
    if (this.config.workerMode === 'off') return;
    void this.queue.process(EXPORT_JOB, this.config.concurrency, (job) => this.handle(job));
    // An export whose workers kept dying (Bull gives up after maxStalledCount) never reaches handle()'s
    // catch: record it as failed here so it does not look "running" for ever (Bull's words go to the log).
    this.queue.on('failed', (job: BullJob<ExportJobData>, err: Error) => {
      if (!/stalled/i.test(err.message)) return;
      this.logger.warn(`export ${job.data.exportId} given up: ${err.message}`);
      void this.dataSource
        .query(
          `UPDATE exports SET state = 'failed', error_code = 'EXPORT.STALLED', error_message = $2, finished_at = now()
            WHERE id = $1 AND state NOT IN ('done', 'failed')`,
          [job.data.exportId, EXPORT_GAVE_UP_MESSAGE],
        )
        .catch(() => undefined);
    });
    this.logger.log(`working the ${EXPORT_QUEUE} queue (concurrency ${this.config.concurrency})`);
  }

  /** One attempt at one export. Throws to let Bull retry (with backoff) or, once discarded, fail it. */
  async handle(bullJob: BullJob<ExportJobData>): Promise<void> {
    const { exportId, requestId } = bullJob.data;
    const started = await this.returning<Export>(
      this.dataSource.manager,
      `UPDATE exports SET state = 'running', progress = 0, attempts = attempts + 1, started_at = now(),
              finished_at = NULL
        WHERE id = $1 AND state IN ('queued', 'running')
        RETURNING id, job_id AS "jobId", requested_by AS "requestedBy", created_at AS "createdAt",
                  storage_prefix AS "storagePrefix"`,
      [exportId],
    );
    const exp = started[0];
    if (!exp) {
      // Done already, or failed (a job returned meanwhile cancels its pack): nothing to do, exactly once. A
      // missing row means the job was deleted, or this worker reads another database than the API that queued
      // it (check KW_DB_* and KW_QUEUE_PREFIX).
      const known: unknown[] = await this.dataSource.query(`SELECT 1 FROM exports WHERE id = $1`, [exportId]);
      if (known.length === 0) this.logger.warn(`export ${exportId} is not in this database; skipped`);
      return;
    }
    try {
      const { files, manifest } = await this.build(exp);
      await this.finish(exp, files, manifest, requestId);
    } catch (err) {
      const failure = err instanceof ExportFailure ? err : null;
      const attemptsLeft = (bullJob.opts.attempts ?? 1) - (bullJob.attemptsMade + 1);
      const final = failure !== null || attemptsLeft <= 0;
      const code = failure?.code ?? 'EXPORT.ATTEMPT_FAILED';
      // The export's readers (the hobbyist who owns the job included) get plain words; the error's own text,
      // which may name hosts, ports and paths, goes to the log only.
      const message = (failure?.message ?? attemptFailureMessage(err, final)).slice(0, 1000);
      const detail = failure
        ? (failure.detail ?? failure.message)
        : err instanceof Error
          ? err.message
          : String(err);
      await this.dataSource
        .query(
          `UPDATE exports SET state = $2::export_state, error_code = $3, error_message = $4,
                  finished_at = CASE WHEN $5::boolean THEN now() ELSE NULL END
            WHERE id = $1 AND state = 'running'`,
          [exportId, final ? 'failed' : 'queued', code, message, final],
        )
        .catch((e: unknown) =>
          this.logger.warn(`export ${exportId}: could not record failure: ${String(e)}`),
        );
      this.logger.warn(`export ${exportId} attempt ${bullJob.attemptsMade + 1} failed (${code}): ${detail}`);
      if (failure) {
        await bullJob.discard();
        await this.discardObjects(exp);
      }
      throw err;
    }
  }

  /** Builds the pack and writes every file (overwriting what an earlier attempt left). */
  private async build(exp: Export): Promise<{ files: ExportFile[]; manifest: CutPackManifest }> {
    await this.onStorage(() => this.storage.ready());
    const input = await this.inputs.forJob(this.dataSource.manager, exp.jobId, new Date(exp.createdAt));
    const progress = this.progressWriter(exp.id);
    let pack: CutPackResult;
    try {
      pack = await this.buildPack(input, (f) =>
        progress(Math.round(Math.max(0, Math.min(1, f)) * BUILD_SHARE)),
      );
    } catch (err) {
      throw ExportFailure.from(err, 'EXPORT.PACK_FAILED');
    }
    const names = new Set<string>();
    for (const f of pack.files) {
      if (!isSafeFileName(f.name) || names.has(f.name)) {
        throw new ExportFailure('EXPORT.BAD_FILE_NAME', `The pack holds an unusable file name "${f.name}"`);
      }
      names.add(f.name);
    }
    // Files go up a few at a time (one at a time when the test/bench step delay is set).
    const parallel = this.config.stepDelayMs > 0 ? 1 : UPLOADS_AT_ONCE;
    const rows: ExportFile[] = new Array<ExportFile>(pack.files.length);
    let next = 0;
    let stored = 0;
    const uploader = async (): Promise<void> => {
      while (next < pack.files.length) {
        const i = next++;
        const f = pack.files[i]!;
        const row = await this.store(exp, f);
        const listed = pack.manifest.files.find((e) => e.name === f.name);
        if (listed && (listed.sha256 !== row.sha256 || listed.bytes !== row.bytes)) {
          throw new ExportFailure('EXPORT.CHECKSUM_MISMATCH', `${f.name} differs from the manifest's entry`);
        }
        rows[i] = row;
        stored++;
        void progress(BUILD_SHARE + Math.floor((stored / pack.files.length) * (99 - BUILD_SHARE)));
        if (this.config.stepDelayMs > 0) await sleep(this.config.stepDelayMs);
      }
    };
    await Promise.all(Array.from({ length: parallel }, uploader));
    // Objects under the prefix that this attempt did not write (an earlier, different attempt) go.
    for (const o of await this.onStorage(() => this.storage.list(exp.storagePrefix))) {
      if (!rows.some((r) => r.storageKey === o.key)) await this.onStorage(() => this.storage.delete(o.key));
    }
    return { files: rows, manifest: pack.manifest };
  }

  private async store(exp: Export, f: CutPackFile): Promise<ExportFile> {
    const body = Buffer.from(f.data.buffer, f.data.byteOffset, f.data.byteLength);
    const key = fileKey(exp.storagePrefix, f.name);
    await this.onStorage(() => this.storage.put(key, body, f.contentType));
    return Object.assign(new ExportFile(), {
      exportId: exp.id,
      name: f.name,
      role: f.role,
      contentType: f.contentType,
      bytes: body.length,
      sha256: createHash('sha256').update(body).digest('hex'),
      storageKey: key,
    });
  }

  /** The one atomic "done": export row, file rows, and approved → released, or nothing. */
  private async finish(
    exp: Export,
    files: ExportFile[],
    manifest: CutPackManifest,
    requestId: string | null,
  ): Promise<void> {
    await this.dataSource.transaction(async (m) => {
      // The job is locked first (as its state changes lock it), then checked as the build began: a job
      // returned meanwhile, or a material taken off the laser, gets no files and is not released.
      const job = await m.findOne(Job, { where: { id: exp.jobId }, lock: { mode: 'pessimistic_write' } });
      if (!job) throw new ExportFailure('EXPORT.JOB_GONE', 'The job no longer exists');
      assertJobExportable(job);
      await this.preparation.assertStillCuttable(m, job).catch((err: unknown) => {
        throw ExportFailure.from(err, 'EXPORT.PROFILE_NOT_APPROVED');
      });
      const done = await this.returning<{ id: string }>(
        m,
        `UPDATE exports SET state = 'done', progress = 100, finished_at = now(), error_code = NULL,
                error_message = NULL, manifest = $2
          WHERE id = $1 AND state = 'running' RETURNING id`,
        [exp.id, JSON.stringify(manifest)],
      );
      if (done.length === 0) {
        const [row] = await m.query<{ state: string; error_message: string | null }[]>(
          `SELECT state, error_message FROM exports WHERE id = $1`,
          [exp.id],
        );
        // Cancelled while it was built (the job returned and, maybe, approved again since): its files go.
        if (row?.state === 'failed') {
          throw new ExportFailure('EXPORT.JOB_CHANGED', row.error_message ?? 'The cut pack was cancelled');
        }
        return; // another worker finished it first
      }
      await m.delete(ExportFile, { exportId: exp.id });
      await m.insert(ExportFile, files);
      await this.audit.record(m, {
        actorId: exp.requestedBy,
        action: 'export.done',
        entityType: 'job',
        entityId: exp.jobId,
        after: { exportId: exp.id, files: files.map((f) => ({ name: f.name, sha256: f.sha256 })) },
        requestId,
      });
      await this.jobs.releaseForExport(m, exp.jobId, exp.requestedBy, requestId);
    });
  }

  /**
   * Deletes what the attempts of a failed export stored: files of a job that must not be cut as built (returned
   * meanwhile, a material now prohibited) are not kept where anyone could reach them. Never a done export's.
   */
  private async discardObjects(exp: Export): Promise<void> {
    try {
      const state: { state: string }[] = await this.dataSource.query(
        `SELECT state FROM exports WHERE id = $1`,
        [exp.id],
      );
      if (state[0]?.state !== 'failed') return;
      for (const o of await this.storage.list(exp.storagePrefix)) await this.storage.delete(o.key);
    } catch (e) {
      this.logger.warn(`export ${exp.id}: could not delete the files of the failed export: ${String(e)}`);
    }
  }

  /** Runs a call to the object storage; its failure is marked as the storage's (for the message users read). */
  private async onStorage<T>(call: () => Promise<T>): Promise<T> {
    try {
      return await call();
    } catch (err) {
      throw new ExportStorageError(err);
    }
  }

  /** Rows of an UPDATE … RETURNING (TypeORM's postgres driver answers those with [rows, count]). */
  private async returning<T>(m: EntityManager, sql: string, params: unknown[]): Promise<T[]> {
    const out: unknown = await m.query(sql, params);
    if (Array.isArray(out) && out.length === 2 && Array.isArray(out[0]) && typeof out[1] === 'number') {
      return out[0] as T[];
    }
    return out as T[];
  }

  /** Writes progress to the export row (whole percent, only upwards), one write at a time. */
  private progressWriter(exportId: string): (pct: number) => Promise<void> {
    let last = 0;
    let chain = Promise.resolve();
    return (pct: number) => {
      if (pct <= last) return chain;
      last = pct;
      chain = chain
        .then(() =>
          this.dataSource.query(`UPDATE exports SET progress = $2 WHERE id = $1 AND state = 'running'`, [
            exportId,
            pct,
          ]),
        )
        .then(
          () => undefined,
          () => undefined,
        );
      return chain;
    };
  }
}
