import { Injectable } from '@nestjs/common';
import { type EntityManager } from 'typeorm';
import { AuditEvent } from './audit-event.entity';

export interface AuditEntry {
  actorId: string | null;
  action: string;
  entityType: string;
  entityId: string;
  before?: object;
  after?: object;
  requestId?: string | null;
}

/** Records every write, inside the caller's transaction so a rolled-back write leaves no audit row. */
@Injectable()
export class AuditService {
  async record(manager: EntityManager, entry: AuditEntry): Promise<void> {
    await manager.insert(AuditEvent, {
      actorId: entry.actorId,
      action: entry.action,
      entityType: entry.entityType,
      entityId: entry.entityId,
      before: entry.before ?? null,
      after: entry.after ?? null,
      requestId: entry.requestId ?? null,
    });
  }
}
