import { HttpStatus, Injectable } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import { DataSource, type EntityManager } from 'typeorm';
import {
  allowedJobActions,
  type JobAction,
  type JobDetailView,
  type JobView,
  type Page,
  transitionFor,
} from '@kerfwright/contracts';
import { AuditService } from '../audit/audit.service';
import { type AuthUser } from '../common/decorators/auth.decorators';
import { likePattern } from '../common/db-helpers';
import { AppError, notFound } from '../common/errors';
import { pageWindow, sortOrder } from '../common/paging';
import { requestIdOf } from '../common/middleware/request-id.middleware';
import { canReadDesign } from '../designs/designs.service';
import { Design } from '../designs/design.entity';
import { type CreateJobDto, type ListJobsQuery, type PrepareJobDto, type RecordCutDto } from './dto/job.dto';
import { Job, JobTransition } from './job.entity';
import { JobMailer } from './job-mailer';
import { JobPreparationService } from './job-preparation.service';

const SORT_COLUMNS: Record<string, string> = {
  createdAt: 'j.created_at',
  updatedAt: 'j.updated_at',
  state: 'j.state',
};

/** Job columns (entity properties) a list row needs; the spec stays in the database. */
const LIST_COLUMNS: readonly (keyof Job)[] = [
  'id',
  'state',
  'designId',
  'requesterId',
  'quantity',
  'notes',
  'materialId',
  'colours',
  'profileVersionId',
  'returnReason',
  'preparation',
  'actualMinutes',
  'sheetsUsed',
  'measuredKerfMm',
  'version',
  'createdAt',
  'updatedAt',
];

/** Staff see every job that has left the draft stage; everyone sees their own. */
export function canReadJob(user: AuthUser, job: Pick<Job, 'requesterId' | 'state'>): boolean {
  if (job.requesterId === user.id) return true;
  if (user.role === 'hobbyist') return false;
  return job.state !== 'draft' || user.role === 'supervisor';
}

interface Names {
  materials: Map<string, string>;
  profiles: Map<string, { name: string; number: number }>;
  /** Who prepared each prepared job (its latest `prepare`): they may not approve it (four eyes). */
  preparers: Map<string, string>;
}

@Injectable()
export class JobsService {
  constructor(
    @InjectDataSource() private readonly dataSource: DataSource,
    private readonly audit: AuditService,
    private readonly preparation: JobPreparationService,
    private readonly mailer: JobMailer,
  ) {}

  async list(user: AuthUser, query: ListJobsQuery): Promise<Page<JobView>> {
    const { page, pageSize, skip, take } = pageWindow(query);
    const [column, direction] = sortOrder(query.sort ?? '-updatedAt', SORT_COLUMNS, 'j.updated_at');
    // Only what a row of the list shows: not the job's or the design's spec (an uploaded solid can be large).
    // Both joins are many-to-one, so plain LIMIT/OFFSET pages correctly without TypeORM's distinct subquery.
    const qb = this.dataSource.manager
      .createQueryBuilder(Job, 'j')
      .select(LIST_COLUMNS.map((c) => `j.${c}`))
      .leftJoin('j.design', 'design')
      .addSelect(['design.id', 'design.name'])
      .leftJoin('j.requester', 'requester')
      .addSelect(['requester.id', 'requester.displayName']);
    if (user.role === 'hobbyist' || query.scope === 'mine') {
      qb.andWhere('j.requester_id = :me', { me: user.id });
    } else if (user.role !== 'supervisor') {
      qb.andWhere(`(j.state <> 'draft' OR j.requester_id = :me)`, { me: user.id });
    }
    if (query.state) qb.andWhere('j.state = :state', { state: query.state });
    if (query.q) {
      const like = likePattern(query.q);
      qb.andWhere('(design.name ILIKE :like OR requester.display_name ILIKE :like OR j.notes ILIKE :like)', {
        like,
      });
    }
    qb.orderBy(column, direction).addOrderBy('j.id', 'ASC').offset(skip).limit(take);
    const [rows, total] = await qb.getManyAndCount();
    const names = await this.names(this.dataSource.manager, rows);
    return { items: rows.map((j) => this.toView(j, user, names)), total, page, pageSize };
  }

