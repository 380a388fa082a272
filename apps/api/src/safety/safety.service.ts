import { HttpStatus, Injectable } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import { DataSource, type EntityManager } from 'typeorm';
import {
  type AcknowledgeSafetyRequest,
  type JobSafetyView,
  type JobState,
  type LocalRulesView,
  type MachineProfileKind,
  type MaterialFamily,
  type MaterialHazard,
  noticeApplies,
  type SafetyNotice,
} from '@kerfwright/contracts';
import { AuditService } from '../audit/audit.service';
import { type AuthUser } from '../common/decorators/auth.decorators';
import { AppError, notFound } from '../common/errors';
import { canReadJob } from '../jobs/job-access';
import { preparationInEffectSql } from '../jobs/preparation-in-effect';

interface NoticeRow {
  notice_key: string;
  version: number;
  title: string;
  severity: SafetyNotice['severity'];
  machine_kinds: SafetyNotice['appliesTo']['machineKinds'];
  material_families: SafetyNotice['appliesTo']['materialFamilies'];
  body: string;
  sources: string[];
}

const toNotice = (r: NoticeRow): SafetyNotice => ({
  id: r.notice_key,
  version: r.version,
  title: r.title,
  severity: r.severity,
  appliesTo: { machineKinds: r.machine_kinds, materialFamilies: r.material_families },
  body: r.body,
  sources: r.sources,
});

const SEVERITY_ORDER: Record<string, number> = { danger: 0, warning: 1, caution: 2 };

/** Safety notices (current versions), the hazard table, local rules and operators' acknowledgements. */
/** Notice versions as sorted "id@version" keys: two lists name the same versions when their keys are equal. */
export function noticeVersionKeys(list: readonly { id: string; version: number }[]): string[] {
  return list.map((n) => `${n.id}@${n.version}`).sort();
}

@Injectable()
export class SafetyService {
  constructor(
    @InjectDataSource() private readonly dataSource: DataSource,
    private readonly audit: AuditService,
  ) {}

  async notices(
    filter: { machineKind?: MachineProfileKind; materialFamily?: MaterialFamily } = {},
    m: EntityManager = this.dataSource.manager,
  ): Promise<SafetyNotice[]> {
    const rows: NoticeRow[] = await m.query(`SELECT * FROM safety_notices WHERE current ORDER BY notice_key`);
    return rows
      .map(toNotice)
      .filter((n) => {
        const kinds = n.appliesTo.machineKinds as readonly string[];
        const families = n.appliesTo.materialFamilies as readonly string[];
        return (
          (!filter.machineKind || kinds.includes('*') || kinds.includes(filter.machineKind)) &&
          (!filter.materialFamily || families.includes('*') || families.includes(filter.materialFamily))
        );
      })
      .sort(
        (a, b) =>
          (SEVERITY_ORDER[a.severity] ?? 9) - (SEVERITY_ORDER[b.severity] ?? 9) || a.id.localeCompare(b.id),
      );
  }

  async hazards(): Promise<MaterialHazard[]> {
    const rows: (MaterialHazard & { condition: string | null; nameWords: string[] })[] =
      await this.dataSource.query(
        `SELECT family, examples, name_words AS "nameWords", laser, hazard, condition, source
           FROM material_hazards ORDER BY laser DESC, family`,
      );
    return rows.map(({ condition, nameWords, ...r }) => ({
      ...r,
      ...(nameWords.length > 0 ? { nameWords } : {}),
      ...(condition ? { condition } : {}),
    }));
  }

  async localRules(m: EntityManager = this.dataSource.manager): Promise<LocalRulesView | null> {
    const rows: { version: number; body: string; author_name: string | null; created_at: Date }[] =
      await m.query(
        `SELECT r.version, r.body, u.display_name AS author_name, r.created_at
         FROM local_rules r LEFT JOIN users u ON u.id = r.author_id ORDER BY r.version DESC LIMIT 1`,
      );
    const r = rows[0];
    return r
      ? {
          version: r.version,
          body: r.body,
          authorName: r.author_name,
          updatedAt: new Date(r.created_at).toISOString(),
        }
      : null;
  }

