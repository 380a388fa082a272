import { HttpStatus, Inject, Injectable } from '@nestjs/common';
import { type ConfigType } from '@nestjs/config';
import { InjectDataSource } from '@nestjs/typeorm';
import { DataSource, type EntityManager, In, IsNull, Not } from 'typeorm';
import {
  isLaserKind,
  laserConditionOf,
  laserRefusal,
  type MachineProfileDetailView,
  type MachineProfileKind,
  type MachineProfileSummaryView,
  type MachineProfileVersionView,
  type Page,
  type ProfileSetting,
  type ProfileVersionContent,
  type ProfileVersionState,
} from '@kerfwright/contracts';
import { AuditService } from '../audit/audit.service';
import { AppError, notFound, validationFailed } from '../common/errors';
import { countOf, orList, withIndefinite } from '../common/text';
import { sortOrder } from '../common/paging';
import { MailOutboxService } from '../mail/mail-outbox.service';
import { type MailLinkList, appLink, composeMail } from '../mail/mail-templates';
import { mailConfig } from '../mail/mail.config';
import { likePattern, PG_UNIQUE_VIOLATION, pgError } from '../common/db-helpers';
import { HazardTableService } from '../materials/hazard-table.service';
import { Material } from '../materials/material.entity';
import { type CreateMachineProfileDto } from './dto/create-machine-profile.dto';
import { type ListMachineProfilesQueryDto } from './dto/list-machine-profiles.query';
import {
  type ApproveProfileVersionDto,
  type CreateProfileVersionDto,
  type ProfileDecisionDto,
  type RetireProfileVersionDto,
  type ReturnProfileVersionDto,
  type UpdateProfileVersionDto,
} from './dto/profile-version-requests.dto';
import {
  MachineProfile,
  MachineProfileVersion,
  type SettingMaterial,
  toVersionView,
} from './machine-profile.entity';
import { contentLimitErrors, settingErrors } from './profile-rules';

/** Who is acting, for the audit trail and mails. */
export interface ProfileActor {
  id: string;
  displayName: string;
  requestId: string;
}

/** An approved version with its profile's name and kind: what a job may be prepared with. */
export interface ApprovedProfileVersion extends MachineProfileVersionView {
  profileName: string;
  kind: MachineProfileKind;
}

type VersionChanges = Partial<Omit<MachineProfileVersion, 'id' | 'profileId' | 'number' | 'lockVersion'>>;

const AREA = 'MACHINE_PROFILE';
const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;
const noNames = new Map<string, SettingMaterial>();
/** How many jobs of one kind the out-of-use mail lists with links (the jobs board has them all). */
const OUT_OF_USE_JOBS_LISTED = 25;

/** A version as the audit trail keeps it: its view, and its profile's name so that an entry can say which. */
async function versionSnapshot(
  manager: EntityManager,
  v: MachineProfileVersion,
): Promise<MachineProfileVersionView & { profileName: string | null }> {
  const profile = await manager.findOneBy(MachineProfile, { id: v.profileId });
  return { ...toVersionView(v, noNames), profileName: profile?.name ?? null };
}

/** Whether two versions' contents are equal, whatever the order of their settings. */
function sameContent(a: Required<ProfileVersionContent>, b: Required<ProfileVersionContent>): boolean {
  const canonical = (c: Required<ProfileVersionContent>) =>
    JSON.stringify({
      ...c,
      settings: [...c.settings]
        .sort((x, y) => x.materialId.localeCompare(y.materialId))
        .map((s) => Object.fromEntries(Object.entries(s).sort(([k1], [k2]) => k1.localeCompare(k2)))),
    });
  return canonical(a) === canonical(b);
}

/** Sortable columns of the profiles table (query key → column). */
const PROFILE_SORT_COLUMNS: Readonly<Record<string, string>> = {
  name: 'p.name',
  kind: 'p.kind',
  createdAt: 'p.createdAt',
};

/** The states each change of a version starts from, and how an error message names the change. */
const VERSION_STEPS = {
  edit: { from: ['draft'], what: 'edited' },
  submit: { from: ['draft'], what: 'submitted' },
  approve: { from: ['submitted'], what: 'approved' },
  return: { from: ['submitted'], what: 'sent back' },
  retire: { from: ['approved', 'draft', 'submitted'], what: 'retired' },
} satisfies Record<string, { from: ProfileVersionState[]; what: string }>;
type VersionStep = keyof typeof VERSION_STEPS;

@Injectable()
export class MachineProfilesService {
  constructor(
    @InjectDataSource() private readonly dataSource: DataSource,
    private readonly audit: AuditService,
    private readonly mail: MailOutboxService,
    private readonly hazards: HazardTableService,
    @Inject(mailConfig.KEY) private readonly mailCfg: ConfigType<typeof mailConfig>,
  ) {}

