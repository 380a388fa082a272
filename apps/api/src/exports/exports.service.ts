import { randomUUID } from 'node:crypto';
import { type Readable } from 'node:stream';
import { InjectQueue } from '@nestjs/bull';
import { HttpStatus, Inject, Injectable, type MessageEvent } from '@nestjs/common';
import { type ConfigType } from '@nestjs/config';
import { InjectDataSource } from '@nestjs/typeorm';
import { type Queue } from 'bull';
import { distinctUntilChanged, from, type Observable, switchMap, takeWhile, timer, map } from 'rxjs';
import { DataSource, In } from 'typeorm';
import { type ExportView } from '@kerfwright/contracts';
import { AuditService } from '../audit/audit.service';
import { type AuthUser } from '../common/decorators/auth.decorators';
import { AppError, notFound } from '../common/errors';
import { Job } from '../jobs/job.entity';
import { SafetyService } from '../safety/safety.service';
import { OBJECT_STORAGE, type ObjectStorage } from '../storage/object-storage';
import { exportPrefix, isSafeFileName } from './export-keys';
import { Export, ExportFile } from './export.entity';
import { EXPORT_JOB, EXPORT_QUEUE, exportsConfig } from './exports.config';
import { type ExportJobData } from './exports.processor';

/** States of a job whose cut pack may be (re)built. */
const EXPORTABLE = ['approved', 'released', 'cut', 'closed'];
/** What a hobbyist may download: the assembly guide of their own job, nothing else. */
const HOBBYIST_ROLES = ['assembly-guide'];
const POLL_MS = 500;

export interface OpenedFile {
  name: string;
  contentType: string;
  bytes: number;
  sha256: string;
  body: Readable;
}

/** Export records: asking for a cut pack, following it, and reading its files back. */
@Injectable()
export class ExportsService {
  constructor(
    @InjectDataSource() private readonly dataSource: DataSource,
    @InjectQueue(EXPORT_QUEUE) private readonly queue: Queue<ExportJobData>,
    @Inject(OBJECT_STORAGE) private readonly storage: ObjectStorage,
    @Inject(exportsConfig.KEY) private readonly config: ConfigType<typeof exportsConfig>,
    private readonly safety: SafetyService,
    private readonly audit: AuditService,
  ) {}

  /**
   * Queues a cut pack for an approved job (or a released one, again). While an export of the job is queued
   * or running, asking again answers that export (and re-queues it should the queue have lost it).
   */
  async request(user: AuthUser, jobId: string, requestId: string): Promise<{ exportId: string }> {
    const exp = await this.dataSource.transaction(async (m) => {
      const job = await m.findOne(Job, { where: { id: jobId }, lock: { mode: 'pessimistic_write' } });
      if (!job || job.state === 'draft') throw notFound('JOB', 'No such job');
      if (!EXPORTABLE.includes(job.state)) {
        throw new AppError(
          HttpStatus.CONFLICT,
          'EXPORT.JOB_NOT_READY',
          `A ${job.state} job has no cut pack yet; it must be approved first`,
          { state: job.state },
        );
      }
      const open = await m.findOne(Export, { where: { jobId, state: In(['queued', 'running']) } });
      if (open) return open;
      const id = randomUUID();
      const created = m.create(Export, {
        id,
        jobId,
        state: 'queued',
        requestedBy: user.id,
        storagePrefix: exportPrefix(jobId, id),
      });
      await m.insert(Export, created);
      await this.audit.record(m, {
        actorId: user.id,
        action: 'export.request',
        entityType: 'job',
        entityId: jobId,
        after: { exportId: id },
        requestId,
      });
      return created;
    });
    try {
      await this.queue.add(EXPORT_JOB, { exportId: exp.id, requestId }, this.jobOptions(exp.id));
    } catch (err) {
      await this.dataSource.query(
        `UPDATE exports SET state = 'failed', error_code = 'EXPORT.QUEUE_UNAVAILABLE', error_message = $2,
                finished_at = now() WHERE id = $1 AND state = 'queued'`,
        [exp.id, String((err as Error).message).slice(0, 500)],
      );
      throw new AppError(
        HttpStatus.SERVICE_UNAVAILABLE,
        'EXPORT.QUEUE_UNAVAILABLE',
        'The export queue is not available; try again shortly',
      );
    }
    return { exportId: exp.id };
  }

  /** Bull job options: the export id is the job id, so adding it twice is a no-op. */
  private jobOptions(exportId: string) {
    return {
      jobId: exportId,
      attempts: this.config.attempts,
      backoff: { type: 'exponential', delay: this.config.backoffMs },
      removeOnComplete: true,
      removeOnFail: 1000,
    };
  }

