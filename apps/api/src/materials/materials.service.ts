import { HttpStatus, Injectable } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import { DataSource, type EntityManager } from 'typeorm';
import {
  familyNamedIn,
  findMaterialHazard,
  isLaserKind,
  laserRefusal,
  type MachineProfileKind,
  type MaterialFamily,
  type MaterialHazard,
  type MaterialView,
  type Page,
  type Role,
} from '@kerfwright/contracts';
import { AuditService } from '../audit/audit.service';
import { AppError, notFound } from '../common/errors';
import { likePattern, PG_FOREIGN_KEY_VIOLATION, PG_UNIQUE_VIOLATION, pgError } from '../common/db-helpers';
import { type CreateMaterialDto } from './dto/create-material.dto';
import { type ListMaterialsQueryDto } from './dto/list-materials.query';
import { type UpdateMaterialDto } from './dto/update-material.dto';
import { HazardTableService } from './hazard-table.service';
import { Material, toMaterialView } from './material.entity';

const SORT_COLUMNS: Record<string, string> = {
  name: 'lower(m.name)',
  family: 'm.family',
  nominalThicknessMm: 'm.nominal_thickness_mm',
  createdAt: 'm.created_at',
  updatedAt: 'm.updated_at',
};

export interface Actor {
  id: string;
  requestId: string;
  /** The caller's role: putting a material kept off the laser back on it is a supervisor's decision. */
  role: Role;
}

@Injectable()
export class MaterialsService {
  constructor(
    @InjectDataSource() private readonly dataSource: DataSource,
    private readonly audit: AuditService,
    private readonly hazards: HazardTableService,
  ) {}

  async list(query: ListMaterialsQueryDto): Promise<Page<MaterialView>> {
    const page = query.page ?? 1;
    const pageSize = query.pageSize ?? 25;
    const sort = query.sort ?? 'name';
    const desc = sort.startsWith('-');
    const column = SORT_COLUMNS[desc ? sort.slice(1) : sort] ?? SORT_COLUMNS.name!;
    const qb = this.dataSource.getRepository(Material).createQueryBuilder('m');
    if (query.family) qb.andWhere('m.family = :family', { family: query.family });
    if (query.laserAllowed !== undefined) qb.andWhere('m.laser_allowed = :la', { la: query.laserAllowed });
    if (query.q) qb.andWhere('(m.name ILIKE :like OR m.notes ILIKE :like)', { like: likePattern(query.q) });
    qb.orderBy(column, desc ? 'DESC' : 'ASC')
      .addOrderBy('m.id', 'ASC')
      .skip((page - 1) * pageSize)
      .take(pageSize);
    const [rows, total] = await qb.getManyAndCount();
    return { items: rows.map(toMaterialView), total, page, pageSize };
  }

  async get(id: string): Promise<MaterialView> {
    const m = await this.dataSource.getRepository(Material).findOneBy({ id });
    if (!m) throw notFound('MATERIAL', 'No such material');
    return toMaterialView(m);
  }

  async create(actor: Actor, dto: CreateMaterialDto): Promise<MaterialView> {
    return this.mapDbErrors(
      this.dataSource.transaction(async (manager) => {
        const laser = this.laserFields(
          await this.hazards.rows(manager),
          dto.family,
          dto.laserAllowed,
          dto.hazardNote,
          dto.name,
        );
        const material = manager.create(Material, {
          name: dto.name,
          family: dto.family,
          nominalThicknessMm: dto.nominalThicknessMm,
          measuredThicknessMm: dto.measuredThicknessMm ?? null,
          flexible: dto.flexible ?? false,
          colours: dto.colours ?? [],
          stockSheets: (dto.stockSheets ?? []).map((s) => ({ ...s })),
          notes: dto.notes ?? '',
          ...laser,
          createdBy: actor.id,
        });
        const saved = toMaterialView(await manager.save(Material, material));
        await this.audit.record(manager, {
          actorId: actor.id,
          action: 'material.create',
          entityType: 'material',
          entityId: saved.id,
          after: saved,
          requestId: actor.requestId,
        });
        return saved;
      }),
    );
  }

