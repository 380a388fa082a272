import { type MigrationInterface, type QueryRunner } from 'typeorm';

/**
 * Tokens ended by signing out (by their `jti`), kept until they would have expired anyway: a token copied from a
 * shared workshop PC before its user signed out is refused from then on.
 */
export class RevokeSignedOutTokens1796179500000 implements MigrationInterface {
  name = 'RevokeSignedOutTokens1796179500000';

  public async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE revoked_tokens (
        jti uuid PRIMARY KEY,
        user_id uuid NOT NULL REFERENCES users(id) ON DELETE CASCADE,
        expires_at timestamptz NOT NULL
      )`);
    await q.query(`CREATE INDEX revoked_tokens_expires_at ON revoked_tokens (expires_at)`);
  }

  public async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE revoked_tokens`);
  }
}