  // ---- reads ------------------------------------------------------------------------------------

  async list(query: ListMachineProfilesQueryDto): Promise<Page<MachineProfileSummaryView>> {
    const page = query.page ?? 1;
    const pageSize = query.pageSize ?? 25;
    const qb = this.dataSource.getRepository(MachineProfile).createQueryBuilder('p');
    if (query.kind) qb.andWhere('p.kind = :kind', { kind: query.kind });
    if (query.q) qb.andWhere('p.name ILIKE :like', { like: likePattern(query.q) });
    if (query.state) {
      qb.andWhere(
        `(SELECT v.state FROM machine_profile_versions v WHERE v.profile_id = p.id ORDER BY v.number DESC LIMIT 1) = :state`,
        { state: query.state },
      );
    }
    const [column, direction] = sortOrder(query.sort ?? 'name', PROFILE_SORT_COLUMNS, 'p.name');
    qb.orderBy(column, direction)
      .addOrderBy('p.id', 'ASC')
      .skip((page - 1) * pageSize)
      .take(pageSize);
    const [profiles, total] = await qb.getManyAndCount();
    const manager = this.dataSource.manager;
    const versions = profiles.length
      ? await manager.find(MachineProfileVersion, {
          where: { profileId: In(profiles.map((p) => p.id)) },
          order: { number: 'DESC' },
        })
      : [];
    const materials = await this.settingMaterials(manager, versions);
    const items = profiles.map((p) =>
      this.summary(
        p,
        versions.filter((v) => v.profileId === p.id),
        materials,
      ),
    );
    return { items, total, page, pageSize };
  }

  async get(id: string): Promise<MachineProfileDetailView> {
    return this.detail(this.dataSource.manager, id);
  }

  /**
   * For the jobs module: the version, which must be approved (409 MACHINE_PROFILE.NOT_APPROVED
   * otherwise). Pass the job's transaction manager to read inside it.
   */
  async getApprovedVersion(
    versionId: string,
    manager?: EntityManager,
    /** Also take a version retired since it was approved (a released job's pack built again). */
    retiredAllowed = false,
  ): Promise<ApprovedProfileVersion> {
    const m = manager ?? this.dataSource.manager;
    // Inside a job's transaction (preparation, approval, release) the version row is share-locked until it
    // commits: a retire, or the approval of a newer version, waits for it rather than committing between this
    // check and the job's change (a job released on a machine already out of use, and the out-of-use mail
    // calling it not released). Share locks do not wait for each other, so jobs still pass in parallel.
    const v = UUID.test(versionId)
      ? await m.findOne(MachineProfileVersion, {
          where: { id: versionId },
          ...(m.queryRunner?.isTransactionActive ? { lock: { mode: 'pessimistic_read' as const } } : {}),
        })
      : null;
    if (!v)
      throw new AppError(
        HttpStatus.NOT_FOUND,
        `${AREA}.VERSION_NOT_FOUND`,
        'No such machine profile version',
      );
    const profile = await m.findOneByOrFail(MachineProfile, { id: v.profileId });
    if (v.state !== 'approved' && !(retiredAllowed && v.state === 'retired')) {
      throw new AppError(
        HttpStatus.CONFLICT,
        `${AREA}.NOT_APPROVED`,
        `Version ${v.number} of "${profile.name}" is ${v.state}; only an approved version can be used for a job`,
        { profileId: profile.id, versionId: v.id, state: v.state },
      );
    }
    return this.approvedView(m, profile, v);
  }

  /** For the jobs module: the profile's approved version now (409 MACHINE_PROFILE.NOT_APPROVED if none). */
  async currentApprovedVersion(profileId: string, manager?: EntityManager): Promise<ApprovedProfileVersion> {
    const m = manager ?? this.dataSource.manager;
    const profile = UUID.test(profileId) ? await m.findOneBy(MachineProfile, { id: profileId }) : null;
    if (!profile) throw notFound(AREA, 'No such machine profile');
    const v = await m.findOneBy(MachineProfileVersion, { profileId, state: 'approved' });
    if (!v) {
      throw new AppError(
        HttpStatus.CONFLICT,
        `${AREA}.NOT_APPROVED`,
        `"${profile.name}" has no approved version yet; a supervisor must approve one before it is used for a job`,
        { profileId },
      );
    }
    return this.approvedView(m, profile, v);
  }

  // ---- writes -----------------------------------------------------------------------------------

