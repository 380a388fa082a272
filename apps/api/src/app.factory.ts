import * as fs from 'node:fs';
import * as path from 'node:path';
import { type INestApplication, Logger, type LogLevel } from '@nestjs/common';
import { type ConfigType } from '@nestjs/config';
import { NestFactory } from '@nestjs/core';
import { type NestExpressApplication } from '@nestjs/platform-express';
import express, { type NextFunction, type Request, type Response } from 'express';
import helmet from 'helmet';
import { DocumentBuilder, SwaggerModule } from '@nestjs/swagger';
import { AppModule } from './app.module';
import { requestIdMiddleware } from './common/middleware/request-id.middleware';
import { createValidationPipe } from './common/pipes/validation.pipe';
import { appConfig } from './config/app.config';

export const JSON_BODY_LIMIT = '1mb';

/** Builds the whole application exactly as production runs it (tests use this too). */
export async function createApp(options: { logger?: LogLevel[] | false } = {}): Promise<INestApplication> {
  const app = await NestFactory.create<NestExpressApplication>(AppModule, {
    bodyParser: false,
    logger: options.logger ?? ['error', 'warn', 'log'],
  });
  const config = app.get<ConfigType<typeof appConfig>>(appConfig.KEY);
  app.set('trust proxy', 'loopback');
  app.use(requestIdMiddleware);
  app.use(
    helmet({
      contentSecurityPolicy: {
        directives: {
          defaultSrc: ["'self'"],
          styleSrc: ["'self'", "'unsafe-inline'"],
          imgSrc: ["'self'", 'data:', 'blob:'],
          workerSrc: ["'self'", 'blob:'],
          connectSrc: ["'self'"],
          // Served over plain HTTP on loopback or a workshop LAN: do not rewrite requests to https.
          upgradeInsecureRequests: null,
        },
      },
      // HSTS belongs on the TLS terminator in front of Kerfwright, not on a plain-HTTP server.
      strictTransportSecurity: false,
    }),
  );
  app.enableCors(config.corsOrigin ? { origin: config.corsOrigin, credentials: false } : { origin: false });
  app.useBodyParser('json', { limit: JSON_BODY_LIMIT });
  app.setGlobalPrefix('api');
  app.useGlobalPipes(createValidationPipe());
  app.enableShutdownHooks();
  mountApiDocs(app);
  serveWebApp(app, config.webDist);
  return app;
}

/** OpenAPI description of every route at /api/docs (JSON at /api/docs-json). */
function mountApiDocs(app: NestExpressApplication): void {
  const doc = new DocumentBuilder()
    .setTitle('Kerfwright API')
    .setDescription(
      'Slotted sheet models from design to cut pack: workshop resources, jobs and files. Lengths in mm.',
    )
    .setVersion('1')
    .addBearerAuth()
    .build();
  SwaggerModule.setup('api/docs', app, () => SwaggerModule.createDocument(app, doc), {
    jsonDocumentUrl: 'api/docs-json',
  });
}

/** Serves the built web client at / with a fallback to index.html for client-side routes. */
function serveWebApp(app: NestExpressApplication, webDist: string): void {
  const index = path.join(webDist, 'index.html');
  if (!fs.existsSync(index)) {
    new Logger('Web').warn(`web client not built (${index} missing): only the API is served`);
    return;
  }
  app.use(express.static(webDist, { index: false, maxAge: '1h', setHeaders: noCacheForHtml }));
  app.use((req: Request, res: Response, next: NextFunction) => {
    if (req.method !== 'GET' || req.path === '/api' || req.path.startsWith('/api/')) return next();
    res.setHeader('Cache-Control', 'no-cache');
    res.sendFile(index);
  });
}

function noCacheForHtml(res: Response, filePath: string): void {
  if (filePath.endsWith('.html')) res.setHeader('Cache-Control', 'no-cache');
}
