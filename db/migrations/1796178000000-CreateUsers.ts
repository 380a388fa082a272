import { type MigrationInterface, type QueryRunner } from 'typeorm';

/** Users with one workshop role each, and the audit trail of writes. */
export class CreateUsers1796178000000 implements MigrationInterface {
  name = 'CreateUsers1796178000000';

  public async up(q: QueryRunner): Promise<void> {
    await q.query(`CREATE TYPE user_role AS ENUM ('hobbyist', 'fabricator', 'operator', 'supervisor')`);
    await q.query(`
      CREATE TABLE users (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        email varchar(254) NOT NULL,
        display_name varchar(80) NOT NULL,
        password_hash varchar(100) NOT NULL,
        role user_role NOT NULL DEFAULT 'hobbyist',
        active boolean NOT NULL DEFAULT true,
        is_demo boolean NOT NULL DEFAULT false,
        version integer NOT NULL DEFAULT 1,
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now()
      )`);
    await q.query(`CREATE UNIQUE INDEX users_email_lower_key ON users (lower(email))`);
    await q.query(`
      CREATE TABLE audit_events (
        id bigserial PRIMARY KEY,
        actor_id uuid REFERENCES users(id) ON DELETE SET NULL,
        action varchar(80) NOT NULL,
        entity_type varchar(40) NOT NULL,
        entity_id varchar(64) NOT NULL,
        before jsonb,
        after jsonb,
        request_id varchar(64),
        created_at timestamptz NOT NULL DEFAULT now()
      )`);
    await q.query(`CREATE INDEX audit_events_entity_idx ON audit_events (entity_type, entity_id)`);
    await q.query(`CREATE INDEX audit_events_created_idx ON audit_events (created_at DESC)`);
  }

  public async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE audit_events`);
    await q.query(`DROP TABLE users`);
    await q.query(`DROP TYPE user_role`);
  }
}
