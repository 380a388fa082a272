import { type MigrationInterface, type QueryRunner } from 'typeorm';

/**
 * A job keeps the design's spec as it was requested (jobs.requested_spec): preparing it again starts from that,
 * with the design's margin, gap, colour rule and size search, not from the first preparation's spec, which
 * keeps none of them. Jobs requested but not prepared yet still hold it in `spec`; others keep null and are
 * prepared again from `spec` as before.
 */
export class KeepRequestedSpec1796509000000 implements MigrationInterface {
  name = 'KeepRequestedSpec1796509000000';

  public async up(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE jobs ADD COLUMN requested_spec jsonb`);
    await q.query(`UPDATE jobs SET requested_spec = spec WHERE state = 'requested'`);
  }

  public async down(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE jobs DROP COLUMN requested_spec`);
  }
}