  async update(actor: Actor, id: string, dto: UpdateMaterialDto): Promise<MaterialView> {
    return this.mapDbErrors(
      this.dataSource.transaction(async (manager) => {
        const m = await manager.findOne(Material, { where: { id }, lock: { mode: 'pessimistic_write' } });
        if (!m) throw notFound('MATERIAL', 'No such material');
        if (m.version !== dto.version) {
          throw new AppError(
            HttpStatus.CONFLICT,
            'MATERIAL.STALE_VERSION',
            `The material was changed by someone else (now version ${m.version}, you sent ${dto.version}); reload it and try again`,
            { currentVersion: m.version },
          );
        }
        const before = toMaterialView(m);
        const family = dto.family ?? m.family;
        const table = await this.hazards.rows(manager);
        const refused = laserRefusal(family, table) !== null;
        const moved = family !== m.family;
        // The note the table wrote for the old family's condition does not hold in another family.
        const oldCondition = findMaterialHazard(m.family, table)?.condition;
        const tableNote = oldCondition !== undefined && m.hazardNote === conditionNote(oldCondition);
        // A prohibited family turns laser use off by itself (with the table's reason unless one is given);
        // otherwise the stored choice and note stand unless the request changes them.
        const laser = this.laserFields(
          table,
          family,
          dto.laserAllowed ?? (refused ? undefined : m.laserAllowed),
          // The note of a material kept off the laser says why; allowed again, that reason no longer holds.
          dto.hazardNote ??
            ((refused && moved) || (!m.laserAllowed && dto.laserAllowed === true) || (moved && tableNote)
              ? undefined
              : m.hazardNote),
          dto.name ?? m.name,
        );
        // Lifting a laser restriction (a material kept off the laser, or of a family the hazard table refuses,
        // made laser-usable by a changed flag or a changed family) is a safety decision: a supervisor's.
        const wasLaserUsable = m.laserAllowed && laserRefusal(m.family, table) === null;
        // Moving a material out of a family the hazard table refuses is the same decision taken in two steps
        // (reclassify now, switch the laser on later): a supervisor's too.
        const leavesRefusedFamily = moved && laserRefusal(m.family, table) !== null;
        if (((!wasLaserUsable && laser.laserAllowed) || leavesRefusedFamily) && actor.role !== 'supervisor') {
          throw new AppError(
            HttpStatus.FORBIDDEN,
            'MATERIAL.LASER_RELEASE_NEEDS_SUPERVISOR',
            `${m.name} is kept off the laser${m.hazardNote ? ` (${m.hazardNote})` : ''}: only a supervisor can allow it on the laser again or move it out of a family the hazard table refuses`,
            { materialId: m.id, family: m.family, requestedFamily: family },
          );
        }
        // Moving a laser-usable material into a family the laser cuts only on a condition: machine versions
        // approved for it were checked against its old family, so the condition is a supervisor's to accept.
        const newCondition = findMaterialHazard(family, table)?.condition;
        const entersCondition =
          moved && laser.laserAllowed && findMaterialHazard(family, table)?.laser === 'conditional';
        if (entersCondition && actor.role !== 'supervisor') {
          throw new AppError(
            HttpStatus.FORBIDDEN,
            'MATERIAL.LASER_RELEASE_NEEDS_SUPERVISOR',
            `A laser may cut a material of this family only on a condition (${(newCondition ?? 'see the hazard table').replace(/[.\s]+$/u, '')}). ` +
              `Only a supervisor moves a material the laser may cut into such a family; or keep ${m.name} off the laser, saying why`,
            { field: 'family', materialId: m.id, family: m.family, requestedFamily: family },
          );
        }
        if (dto.name !== undefined) m.name = dto.name;
        m.family = family;
        if (dto.nominalThicknessMm !== undefined) m.nominalThicknessMm = dto.nominalThicknessMm;
        if (dto.measuredThicknessMm !== undefined) m.measuredThicknessMm = dto.measuredThicknessMm;
        if (dto.flexible !== undefined) m.flexible = dto.flexible;
        if (dto.colours !== undefined) m.colours = dto.colours;
        if (dto.stockSheets !== undefined) m.stockSheets = dto.stockSheets.map((s) => ({ ...s }));
        if (dto.notes !== undefined) m.notes = dto.notes;
        m.laserAllowed = laser.laserAllowed;
        m.hazardNote = laser.hazardNote;
        const after = toMaterialView(await manager.save(Material, m));
        await this.audit.record(manager, {
          actorId: actor.id,
          action: 'material.update',
          entityType: 'material',
          entityId: id,
          before,
          after,
          requestId: actor.requestId,
        });
        return after;
      }),
    );
  }

