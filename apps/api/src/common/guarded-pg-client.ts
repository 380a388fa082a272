import { Logger } from '@nestjs/common';
import { Client, type ClientConfig } from 'pg';

const logger = new Logger('Database');

/**
 * A node-postgres Client that always listens for 'error' (the pool builds its connections with it: `extra.Client`
 * in app.module.ts). A PostgreSQL server that stops sends "terminating connection" (57P01) to every connection;
 * TypeORM listens on a connection only while a query runner holds it and removes its listener when it releases
 * the broken one, and an 'error' event that nobody listens for is thrown and ends the process. Seen in
 * outages.e2e-spec.ts under load. The failure still reaches the query that was running, and the pool drops the
 * client as before.
 */
export class GuardedPgClient extends Client {
  constructor(config?: string | ClientConfig) {
    super(config);
    this.on('error', (err: Error) => logger.warn(`a PostgreSQL connection failed: ${err.message}`));
  }
}
