import { type MigrationInterface, type QueryRunner } from 'typeorm';

/**
 * Audit events about kerf records were written under two entity types ("kerf_record" from job cut records,
 * "kerf-record" from the kerf-records routes); the audit trail filters by one. Keep the hyphenated one.
 */
export class UnifyKerfRecordAuditType1796179100000 implements MigrationInterface {
  name = 'UnifyKerfRecordAuditType1796179100000';

  public async up(q: QueryRunner): Promise<void> {
    await q.query(`UPDATE audit_events SET entity_type = 'kerf-record' WHERE entity_type = 'kerf_record'`);
  }

  public async down(): Promise<void> {
    // Nothing to undo: which rows had the other spelling is not kept.
  }
}