  /** A new version of the rules; `readVersion` (when given) must still be the latest (0: none yet), else 409. */
  async updateLocalRules(
    user: AuthUser,
    body: string,
    requestId: string,
    readVersion?: number,
  ): Promise<LocalRulesView> {
    return this.dataSource.transaction(async (m) => {
      await m.query(`LOCK TABLE local_rules IN EXCLUSIVE MODE`);
      const before = await this.localRules(m);
      if (readVersion !== undefined && readVersion !== (before?.version ?? 0)) {
        throw new AppError(
          HttpStatus.CONFLICT,
          'SAFETY.STALE_RULES',
          `The local rules changed since you opened them (now version ${before?.version ?? 0}` +
            `${before?.authorName ? `, by ${before.authorName}` : ''}): reload them, and write yours over the new text`,
          { current: before?.version ?? 0 },
        );
      }
      const version = (before?.version ?? 0) + 1;
      await m.query(`INSERT INTO local_rules (version, body, author_id) VALUES ($1, $2, $3)`, [
        version,
        body,
        user.id,
      ]);
      await this.audit.record(m, {
        actorId: user.id,
        action: 'safety.local-rules',
        entityType: 'safety',
        entityId: 'local-rules',
        before: before ?? undefined,
        after: { version, body },
        requestId,
      });
      return (await this.localRules(m))!;
    });
  }

  /**
   * The versions of the notices that apply to a job's machine and material now, and of the workshop rules: what a
   * setup sheet built now would print (a cut pack records the versions it printed).
   */
  async versionsForJob(
    jobId: string,
    m: EntityManager = this.dataSource.manager,
  ): Promise<{ notices: { id: string; version: number }[]; localRulesVersion: number | null }> {
    const current = await this.currentForJob(jobId, m);
    return {
      notices: current.notices.map((n) => ({ id: n.id, version: n.version })),
      localRulesVersion: current.localRules?.version ?? null,
    };
  }

  /**
   * The notices that apply to a job's machine and material, and whether the caller acknowledged them for the
   * job's preparation in effect.
   */
  async forJob(
    user: AuthUser,
    jobId: string,
    m: EntityManager = this.dataSource.manager,
  ): Promise<JobSafetyView> {
    const { job, notices, localRules } = await this.currentForJob(jobId, m);
    if (!job || !canReadJob(user, { requesterId: job.requester_id, state: job.state as JobState })) {
      throw notFound('JOB', 'No such job');
    }
    const preparationId = job.preparation_id;
    // Only for the preparation in effect: a job prepared again (another batch, material, machine or kerf) is
    // read again before it is cut, even when its notices happen to be the same versions.
    const acks: {
      notice_versions: { id: string; version: number }[];
      local_rules_version: number | null;
      created_at: Date;
    }[] =
      preparationId === null
        ? []
        : await m.query(
            `SELECT a.notice_versions, a.local_rules_version, a.created_at FROM safety_acknowledgements a
              WHERE a.job_id = $1 AND a.user_id = $2 AND a.preparation_id = $3
              ORDER BY a.created_at DESC LIMIT 1`,
            [jobId, user.id, preparationId],
          );
    const last = acks[0];
    const acknowledged =
      !!last &&
      (last.local_rules_version ?? null) === (localRules?.version ?? null) &&
      notices.every((n) => last.notice_versions.some((a) => a.id === n.id && a.version === n.version));
    return {
      jobId,
      machineKind: job.kind,
      materialFamily: job.family,
      notices,
      localRules,
      preparationId,
      acknowledged,
      acknowledgedAt: acknowledged && last ? new Date(last.created_at).toISOString() : null,
    };
  }

