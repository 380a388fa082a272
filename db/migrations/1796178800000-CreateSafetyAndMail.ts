import { type MigrationInterface, type QueryRunner } from 'typeorm';

/** Versioned safety notices, the material hazard table, local rules, acknowledgements and the mail outbox. */
export class CreateSafetyAndMail1796178800000 implements MigrationInterface {
  name = 'CreateSafetyAndMail1796178800000';

  public async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE safety_notices (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        notice_key varchar(80) NOT NULL,
        version integer NOT NULL CHECK (version > 0),
        title varchar(200) NOT NULL,
        severity varchar(20) NOT NULL,
        machine_kinds jsonb NOT NULL,
        material_families jsonb NOT NULL,
        body text NOT NULL,
        sources jsonb NOT NULL DEFAULT '[]',
        current boolean NOT NULL DEFAULT true,
        created_at timestamptz NOT NULL DEFAULT now(),
        UNIQUE (notice_key, version)
      )`);
    await q.query(
      `CREATE UNIQUE INDEX safety_notices_one_current ON safety_notices (notice_key) WHERE current`,
    );
    await q.query(`
      CREATE TABLE material_hazards (
        family varchar(40) PRIMARY KEY,
        examples jsonb NOT NULL DEFAULT '[]',
        laser varchar(12) NOT NULL CHECK (laser IN ('yes', 'no', 'conditional')),
        hazard text NOT NULL,
        condition text,
        source text NOT NULL,
        updated_at timestamptz NOT NULL DEFAULT now()
      )`);
    await q.query(`
      CREATE TABLE local_rules (
        id serial PRIMARY KEY,
        version integer NOT NULL UNIQUE,
        body text NOT NULL,
        author_id uuid REFERENCES users(id) ON DELETE SET NULL,
        created_at timestamptz NOT NULL DEFAULT now()
      )`);
    await q.query(`
      CREATE TABLE safety_acknowledgements (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        job_id uuid NOT NULL REFERENCES jobs(id) ON DELETE CASCADE,
        user_id uuid NOT NULL REFERENCES users(id) ON DELETE CASCADE,
        notice_versions jsonb NOT NULL,
        local_rules_version integer,
        created_at timestamptz NOT NULL DEFAULT now()
      )`);
    await q.query(
      `CREATE INDEX safety_ack_job_user_idx ON safety_acknowledgements (job_id, user_id, created_at DESC)`,
    );

    await q.query(`
      CREATE TABLE mail_outbox (
        id bigserial PRIMARY KEY,
        recipients jsonb NOT NULL,
        subject varchar(200) NOT NULL,
        text_body text NOT NULL,
        html_body text NOT NULL,
        kind varchar(60) NOT NULL,
        status varchar(12) NOT NULL DEFAULT 'pending' CHECK (status IN ('pending', 'sent', 'failed')),
        attempts integer NOT NULL DEFAULT 0,
        next_attempt_at timestamptz NOT NULL DEFAULT now(),
        last_error text,
        sent_at timestamptz,
        created_at timestamptz NOT NULL DEFAULT now()
      )`);
    await q.query(
      `CREATE INDEX mail_outbox_due_idx ON mail_outbox (next_attempt_at) WHERE status = 'pending'`,
    );
  }

  public async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE IF EXISTS mail_outbox CASCADE`);
    await q.query(`DROP TABLE IF EXISTS safety_acknowledgements CASCADE`);
    await q.query(`DROP TABLE IF EXISTS local_rules CASCADE`);
    await q.query(`DROP TABLE IF EXISTS material_hazards CASCADE`);
    await q.query(`DROP TABLE IF EXISTS safety_notices CASCADE`);
  }
}
