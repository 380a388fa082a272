import { HttpStatus, Injectable } from '@nestjs/common';
import { InjectDataSource, InjectRepository } from '@nestjs/typeorm';
import { DataSource, type EntityManager, Repository } from 'typeorm';
import { type DesignSummary, type DesignView, type Page, type SolidTextFormat } from '@kerfwright/contracts';
import { AuditService } from '../audit/audit.service';
import { type AuthUser } from '../common/decorators/auth.decorators';
import { likePattern, preparedQuery } from '../common/db-helpers';
import { AppError, notFound } from '../common/errors';
import { pageWindow, sortOrder } from '../common/paging';
import { GeometryThreads } from '../geometry/geometry-threads';
import { checkSolidText, previewDesign } from './design-engine';
import { Design, toDesignSummary, toDesignView } from './design.entity';
import { type CreateDesignDto, type ListDesignsQuery, type UpdateDesignDto } from './dto/design.dto';

const SORT_COLUMNS: Record<string, string> = {
  name: 'd.name',
  createdAt: 'd.created_at',
  updatedAt: 'd.updated_at',
};

/** The design read's row: the view's fields, with timestamps as node-postgres parses them. */
type DesignRow = Omit<DesignView, 'createdAt' | 'updatedAt'> & { createdAt: Date; updatedAt: Date };

/** Staff read every design (they prepare jobs from them); hobbyists only their own. */
export function canReadDesign(user: AuthUser, ownerId: string): boolean {
  return user.role !== 'hobbyist' || user.id === ownerId;
}

export function canWriteDesign(user: AuthUser, ownerId: string): boolean {
  return user.role === 'supervisor' || user.id === ownerId;
}

@Injectable()
export class DesignsService {
  constructor(
    @InjectRepository(Design) private readonly designs: Repository<Design>,
    @InjectDataSource() private readonly dataSource: DataSource,
    private readonly audit: AuditService,
    private readonly threads: GeometryThreads,
  ) {}

  async list(user: AuthUser, query: ListDesignsQuery): Promise<Page<DesignSummary>> {
    const { page, pageSize, skip, take } = pageWindow(query);
    const [column, direction] = sortOrder(query.sort ?? '-updatedAt', SORT_COLUMNS, 'd.updated_at');
    const qb = this.designs.createQueryBuilder('d').leftJoinAndSelect('d.owner', 'owner');
    if (user.role === 'hobbyist' || query.scope === 'mine') qb.andWhere('d.owner_id = :me', { me: user.id });
    if (query.q) {
      const like = likePattern(query.q);
      qb.andWhere('(d.name ILIKE :like OR d.description ILIKE :like)', { like });
    }
    qb.orderBy(column, direction).addOrderBy('d.id', 'ASC').skip(skip).take(take);
    const [rows, total] = await qb.getManyAndCount();
    return { items: rows.map(toDesignSummary), total, page, pageSize };
  }

  /** One design with its owner's name: a single prepared query (the most frequent read of a design). */
  async get(user: AuthUser, id: string): Promise<DesignView> {
    const [d] = await preparedQuery<DesignRow>(
      this.dataSource,
      `SELECT d.id, d.owner_id AS "ownerId", u.display_name AS "ownerName", d.name, d.description, d.spec,
              d.solid_file_name AS "solidFileName", d.preview, d.version,
              d.created_at AS "createdAt", d.updated_at AS "updatedAt"
         FROM designs d JOIN users u ON u.id = d.owner_id WHERE d.id = $1`,
      [id],
    );
    if (!d || !canReadDesign(user, d.ownerId)) throw notFound('DESIGN', 'No such design');
    return { ...d, createdAt: d.createdAt.toISOString(), updatedAt: d.updatedAt.toISOString() };
  }

  async create(user: AuthUser, dto: CreateDesignDto, requestId: string): Promise<DesignView> {
    const { spec, preview } = await previewDesign(this.threads, dto.spec);
    return this.dataSource.transaction(async (m) => {
      const saved = await m.save(
        m.create(Design, {
          ownerId: user.id,
          name: dto.name.trim(),
          description: dto.description ?? '',
          spec,
          preview,
        }),
      );
      await this.audit.record(m, {
        actorId: user.id,
        action: 'design.create',
        entityType: 'design',
        entityId: saved.id,
        after: { name: saved.name },
        requestId,
      });
      return toDesignView(await this.load(m, saved.id));
    });
  }

  async update(user: AuthUser, id: string, dto: UpdateDesignDto, requestId: string): Promise<DesignView> {
    const next = dto.spec !== undefined ? await previewDesign(this.threads, dto.spec) : null;
    return this.dataSource.transaction(async (m) => {
      const d = await this.findWritable(m, user, id, true);
      if (d.version !== dto.version) {
        throw new AppError(
          HttpStatus.CONFLICT,
          'DESIGN.STALE_VERSION',
          'Someone changed this design since you opened it; reload it',
          {
            current: d.version,
          },
        );
      }
      const before = { name: d.name, spec: d.spec };
      if (dto.name !== undefined) d.name = dto.name.trim();
      if (dto.description !== undefined) d.description = dto.description;
      if (next) {
        d.spec = next.spec;
        d.preview = next.preview;
        if (typeof next.spec.solid === 'string') d.solidFileName = null;
      }
      await m.save(d);
      await this.audit.record(m, {
        actorId: user.id,
        action: 'design.update',
        entityType: 'design',
        entityId: id,
        before,
        after: { name: d.name, spec: d.spec },
        requestId,
      });
      return toDesignView(await this.load(m, id));
    });
  }

