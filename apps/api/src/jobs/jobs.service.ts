import { isDeepStrictEqual } from 'node:util';
import { HttpStatus, Inject, Injectable } from '@nestjs/common';
import { type ConfigType } from '@nestjs/config';
import { InjectDataSource } from '@nestjs/typeorm';
import { DataSource, type EntityManager } from 'typeorm';
import {
  allowedJobActions,
  type JobAction,
  type JobDetailView,
  type JobLayoutChoice,
  type JobPreparation,
  type JobState,
  type JobView,
  JOB_EDITABLE_STATES,
  JOB_OPEN_STATES,
  JOB_PACK_STATES,
  isLaserKind,
  layoutChoiceOf,
  type MachineProfileKind,
  type MaterialFamily,
  type MaterialHazard,
  mayChangeJobRequest,
  type Page,
  transitionFor,
} from '@kerfwright/contracts';
import { AuditService } from '../audit/audit.service';
import { type AuthUser } from '../common/decorators/auth.decorators';
import { likePattern, preparedQuery } from '../common/db-helpers';
import { AppError, notFound, validationFailed } from '../common/errors';
import { pageWindow, sortOrder } from '../common/paging';
import { requestIdOf } from '../common/middleware/request-id.middleware';
import { canReadDesign } from '../designs/designs.service';
import { Design } from '../designs/design.entity';
import { measuredKerfError } from '../machine-profiles/profile-rules';
import { HazardTableService } from '../materials/hazard-table.service';
import { laserRefusalOf } from '../materials/materials.service';
import { SafetyService } from '../safety/safety.service';
import {
  type CreateJobDto,
  type ListJobsQuery,
  type PrepareJobDto,
  type RecordCutDto,
  type UpdateJobDto,
} from './dto/job.dto';
import { assertVersion, canReadJob } from './job-access';
import { Job, JobTransition } from './job.entity';
import { JobMailer } from './job-mailer';
import { JobPreparationService } from './job-preparation.service';
import { jobsConfig } from './jobs.config';
import { withArticle } from '../common/text';

const SORT_COLUMNS: Record<string, string> = {
  createdAt: 'j.created_at',
  updatedAt: 'j.updated_at',
  state: 'j.state',
};

/** Job columns a list row needs; the spec stays in the database. */
const LIST_COLUMNS = [
  'id',
  'state',
  'design_id',
  'requester_id',
  'quantity',
  'notes',
  'material_id',
  'colours',
  'profile_version_id',
  'return_reason',
  'preparation',
  'layout_choice',
  'actual_minutes',
  'sheets_used',
  'measured_kerf_mm',
  'version',
  'created_at',
  'updated_at',
] as const;

/**
 * A timestamp as JSON shows it (what Date#toISOString gives: UTC, milliseconds truncated), formatted by
 * PostgreSQL: a page of jobs then needs no Date objects in the API.
 */
const isoTimestamp = (column: string) =>
  `to_char(${column} AT TIME ZONE 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS.MS"Z"')`;

/**
 * A job row as the list and the job route show it, read from a source named `page` holding LIST_COLUMNS of the
 * jobs wanted: the names a row shows, and who prepared a prepared job (they may not approve it).
 */
const ROW_SELECT = `${LIST_COLUMNS.filter((c) => !c.endsWith('_at'))
  .map((c) => `page.${c}`)
  .join(', ')},
       ${isoTimestamp('page.created_at')} AS created_at, ${isoTimestamp('page.updated_at')} AS updated_at,
       d.name AS design_name, r.display_name AS requester_name,
       m.name AS material_name, m.family AS material_family, m.laser_allowed AS material_laser_allowed,
       m.hazard_note AS material_hazard_note, p.kind AS profile_kind, p.name AS profile_name, v.number AS profile_number, v.state AS profile_state,
       v.retire_reason AS profile_retire_reason,
       CASE WHEN page.state = 'prepared' THEN
         (SELECT t.actor_id FROM job_transitions t
           WHERE t.job_id = page.id AND t.action = 'prepare' ORDER BY t.id DESC LIMIT 1)
       END AS preparer_id`;