  async get(user: AuthUser, id: string): Promise<JobDetailView> {
    return this.detail(this.dataSource.manager, user, id);
  }

  async create(user: AuthUser, dto: CreateJobDto, req: unknown): Promise<JobDetailView> {
    return this.dataSource.transaction(async (m) => {
      const design = await m.findOne(Design, { where: { id: dto.designId } });
      if (!design || !canReadDesign(user, design.ownerId)) throw notFound('DESIGN', 'No such design');
      const job = await m.save(
        m.create(Job, {
          designId: design.id,
          requesterId: user.id,
          state: 'draft',
          spec: design.spec,
          quantity: dto.quantity ?? 1,
          notes: dto.notes ?? '',
          colours: [],
        }),
      );
      await m.insert(JobTransition, {
        jobId: job.id,
        fromState: null,
        toState: 'draft',
        action: 'create',
        actorId: user.id,
      });
      await this.audit.record(m, {
        actorId: user.id,
        action: 'job.create',
        entityType: 'job',
        entityId: job.id,
        after: { designId: design.id, quantity: job.quantity },
        requestId: requestIdOf(req),
      });
      return this.detail(m, user, job.id);
    });
  }

  request(user: AuthUser, id: string, version: number, req: unknown) {
    return this.transition(user, id, 'request', version, req, async (m, job) => {
      // The job cuts the design as it is now.
      const design = await m.findOneOrFail(Design, { where: { id: job.designId } });
      if (!design.preview.valid) {
        throw new AppError(
          HttpStatus.CONFLICT,
          'JOB.DESIGN_INVALID',
          'The design has errors; fix them before requesting a cut',
          design.preview.errors,
        );
      }
      job.spec = design.spec;
      job.returnReason = null;
    });
  }

  prepare(user: AuthUser, id: string, dto: PrepareJobDto, req: unknown) {
    return this.transition(user, id, 'prepare', dto.version, req, async (m, job) => {
      const prepared = await this.preparation.prepare(m, job, dto);
      job.materialId = dto.materialId;
      job.profileVersionId = dto.profileVersionId;
      job.colours = prepared.colours;
      job.spec = prepared.spec;
      job.preparation = prepared.preparation;
    });
  }

  approve(user: AuthUser, id: string, version: number, req: unknown) {
    return this.transition(user, id, 'approve', version, req, async (m, job) => {
      // Four eyes: whoever prepared the job (its preparation in effect) cannot also approve it.
      const prepared = await m.findOne(JobTransition, {
        where: { jobId: job.id, action: 'prepare' },
        order: { id: 'DESC' },
      });
      if (prepared?.actorId === user.id) {
        throw new AppError(
          HttpStatus.FORBIDDEN,
          'JOB.SELF_APPROVAL',
          'You prepared this job, so another supervisor must approve it (four-eyes rule)',
          { preparedBy: user.id },
        );
      }
      // The profile version must still be approved when the job is.
      if (job.profileVersionId) await this.preparation.assertProfileVersionUsable(m, job.profileVersionId);
    });
  }

  recordCut(user: AuthUser, id: string, dto: RecordCutDto, req: unknown) {
    return this.transition(user, id, 'cut', dto.version, req, async (m, job) => {
      job.actualMinutes = dto.actualMinutes;
      job.sheetsUsed = dto.sheetsUsed;
      job.measuredKerfMm = dto.measuredKerfMm ?? null;
      if (dto.measuredKerfMm !== undefined && job.profileVersionId && job.materialId) {
        await this.preparation.recordMeasuredKerf(m, job, dto.measuredKerfMm, user.id, requestIdOf(req));
      }
    });
  }

