import { type MigrationInterface, type QueryRunner } from 'typeorm';

/**
 * The layout a job was last prepared with (sheet size, colour rule, margin and gap), kept apart from the
 * preparation's figures: a change of copies drops the figures, but the next preparation starts from the same
 * choices. Jobs prepared before take theirs from the preparation they carry.
 */
export class KeepJobLayoutChoice1796179300000 implements MigrationInterface {
  name = 'KeepJobLayoutChoice1796179300000';

  public async up(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE jobs ADD COLUMN layout_choice jsonb`);
    await q.query(
      `UPDATE jobs SET layout_choice = jsonb_strip_nulls(jsonb_build_object(
         'sheet', preparation->'sheet',
         'colourRule', preparation->'colourRule',
         'marginMm', preparation->'marginMm',
         'gapMm', preparation->'gapMm'))
       WHERE preparation IS NOT NULL AND preparation ? 'sheet'`,
    );
  }

  public async down(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE jobs DROP COLUMN layout_choice`);
  }
}
