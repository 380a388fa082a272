import 'reflect-metadata';
import { Logger } from '@nestjs/common';
import { NestFactory } from '@nestjs/core';
import { AppModule } from './app.module';

/**
 * `npm run worker`: a process that works the cut-pack queue (and sends queued mail) with the same code and
 * configuration as the API, but serves no HTTP. Start as many as the machines allow, each pointed at the
 * same PostgreSQL (KW_DB_*), Redis (KW_REDIS_*, KW_QUEUE_PREFIX) and object storage (KW_STORAGE, KW_S3_*).
 */
async function bootstrap(): Promise<void> {
  process.env.KW_WORKER_MODE = 'worker';
  const app = await NestFactory.createApplicationContext(AppModule, { logger: ['error', 'warn', 'log'] });
  app.enableShutdownHooks();
  new Logger('Kerfwright').log(`export worker ${process.pid} started`);
}

bootstrap().catch((err: unknown) => {
  console.error(err instanceof Error ? err.message : err);
  process.exit(1);
});
