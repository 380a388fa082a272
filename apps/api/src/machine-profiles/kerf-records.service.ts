import { HttpStatus, Injectable } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import { DataSource, type EntityManager } from 'typeorm';
import { type KerfRecordView, type MachineProfileVersionView, type Page } from '@kerfwright/contracts';
import { AuditService } from '../audit/audit.service';
import { AppError, notFound, validationFailed } from '../common/errors';
import { sameId } from '../common/pipes/parse-id.pipe';
import { Material } from '../materials/material.entity';
import { MaterialsService } from '../materials/materials.service';
import { type CreateKerfRecordDto } from './dto/create-kerf-record.dto';
import { type ListKerfRecordsQueryDto } from './dto/list-machine-profiles.query';
import { KerfRecord, MachineProfile } from './machine-profile.entity';
import { MachineProfilesService, type ProfileActor } from './machine-profiles.service';
import { measuredKerfError } from './profile-rules';

/** Kerfs measured on test cuts (or jobs) per machine and material, and adopting one into a draft. */
@Injectable()
export class KerfRecordsService {
  constructor(
    @InjectDataSource() private readonly dataSource: DataSource,
    private readonly audit: AuditService,
    private readonly profiles: MachineProfilesService,
    private readonly materials: MaterialsService,
  ) {}

  async record(actor: ProfileActor, profileId: string, dto: CreateKerfRecordDto): Promise<KerfRecordView> {
    return this.dataSource.transaction(async (manager) => {
      const profile = await manager.findOneBy(MachineProfile, { id: profileId });
      if (!profile) throw notFound('MACHINE_PROFILE', 'No such machine profile');
      const errors: { field: string; messages: string[] }[] = [];
      const kerf = measuredKerfError(profile.kind, dto.kerfMm, 'kerfMm');
      if (kerf) errors.push(kerf);
      const material = await manager.findOneBy(Material, { id: dto.materialId });
      if (!material) errors.push({ field: 'materialId', messages: ['no such material'] });
      if (dto.jobId !== undefined) {
        // A measurement of a job's cut belongs to the machine and material that job was prepared with.
        const jobs: { material_id: string | null; profile_id: string | null }[] = await manager.query(
          `SELECT j.material_id, v.profile_id
             FROM jobs j LEFT JOIN machine_profile_versions v ON v.id = j.profile_version_id
            WHERE j.id = $1`,
          [dto.jobId],
        );
        const job = jobs[0];
        if (!job) errors.push({ field: 'jobId', messages: ['no such job'] });
        else if (!sameId(job.profile_id, profileId) || !sameId(job.material_id, dto.materialId)) {
          errors.push({
            field: 'jobId',
            messages: ['the job was not prepared with this machine profile and this material'],
          });
        }
      }
      if (errors.length) {
        throw validationFailed(errors);
      }
      // A material that may not be cut on a laser gets no laser kerf (the check and answer of preparation).
      await this.materials.assertUsableOn(manager, dto.materialId, profile.kind);
      const saved = await manager.save(
        KerfRecord,
        manager.create(KerfRecord, {
          profileId,
          materialId: dto.materialId,
          kerfMm: dto.kerfMm,
          jobId: dto.jobId ?? null,
          notes: dto.notes ?? '',
          recordedBy: actor.id,
          adoptedVersionId: null,
        }),
      );
      const view = toKerfRecordView(saved, material!.name);
      await this.audit.record(manager, {
        actorId: actor.id,
        action: 'kerf-record.create',
        entityType: 'kerf-record',
        entityId: saved.id,
        after: view,
        requestId: actor.requestId,
      });
      return view;
    });
  }

