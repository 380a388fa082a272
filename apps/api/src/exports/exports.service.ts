import { randomUUID } from 'node:crypto';
import { type Readable } from 'node:stream';
import { InjectQueue } from '@nestjs/bull';
import { HttpStatus, Inject, Injectable, Logger, type MessageEvent } from '@nestjs/common';
import { type ConfigType } from '@nestjs/config';
import { InjectDataSource } from '@nestjs/typeorm';
import { type Queue } from 'bull';
import { distinctUntilChanged, from, type Observable, switchMap, takeWhile, timer, map } from 'rxjs';
import { DataSource, type EntityManager, In, IsNull } from 'typeorm';
import {
  CUT_PACK_DOWNLOADABLE_STATES,
  CUT_PACK_ROLES_FOR_REQUESTER,
  CUT_PACK_ROLES_PRINTING_SAFETY,
  type ExportRequested,
  type ExportView,
  JOB_PACK_STATES,
  transitionFor,
} from '@kerfwright/contracts';
import { AuditService } from '../audit/audit.service';
import { type AuthUser } from '../common/decorators/auth.decorators';
import { AppError, notFound } from '../common/errors';
import { withDeadline } from '../common/with-deadline';
import { Job } from '../jobs/job.entity';
import { assertVersion, canReadJob } from '../jobs/job-access';
import { JobPreparationService } from '../jobs/job-preparation.service';
import { noticeVersionKeys, SafetyService } from '../safety/safety.service';
import { OBJECT_STORAGE, type ObjectStorage } from '../storage/object-storage';
import { exportPrefix, isSafeFileName } from './export-keys';
import { Export, ExportFile } from './export.entity';
import { EXPORT_JOB, EXPORT_QUEUE, exportJobOptions, exportsConfig } from './exports.config';
import { type ExportJobData } from './exports.processor';
import { withArticle } from '../common/text';
import { preparationInEffect } from '../jobs/preparation-in-effect';

