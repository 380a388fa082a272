export { readDbOptions, type DbConnectionOptions } from './db-options';
export { createMigrationDataSource } from './data-source';
export { runMigrations, seedDatabase } from './seed/seed';