  /** The history for one machine, oldest first (for a chart), optionally of one material. */
  async list(profileId: string, query: ListKerfRecordsQueryDto): Promise<Page<KerfRecordView>> {
    const page = query.page ?? 1;
    const pageSize = query.pageSize ?? 200;
    const profile = await this.dataSource.manager.findOneBy(MachineProfile, { id: profileId });
    if (!profile) throw notFound('MACHINE_PROFILE', 'No such machine profile');
    const qb = this.dataSource
      .getRepository(KerfRecord)
      .createQueryBuilder('k')
      .where('k.profile_id = :profileId', { profileId });
    if (query.materialId) qb.andWhere('k.material_id = :materialId', { materialId: query.materialId });
    qb.orderBy('k.created_at', 'ASC')
      .addOrderBy('k.id', 'ASC')
      .skip((page - 1) * pageSize)
      .take(pageSize);
    const [rows, total] = await qb.getManyAndCount();
    const names = await this.names(this.dataSource.manager, rows);
    return {
      items: rows.map((r) => toKerfRecordView(r, names.get(r.materialId) ?? '')),
      total,
      page,
      pageSize,
    };
  }

  /**
   * Puts a measured value into the profile's draft: the open draft if there is one, else a new draft
   * copied from the latest version. A router's measured cut width becomes its tool diameter.
   */
  async adopt(actor: ProfileActor, profileId: string, recordId: string): Promise<MachineProfileVersionView> {
    return this.dataSource.transaction(async (manager) => {
      const profile = await this.profiles.lockProfile(manager, profileId);
      const record = await manager.findOneBy(KerfRecord, { id: recordId, profileId });
      if (!record) throw notFound('KERF_RECORD', 'No such kerf record for this machine profile');
      const open = await this.profiles.openVersion(manager, profileId);
      if (open?.state === 'submitted') {
        throw new AppError(
          HttpStatus.CONFLICT,
          'MACHINE_PROFILE.VERSION_PENDING',
          `Version ${open.number} awaits approval; wait for the decision (or have it sent back) before adopting a new value`,
          { versionId: open.id },
        );
      }
      const base = open ?? (await this.profiles.latestVersion(manager, profileId));
      const content = this.profiles.contentOf(base);
      const index = content.settings.findIndex((s) => s.materialId === record.materialId);
      if (index < 0) {
        throw new AppError(
          HttpStatus.CONFLICT,
          'MACHINE_PROFILE.NO_SETTING_FOR_MATERIAL',
          `Version ${base.number} has no settings for this material; add them (speeds, power, passes) before adopting a kerf`,
          { materialId: record.materialId },
        );
      }
      const setting = content.settings[index]!;
      content.settings[index] =
        profile.kind === 'cnc-router'
          ? { ...setting, toolDiameterMm: record.kerfMm }
          : { ...setting, kerfMm: record.kerfMm };
      await this.profiles.checkContent(manager, profile.kind, content);
      const target = open
        ? await this.profiles.change(manager, actor, open, content, 'machine-profile-version.update')
        : await this.profiles.insertDraft(manager, actor, profile, content, base.number);
      const before = toKerfRecordView(record, '');
      await manager.update(KerfRecord, { id: record.id }, { adoptedVersionId: target.id });
      await this.audit.record(manager, {
        actorId: actor.id,
        action: 'kerf-record.adopt',
        entityType: 'kerf-record',
        entityId: record.id,
        before,
        after: { ...before, adoptedVersionId: target.id },
        requestId: actor.requestId,
      });
      return this.profiles.view(manager, target);
    });
  }

  private async names(manager: EntityManager, rows: readonly KerfRecord[]): Promise<Map<string, string>> {
    const ids = [...new Set(rows.map((r) => r.materialId))];
    if (ids.length === 0) return new Map();
    const materials: { id: string; name: string }[] = await manager.query(
      `SELECT id, name FROM materials WHERE id = ANY($1::uuid[])`,
      [ids],
    );
    return new Map(materials.map((m) => [m.id, m.name]));
  }
}

export function toKerfRecordView(r: KerfRecord, materialName: string): KerfRecordView {
  return {
    id: r.id,
    profileId: r.profileId,
    materialId: r.materialId,
    materialName,
    kerfMm: r.kerfMm,
    jobId: r.jobId,
    notes: r.notes,
    recordedBy: r.recordedBy,
    adoptedVersionId: r.adoptedVersionId,
    createdAt: r.createdAt.toISOString(),
  };
}