  close(user: AuthUser, id: string, version: number, req: unknown) {
    return this.transition(user, id, 'close', version, req, async () => undefined);
  }

  returnJob(user: AuthUser, id: string, version: number, reason: string, req: unknown) {
    return this.transition(
      user,
      id,
      'return',
      version,
      req,
      async (_m, job) => {
        job.returnReason = reason.trim();
      },
      reason.trim(),
    );
  }

  reopen(user: AuthUser, id: string, version: number, req: unknown) {
    return this.transition(user, id, 'reopen', version, req, async () => undefined);
  }

  /**
   * One state change: row lock, role and state checks, optimistic version check, the change itself, the
   * transition record, the audit event and the mails — all in one transaction.
   */
  private async transition(
    user: AuthUser,
    id: string,
    action: JobAction,
    version: number,
    req: unknown,
    apply: (m: EntityManager, job: Job) => Promise<void>,
    reason: string | null = null,
  ): Promise<JobDetailView> {
    const rule = transitionFor(action);
    return this.dataSource.transaction(async (m) => {
      const job = await m.findOne(Job, { where: { id }, lock: { mode: 'pessimistic_write' } });
      if (!job || !canReadJob(user, job)) throw notFound('JOB', 'No such job');
      const isOwner = job.requesterId === user.id;
      const roleMay =
        user.role === 'supervisor' ||
        rule.roles.includes(user.role) ||
        (isOwner && rule.roles.includes('owner'));
      if (!roleMay) {
        throw new AppError(
          HttpStatus.FORBIDDEN,
          'JOB.ACTION_NOT_ALLOWED',
          `Your role cannot ${action} a job`,
        );
      }
      if (!rule.from.includes(job.state)) {
        throw new AppError(
          HttpStatus.CONFLICT,
          'JOB.ILLEGAL_TRANSITION',
          `A ${job.state} job cannot be given "${action}"`,
          {
            state: job.state,
            action,
            allowedFrom: rule.from,
          },
        );
      }
      if (job.version !== version) {
        throw new AppError(
          HttpStatus.CONFLICT,
          'JOB.STALE_VERSION',
          'The job changed since you read it; reload it and try again',
          {
            current: job.version,
          },
        );
      }
      await apply(m, job);
      await this.applyTransition(m, job, action, user.id, requestIdOf(req), reason);
      return this.detail(m, user, id);
    });
  }

  /**
   * approved → released for the cut-pack queue, inside the transaction that marks the export done (no HTTP
   * request; the actor is whoever asked for the export). Returns false, changing nothing, when the job is
   * not approved any more (a re-export of a released job, or a job returned meanwhile).
   */
  async releaseForExport(
    m: EntityManager,
    jobId: string,
    actorId: string | null,
    requestId: string | null,
  ): Promise<boolean> {
    const job = await m.findOne(Job, { where: { id: jobId }, lock: { mode: 'pessimistic_write' } });
    if (!job || !transitionFor('release').from.includes(job.state)) return false;
    await this.applyTransition(m, job, 'release', actorId, requestId, null);
    return true;
  }

  /** The state change itself, its transition record, audit event and mails (checks are the caller's). */
  private async applyTransition(
    m: EntityManager,
    job: Job,
    action: JobAction,
    actorId: string | null,
    requestId: string | null,
    reason: string | null,
  ): Promise<void> {
    const rule = transitionFor(action);
    const from = job.state;
    job.state = rule.to;
    await m.save(job);
    await m.insert(JobTransition, {
      jobId: job.id,
      fromState: from,
      toState: rule.to,
      action,
      actorId,
      reason,
    });
    await this.audit.record(m, {
      actorId,
      action: `job.${action}`,
      entityType: 'job',
      entityId: job.id,
      before: { state: from },
      after: { state: rule.to, ...(reason ? { reason } : {}) },
      requestId,
    });
    await this.mailer.onTransition(m, job, action);
  }