  /** A new profile and its version 1 as a draft. */
  async create(actor: ProfileActor, dto: CreateMachineProfileDto): Promise<MachineProfileDetailView> {
    return this.mapDbErrors(
      this.dataSource.transaction(async (manager) => {
        const content = this.contentOf(dto);
        await this.checkContent(manager, dto.kind, content);
        const profile = await manager.save(
          MachineProfile,
          manager.create(MachineProfile, { name: dto.name, kind: dto.kind, createdBy: actor.id }),
        );
        await this.audit.record(manager, {
          actorId: actor.id,
          action: 'machine-profile.create',
          entityType: 'machine-profile',
          entityId: profile.id,
          after: { id: profile.id, name: profile.name, kind: profile.kind },
          requestId: actor.requestId,
        });
        await this.insertDraft(manager, actor, profile, content, null);
        return this.detail(manager, profile.id);
      }),
    );
  }

  /** A new draft: a copy of the latest version with the given changes. One open version at a time. */
  async createVersion(
    actor: ProfileActor,
    profileId: string,
    dto: CreateProfileVersionDto,
  ): Promise<MachineProfileVersionView> {
    return this.dataSource.transaction(async (manager) => {
      const profile = await this.lockProfile(manager, profileId);
      await this.refuseOpenVersion(manager, profile);
      const base = await this.latestVersion(manager, profileId);
      const content = { ...this.contentOf(base), ...this.changesOf(dto) };
      await this.checkContent(manager, profile.kind, content);
      const v = await this.insertDraft(manager, actor, profile, content, base.number);
      return this.view(manager, v);
    });
  }

  /** Edits a draft (only drafts change; submitted and approved versions are fixed). */
  async updateVersion(
    actor: ProfileActor,
    profileId: string,
    versionId: string,
    dto: UpdateProfileVersionDto,
  ): Promise<MachineProfileVersionView> {
    return this.versionStep('edit', profileId, versionId, dto, async (manager, profile, v) => {
      const content = { ...this.contentOf(v), ...this.changesOf(dto) };
      await this.checkContent(manager, profile.kind, content);
      return this.change(manager, actor, v, content, 'machine-profile-version.update');
    });
  }

  /** Draft → submitted; every active supervisor gets a mail asking for review. */
  async submit(
    actor: ProfileActor,
    profileId: string,
    versionId: string,
    dto: ProfileDecisionDto,
  ): Promise<MachineProfileVersionView> {
    return this.versionStep('submit', profileId, versionId, dto, async (manager, profile, v) => {
      if (v.settings.length === 0) {
        throw new AppError(
          HttpStatus.CONFLICT,
          `${AREA}.INCOMPLETE`,
          'Add the settings for at least one material before submitting the version',
        );
      }
      await this.checkContent(manager, profile.kind, this.contentOf(v));
      // A version that changes nothing would only cost a supervisor a review, and retire an equal version.
      const approved = await manager.findOneBy(MachineProfileVersion, { profileId, state: 'approved' });
      if (approved && sameContent(this.contentOf(approved), this.contentOf(v))) {
        throw new AppError(
          HttpStatus.CONFLICT,
          `${AREA}.NO_CHANGES`,
          `Version ${v.number} holds the same values as the approved version ${approved.number}: change something ` +
            'before submitting it, or retire the draft',
          { approvedVersionId: approved.id },
        );
      }
      const saved = await this.change(
        manager,
        actor,
        v,
        { state: 'submitted', submittedBy: actor.id, submittedAt: new Date(), returnReason: null },
        'machine-profile-version.submit',
      );
      const mail = composeMail(
        `Machine profile to review: ${profile.name}, version ${v.number}`,
        [
          `${actor.displayName} has submitted version ${v.number} of the machine profile "${profile.name}" (${profile.kind}) for approval.`,
          `It holds cutting values for ${countOf(v.settings.length, 'material')}. Jobs can only use it once a supervisor has approved it.`,
          'Please look it over, then approve it or send it back with a reason.',
        ],
        { label: 'Review the machine profile', url: this.link(profile.id) },
      );
      await this.mail.enqueue(manager, {
        kind: 'machine-profile.submitted',
        // Those who had a hand in the version may not approve it (four eyes): they are not asked to review it.
        to: await this.mail.addressesOfRoles(manager, ['supervisor'], await this.authors(manager, saved)),
        ...mail,
      });
      return saved;
    });
  }