const ROW_JOINS = `LEFT JOIN designs d ON d.id = page.design_id
       LEFT JOIN users r ON r.id = page.requester_id
       LEFT JOIN materials m ON m.id = page.material_id
       LEFT JOIN machine_profile_versions v ON v.id = page.profile_version_id
       LEFT JOIN machine_profiles p ON p.id = v.profile_id`;
const PAGE_COLUMNS = LIST_COLUMNS.map((c) => `j.${c}`).join(', ');

/** One row of the jobs-list query, as node-postgres returns it (numeric and bigint as strings). */
type JobListRow = {
  id: string;
  state: JobState;
  design_id: string;
  requester_id: string;
  quantity: number;
  notes: string;
  material_id: string | null;
  colours: string[];
  profile_version_id: string | null;
  return_reason: string | null;
  preparation: JobPreparation | null;
  layout_choice: JobLayoutChoice | null;
  actual_minutes: string | null;
  sheets_used: number | null;
  measured_kerf_mm: string | null;
  version: number;
  /** ISO 8601 in UTC (isoTimestamp). */
  created_at: string;
  updated_at: string;
  design_name: string;
  requester_name: string;
  /** The list's total (the job route reads no total). */
  total?: string;
  material_name: string | null;
  material_family: MaterialFamily | null;
  material_laser_allowed: boolean | null;
  material_hazard_note: string | null;
  profile_kind: MachineProfileKind | null;
  profile_name: string | null;
  profile_number: number | null;
  profile_state: string | null;
  profile_retire_reason: string | null;
  preparer_id: string | null;
};

const numberOrNull = (v: string | null): number | null => (v === null ? null : Number(v));

/** States in which a job's material is checked against its machine before it is cut (approve, release, cut). */
const MATERIAL_CHECKED_STATES: readonly JobState[] = ['prepared', 'approved', 'released'];

/** Whether a row's material is to be checked against the hazard table: a laser job waiting to be cut. */
const laserChecked = (r: JobListRow): boolean =>
  r.material_id !== null &&
  r.profile_kind !== null &&
  isLaserKind(r.profile_kind) &&
  MATERIAL_CHECKED_STATES.includes(r.state);

/** Why the row's material may not be cut on its machine now (as the server's 409 says), or null. */
function materialRefusalOf(r: JobListRow, table: readonly MaterialHazard[] | null): string | null {
  if (!table || !laserChecked(r)) return null;
  return laserRefusalOf(
    {
      name: r.material_name ?? '',
      family: r.material_family!,
      laserAllowed: r.material_laser_allowed === true,
      hazardNote: r.material_hazard_note ?? '',
    },
    table,
  );
}

/** Actions refused while the job's material may not be cut on its machine (MATERIAL.LASER_PROHIBITED). */
const MATERIAL_REFUSED_ACTIONS: readonly JobAction[] = ['approve', 'release', 'cut'];

function rowView(r: JobListRow, user: AuthUser, hazards: readonly MaterialHazard[] | null): JobView {
  const materialRefusal = materialRefusalOf(r, hazards);
  return {
    id: r.id,
    state: r.state,
    designId: r.design_id,
    designName: r.design_name,
    requesterId: r.requester_id,
    requesterName: r.requester_name,
    quantity: r.quantity,
    notes: r.notes,
    materialId: r.material_id,
    materialName: r.material_name,
    colours: r.colours,
    profileVersionId: r.profile_version_id,
    profileName: r.profile_name,
    profileVersionNumber: r.profile_number === null ? null : Number(r.profile_number),
    profileVersionRetired: r.profile_state !== null && r.profile_state !== 'approved',
    profileRetireReason: r.profile_retire_reason,
    materialRefusal,
    preparedByCaller: r.preparer_id === user.id,
    returnReason: r.return_reason,
    preparation: r.preparation,
    layoutChoice: r.layout_choice,
    actualMinutes: numberOrNull(r.actual_minutes),
    sheetsUsed: r.sheets_used,
    measuredKerfMm: numberOrNull(r.measured_kerf_mm),
    version: r.version,
    createdAt: r.created_at,
    updatedAt: r.updated_at,
    actions: jobActionsFor(r.state, user, r.requester_id, r.preparer_id).filter(
      // A job prepared on a version retired (or withdrawn) since cannot be approved or released: it is
      // prepared again on the approved version first (the server refuses either with 409 otherwise). Nor is a
      // job whose material was taken off its laser since approved, released or cut.
      (a) =>
        (r.profile_state === null ||
          r.profile_state === 'approved' ||
          (a !== 'approve' && a !== 'release')) &&
        (materialRefusal === null || !MATERIAL_REFUSED_ACTIONS.includes(a)),
    ),
  };
}

