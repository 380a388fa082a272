import { type MigrationInterface, type QueryRunner } from 'typeorm';

/** Designs, jobs moving through their states, and the record of every transition. */
export class CreateDesignsAndJobs1796178700000 implements MigrationInterface {
  name = 'CreateDesignsAndJobs1796178700000';

  public async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE designs (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        seed_key varchar(64) UNIQUE,
        owner_id uuid NOT NULL REFERENCES users(id) ON DELETE CASCADE,
        name varchar(120) NOT NULL,
        description text NOT NULL DEFAULT '',
        spec jsonb NOT NULL,
        solid_file_name varchar(200),
        preview jsonb NOT NULL DEFAULT '{}',
        version integer NOT NULL DEFAULT 1,
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now()
      )`);
    await q.query(`CREATE INDEX designs_owner_idx ON designs (owner_id, updated_at DESC)`);

    await q.query(`CREATE TYPE job_state AS ENUM
      ('draft', 'requested', 'prepared', 'approved', 'released', 'cut', 'closed', 'returned')`);
    await q.query(`
      CREATE TABLE jobs (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        seed_key varchar(64) UNIQUE,
        design_id uuid NOT NULL REFERENCES designs(id) ON DELETE RESTRICT,
        requester_id uuid NOT NULL REFERENCES users(id) ON DELETE RESTRICT,
        state job_state NOT NULL DEFAULT 'draft',
        spec jsonb NOT NULL,
        material_id uuid REFERENCES materials(id) ON DELETE RESTRICT,
        colours jsonb NOT NULL DEFAULT '[]',
        profile_version_id uuid REFERENCES machine_profile_versions(id) ON DELETE RESTRICT,
        quantity integer NOT NULL DEFAULT 1 CHECK (quantity BETWEEN 1 AND 100),
        notes text NOT NULL DEFAULT '',
        return_reason text,
        preparation jsonb,
        actual_minutes numeric(8,1),
        sheets_used integer,
        measured_kerf_mm numeric(6,3),
        version integer NOT NULL DEFAULT 1,
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now()
      )`);
    await q.query(`CREATE INDEX jobs_state_idx ON jobs (state, updated_at DESC)`);
    await q.query(`CREATE INDEX jobs_requester_idx ON jobs (requester_id, updated_at DESC)`);
    await q.query(
      `ALTER TABLE kerf_records ADD CONSTRAINT kerf_records_job_fk FOREIGN KEY (job_id) REFERENCES jobs(id) ON DELETE SET NULL`,
    );
    await q.query(`
      CREATE TABLE job_transitions (
        id bigserial PRIMARY KEY,
        job_id uuid NOT NULL REFERENCES jobs(id) ON DELETE CASCADE,
        from_state job_state,
        to_state job_state NOT NULL,
        action varchar(20) NOT NULL,
        actor_id uuid REFERENCES users(id) ON DELETE SET NULL,
        reason text,
        created_at timestamptz NOT NULL DEFAULT now()
      )`);
    await q.query(`CREATE INDEX job_transitions_job_idx ON job_transitions (job_id, id)`);
  }

  public async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE IF EXISTS job_transitions CASCADE`);
    await q.query(`DROP TABLE IF EXISTS jobs CASCADE`);
    await q.query(`DROP TABLE IF EXISTS designs CASCADE`);
    await q.query(`DROP TYPE IF EXISTS job_state`);
  }
}