  /** Deletes a material no job, machine profile or kerf record refers to. */
  async remove(actor: Actor, id: string): Promise<void> {
    await this.mapDbErrors(
      this.dataSource.transaction(async (manager) => {
        const m = await manager.findOne(Material, { where: { id }, lock: { mode: 'pessimistic_write' } });
        if (!m) throw notFound('MATERIAL', 'No such material');
        const uses = await this.usesOf(manager, id);
        if (uses.jobs + uses.profileVersions + uses.kerfRecords > 0) throw inUse(uses);
        const before = toMaterialView(m);
        await manager.delete(Material, { id });
        await this.audit.record(manager, {
          actorId: actor.id,
          action: 'material.delete',
          entityType: 'material',
          entityId: id,
          before,
          requestId: actor.requestId,
        });
      }),
    );
  }

  /**
   * For the jobs module: the material, checked to be usable on a machine of this kind. A material that
   * is not laser-allowed, or whose family the hazard table now refuses, is never usable on a laser.
   */
  async assertUsableOn(
    manager: EntityManager,
    materialId: string,
    kind: MachineProfileKind,
  ): Promise<MaterialView> {
    const m = await manager.findOneBy(Material, { id: materialId });
    if (!m) throw notFound('MATERIAL', 'No such material');
    if (isLaserKind(kind)) {
      const refusal = laserRefusalOf(m, await this.hazards.rows(manager));
      if (refusal !== null) {
        throw new AppError(HttpStatus.CONFLICT, 'MATERIAL.LASER_PROHIBITED', refusal, {
          materialId: m.id,
          family: m.family,
        });
      }
    }
    return toMaterialView(m);
  }

  /**
   * Laser-allowed and hazard note, made consistent with the hazard table: a refused family is kept off the
   * laser, and a material whose name says it is of a refused family (its name words: "PVC", "vinyl") may not
   * go on the laser filed under another family.
   */
  private laserFields(
    table: Parameters<typeof laserRefusal>[1],
    family: MaterialFamily,
    laserAllowed: boolean | undefined,
    hazardNote: string | undefined,
    name: string,
  ): { laserAllowed: boolean; hazardNote: string } {
    const refusal = laserRefusal(family, table);
    const note = (hazardNote ?? '').trim();
    if (refusal !== null) {
      if (laserAllowed === true) {
        throw new AppError(HttpStatus.CONFLICT, 'MATERIAL.LASER_PROHIBITED', refusal, {
          field: 'laserAllowed',
          family,
        });
      }
      return { laserAllowed: false, hazardNote: note || refusal };
    }
    const allowed = laserAllowed ?? true;
    const named = allowed ? familyNamedIn(name, family, table) : undefined;
    if (named) throw namedRefusedFamily(name, named);
    const condition = findMaterialHazard(family, table)?.condition;
    if (allowed && !note && condition) return { laserAllowed: true, hazardNote: conditionNote(condition) };
    if (!allowed && !note) {
      throw new AppError(
        HttpStatus.BAD_REQUEST,
        'VALIDATION.FAILED',
        'Invalid request: hazardNote (say why the material is kept off the laser)',
        [{ field: 'hazardNote', messages: ['hazardNote is required when laserAllowed is false'] }],
      );
    }
    return { laserAllowed: allowed, hazardNote: note };
  }