  private async detail(m: EntityManager, user: AuthUser, id: string): Promise<JobDetailView> {
    const job = await m.findOne(Job, { where: { id }, relations: { design: true, requester: true } });
    if (!job || !canReadJob(user, job)) throw notFound('JOB', 'No such job');
    const transitions = await m.find(JobTransition, {
      where: { jobId: id },
      relations: { actor: true },
      order: { id: 'ASC' },
    });
    const view = this.toView(job, user, await this.names(m, [job]));
    return {
      ...view,
      transitions: transitions.map((t) => ({
        from: t.fromState,
        to: t.toState,
        action: t.action,
        actorId: t.actorId,
        actorName: t.actor?.displayName ?? null,
        reason: t.reason,
        at: t.createdAt.toISOString(),
      })),
    };
  }

  private async names(m: EntityManager, jobs: Job[]): Promise<Names> {
    const materialIds = [...new Set(jobs.map((j) => j.materialId).filter((x): x is string => !!x))];
    const versionIds = [...new Set(jobs.map((j) => j.profileVersionId).filter((x): x is string => !!x))];
    const materials = new Map<string, string>();
    const profiles = new Map<string, { name: string; number: number }>();
    const preparers = new Map<string, string>();
    const preparedIds = jobs.filter((j) => j.state === 'prepared').map((j) => j.id);
    if (preparedIds.length) {
      const rows: { job_id: string; actor_id: string | null }[] = await m.query(
        `SELECT DISTINCT ON (job_id) job_id, actor_id FROM job_transitions
          WHERE job_id = ANY($1::uuid[]) AND action = 'prepare' ORDER BY job_id, id DESC`,
        [preparedIds],
      );
      for (const r of rows) if (r.actor_id) preparers.set(r.job_id, r.actor_id);
    }
    if (materialIds.length) {
      const rows: { id: string; name: string }[] = await m.query(
        `SELECT id, name FROM materials WHERE id = ANY($1::uuid[])`,
        [materialIds],
      );
      for (const r of rows) materials.set(r.id, r.name);
    }
    if (versionIds.length) {
      const rows: { id: string; name: string; number: number }[] = await m.query(
        `SELECT v.id, p.name, v.number FROM machine_profile_versions v JOIN machine_profiles p ON p.id = v.profile_id WHERE v.id = ANY($1::uuid[])`,
        [versionIds],
      );
      for (const r of rows) profiles.set(r.id, { name: r.name, number: Number(r.number) });
    }
    return { materials, profiles, preparers };
  }

  private toView(job: Job, user: AuthUser, names: Names): JobView {
    const profile = job.profileVersionId ? names.profiles.get(job.profileVersionId) : undefined;
    return {
      id: job.id,
      state: job.state,
      designId: job.designId,
      designName: job.design?.name ?? '',
      requesterId: job.requesterId,
      requesterName: job.requester?.displayName ?? '',
      quantity: job.quantity,
      notes: job.notes,
      materialId: job.materialId,
      materialName: job.materialId ? (names.materials.get(job.materialId) ?? null) : null,
      colours: job.colours,
      profileVersionId: job.profileVersionId,
      profileName: profile?.name ?? null,
      profileVersionNumber: profile?.number ?? null,
      returnReason: job.returnReason,
      preparation: job.preparation,
      actualMinutes: job.actualMinutes,
      sheetsUsed: job.sheetsUsed,
      measuredKerfMm: job.measuredKerfMm,
      version: job.version,
      createdAt: job.createdAt.toISOString(),
      updatedAt: job.updatedAt.toISOString(),
      actions: allowedJobActions(job.state, user.role, job.requesterId === user.id).filter(
        (a) => a !== 'approve' || names.preparers.get(job.id) !== user.id,
      ),
    };
  }
}
