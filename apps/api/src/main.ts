import 'reflect-metadata';
import { Logger } from '@nestjs/common';
import { type ConfigType } from '@nestjs/config';
import { createApp } from './app.factory';
import { appConfig } from './config/app.config';

async function bootstrap(): Promise<void> {
  const app = await createApp();
  const config = app.get<ConfigType<typeof appConfig>>(appConfig.KEY);
  await app.listen(config.port, config.host);
  new Logger('Kerfwright').log(`listening on http://${config.host}:${config.port} (${config.mode} mode)`);
}

bootstrap().catch((err: unknown) => {
  console.error(err instanceof Error ? err.message : err);
  process.exit(1);
});
