import { type MigrationInterface, type QueryRunner } from 'typeorm';

/**
 * Cut-pack exports (the queue's records) and the files each finished export wrote to object storage,
 * with their SHA-256 checksums. A done export and its file rows are written in one transaction.
 */
export class CreateExports1796179000000 implements MigrationInterface {
  name = 'CreateExports1796179000000';

  public async up(q: QueryRunner): Promise<void> {
    await q.query(`CREATE TYPE export_state AS ENUM ('queued', 'running', 'done', 'failed')`);
    await q.query(`
      CREATE TABLE exports (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        job_id uuid NOT NULL REFERENCES jobs(id) ON DELETE CASCADE,
        state export_state NOT NULL DEFAULT 'queued',
        progress integer NOT NULL DEFAULT 0 CHECK (progress BETWEEN 0 AND 100),
        attempts integer NOT NULL DEFAULT 0,
        error_code varchar(80),
        error_message text,
        requested_by uuid REFERENCES users(id) ON DELETE SET NULL,
        created_at timestamptz NOT NULL DEFAULT now(),
        started_at timestamptz,
        finished_at timestamptz,
        manifest jsonb,
        storage_prefix varchar(300) NOT NULL
      )`);
    await q.query(`CREATE INDEX exports_job_idx ON exports (job_id, created_at DESC)`);
    await q.query(`
      CREATE TABLE export_files (
        export_id uuid NOT NULL REFERENCES exports(id) ON DELETE CASCADE,
        name varchar(128) NOT NULL,
        role varchar(40) NOT NULL,
        content_type varchar(100) NOT NULL,
        bytes bigint NOT NULL CHECK (bytes >= 0),
        sha256 char(64) NOT NULL CHECK (sha256 ~ '^[0-9a-f]{64}$'),
        storage_key varchar(400) NOT NULL UNIQUE,
        PRIMARY KEY (export_id, name)
      )`);
  }

  public async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE IF EXISTS export_files CASCADE`);
    await q.query(`DROP TABLE IF EXISTS exports CASCADE`);
    await q.query(`DROP TYPE IF EXISTS export_state`);
  }
}
