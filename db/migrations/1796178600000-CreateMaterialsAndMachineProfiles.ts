import { type MigrationInterface, type QueryRunner } from 'typeorm';

/** Materials, machine profiles with numbered versions and approval states, and measured kerf records. */
export class CreateMaterialsAndMachineProfiles1796178600000 implements MigrationInterface {
  name = 'CreateMaterialsAndMachineProfiles1796178600000';

  public async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE materials (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        seed_key varchar(64) UNIQUE,
        name varchar(120) NOT NULL,
        family varchar(40) NOT NULL,
        nominal_thickness_mm numeric(8,3) NOT NULL CHECK (nominal_thickness_mm > 0),
        measured_thickness_mm numeric(8,3) CHECK (measured_thickness_mm > 0),
        flexible boolean NOT NULL DEFAULT false,
        colours jsonb NOT NULL DEFAULT '[]',
        stock_sheets jsonb NOT NULL DEFAULT '[]',
        laser_allowed boolean NOT NULL DEFAULT true,
        hazard_note text NOT NULL DEFAULT '',
        notes text NOT NULL DEFAULT '',
        version integer NOT NULL DEFAULT 1,
        created_by uuid REFERENCES users(id) ON DELETE SET NULL,
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now()
      )`);
    await q.query(`CREATE UNIQUE INDEX materials_name_lower_key ON materials (lower(name))`);
    await q.query(`CREATE INDEX materials_family_idx ON materials (family)`);

    await q.query(`CREATE TYPE profile_state AS ENUM ('draft', 'submitted', 'approved', 'retired')`);
    await q.query(`
      CREATE TABLE machine_profiles (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        seed_key varchar(64) UNIQUE,
        name varchar(120) NOT NULL,
        kind varchar(40) NOT NULL,
        created_by uuid REFERENCES users(id) ON DELETE SET NULL,
        created_at timestamptz NOT NULL DEFAULT now()
      )`);
    await q.query(`CREATE UNIQUE INDEX machine_profiles_name_lower_key ON machine_profiles (lower(name))`);
    await q.query(`
      CREATE TABLE machine_profile_versions (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        profile_id uuid NOT NULL REFERENCES machine_profiles(id) ON DELETE CASCADE,
        number integer NOT NULL CHECK (number > 0),
        based_on_number integer,
        state profile_state NOT NULL DEFAULT 'draft',
        bed_width_mm numeric(8,1) NOT NULL CHECK (bed_width_mm > 0),
        bed_height_mm numeric(8,1) NOT NULL CHECK (bed_height_mm > 0),
        rapid_speed_mm_s numeric(8,1) NOT NULL CHECK (rapid_speed_mm_s > 0),
        hourly_rate numeric(10,2) NOT NULL CHECK (hourly_rate >= 0),
        currency varchar(3) NOT NULL DEFAULT 'EUR',
        settings jsonb NOT NULL DEFAULT '[]',
        notes text NOT NULL DEFAULT '',
        return_reason text,
        created_by uuid REFERENCES users(id) ON DELETE SET NULL,
        submitted_by uuid REFERENCES users(id) ON DELETE SET NULL,
        submitted_at timestamptz,
        approved_by uuid REFERENCES users(id) ON DELETE SET NULL,
        approved_at timestamptz,
        returned_by uuid REFERENCES users(id) ON DELETE SET NULL,
        returned_at timestamptz,
        retired_by uuid REFERENCES users(id) ON DELETE SET NULL,
        retired_at timestamptz,
        lock_version integer NOT NULL DEFAULT 1,
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now(),
        UNIQUE (profile_id, number)
      )`);
    // At most one approved version per profile at a time.
    await q.query(
      `CREATE UNIQUE INDEX machine_profile_versions_one_approved ON machine_profile_versions (profile_id) WHERE state = 'approved'`,
    );
    // At most one open (draft or submitted) version per profile: changes go into it, not beside it.
    await q.query(
      `CREATE UNIQUE INDEX machine_profile_versions_one_open ON machine_profile_versions (profile_id) WHERE state IN ('draft', 'submitted')`,
    );
    // A version's content is fixed once it leaves draft: jobs keep the exact version id they were prepared with.
    // (The order of states is the service's job; this guards the content against any writer.)
    await q.query(`
      CREATE FUNCTION machine_profile_version_guard() RETURNS trigger LANGUAGE plpgsql AS $$
      BEGIN
        IF OLD.state <> 'draft' AND (
          NEW.profile_id <> OLD.profile_id OR NEW.number <> OLD.number
          OR NEW.settings IS DISTINCT FROM OLD.settings
          OR NEW.bed_width_mm <> OLD.bed_width_mm OR NEW.bed_height_mm <> OLD.bed_height_mm
          OR NEW.rapid_speed_mm_s <> OLD.rapid_speed_mm_s OR NEW.hourly_rate <> OLD.hourly_rate
          OR NEW.currency <> OLD.currency OR NEW.notes <> OLD.notes
        ) THEN
          RAISE EXCEPTION 'machine profile version % is %: its content cannot change', OLD.id, OLD.state
            USING ERRCODE = 'check_violation';
        END IF;
        RETURN NEW;
      END $$`);
    await q.query(`
      CREATE TRIGGER machine_profile_versions_guard BEFORE UPDATE ON machine_profile_versions
      FOR EACH ROW EXECUTE FUNCTION machine_profile_version_guard()`);
    // Finds the versions that name a material in their settings (refusing to delete a material in use).
    await q.query(
      `CREATE INDEX machine_profile_versions_settings_idx ON machine_profile_versions USING gin (settings jsonb_path_ops)`,
    );

    await q.query(`
      CREATE TABLE kerf_records (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        profile_id uuid NOT NULL REFERENCES machine_profiles(id) ON DELETE CASCADE,
        material_id uuid NOT NULL REFERENCES materials(id) ON DELETE RESTRICT,
        kerf_mm numeric(6,3) NOT NULL CHECK (kerf_mm > 0 AND kerf_mm <= 25),
        job_id uuid,
        notes text NOT NULL DEFAULT '',
        recorded_by uuid REFERENCES users(id) ON DELETE SET NULL,
        adopted_version_id uuid REFERENCES machine_profile_versions(id) ON DELETE SET NULL,
        created_at timestamptz NOT NULL DEFAULT now()
      )`);
    await q.query(
      `CREATE INDEX kerf_records_profile_material_idx ON kerf_records (profile_id, material_id, created_at)`,
    );
    await q.query(`CREATE INDEX kerf_records_material_idx ON kerf_records (material_id)`);
  }

  public async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE IF EXISTS kerf_records CASCADE`);
    await q.query(`DROP TABLE IF EXISTS machine_profile_versions CASCADE`);
    await q.query(`DROP TABLE IF EXISTS machine_profiles CASCADE`);
    await q.query(`DROP TABLE IF EXISTS materials CASCADE`);
    await q.query(`DROP FUNCTION IF EXISTS machine_profile_version_guard()`);
    await q.query(`DROP TYPE IF EXISTS profile_state`);
  }
}