  /** Submitted → approved; the version approved before it is retired. Supervisors only. */
  async approve(
    actor: ProfileActor,
    profileId: string,
    versionId: string,
    dto: ApproveProfileVersionDto,
  ): Promise<MachineProfileVersionView> {
    return this.versionStep('approve', profileId, versionId, dto, async (manager, profile, v) => {
      // Four eyes: whoever wrote any of the version's content (drafted it, edited it, adopted a kerf into it)
      // or submitted it cannot also approve it.
      const part = await this.authorship(manager, v, actor.id);
      if (part) {
        throw new AppError(
          HttpStatus.FORBIDDEN,
          `${AREA}.SELF_APPROVAL`,
          `You ${part} version ${v.number}, so another supervisor must approve it (four-eyes rule)`,
          { versionId: v.id, part },
        );
      }
      // Materials may have changed since the version was submitted (e.g. marked not laser-allowed). A laser
      // cuts some only on a condition (the hazard table's): approving is confirming that each was checked.
      const conditional = await this.checkContent(manager, profile.kind, this.contentOf(v));
      if (conditional.length > 0 && !dto.conditionsChecked) {
        throw new AppError(
          HttpStatus.CONFLICT,
          `${AREA}.CONDITIONS_UNCHECKED`,
          `Version ${v.number} holds settings for ${conditional.map((c) => c.materialName).join(', ')}, which a laser ` +
            'may cut only on a condition; check each and approve with conditionsChecked: true',
          { conditions: conditional },
        );
      }
      const previous = await manager.findOneBy(MachineProfileVersion, { profileId, state: 'approved' });
      if (previous) {
        await this.change(
          manager,
          actor,
          previous,
          { state: 'retired', retiredBy: actor.id, retiredAt: new Date() },
          'machine-profile-version.retire',
        );
      }
      const saved = await this.change(
        manager,
        actor,
        v,
        { state: 'approved', approvedBy: actor.id, approvedAt: new Date() },
        'machine-profile-version.approve',
      );
      if (!previous) await this.mailBackInUse(manager, actor, profile, v);
      await this.notifySubmitter(
        manager,
        v,
        `Machine profile approved: ${profile.name}, version ${v.number}`,
        [
          `${actor.displayName} has approved version ${v.number} of the machine profile "${profile.name}".`,
          previous
            ? `It replaces version ${previous.number}, which is now retired; new jobs use version ${v.number}.`
            : 'Jobs can now be prepared with it.',
        ],
        profile.id,
      );
      return saved;
    });
  }

  /** Submitted → draft with the supervisor's reason; the submitter is told why. */
  async returnToDraft(
    actor: ProfileActor,
    profileId: string,
    versionId: string,
    dto: ReturnProfileVersionDto,
  ): Promise<MachineProfileVersionView> {
    return this.versionStep('return', profileId, versionId, dto, async (manager, profile, v) => {
      const saved = await this.change(
        manager,
        actor,
        v,
        { state: 'draft', returnReason: dto.reason, returnedBy: actor.id, returnedAt: new Date() },
        'machine-profile-version.return',
      );
      await this.notifySubmitter(
        manager,
        v,
        `Machine profile sent back: ${profile.name}, version ${v.number}`,
        [
          `${actor.displayName} has sent version ${v.number} of the machine profile "${profile.name}" back to draft.`,
          `Reason: ${dto.reason}`,
          'Change the draft and submit it again when it is ready.',
        ],
        profile.id,
      );
      return saved;
    });
  }

  /**
   * Takes a version out of use (an approved one) or closes an abandoned draft. Supervisors only. Retiring the
   * approved version leaves the machine without one until a newer version is approved: jobs prepared or approved
   * on it must be prepared again (approval and release check the version), and jobs released on it stay released
   * but marked. Fabricators, operators and supervisors are mailed why, with those jobs named.
   */
  async retire(
    actor: ProfileActor,
    profileId: string,
    versionId: string,
    dto: RetireProfileVersionDto,
  ): Promise<MachineProfileVersionView> {
    return this.versionStep('retire', profileId, versionId, dto, async (manager, profile, v) => {
      const wasApproved = v.state === 'approved';
      const saved = await this.change(
        manager,
        actor,
        v,
        { state: 'retired', retiredBy: actor.id, retiredAt: new Date(), retireReason: dto.reason ?? null },
        'machine-profile-version.retire',
      );
      if (wasApproved) await this.mailOutOfUse(manager, actor, profile, v, dto.reason ?? null);
      return saved;
    });
  }

  /**
   * When a version is approved for a machine a supervisor had taken out of use (its last retired version was an
   * approved one, retired with a reason), those who were told it stopped hear that it runs again.
   */
  private async mailBackInUse(
    manager: EntityManager,
    actor: ProfileActor,
    profile: MachineProfile,
    v: MachineProfileVersion,
  ): Promise<void> {
    // The last version that was in use (a draft closed since says nothing of the machine).
    const last = await manager.findOne(MachineProfileVersion, {
      where: { profileId: profile.id, state: 'retired', approvedAt: Not(IsNull()) },
      order: { retiredAt: 'DESC' },
    });
    if (!last?.retireReason) return;
    const mail = composeMail(
      `Machine back in use: ${profile.name}`,
      [
        `${actor.displayName} has approved version ${v.number} of the machine profile "${profile.name}", which was ` +
          `out of use (“${last.retireReason}”). Jobs can be prepared on it again.`,
        'Jobs returned while it was out of use can be requested again.',
      ],
      { label: 'Open the machine profile', url: this.link(profile.id) },
    );
    await this.mail.enqueue(manager, {
      kind: 'machine-profile.back-in-use',
      to: await this.mail.addressesOfRoles(manager, ['fabricator', 'operator', 'supervisor']),
      ...mail,
    });
  }