/** allowedJobActions by state, role and ownership: a list page asks the same few questions for every row. */
const actionsByCase = new Map<string, readonly JobAction[]>();

/** What the caller may do with a job now; whoever prepared it may not also approve it (four eyes). */
function jobActionsFor(
  state: JobState,
  user: AuthUser,
  requesterId: string,
  preparerId: string | null | undefined,
): JobAction[] {
  const isOwner = requesterId === user.id;
  const key = `${state}|${user.role}|${isOwner}`;
  let actions = actionsByCase.get(key);
  if (!actions) actionsByCase.set(key, (actions = allowedJobActions(state, user.role, isOwner)));
  return preparerId === user.id ? actions.filter((a) => a !== 'approve') : actions.slice();
}

/** The jobs list's statement texts by shape (their values are parameters; sort columns come from SORT_COLUMNS). */
const LIST_STATEMENTS = new Map<string, string>();

/** Requests of one job allowed within REQUEST_WINDOW_MINUTES (see assertRequestPace). */
const REQUESTS_PER_JOB = 3;
const REQUEST_WINDOW_MINUTES = 10;

@Injectable()
export class JobsService {
  constructor(
    @InjectDataSource() private readonly dataSource: DataSource,
    private readonly audit: AuditService,
    private readonly preparation: JobPreparationService,
    private readonly mailer: JobMailer,
    private readonly safety: SafetyService,
    private readonly hazards: HazardTableService,
    @Inject(jobsConfig.KEY) private readonly config: ConfigType<typeof jobsConfig>,
  ) {}