  async remove(user: AuthUser, id: string, requestId: string): Promise<void> {
    await this.dataSource.transaction(async (m) => {
      const d = await this.findWritable(m, user, id, true);
      const jobs: { n: string }[] = await m.query(
        `SELECT count(*)::text AS n FROM jobs WHERE design_id = $1`,
        [id],
      );
      if (Number(jobs[0]?.n ?? 0) > 0) {
        throw new AppError(
          HttpStatus.CONFLICT,
          'DESIGN.IN_USE',
          'This design has jobs; duplicate it instead of deleting it',
        );
      }
      await m.delete(Design, { id });
      await this.audit.record(m, {
        actorId: user.id,
        action: 'design.delete',
        entityType: 'design',
        entityId: id,
        before: { name: d.name },
        requestId,
      });
    });
  }

  /** Copies a readable design into a new design owned by the caller. */
  async duplicate(user: AuthUser, id: string, requestId: string): Promise<DesignView> {
    return this.dataSource.transaction(async (m) => {
      const d = await this.findReadable(m, user, id);
      const copy = await m.save(
        m.create(Design, {
          ownerId: user.id,
          name: `${d.name} (copy)`.slice(0, 120),
          description: d.description,
          spec: d.spec,
          solidFileName: d.solidFileName,
          preview: d.preview,
        }),
      );
      await this.audit.record(m, {
        actorId: user.id,
        action: 'design.duplicate',
        entityType: 'design',
        entityId: copy.id,
        after: { from: id },
        requestId,
      });
      return toDesignView(await this.load(m, copy.id));
    });
  }

  /** Replaces a design's base solid with an uploaded OBJ/OFF file, checked by the engine first. */
  async attachSolid(
    user: AuthUser,
    id: string,
    file: { originalname: string; buffer: Buffer },
    requestId: string,
  ): Promise<DesignView> {
    // Whose design it is comes before the engine's work: nobody else's upload is parsed at all.
    await this.findWritable(this.dataSource.manager, user, id);
    const { format, text, name } = readSolidUpload(file);
    await checkSolidText(this.threads, format, text, name);
    return this.dataSource.transaction(async (m) => {
      const d = await this.findWritable(m, user, id, true);
      const { spec, preview } = await previewDesign(this.threads, {
        ...d.spec,
        solid: { format, text, name },
      });
      d.spec = spec;
      d.preview = preview;
      d.solidFileName = file.originalname.slice(0, 200);
      await m.save(d);
      await this.audit.record(m, {
        actorId: user.id,
        action: 'design.solid',
        entityType: 'design',
        entityId: id,
        after: { file: d.solidFileName },
        requestId,
      });
      return toDesignView(await this.load(m, id));
    });
  }

  async checkSolid(file: { originalname: string; buffer: Buffer }) {
    const { format, text, name } = readSolidUpload(file);
    return { format, ...(await checkSolidText(this.threads, format, text, name)) };
  }

  private async load(m: EntityManager, id: string): Promise<Design> {
    return m.findOneOrFail(Design, { where: { id }, relations: { owner: true } });
  }

  private async findReadable(m: EntityManager, user: AuthUser, id: string): Promise<Design> {
    const d = await m.findOneBy(Design, { id });
    if (!d || !canReadDesign(user, d.ownerId)) throw notFound('DESIGN', 'No such design');
    return d;
  }

  private async findWritable(m: EntityManager, user: AuthUser, id: string, lock = false): Promise<Design> {
    const d = await m.findOne(Design, {
      where: { id },
      lock: lock ? { mode: 'pessimistic_write' } : undefined,
    });
    if (!d || !canReadDesign(user, d.ownerId)) throw notFound('DESIGN', 'No such design');
    if (!canWriteDesign(user, d.ownerId)) {
      throw new AppError(
        HttpStatus.FORBIDDEN,
        'DESIGN.NOT_OWNER',
        'Only the owner or a supervisor can change this design',
      );
    }
    return d;
  }
}

const SAFE_NAME = /[^A-Za-z0-9 ._()-]/g;

/** The format from the file name's extension, the text as UTF-8; anything else is refused. */
export function readSolidUpload(file: { originalname: string; buffer: Buffer }): {
  format: SolidTextFormat;
  text: string;
  name: string;
} {
  const ext = /\.([A-Za-z]+)$/.exec(file.originalname)?.[1]?.toLowerCase();
  if (ext !== 'obj' && ext !== 'off') {
    throw new AppError(
      HttpStatus.UNSUPPORTED_MEDIA_TYPE,
      'DESIGN.UPLOAD_TYPE',
      'Upload a Wavefront .obj or an .off file',
    );
  }
  if (file.buffer.includes(0)) {
    throw new AppError(
      HttpStatus.BAD_REQUEST,
      'DESIGN.INVALID_SOLID',
      'The file is binary, not OBJ/OFF text',
    );
  }
  const text = new TextDecoder('utf-8', { fatal: false }).decode(file.buffer);
  const base = file.originalname.replace(/^.*[\\/]/, '').replace(/\.[^.]*$/, '');
  const name = base.replace(SAFE_NAME, '_').slice(0, 80) || `uploaded-${ext}`;
  return { format: ext, text, name };
}