  /** The mail when a supervisor retires a machine's approved version: what stops, and which jobs it touches. */
  private async mailOutOfUse(
    manager: EntityManager,
    actor: ProfileActor,
    profile: MachineProfile,
    v: MachineProfileVersion,
    reason: string | null,
  ): Promise<void> {
    const jobs: { id: string; state: 'prepared' | 'approved' | 'released'; name: string }[] =
      await manager.query(
        `SELECT j.id, j.state, d.name FROM jobs j JOIN designs d ON d.id = j.design_id
          WHERE j.profile_version_id = $1 AND j.state IN ('prepared', 'approved', 'released')
          ORDER BY j.state, d.name, j.created_at`,
        [v.id],
      );
    // Each job named with a link to its page (two jobs of one design differ by their links).
    const listed = (states: string[], text: string): MailLinkList | null => {
      const of = jobs.filter((j) => states.includes(j.state));
      if (of.length === 0) return null;
      const shown = of.slice(0, OUT_OF_USE_JOBS_LISTED).map((j) => ({
        label: `"${j.name}" (${j.state})`,
        url: appLink(this.mailCfg.appUrl, `jobs/${j.id}`),
      }));
      const more = of.length - shown.length;
      return {
        text: `${text}${more > 0 ? ` The first ${shown.length} of ${of.length} (the jobs board lists them all):` : ''}`,
        links: shown,
      };
    };
    const said = [
      `${actor.displayName} has taken version ${v.number} of the machine profile "${profile.name}" out of use. ` +
        'No job can be prepared, approved or released on this machine until a newer version is approved.',
      `Reason given: ${reason ?? '(none)'}`,
    ];
    const noneReleased = 'No released job uses these settings.';
    // Those who prepare and approve jobs hear what to do with them, with the profile's link.
    const released = listed(
      ['released'],
      'Released with these settings, not yet cut; they stay on the release desk, marked. Return any that must ' +
        'not be cut on them:',
    );
    const waiting = listed(
      ['prepared', 'approved'],
      'Prepared or approved with these settings; they cannot be released on them. Return them with a reason; ' +
        'once requested again, they are prepared on the version approved then:',
    );
    const workshop = composeMail(
      `Machine out of use: ${profile.name}`,
      [...said, released ?? noneReleased, ...(waiting ? [waiting] : [])],
      { label: 'Open the machine profile', url: this.link(profile.id) },
    );
    await this.mail.enqueue(manager, {
      kind: 'machine-profile.out-of-use',
      to: await this.mail.addressesOfRoles(manager, ['fabricator', 'supervisor']),
      ...workshop,
    });
    // Operators cut: they hear which released jobs to hold, and go to the release desk (the profile is not theirs).
    const toHold = listed(
      ['released'],
      'Released with these settings, not yet cut. Check with a supervisor before cutting any of them; a job ' +
        'that must not be cut is returned and leaves the release desk:',
    );
    const operators = composeMail(`Machine out of use: ${profile.name}`, [...said, toHold ?? noneReleased], {
      label: 'Open the release desk',
      url: appLink(this.mailCfg.appUrl, 'release-desk'),
    });
    await this.mail.enqueue(manager, {
      kind: 'machine-profile.out-of-use',
      to: await this.mail.addressesOfRoles(manager, ['operator']),
      ...operators,
    });
  }

  /**
   * One change of a version: in a transaction, with the profile locked (its version writes run one at a time),
   * the version loaded and checked to be in one of the `from` states at the lockVersion the caller read.
   */
  private versionStep(
    step: VersionStep,
    profileId: string,
    versionId: string,
    dto: { lockVersion?: number },
    change: (
      manager: EntityManager,
      profile: MachineProfile,
      v: MachineProfileVersion,
    ) => Promise<MachineProfileVersion>,
  ): Promise<MachineProfileVersionView> {
    const { from, what }: { from: ProfileVersionState[]; what: string } = VERSION_STEPS[step];
    return this.dataSource.transaction(async (manager) => {
      const profile = await this.lockProfile(manager, profileId);
      const v = await this.loadVersion(manager, profileId, versionId);
      this.expect(v, from, dto.lockVersion, what);
      return this.view(manager, await change(manager, profile, v));
    });
  }

