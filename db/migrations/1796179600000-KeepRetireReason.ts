import { type MigrationInterface, type QueryRunner } from 'typeorm';

/**
 * Why a supervisor took a machine profile version out of use (a cracked tube, a bed out of square): shown on the
 * profile beside the retired version and mailed to those who prepare and cut jobs. Versions retired because a
 * newer one was approved have none.
 */
export class KeepRetireReason1796179600000 implements MigrationInterface {
  name = 'KeepRetireReason1796179600000';

  public async up(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE machine_profile_versions ADD COLUMN retire_reason text`);
  }

  public async down(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE machine_profile_versions DROP COLUMN retire_reason`);
  }
}
