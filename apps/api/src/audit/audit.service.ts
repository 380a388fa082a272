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
    let before = entry.before ?? null;
    let after = entry.after ?? null;
    // Every entry about a job names it by its design (its state changes, its cut pack queued or built, notices
    // acknowledged), so the audit trail can say which job whatever the entry's own fields. The name goes into
    // both snapshots, so it never reads as a change.
    if (entry.entityType === 'job' && !(after && 'designName' in after)) {
      const rows: { name: string }[] = await manager.query(
        `SELECT d.name FROM jobs j JOIN designs d ON d.id = j.design_id WHERE j.id::text = $1`,
        [entry.entityId],
      );
      const designName = rows[0]?.name;
      if (designName !== undefined) {
        after = { ...(after ?? {}), designName };
        if (before) before = { ...before, designName };
      }
    }
    await manager.insert(AuditEvent, {
      actorId: entry.actorId,
      action: entry.action,
      entityType: entry.entityType,
      entityId: entry.entityId,
      before,
      after,
      requestId: entry.requestId ?? null,
    });
  }
}
