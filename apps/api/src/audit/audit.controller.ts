import { Controller, Get, Query } from '@nestjs/common';
import { ApiBearerAuth, ApiOkResponse, ApiProperty, ApiPropertyOptional, ApiTags } from '@nestjs/swagger';
import { InjectRepository } from '@nestjs/typeorm';
import { Transform } from 'class-transformer';
import { IsIn, IsOptional, IsString, MaxLength } from 'class-validator';
import { Repository } from 'typeorm';
import { type AuditEventView, type Page } from '@kerfwright/contracts';
import { Roles } from '../common/decorators/auth.decorators';
import { likePattern } from '../common/db-helpers';
import { PageQueryDto, pageWindow } from '../common/paging';
import { AuditEvent } from './audit-event.entity';
import { canonicalId, IsId } from '../common/validation/id';

export class ListAuditQuery extends PageQueryDto {
  @ApiPropertyOptional({
    description: 'The kind of record the events are about',
    enum: [
      'user',
      'material',
      'machine-profile',
      'machine-profile-version',
      'kerf-record',
      'design',
      'job',
      'safety',
    ],
  })
  @IsOptional()
  @IsString()
  @MaxLength(40)
  entityType?: string;
  @ApiPropertyOptional()
  @IsOptional()
  @Transform(({ value }: { value: unknown }) => canonicalId(value))
  @IsString()
  @MaxLength(64)
  entityId?: string;
  @ApiPropertyOptional() @IsOptional() @IsId() actorId?: string;
  @ApiPropertyOptional({ description: 'Action prefix, e.g. "job." or "user.update"' })
  @IsOptional()
  @IsString()
  @MaxLength(80)
  action?: string;
  @ApiPropertyOptional({ enum: ['createdAt', '-createdAt'] })
  @IsOptional()
  @IsIn(['createdAt', '-createdAt'])
  sort?: string;
}

export class AuditEventResponse implements AuditEventView {
  @ApiProperty() id: string;
  @ApiProperty({ type: String, format: 'uuid', nullable: true }) actorId: string | null;
  @ApiProperty({ type: String, nullable: true }) actorName: string | null;
  @ApiProperty({ description: 'What was done, e.g. job.approve' }) action: string;
  @ApiProperty() entityType: string;
  @ApiProperty() entityId: string;
  @ApiProperty({ type: 'object', nullable: true, additionalProperties: true }) before: unknown;
  @ApiProperty({ type: 'object', nullable: true, additionalProperties: true }) after: unknown;
  @ApiProperty({ type: String, nullable: true, description: 'The X-Request-Id of the write' })
  requestId: string | null;
  @ApiProperty({ format: 'date-time' }) createdAt: string;
}

export class AuditPageResponse implements Page<AuditEventView> {
  @ApiProperty({ type: [AuditEventResponse] }) items: AuditEventResponse[];
  @ApiProperty() total: number;
  @ApiProperty() page: number;
  @ApiProperty() pageSize: number;
}

/** The audit trail of every write, newest first; supervisors only. */
@ApiTags('audit')
@ApiBearerAuth()
@Controller('audit')
@Roles('supervisor')
export class AuditController {
  constructor(@InjectRepository(AuditEvent) private readonly events: Repository<AuditEvent>) {}

  @Get()
  @ApiOkResponse({ type: AuditPageResponse, description: 'A page of audit events' })
  async list(@Query() q: ListAuditQuery): Promise<Page<AuditEventView>> {
    const { page, pageSize, skip, take } = pageWindow(q, 50);
    const qb = this.events
      .createQueryBuilder('e')
      .leftJoin('users', 'u', 'u.id = e.actor_id')
      .addSelect('u.display_name', 'actor_name');
    if (q.entityType) qb.andWhere('e.entity_type = :t', { t: q.entityType });
    if (q.entityId) qb.andWhere('e.entity_id = :eid', { eid: q.entityId });
    if (q.actorId) qb.andWhere('e.actor_id = :aid', { aid: q.actorId });
    if (q.action) qb.andWhere('e.action LIKE :a', { a: `${likePattern(q.action).slice(1)}` });
    const total = await qb.getCount();
    const { entities, raw } = await qb
      .orderBy('e.id', q.sort === 'createdAt' ? 'ASC' : 'DESC')
      .offset(skip)
      .limit(take)
      .getRawAndEntities<{ actor_name: string | null }>();
    return {
      items: entities.map((e, i) => ({
        id: e.id,
        actorId: e.actorId,
        actorName: raw[i]?.actor_name ?? null,
        action: e.action,
        entityType: e.entityType,
        entityId: e.entityId,
        before: e.before,
        after: e.after,
        requestId: e.requestId,
        createdAt: e.createdAt.toISOString(),
      })),
      total,
      page,
      pageSize,
    };
  }
}
