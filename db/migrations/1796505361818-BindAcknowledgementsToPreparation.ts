import { type MigrationInterface, type QueryRunner } from 'typeorm';

/**
 * An operator's acknowledgement names the preparation it was made for (the job's `prepare` transition in effect
 * when it was read): a job prepared again (another material, machine or kerf) needs a fresh one, whatever the
 * clocks of the two transactions said. Acknowledgements made before take the latest preparation recorded before
 * them; one with none (never made through the API) names none and counts for nothing.
 */
export class BindAcknowledgementsToPreparation1796505361818 implements MigrationInterface {
  name = 'BindAcknowledgementsToPreparation1796505361818';

  public async up(q: QueryRunner): Promise<void> {
    await q.query(
      `ALTER TABLE safety_acknowledgements
         ADD COLUMN preparation_id bigint REFERENCES job_transitions(id) ON DELETE CASCADE`,
    );
    await q.query(
      `UPDATE safety_acknowledgements a SET preparation_id = (
         SELECT max(t.id) FROM job_transitions t
          WHERE t.job_id = a.job_id AND t.action = 'prepare' AND t.created_at <= a.created_at)`,
    );
    await q.query(
      `CREATE INDEX safety_ack_preparation_idx
         ON safety_acknowledgements (preparation_id, user_id, created_at DESC)`,
    );
  }

  public async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP INDEX safety_ack_preparation_idx`);
    await q.query(`ALTER TABLE safety_acknowledgements DROP COLUMN preparation_id`);
  }
}