  /**
   * One page of the jobs table in one round trip: the page with its total and, for the page's rows only, what a
   * row shows (ROW_SELECT). Not the job's or the design's spec: an uploaded solid can be large.
   */
  async list(user: AuthUser, query: ListJobsQuery): Promise<Page<JobView>> {
    const { page, pageSize, skip, take } = pageWindow(query);
    const [column, direction] = sortOrder(query.sort ?? '-updatedAt', SORT_COLUMNS, 'j.updated_at');
    const params: unknown[] = [];
    const param = (v: unknown) => `$${params.push(v)}`;
    const where: string[] = [];
    if (user.role === 'hobbyist' || query.scope === 'mine') {
      where.push(`j.requester_id = ${param(user.id)}`);
    } else if (user.role !== 'supervisor') {
      where.push(`(j.state <> 'draft' OR j.requester_id = ${param(user.id)})`);
    }
    if (query.state) where.push(`j.state = ${param(query.state)}`);
    if (query.q) {
      const like = param(likePattern(query.q));
      where.push(`(d.name ILIKE ${like} OR r.display_name ILIKE ${like} OR j.notes ILIKE ${like})`);
    }
    const filter = where.length ? `WHERE ${where.join(' AND ')}` : '';
    // Joined for the search only: every job has its design and requester (NOT NULL foreign keys).
    const searchJoins = query.q
      ? 'JOIN designs d ON d.id = j.design_id JOIN users r ON r.id = j.requester_id'
      : '';
    const pageOrder = `${column.replace(/^j\./, 'page.')} ${direction}, page.id ASC`;
    // The count and the page are separate parts of one statement, so the page keeps PostgreSQL's top-N sort
    // (a window count would sort every matching job); the count row is there even past the last page.
    const offset = param(skip);
    const limit = param(take);
    // A handful of statement shapes (filters × sort orders), each text built once: the same string every call.
    const shape = `${searchJoins}|${filter}|${column}|${direction}|${offset}|${limit}`;
    let text = LIST_STATEMENTS.get(shape);
    if (!text) {
      text = `WITH total AS (SELECT count(*) AS n FROM jobs j ${searchJoins} ${filter}),
       page AS (
         SELECT ${PAGE_COLUMNS} FROM jobs j ${searchJoins} ${filter}
          ORDER BY ${column} ${direction}, j.id ASC
         OFFSET ${offset} LIMIT ${limit})
       SELECT total.n AS total, ${ROW_SELECT}
         FROM total LEFT JOIN page ON true
       ${ROW_JOINS}
        ORDER BY ${pageOrder}`;
      LIST_STATEMENTS.set(shape, text);
    }
    const rows = await preparedQuery<JobListRow>(this.dataSource, text, params);
    const total = Number(rows[0]?.total ?? 0);
    const found = rows.filter((r) => r.id !== null);
    const hazards = await this.hazardsFor(this.dataSource.manager, found);
    const items = found.map((r) => rowView(r, user, hazards));
    return { items, total, page, pageSize };
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
        after: { designId: design.id, designName: design.name, quantity: job.quantity },
        requestId: requestIdOf(req),
      });
      return this.detail(m, user, job.id);
    });
  }

  /**
   * A draft's copies and notes, changed by its requester (or a supervisor). The state stays; a new number of
   * copies drops the layout of an earlier preparation (its pieces and sheets were for the old number), so a
   * reopened job never shows figures for copies it no longer asks for. Its layout choice (sheet, colour rule)
   * stays for the next preparation.
   */
  async update(user: AuthUser, id: string, dto: UpdateJobDto, req: unknown): Promise<JobDetailView> {
    return this.dataSource.transaction(async (m) => {
      const job = await m.findOne(Job, { where: { id }, lock: { mode: 'pessimistic_write' } });
      if (!job || !canReadJob(user, job)) throw notFound('JOB', 'No such job');
      if (!mayChangeJobRequest(user.role, job.requesterId === user.id)) {
        throw new AppError(
          HttpStatus.FORBIDDEN,
          'JOB.ACTION_NOT_ALLOWED',
          "Only the job's requester or a supervisor can change its copies and notes",
        );
      }
      if (!JOB_EDITABLE_STATES.includes(job.state)) {
        throw new AppError(
          HttpStatus.CONFLICT,
          'JOB.NOT_EDITABLE',
          `${withArticle(job.state)} job's copies and notes cannot be changed; withdraw the request or reopen the job first`,
          { state: job.state, editableIn: JOB_EDITABLE_STATES },
        );
      }
      assertVersion(job, dto.version);
      const before = { quantity: job.quantity, notes: job.notes };
      const hadLayout = job.preparation !== null;
      if (dto.quantity !== undefined && dto.quantity !== job.quantity) {
        job.quantity = dto.quantity;
        job.preparation = null;
      }
      if (dto.notes !== undefined) job.notes = dto.notes;
      if (job.quantity !== before.quantity || job.notes !== before.notes) {
        await m.save(job);
        // The job's history says what changed, as it says every step (the audit trail keeps the values).
        const changes = [
          ...(job.quantity !== before.quantity ? [`copies ${before.quantity} → ${job.quantity}`] : []),
          ...(job.notes !== before.notes ? ['notes changed'] : []),
          ...(job.quantity !== before.quantity && hadLayout ? ['the earlier layout was dropped'] : []),
        ];
        await m.insert(JobTransition, {
          jobId: job.id,
          fromState: job.state,
          toState: job.state,
          action: 'change',
          actorId: user.id,
          reason: changes.join('; '),
        });
        await this.audit.record(m, {
          actorId: user.id,
          action: 'job.update',
          entityType: 'job',
          entityId: job.id,
          before,
          after: { quantity: job.quantity, notes: job.notes },
          requestId: requestIdOf(req),
        });
      }
      return this.detail(m, user, id);
    });
  }

  request(user: AuthUser, id: string, version: number, req: unknown) {
    return this.transition(user, id, 'request', version, req, async (m, job) => {
      await this.assertRequestPace(m, job.id);
      await this.assertOpenRequestsBelowLimit(m, user, job);
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
      // A design changed since the job's last preparation makes that preparation's layout and figures wrong.
      const earlier = job.requestedSpec;
      if (earlier && job.preparation && !isDeepStrictEqual(earlier, design.spec)) job.preparation = null;
      job.spec = design.spec;
      job.requestedSpec = design.spec;
      job.returnReason = null;
    });
  }

  /**
   * Every request mails every fabricator, and a request can be withdrawn and made again at once: a job asked
   * for REQUESTS_PER_JOB times within REQUEST_WINDOW_MINUTES waits (429), so withdrawing and requesting in a
   * loop cannot flood the workshop's inboxes.
   */
  private async assertRequestPace(m: EntityManager, jobId: string): Promise<void> {
    const rows: { n: number }[] = await m.query(
      `SELECT count(*)::int AS n FROM job_transitions
        WHERE job_id = $1 AND action = 'request' AND created_at > now() - make_interval(mins => $2)`,
      [jobId, REQUEST_WINDOW_MINUTES],
    );
    const n = rows[0]?.n ?? 0;
    if (n >= REQUESTS_PER_JOB) {
      throw new AppError(
        HttpStatus.TOO_MANY_REQUESTS,
        'JOB.REQUESTED_TOO_OFTEN',
        `This job was requested ${n} times in the last ${REQUEST_WINDOW_MINUTES} minutes, and each request ` +
          'mails the fabricators; wait a few minutes before requesting it again',
        { windowMinutes: REQUEST_WINDOW_MINUTES },
      );
    }
  }

  /**
   * Every request mails every fabricator, and nothing stops a requester creating job after job: one who has
   * KW_OPEN_REQUEST_LIMIT jobs open with the workshop (JOB_OPEN_STATES: requested, or prepared and not yet
   * approved) waits for one to be approved or returned, or withdraws one (429). The workshop's own people are not
   * limited. Requests of one requester are taken one at a time, so two sent at once cannot both pass.
   */
  private async assertOpenRequestsBelowLimit(m: EntityManager, user: AuthUser, job: Job): Promise<void> {
    if (user.role === 'fabricator' || user.role === 'supervisor') return;
    await m.query(`SELECT pg_advisory_xact_lock(hashtextextended('job-request:' || $1::text, 0))`, [
      job.requesterId,
    ]);
    const rows: { n: number }[] = await m.query(
      `SELECT count(*)::int AS n FROM jobs WHERE requester_id = $1 AND state = ANY($2::job_state[]) AND id <> $3`,
      [job.requesterId, [...JOB_OPEN_STATES], job.id],
    );
    const open = rows[0]?.n ?? 0;
    const limit = this.config.openRequestLimit;
    if (open >= limit) {
      throw new AppError(
        HttpStatus.TOO_MANY_REQUESTS,
        'JOB.TOO_MANY_OPEN_REQUESTS',
        `${open === 1 ? 'One job is' : `${open} jobs are`} already waiting for the workshop (requested, or ` +
          `prepared and not yet approved), and ${limit === 1 ? 'one is' : `${limit} are`} allowed at a time: ` +
          'request this one once the workshop has approved or returned one, or withdraw one not yet prepared. ' +
          'The workshop can raise the limit.',
        { open, limit, openStates: JOB_OPEN_STATES },
      );
    }
  }

  prepare(user: AuthUser, id: string, dto: PrepareJobDto, req: unknown) {
    return this.transition(user, id, 'prepare', dto.version, req, async (m, job) => {
      const prepared = await this.preparation.prepare(m, job, dto);
      job.materialId = dto.materialId;
      job.profileVersionId = dto.profileVersionId;
      job.colours = prepared.colours;
      job.spec = prepared.spec;
      job.preparation = prepared.preparation;
      job.layoutChoice = layoutChoiceOf(prepared.preparation);
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
      // Machine and material must pass preparation's checks still: the profile version approved, and the
      // material not taken off the laser since (409 MATERIAL.LASER_PROHIBITED).
      await this.preparation.assertStillCuttable(m, job);
    });
  }

  recordCut(user: AuthUser, id: string, dto: RecordCutDto, req: unknown) {
    return this.transition(user, id, 'cut', dto.version, req, async (m, job) => {
      // The measured kerf in the range of the job's machine kind, as the kerf-records route has it.
      if (dto.measuredKerfMm !== undefined) await this.assertMeasuredKerf(m, job, dto.measuredKerfMm);
      // Whoever records the cut answers for it: they must have acknowledged the job's current safety
      // notices, as a download needs, and the material must still be allowed on the machine.
      const safety = await this.safety.forJob(user, job.id, m);
      if (!safety.acknowledged) {
        throw new AppError(
          HttpStatus.CONFLICT,
          'SAFETY.ACKNOWLEDGEMENT_REQUIRED',
          'Acknowledge the current safety notices for this job before recording its cut',
          { jobId: job.id },
        );
      }
      await this.preparation.assertMaterialAllowed(m, job);
      job.actualMinutes = dto.actualMinutes;
      job.sheetsUsed = dto.sheetsUsed;
      job.measuredKerfMm = dto.measuredKerfMm ?? null;
      if (dto.measuredKerfMm !== undefined && job.profileVersionId && job.materialId) {
        await this.preparation.recordMeasuredKerf(m, job, dto.measuredKerfMm, user.id, requestIdOf(req));
      }
    });
  }

  /** 400 VALIDATION.FAILED when the kerf is outside the range of the machine kind the job was prepared on. */
  private async assertMeasuredKerf(m: EntityManager, job: Job, kerfMm: number): Promise<void> {
    if (!job.profileVersionId) return;
    const rows: { kind: MachineProfileKind }[] = await m.query(
      `SELECT p.kind FROM machine_profile_versions v JOIN machine_profiles p ON p.id = v.profile_id WHERE v.id = $1`,
      [job.profileVersionId],
    );
    const kind = rows[0]?.kind;
    const error = kind ? measuredKerfError(kind, kerfMm, 'measuredKerfMm') : null;
    if (error) {
      throw validationFailed([error]);
    }
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

  withdraw(user: AuthUser, id: string, version: number, req: unknown) {
    return this.transition(user, id, 'withdraw', version, req, async () => undefined);
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
          `${withArticle(job.state)} job cannot be given "${action}"`,
          {
            state: job.state,
            action,
            allowedFrom: rule.from,
          },
        );
      }
      assertVersion(job, version);
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
    // A job that leaves the states a cut pack is built in takes its pending pack with it: a pack queued before
    // a return would otherwise be built, and release the job, once it is approved again, with nobody asking.
    if (JOB_PACK_STATES.includes(from) && !JOB_PACK_STATES.includes(rule.to)) {
      await m.query(
        `UPDATE exports SET state = 'failed', error_code = 'EXPORT.JOB_CHANGED', error_message = $2,
                finished_at = now()
          WHERE job_id = $1 AND state IN ('queued', 'running')`,
        [job.id, `The job was ${rule.to} before its cut pack was built; the pack is not built`],
      );
    }
    // The audit service adds the design's name, so the trail can say which job ("Job “Felt honeycomb ball” approved").
    await this.audit.record(m, {
      actorId,
      action: `job.${action}`,
      entityType: 'job',
      entityId: job.id,
      before: { state: from },
      after: { state: rule.to, ...(reason ? { reason } : {}) },
      requestId,
    });
    await this.mailer.onTransition(m, job, action, from, actorId);
  }

  /**
   * The hazard table, read only when one of the rows is a laser job waiting to be cut (whose material it may
   * refuse since preparation); null otherwise.
   */
  private async hazardsFor(m: EntityManager, rows: JobListRow[]): Promise<MaterialHazard[] | null> {
    return rows.some(laserChecked) ? this.hazards.rows(m) : null;
  }

  /** The job route's view: the list's row for this job (same SQL, same mapping) and its transitions. */
  private async detail(m: EntityManager, user: AuthUser, id: string): Promise<JobDetailView> {
    // A plain query, not a prepared one: it also runs inside the transactions of job changes.
    const [row]: JobListRow[] = await m.query(
      `SELECT ${ROW_SELECT} FROM (SELECT ${PAGE_COLUMNS} FROM jobs j WHERE j.id = $1) page ${ROW_JOINS}`,
      [id],
    );
    if (!row || !canReadJob(user, { requesterId: row.requester_id, state: row.state }))
      throw notFound('JOB', 'No such job');
    const transitions = await m.find(JobTransition, {
      where: { jobId: id },
      relations: { actor: true },
      order: { id: 'ASC' },
    });
    return {
      ...rowView(row, user, await this.hazardsFor(m, [row])),
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
}