  private async usesOf(
    manager: EntityManager,
    id: string,
  ): Promise<{ jobs: number; profileVersions: number; kerfRecords: number }> {
    const rows: { jobs: string; versions: string; kerf: string }[] = await manager.query(
      `SELECT (SELECT count(*) FROM jobs WHERE material_id = $1)::text AS jobs,
              (SELECT count(*) FROM machine_profile_versions WHERE settings @> $2::jsonb)::text AS versions,
              (SELECT count(*) FROM kerf_records WHERE material_id = $1)::text AS kerf`,
      [id, JSON.stringify([{ materialId: id }])],
    );
    const r = rows[0]!;
    return { jobs: Number(r.jobs), profileVersions: Number(r.versions), kerfRecords: Number(r.kerf) };
  }

  private async mapDbErrors<T>(work: Promise<T>): Promise<T> {
    try {
      return await work;
    } catch (err) {
      const pg = pgError(err);
      if (pg?.code === PG_UNIQUE_VIOLATION && pg.constraint === 'materials_name_lower_key') {
        throw new AppError(
          HttpStatus.CONFLICT,
          'MATERIAL.NAME_TAKEN',
          'A material with this name already exists',
          {
            field: 'name',
          },
        );
      }
      if (pg?.code === PG_FOREIGN_KEY_VIOLATION) throw inUse(null);
      throw err;
    }
  }
}

function inUse(uses: { jobs: number; profileVersions: number; kerfRecords: number } | null): AppError {
  const what = uses
    ? [
        uses.jobs ? `${uses.jobs} job(s)` : '',
        uses.profileVersions ? `${uses.profileVersions} machine profile version(s)` : '',
        uses.kerfRecords ? `${uses.kerfRecords} kerf record(s)` : '',
      ]
        .filter(Boolean)
        .join(', ')
    : 'other records';
  return new AppError(
    HttpStatus.CONFLICT,
    'MATERIAL.IN_USE',
    `The material cannot be deleted: it is used by ${what}`,
    uses ?? undefined,
  );
}

/** The hazard note a material of a conditionally allowed family gets when none is given. */
function conditionNote(condition: string): string {
  return `Laser only when: ${condition}`;
}

/** 409: a material named as one of a refused family ("Grey PVC sheet") but filed under another, on the laser. */
function namedRefusedFamily(name: string, named: NonNullable<ReturnType<typeof familyNamedIn>>): AppError {
  return new AppError(
    HttpStatus.CONFLICT,
    'MATERIAL.NAME_NAMES_REFUSED_FAMILY',
    `"${name}" says "${named.word}": ${named.row.examples.join(', ')} must not be cut on a laser. File it under ` +
      'that family, keep it off the laser saying why, or correct the name if it is wrong',
    { field: 'name', family: named.row.family, word: named.word },
  );
}

/**
 * Why a material may not be cut on a laser now, in the words of 409 MATERIAL.LASER_PROHIBITED, or null when it
 * may: kept off the laser by its own flag, named as a refused plastic, or of a family the hazard table refuses.
 */
export function laserRefusalOf(
  m: Pick<Material, 'name' | 'family' | 'laserAllowed' | 'hazardNote'>,
  table: readonly MaterialHazard[],
): string | null {
  const named = familyNamedIn(m.name, m.family, table);
  const refusal = !m.laserAllowed
    ? m.hazardNote
    : named
      ? `its name says "${named.word}": ${laserRefusal(named.row.family, table)}`
      : laserRefusal(m.family, table);
  if (refusal === null) return null;
  return `${m.name} may not be cut on a laser: ${refusal || 'it is marked as not laser-allowed'}`;
}
