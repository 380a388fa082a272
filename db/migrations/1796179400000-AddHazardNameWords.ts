import { type MigrationInterface, type QueryRunner } from 'typeorm';

/**
 * Words that, in a material's name, say it is of a family refused on the laser ("PVC", "vinyl"): a material
 * named so but filed under another family is not allowed on the laser. Filled by the seed from the table.
 */
export class AddHazardNameWords1796179400000 implements MigrationInterface {
  name = 'AddHazardNameWords1796179400000';

  public async up(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE material_hazards ADD COLUMN name_words jsonb NOT NULL DEFAULT '[]'`);
  }

  public async down(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE material_hazards DROP COLUMN name_words`);
  }
}