  /** Everyone who drafted, edited or submitted the version (approve refuses them; see `authorship`). */
  private async authors(manager: EntityManager, v: MachineProfileVersion): Promise<string[]> {
    const rows: { actor_id: string }[] = await manager.query(
      `SELECT DISTINCT actor_id FROM audit_events
        WHERE entity_type = 'machine-profile-version' AND entity_id = $1 AND actor_id IS NOT NULL
          AND action IN ('machine-profile-version.create', 'machine-profile-version.update',
                         'machine-profile-version.submit')`,
      [v.id],
    );
    const ids = new Set(rows.map((r) => r.actor_id));
    for (const id of [v.createdBy, v.submittedBy]) if (id) ids.add(id);
    return [...ids];
  }

  /**
   * What the user had to do with a version's content, from the version's columns and its audit trail (every
   * write of a version records an audit event in its transaction): 'submitted', 'edited', 'drafted', or null.
   */
  private async authorship(
    manager: EntityManager,
    v: MachineProfileVersion,
    userId: string,
  ): Promise<'submitted' | 'edited' | 'drafted' | null> {
    if (v.submittedBy === userId) return 'submitted';
    const rows: { action: string }[] = await manager.query(
      `SELECT DISTINCT action FROM audit_events
        WHERE entity_type = 'machine-profile-version' AND entity_id = $1 AND actor_id = $2
          AND action IN ('machine-profile-version.create', 'machine-profile-version.update',
                         'machine-profile-version.submit')`,
      [v.id, userId],
    );
    const actions = new Set(rows.map((r) => r.action));
    if (actions.has('machine-profile-version.submit')) return 'submitted';
    if (actions.has('machine-profile-version.update')) return 'edited';
    if (v.createdBy === userId || actions.has('machine-profile-version.create')) return 'drafted';
    return null;
  }

  // ---- helpers shared with kerf records ---------------------------------------------------------

  /** Locks the profile row: every version write of a profile runs one at a time. */
  async lockProfile(manager: EntityManager, profileId: string): Promise<MachineProfile> {
    const p = await manager.findOne(MachineProfile, {
      where: { id: profileId },
      lock: { mode: 'pessimistic_write' },
    });
    if (!p) throw notFound(AREA, 'No such machine profile');
    return p;
  }

  async latestVersion(manager: EntityManager, profileId: string): Promise<MachineProfileVersion> {
    const v = await manager.findOne(MachineProfileVersion, {
      where: { profileId },
      order: { number: 'DESC' },
    });
    if (!v) throw notFound(AREA, 'The machine profile has no versions');
    return v;
  }

  async openVersion(manager: EntityManager, profileId: string): Promise<MachineProfileVersion | null> {
    return manager.findOneBy(MachineProfileVersion, { profileId, state: In(['draft', 'submitted']) });
  }

  async insertDraft(
    manager: EntityManager,
    actor: { id: string; requestId: string },
    profile: MachineProfile,
    content: Required<ProfileVersionContent>,
    basedOnNumber: number | null,
  ): Promise<MachineProfileVersion> {
    const number = basedOnNumber === null ? 1 : (await this.latestVersion(manager, profile.id)).number + 1;
    const v = await manager.save(
      MachineProfileVersion,
      manager.create(MachineProfileVersion, {
        profileId: profile.id,
        number,
        basedOnNumber,
        state: 'draft',
        ...content,
        createdBy: actor.id,
        lockVersion: 1,
      }),
    );
    await this.audit.record(manager, {
      actorId: actor.id,
      action: 'machine-profile-version.create',
      entityType: 'machine-profile-version',
      entityId: v.id,
      after: await versionSnapshot(manager, v),
      requestId: actor.requestId,
    });
    return v;
  }

  /** Writes changes to a version if its lock_version is unchanged, raising it; audited. */
  async change(
    manager: EntityManager,
    actor: { id: string; requestId: string },
    v: MachineProfileVersion,
    changes: VersionChanges,
    action: string,
  ): Promise<MachineProfileVersion> {
    const result = await manager.update(
      MachineProfileVersion,
      { id: v.id, lockVersion: v.lockVersion },
      { ...changes, lockVersion: v.lockVersion + 1 },
    );
    if (result.affected !== 1) throw stale(v.lockVersion);
    const saved = await manager.findOneByOrFail(MachineProfileVersion, { id: v.id });
    await this.audit.record(manager, {
      actorId: actor.id,
      action,
      entityType: 'machine-profile-version',
      entityId: v.id,
      before: await versionSnapshot(manager, v),
      after: await versionSnapshot(manager, saved),
      requestId: actor.requestId,
    });
    return saved;
  }

