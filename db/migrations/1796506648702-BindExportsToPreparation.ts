import { type MigrationInterface, type QueryRunner } from 'typeorm';

/**
 * A cut pack names the preparation it was built for (the job's `prepare` transition in effect when it was asked
 * for): once the job is returned and prepared again (another material, kerf or layout), the earlier packs'
 * files are not offered for it. Exports made before take the latest preparation recorded before them.
 */
export class BindExportsToPreparation1796506648702 implements MigrationInterface {
  name = 'BindExportsToPreparation1796506648702';

  public async up(q: QueryRunner): Promise<void> {
    await q.query(
      `ALTER TABLE exports ADD COLUMN preparation_id bigint REFERENCES job_transitions(id) ON DELETE CASCADE`,
    );
    await q.query(
      `UPDATE exports e SET preparation_id = (
         SELECT max(t.id) FROM job_transitions t
          WHERE t.job_id = e.job_id AND t.action = 'prepare' AND t.created_at <= e.created_at)`,
    );
  }

  public async down(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE exports DROP COLUMN preparation_id`);
  }
}
