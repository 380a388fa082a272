/**
 * Connection settings for the Kerfwright database, read from the environment.
 * The same variables are used by the API, the workers and the db CLI.
 */
export interface DbConnectionOptions {
  host: string;
  port: number;
  database: string;
  username: string;
  password: string;
}

export function readDbOptions(env: NodeJS.ProcessEnv = process.env): DbConnectionOptions {
  const port = Number(env.KW_DB_PORT ?? 54329);
  if (!Number.isInteger(port) || port <= 0 || port > 65535) {
    throw new Error(`KW_DB_PORT must be a TCP port, got "${env.KW_DB_PORT}"`);
  }
  return {
    host: env.KW_DB_HOST ?? '127.0.0.1',
    port,
    database: env.KW_DB_NAME ?? 'kerfwright',
    username: env.KW_DB_USER ?? 'kerfwright',
    password: env.KW_DB_PASSWORD ?? 'kerfwright-local',
  };
}