  /**
   * Checks a version's content: the edit route's limits (content may come from elsewhere: an adopted kerf, a
   * stored version being submitted or approved), the right fields for the kind, each material existing and
   * named once, and on a laser only materials that may be cut on one. Answers, on a laser, the materials it
   * may cut only on the hazard table's condition (felt, an unlisted material), for approval to confirm.
   */
  async checkContent(
    manager: EntityManager,
    kind: MachineProfileKind,
    content: ProfileVersionContent,
  ): Promise<{ materialId: string; materialName: string; condition: string }[]> {
    const limits = contentLimitErrors(content);
    if (limits.length) throw validationFailed(limits);
    const errors = settingErrors(kind, content.settings);
    const ids = [...new Set(content.settings.map((s) => s.materialId))];
    const materials = ids.length ? await manager.findBy(Material, { id: In(ids) }) : [];
    const byId = new Map(materials.map((m) => [m.id, m]));
    content.settings.forEach((s, i) => {
      if (!byId.has(s.materialId))
        errors.push({ field: `settings[${i}].materialId`, messages: ['no such material'] });
    });
    if (errors.length) throw validationFailed(errors);
    if (!isLaserKind(kind)) return [];
    const table = await this.hazards.rows(manager);
    const conditional: { materialId: string; materialName: string; condition: string }[] = [];
    for (const [i, s] of content.settings.entries()) {
      const m = byId.get(s.materialId)!;
      const refusal = m.laserAllowed
        ? laserRefusal(m.family, table)
        : m.hazardNote || 'it is marked as not laser-allowed';
      if (refusal !== null) {
        throw new AppError(
          HttpStatus.CONFLICT,
          'MATERIAL.LASER_PROHIBITED',
          `${m.name} may not be cut on a laser, so a ${kind} profile cannot hold settings for it: ${refusal}`,
          { field: `settings[${i}].materialId`, materialId: m.id, family: m.family },
        );
      }
      const { laserCondition } = laserConditionOf(m.family, table);
      if (laserCondition)
        conditional.push({ materialId: m.id, materialName: m.name, condition: laserCondition });
    }
    return conditional;
  }

  async view(manager: EntityManager, v: MachineProfileVersion): Promise<MachineProfileVersionView> {
    return toVersionView(v, await this.settingMaterials(manager, [v]));
  }

  contentOf(v: ProfileVersionContent): Required<ProfileVersionContent> {
    return {
      bedWidthMm: v.bedWidthMm,
      bedHeightMm: v.bedHeightMm,
      rapidSpeedMmS: v.rapidSpeedMmS,
      hourlyRate: v.hourlyRate,
      currency: v.currency ?? 'EUR',
      settings: v.settings.map((s) => settingOf(s)),
      notes: v.notes ?? '',
    };
  }

  // ---- private ----------------------------------------------------------------------------------

  private changesOf(dto: Partial<ProfileVersionContent>): Partial<Required<ProfileVersionContent>> {
    const out: Partial<Required<ProfileVersionContent>> = {};
    if (dto.bedWidthMm !== undefined) out.bedWidthMm = dto.bedWidthMm;
    if (dto.bedHeightMm !== undefined) out.bedHeightMm = dto.bedHeightMm;
    if (dto.rapidSpeedMmS !== undefined) out.rapidSpeedMmS = dto.rapidSpeedMmS;
    if (dto.hourlyRate !== undefined) out.hourlyRate = dto.hourlyRate;
    if (dto.currency !== undefined) out.currency = dto.currency;
    if (dto.settings !== undefined) out.settings = dto.settings.map((s) => settingOf(s));
    if (dto.notes !== undefined) out.notes = dto.notes;
    return out;
  }

  private async loadVersion(
    manager: EntityManager,
    profileId: string,
    versionId: string,
  ): Promise<MachineProfileVersion> {
    const v = await manager.findOneBy(MachineProfileVersion, { id: versionId, profileId });
    if (!v)
      throw new AppError(
        HttpStatus.NOT_FOUND,
        `${AREA}.VERSION_NOT_FOUND`,
        'No such version of this profile',
      );
    return v;
  }

  private expect(
    v: MachineProfileVersion,
    from: ProfileVersionState[],
    lockVersion: number | undefined,
    what: string,
  ): void {
    if (!from.includes(v.state)) {
      throw new AppError(
        HttpStatus.CONFLICT,
        `${AREA}.INVALID_STATE`,
        `Version ${v.number} is ${v.state}${v.state === what ? ' already (someone else may have just done it)' : ''}; ` +
          `only ${withIndefinite(orList(from))} version can be ${what}`,
        { state: v.state, allowed: from },
      );
    }
    if (lockVersion !== undefined && lockVersion !== v.lockVersion) throw stale(v.lockVersion, lockVersion);
  }