  /**
   * The job's owner, state, machine kind, material family and preparation in effect (its latest `prepare`
   * transition), the notices that apply to them, and the rules.
   */
  private async currentForJob(jobId: string, m: EntityManager) {
    const rows: {
      requester_id: string;
      state: string;
      kind: MachineProfileKind | null;
      family: MaterialFamily | null;
      /** bigint, as node-postgres gives it: a string. */
      preparation_id: string | null;
    }[] = await m.query(
      `SELECT j.requester_id, j.state, p.kind, mat.family,
              ${preparationInEffectSql('j.id')} AS preparation_id
         FROM jobs j
         LEFT JOIN machine_profile_versions v ON v.id = j.profile_version_id
         LEFT JOIN machine_profiles p ON p.id = v.profile_id
         LEFT JOIN materials mat ON mat.id = j.material_id
        WHERE j.id = $1`,
      [jobId],
    );
    const job = rows[0];
    const all = await this.notices({}, m);
    const notices =
      job?.kind && job.family ? all.filter((n) => noticeApplies(n, job.kind!, job.family!)) : all;
    return { job, notices, localRules: await this.localRules(m) };
  }

  /**
   * Records that the caller read and accepts exactly the current notice versions for the job. A stale list
   * (a notice changed since the page was opened) is refused so nobody acknowledges text they did not see, and
   * so is a job not yet prepared (its machine and material, and so its notices, are not known), and one prepared
   * again since the caller read its notices (409 SAFETY.PREPARATION_CHANGED): the acknowledgement is stored with
   * the preparation it was read for, and counts for that one only.
   */
  async acknowledge(
    user: AuthUser,
    jobId: string,
    dto: AcknowledgeSafetyRequest,
    requestId: string,
  ): Promise<JobSafetyView> {
    return this.dataSource.transaction(async (m) => {
      // A preparation being saved holds the job's row: wait for it, so the check below sees it and refuses an
      // acknowledgement read for the preparation it replaces rather than answering "acknowledged" for that one.
      await m.query(`SELECT 1 FROM jobs WHERE id = $1 FOR SHARE`, [jobId]);
      const view = await this.forJob(user, jobId, m);
      if (!view.machineKind || !view.materialFamily || view.preparationId === null) {
        // Before a job has a machine and a material, its notices are every notice: acknowledging that list
        // would read nothing about this job, and would count once it is prepared.
        throw new AppError(
          HttpStatus.CONFLICT,
          'SAFETY.JOB_NOT_PREPARED',
          'This job has no machine and material yet; its safety notices can be acknowledged once it is prepared',
        );
      }
      if (dto.preparationId !== view.preparationId) {
        throw new AppError(
          HttpStatus.CONFLICT,
          'SAFETY.PREPARATION_CHANGED',
          'This job was prepared again since you read its notices, and its material, machine or kerf may have ' +
            'changed; read the notices for the job as it is prepared now and acknowledge again',
          { preparationId: view.preparationId },
        );
      }
      const want = noticeVersionKeys(view.notices);
      const got = noticeVersionKeys(dto.notices);
      const rulesMatch = (dto.localRulesVersion ?? null) === (view.localRules?.version ?? null);
      if (want.join('|') !== got.join('|') || !rulesMatch) {
        throw new AppError(
          HttpStatus.CONFLICT,
          'SAFETY.STALE_ACKNOWLEDGEMENT',
          'The safety notices changed; read the current ones and acknowledge again',
          {
            current: view.notices.map((n) => ({ id: n.id, version: n.version })),
            localRulesVersion: view.localRules?.version ?? null,
          },
        );
      }
      await m.query(
        `INSERT INTO safety_acknowledgements (job_id, user_id, notice_versions, local_rules_version, preparation_id)
         VALUES ($1, $2, $3, $4, $5)`,
        [jobId, user.id, JSON.stringify(dto.notices), dto.localRulesVersion, view.preparationId],
      );
      await this.audit.record(m, {
        actorId: user.id,
        action: 'safety.acknowledge',
        entityType: 'job',
        entityId: jobId,
        after: { notices: got, localRulesVersion: dto.localRulesVersion, preparationId: view.preparationId },
        requestId,
      });
      return this.forJob(user, jobId, m);
    });
  }
}