  async get(user: AuthUser, id: string): Promise<ExportView> {
    const exp = await this.visible(user, id);
    return this.toView(user, exp);
  }

  async list(user: AuthUser, jobId: string): Promise<ExportView[]> {
    const job = await this.dataSource.manager.findOne(Job, { where: { id: jobId } });
    if (!job || !this.canSee(user, job)) throw notFound('JOB', 'No such job');
    const rows = await this.dataSource.manager.find(Export, {
      where: { jobId },
      order: { createdAt: 'DESC' },
    });
    return Promise.all(rows.map((e) => this.toView(user, e)));
  }

  /** Server-sent events: the export's view whenever its state or progress changes, until it ends. */
  async events(user: AuthUser, id: string): Promise<Observable<MessageEvent>> {
    await this.visible(user, id);
    return timer(0, POLL_MS).pipe(
      switchMap(() => from(this.get(user, id))),
      distinctUntilChanged(
        (a, b) => a.state === b.state && a.progress === b.progress && a.attempts === b.attempts,
      ),
      takeWhile((v) => v.state !== 'done' && v.state !== 'failed', true),
      map((v) => ({ type: v.state === 'done' || v.state === 'failed' ? v.state : 'progress', data: v })),
    );
  }

  /**
   * Opens one file of a done export. The name is checked against the strict pattern and looked up in
   * PostgreSQL; only the stored key of that row ever reaches the storage driver. Staff need a current
   * acknowledgement of the job's safety notices; a hobbyist may fetch their own job's assembly guide only.
   */
  async open(user: AuthUser, id: string, name: string): Promise<OpenedFile> {
    const exp = await this.visible(user, id);
    const missing = () =>
      new AppError(HttpStatus.NOT_FOUND, 'EXPORT.FILE_NOT_FOUND', 'No such file in this export');
    if (!isSafeFileName(name)) throw missing();
    if (user.role !== 'hobbyist') {
      const safety = await this.safety.forJob(user, exp.jobId);
      if (!safety.acknowledged) {
        throw new AppError(
          HttpStatus.FORBIDDEN,
          'SAFETY.ACKNOWLEDGEMENT_REQUIRED',
          'Acknowledge the current safety notices for this job before downloading its files',
          { jobId: exp.jobId },
        );
      }
    }
    if (exp.state !== 'done') {
      throw new AppError(
        HttpStatus.CONFLICT,
        'EXPORT.NOT_DONE',
        `The export is ${exp.state}; its files are not ready`,
      );
    }
    const file = await this.dataSource.manager.findOne(ExportFile, { where: { exportId: id, name } });
    if (!file || (user.role === 'hobbyist' && !HOBBYIST_ROLES.includes(file.role))) throw missing();
    let stored;
    try {
      stored = await this.storage.get(file.storageKey);
    } catch {
      throw new AppError(
        HttpStatus.SERVICE_UNAVAILABLE,
        'EXPORT.STORAGE_UNAVAILABLE',
        'The file store did not answer',
      );
    }
    return {
      name: file.name,
      contentType: file.contentType,
      bytes: file.bytes,
      sha256: file.sha256,
      body: stored.body,
    };
  }

  /** The export if the caller may see its job (a hobbyist: their own job only); 404 otherwise. */
  private async visible(user: AuthUser, id: string): Promise<Export> {
    const exp = await this.dataSource.manager.findOne(Export, { where: { id } });
    const job = exp ? await this.dataSource.manager.findOne(Job, { where: { id: exp.jobId } }) : null;
    if (!exp || !job || !this.canSee(user, job)) throw notFound('EXPORT', 'No such export');
    return exp;
  }

  private canSee(user: AuthUser, job: Pick<Job, 'requesterId' | 'state'>): boolean {
    if (job.requesterId === user.id) return true;
    return user.role !== 'hobbyist' && job.state !== 'draft';
  }

  private async toView(user: AuthUser, exp: Export): Promise<ExportView> {
    const files =
      exp.state === 'done'
        ? await this.dataSource.manager.find(ExportFile, {
            where: { exportId: exp.id },
            order: { name: 'ASC' },
          })
        : [];
    return {
      id: exp.id,
      jobId: exp.jobId,
      state: exp.state,
      progress: exp.progress,
      attempts: exp.attempts,
      errorCode: exp.errorCode,
      errorMessage: exp.errorMessage,
      files: files
        .filter((f) => user.role !== 'hobbyist' || HOBBYIST_ROLES.includes(f.role))
        .map((f) => ({
          name: f.name,
          role: f.role,
          contentType: f.contentType,
          bytes: f.bytes,
          sha256: f.sha256,
        })),
      createdAt: exp.createdAt.toISOString(),
      finishedAt: exp.finishedAt ? exp.finishedAt.toISOString() : null,
    };
  }
}
