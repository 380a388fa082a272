import 'reflect-metadata';
import * as path from 'node:path';
import { DataSource } from 'typeorm';
import { readDbOptions } from './db-options';

/**
 * The one TypeORM data source for migrations (TypeORM CLI: `typeorm -d db/dist/src/data-source.js`).
 * Entities live with their feature modules in apps/api; migrations are plain SQL here.
 */
export function createMigrationDataSource(env: NodeJS.ProcessEnv = process.env): DataSource {
  const o = readDbOptions(env);
  return new DataSource({
    type: 'postgres',
    host: o.host,
    port: o.port,
    database: o.database,
    username: o.username,
    password: o.password,
    migrations: [path.join(__dirname, '..', 'migrations', '*.js')],
    migrationsTableName: 'schema_migrations',
    migrationsTransactionMode: 'each',
    logging: ['error'],
  });
}

export default createMigrationDataSource();
