import { type EntityManager } from 'typeorm';

/**
 * SQL for a job's preparation in effect: the id of its latest `prepare` transition, as text (node-postgres gives
 * a bigint as a string), or NULL when it was never prepared. `jobId` is the SQL expression naming the job's id.
 * Acknowledgements and cut packs name it, and count only while it is still in effect.
 */
export const preparationInEffectSql = (jobId: string): string =>
  `(SELECT max(t.id) FROM job_transitions t WHERE t.job_id = ${jobId} AND t.action = 'prepare')::text`;

/** The job's preparation in effect (see preparationInEffectSql); null when it was never prepared. */
export async function preparationInEffect(m: EntityManager, jobId: string): Promise<string | null> {
  const rows: { id: string | null }[] = await m.query(`SELECT ${preparationInEffectSql('$1')} AS id`, [
    jobId,
  ]);
  return rows[0]?.id ?? null;
}