const POLL_MS = 500;
/** How long a request waits for Redis to take a new export before answering anyway. */
const QUEUE_ADD_MS = 3000;

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
  private readonly logger = new Logger('Exports');

  constructor(
    @InjectDataSource() private readonly dataSource: DataSource,
    @InjectQueue(EXPORT_QUEUE) private readonly queue: Queue<ExportJobData>,
    @Inject(OBJECT_STORAGE) private readonly storage: ObjectStorage,
    @Inject(exportsConfig.KEY) private readonly config: ConfigType<typeof exportsConfig>,
    private readonly safety: SafetyService,
    private readonly audit: AuditService,
    private readonly preparation: JobPreparationService,
  ) {}

  /**
   * Releases an approved job the only way a job is released: by queueing its cut pack. The export, once done,
   * moves the job to released in the same transaction that records its files (see ExportsProcessor.finish),
   * so the job is never released without them. The job must be approved and the caller must name the
   * version they read (409 JOB.ILLEGAL_TRANSITION / JOB.STALE_VERSION otherwise); an export of the job
   * already queued or running is answered instead of a second one.
   */
  release(user: AuthUser, jobId: string, version: number, requestId: string): Promise<ExportRequested> {
    const rule = transitionFor('release');
    return this.request(user, jobId, requestId, (job) => {
      if (!rule.from.includes(job.state)) {
        throw new AppError(
          HttpStatus.CONFLICT,
          'JOB.ILLEGAL_TRANSITION',
          `${withArticle(job.state)} job cannot be given "release"`,
          { state: job.state, action: 'release', allowedFrom: rule.from },
        );
      }
      assertVersion(job, version);
    });
  }

  /**
   * Queues a cut pack for an approved job (or a released one, again). While an export of the job is queued
   * or running, asking again answers that export (and re-queues it should the queue have lost it).
   * `check` runs on the locked job before anything is written (release's state and version checks).
   */
  async request(
    user: AuthUser,
    jobId: string,
    requestId: string,
    check?: (job: Job) => void,
  ): Promise<ExportRequested> {
    const exp = await this.dataSource.transaction(async (m) => {
      const job = await m.findOne(Job, { where: { id: jobId }, lock: { mode: 'pessimistic_write' } });
      if (!job || !canReadJob(user, job)) throw notFound('JOB', 'No such job');
      check?.(job);
      if (!JOB_PACK_STATES.includes(job.state)) {
        const done = job.state === 'cut' || job.state === 'closed';
        throw new AppError(
          HttpStatus.CONFLICT,
          'EXPORT.JOB_NOT_READY',
          done
            ? `${withArticle(job.state)} job gets no new cut pack; its files stay as they were released`
            : `${withArticle(job.state)} job has no cut pack yet; it must be approved first`,
          { state: job.state, allowed: JOB_PACK_STATES },
        );
      }
      // The files are built for the machine and material as prepared: both must pass preparation's checks
      // now (409 MATERIAL.LASER_PROHIBITED for a material taken off the laser since, for instance).
      await this.preparation.assertStillCuttable(m, job);
      const open = await m.findOne(Export, { where: { jobId, state: In(['queued', 'running']) } });
      if (open) return open;
      return this.owe(m, jobId, user.id, requestId);
    });
    await this.enqueue(exp.id, requestId);
    return { exportId: exp.id };
  }

  /** A new queued export of a job, recorded in the audit trail (the caller holds the job's row lock). */
  private async owe(
    m: EntityManager,
    jobId: string,
    actorId: string | null,
    requestId: string | null,
    after: object = {},
  ): Promise<Export> {
    const id = randomUUID();
    const created = m.create(Export, {
      id,
      jobId,
      state: 'queued',
      requestedBy: actorId,
      storagePrefix: exportPrefix(jobId, id),
      preparationId: await preparationInEffect(m, jobId),
    });
    await m.insert(Export, created);
    await this.audit.record(m, {
      actorId,
      action: 'export.request',
      entityType: 'job',
      entityId: jobId,
      after: { exportId: id, ...after },
      requestId,
    });
    return created;
  }

  private async enqueue(exportId: string, requestId: string | null): Promise<void> {
    try {
      await withDeadline(
        this.queue.add(EXPORT_JOB, { exportId, requestId }, exportJobOptions(this.config, exportId)),
        QUEUE_ADD_MS,
        'adding to the queue',
      );
    } catch (err) {
      // Redis is down or slow. The export stays queued in PostgreSQL, which is the record of what is owed;
      // the add completes when Redis answers again, or a worker's reconciler puts it on the queue.
      this.logger.warn(`export ${exportId} is owed but not yet on the queue: ${String(err)}`);
    }
  }

  /** Done packs found current, by export id, with the safety stamp they were checked under. */
  private readonly currentPacks = new Map<string, string>();

  /**
   * Builds again, by itself, every released job's cut pack whose setup sheet prints safety notices or workshop
   * rules changed since it was built, so the operator gets current ones without waiting for a fabricator.
   * Only a job whose newest export is that done pack (a rebuild that failed is left to the fabricator, not
   * tried again and again) and which is still cuttable as prepared. Safe to run in several processes at once:
   * each job is decided under its row lock. Resolves with the number of packs queued; the reconciler runs it.
   */
  async rebuildOutdated(limit = 200): Promise<number> {
    // What every setup sheet built now would print, in one stamp: a pack found current under a stamp is not
    // looked at again until the notices or rules change (the reconciler runs this every few seconds).
    const [notices, rules] = await Promise.all([this.safety.notices({}), this.safety.localRules()]);
    const stamp = `${rules?.version ?? 0}|${noticeVersionKeys(notices).join('|')}`;
    if (![...this.currentPacks.values()].every((s) => s === stamp)) this.currentPacks.clear();
    const newest: { id: string; job_id: string }[] = await this.dataSource.query(
      `SELECT DISTINCT ON (e.job_id) e.id, e.job_id
         FROM exports e JOIN jobs j ON j.id = e.job_id
        WHERE j.state = 'released'
        ORDER BY e.job_id, e.created_at DESC, e.id DESC`,
    );
    let queued = 0;
    for (const row of newest) {
      if (queued >= limit) break;
      if (this.currentPacks.get(row.id) === stamp) continue;
      const exp = await this.dataSource.manager.findOne(Export, { where: { id: row.id } });
      if (!exp || exp.state !== 'done') continue;
      if (!(await this.safetyChanged(exp))) {
        this.currentPacks.set(row.id, stamp);
        continue;
      }
      const owed = await this.dataSource.transaction(async (m) => {
        const job = await m.findOne(Job, { where: { id: row.job_id }, lock: { mode: 'pessimistic_write' } });
        if (!job || job.state !== 'released') return null;
        const latest = await m.findOne(Export, {
          where: { jobId: job.id },
          order: { createdAt: 'DESC', id: 'DESC' },
        });
        if (latest?.id !== exp.id) return null; // another process queued one meanwhile
        try {
          await this.preparation.assertStillCuttable(m, job);
        } catch {
          return null; // the fabricator sees why when they ask for the pack
        }
        return this.owe(m, job.id, null, null, { reason: 'safety notices or workshop rules changed' });
      });
      if (!owed) continue;
      await this.enqueue(owed.id, null);
      queued++;
    }
    if (queued > 0)
      this.logger.log(`queued ${queued} cut pack(s) again: their safety notices or rules changed`);
    return queued;
  }

  async get(user: AuthUser, id: string): Promise<ExportView> {
    const exp = await this.visible(user, id);
    const inEffect = await preparationInEffect(this.dataSource.manager, exp.jobId);
    return this.toView(user, exp, exp.preparationId !== inEffect);
  }

  /**
   * The cut packs of the job's preparation in effect, newest first. A job returned and prepared again starts
   * with none: the packs of its earlier preparations are for another material, kerf or layout, and their files
   * are refused (EXPORT.PREPARATION_REPLACED), so no page offers them (the audit trail keeps them).
   */
  async list(user: AuthUser, jobId: string): Promise<ExportView[]> {
    const job = await this.dataSource.manager.findOne(Job, { where: { id: jobId } });
    if (!job || !this.canSee(user, job)) throw notFound('JOB', 'No such job');
    const inEffect = await preparationInEffect(this.dataSource.manager, jobId);
    const rows = await this.dataSource.manager.find(Export, {
      where: { jobId, preparationId: inEffect ?? IsNull() },
      order: { createdAt: 'DESC', id: 'DESC' },
    });
    // The job's current notice versions are read once for the whole list, and only if a pack needs them.
    let current: ReturnType<SafetyService['versionsForJob']> | undefined;
    const versions = () => (current ??= this.safety.versionsForJob(jobId));
    return Promise.all(rows.map((e) => this.toView(user, e, false, versions)));
  }

  /** Server-sent events: the export's view whenever its state or progress changes, until it ends. */
  async events(user: AuthUser, id: string): Promise<Observable<MessageEvent>> {
    await this.visible(user, id);
    return timer(0, POLL_MS).pipe(
      // The account is read again at every look, as every request reads it: a user deactivated (or given
      // another role) while the stream is open gets nothing more; the stream ends and a reconnect gets 401.
      switchMap(() => from(this.stillSignedIn(user).then((ok) => (ok ? this.get(user, id) : null)))),
      takeWhile((v): v is ExportView => v !== null),
      distinctUntilChanged(
        (a, b) => a.state === b.state && a.progress === b.progress && a.attempts === b.attempts,
      ),
      takeWhile((v) => v.state !== 'done' && v.state !== 'failed', true),
      map((v) => ({ type: v.state === 'done' || v.state === 'failed' ? v.state : 'progress', data: v })),
    );
  }

  /** Whether the stream's user is still active in the role they signed in with. */
  private async stillSignedIn(user: AuthUser): Promise<boolean> {
    const rows: { active: boolean; role: string }[] = await this.dataSource.query(
      `SELECT active, role FROM users WHERE id = $1`,
      [user.id],
    );
    return rows[0]?.active === true && rows[0].role === user.role;
  }

  /**
   * Opens one file of a done export. The name is checked against the strict pattern and looked up in
   * PostgreSQL; only the stored key of that row ever reaches the storage driver. Operators and supervisors need
   * a current acknowledgement of the job's safety notices; a hobbyist may fetch their own job's assembly guide
   * only; fabricators download nothing (they cannot acknowledge notices).
   */
  async open(user: AuthUser, id: string, name: string): Promise<OpenedFile> {
    const exp = await this.visible(user, id);
    const missing = () =>
      new AppError(HttpStatus.NOT_FOUND, 'EXPORT.FILE_NOT_FOUND', 'No such file in this export');
    if (!isSafeFileName(name)) throw missing();
    // Fabricators prepare jobs; the files go to the machines through operators (and supervisors), who
    // acknowledge the notices first (which a fabricator cannot: a refusal asking them to would mislead).
    if (user.role === 'fabricator') {
      throw new AppError(
        HttpStatus.FORBIDDEN,
        'EXPORT.DOWNLOAD_NOT_ALLOWED',
        "Operators and supervisors download a job's files, after acknowledging its safety notices; " +
          'the job page lists what the cut pack holds',
        { jobId: exp.jobId },
      );
    }
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
    if (!file || (user.role === 'hobbyist' && !CUT_PACK_ROLES_FOR_REQUESTER.includes(file.role)))
      throw missing();
    // Files go to the machines only for a job released to them (or cut and closed since), and never for a
    // material that may no longer be cut on the job's machine.
    const job = await this.dataSource.manager.findOneOrFail(Job, { where: { id: exp.jobId } });
    if (!CUT_PACK_DOWNLOADABLE_STATES.includes(job.state)) {
      throw new AppError(
        HttpStatus.CONFLICT,
        'EXPORT.JOB_NOT_RELEASED',
        job.state === 'returned'
          ? 'The job was returned before its cut; its files are not to be cut'
          : `The job is ${job.state}; its files can be downloaded once it is released`,
        { state: job.state, allowed: CUT_PACK_DOWNLOADABLE_STATES },
      );
    }
    // A pack is for the preparation it was built from: a job returned and prepared again (another material,
    // kerf or layout) is cut from the packs built since, never from an earlier one.
    if (exp.preparationId !== (await preparationInEffect(this.dataSource.manager, job.id))) {
      throw new AppError(
        HttpStatus.CONFLICT,
        'EXPORT.PREPARATION_REPLACED',
        'This cut pack was built before the job was returned and prepared again (its material, kerf or layout ' +
          'may differ); download the files of its current cut pack',
        { exportId: exp.id, jobId: job.id },
      );
    }
    await this.preparation.assertMaterialAllowed(this.dataSource.manager, job);
    // A setup sheet prints the safety notices and rules version of the day it was built: once they change, it
    // (and the ZIP holding it) is out of date, and the pack is built again. The cutting files print no notices.
    if (CUT_PACK_ROLES_PRINTING_SAFETY.includes(file.role) && (await this.safetyChanged(exp))) {
      throw new AppError(
        HttpStatus.CONFLICT,
        'EXPORT.SAFETY_CHANGED',
        JOB_PACK_STATES.includes(job.state)
          ? 'The safety notices or workshop rules changed since this cut pack was built, so its setup sheet prints ' +
              'old ones: a new pack is built by itself shortly (or a fabricator builds it now); download the new one'
          : `The safety notices or workshop rules changed since this job's cut pack was built, so its setup sheet ` +
              `prints old ones; the job is ${job.state}, so no new pack is built. Its cutting files and assembly ` +
              'guide can still be downloaded',
        { exportId: exp.id, role: file.role },
      );
    }
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

  /** Whether the notices or rules a done export's setup sheet prints are no longer the current ones. */
  private async safetyChanged(
    exp: Export,
    versions = () => this.safety.versionsForJob(exp.jobId),
  ): Promise<boolean> {
    const built = exp.manifest?.safety;
    if (!built) return false;
    const now = await versions();
    return (
      built.localRulesVersion !== now.localRulesVersion ||
      noticeVersionKeys(built.notices).join('|') !== noticeVersionKeys(now.notices).join('|')
    );
  }

  private async toView(
    user: AuthUser,
    exp: Export,
    replaced: boolean,
    versions?: () => ReturnType<SafetyService['versionsForJob']>,
  ): Promise<ExportView> {
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
        .filter((f) => user.role !== 'hobbyist' || CUT_PACK_ROLES_FOR_REQUESTER.includes(f.role))
        .map((f) => ({
          name: f.name,
          role: f.role,
          contentType: f.contentType,
          bytes: f.bytes,
          sha256: f.sha256,
        })),
      createdAt: exp.createdAt.toISOString(),
      finishedAt: exp.finishedAt ? exp.finishedAt.toISOString() : null,
      replaced,
      ...(exp.state === 'done' && user.role !== 'hobbyist'
        ? { safetyChanged: await this.safetyChanged(exp, versions) }
        : {}),
    };
  }
}