  private async refuseOpenVersion(manager: EntityManager, profile: MachineProfile): Promise<void> {
    const open = await this.openVersion(manager, profile.id);
    if (open) {
      throw new AppError(
        HttpStatus.CONFLICT,
        `${AREA}.OPEN_VERSION_EXISTS`,
        `Version ${open.number} of "${profile.name}" is still ${open.state}: change that version (or have it returned) instead of starting another`,
        { versionId: open.id, number: open.number, state: open.state },
      );
    }
  }

  private async notifySubmitter(
    manager: EntityManager,
    v: MachineProfileVersion,
    subject: string,
    paragraphs: string[],
    profileId: string,
  ): Promise<void> {
    if (!v.submittedBy) return;
    const mail = composeMail(subject, paragraphs, {
      label: 'Open the machine profile',
      url: this.link(profileId),
    });
    await this.mail.enqueue(manager, {
      kind: 'machine-profile.decided',
      to: await this.mail.addressOfUser(manager, v.submittedBy),
      ...mail,
    });
  }

  private link(profileId: string): string {
    return appLink(this.mailCfg.appUrl, `machine-profiles/${profileId}`);
  }

  private async detail(manager: EntityManager, id: string): Promise<MachineProfileDetailView> {
    const p = await manager.findOneBy(MachineProfile, { id });
    if (!p) throw notFound(AREA, 'No such machine profile');
    const versions = await manager.find(MachineProfileVersion, {
      where: { profileId: id },
      order: { number: 'DESC' },
    });
    const materials = await this.settingMaterials(manager, versions);
    return {
      ...this.summary(p, versions, materials),
      versions: versions.map((v) => toVersionView(v, materials)),
    };
  }

  /** Versions newest first. */
  private summary(
    p: MachineProfile,
    versions: MachineProfileVersion[],
    materials: ReadonlyMap<string, SettingMaterial>,
  ): MachineProfileSummaryView {
    const approved = versions.find((v) => v.state === 'approved');
    return {
      id: p.id,
      name: p.name,
      kind: p.kind,
      currentApproved: approved ? toVersionView(approved, materials) : null,
      latest: toVersionView(versions[0]!, materials),
      createdAt: p.createdAt.toISOString(),
    };
  }

  private async approvedView(
    manager: EntityManager,
    profile: MachineProfile,
    v: MachineProfileVersion,
  ): Promise<ApprovedProfileVersion> {
    return { ...(await this.view(manager, v)), profileName: profile.name, kind: profile.kind };
  }

  /** The versions' materials: names, and the hazard table's laser condition on a conditional family. */
  private async settingMaterials(
    manager: EntityManager,
    versions: readonly MachineProfileVersion[],
  ): Promise<Map<string, SettingMaterial>> {
    const ids = [...new Set(versions.flatMap((v) => v.settings.map((s) => s.materialId)))];
    if (ids.length === 0) return new Map();
    const rows = await manager.find(Material, {
      where: { id: In(ids) },
      select: { id: true, name: true, family: true },
    });
    const table = await this.hazards.rows(manager);
    return new Map(rows.map((m) => [m.id, { name: m.name, ...laserConditionOf(m.family, table) }]));
  }

  private async mapDbErrors<T>(work: Promise<T>): Promise<T> {
    try {
      return await work;
    } catch (err) {
      const pg = pgError(err);
      if (pg?.code === PG_UNIQUE_VIOLATION && pg.constraint === 'machine_profiles_name_lower_key') {
        throw new AppError(
          HttpStatus.CONFLICT,
          `${AREA}.NAME_TAKEN`,
          'A machine profile with this name already exists',
          {
            field: 'name',
          },
        );
      }
      throw err;
    }
  }
}

/** Only the known fields of a setting, in a stable order (no stray keys reach the database). */
function settingOf(s: ProfileSetting): ProfileSetting {
  const out: ProfileSetting = {
    materialId: s.materialId,
    cutSpeedMmS: s.cutSpeedMmS,
    markSpeedMmS: s.markSpeedMmS,
    passes: s.passes,
    pierceTimeS: s.pierceTimeS,
  };
  if (s.kerfMm !== undefined) out.kerfMm = s.kerfMm;
  if (s.toolDiameterMm !== undefined) out.toolDiameterMm = s.toolDiameterMm;
  if (s.powerPct !== undefined) out.powerPct = s.powerPct;
  if (s.spindleRpm !== undefined) out.spindleRpm = s.spindleRpm;
  return out;
}

function stale(current: number, sent?: number): AppError {
  return new AppError(
    HttpStatus.CONFLICT,
    `${AREA}.STALE_VERSION`,
    `The version was changed by someone else${sent === undefined ? '' : ` (lockVersion now ${current}, you sent ${sent})`}; reload it and try again`,
    { currentLockVersion: current },
  );
}
