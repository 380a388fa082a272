import * as fs from 'node:fs';
import * as path from 'node:path';
import { type INestApplication, Logger, type LogLevel } from '@nestjs/common';
import { type ConfigType } from '@nestjs/config';
import { NestFactory } from '@nestjs/core';
import { type NestExpressApplication } from '@nestjs/platform-express';
import express, { type NextFunction, type Request, type Response } from 'express';
import compression from 'compression';
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
    // A failure while starting (bad configuration, database down) rejects instead of aborting the process.
    abortOnError: false,
    bodyParser: false,
    logger: options.logger ?? ['error', 'warn', 'log'],
  });
  const config = app.get<ConfigType<typeof appConfig>>(appConfig.KEY);
  // The client address (req.ip, which the sign-in throttle counts by) is the connection's unless KW_TRUST_PROXY
  // names the reverse proxies whose X-Forwarded-For may be believed.
  app.set('trust proxy', config.trustProxy);
  // API answers are `no-store` (apiResponseHeaders), so a client never revalidates one and hashing every body
  // for an ETag is wasted. The web app's files keep theirs (express.static has its own setting); the
  // index.html fallback of client-side routes is revalidated by its Last-Modified.
  app.set('etag', false);
  app.use(requestIdMiddleware);
  // gzip for text answers over 1 kB (the web app's scripts shrink about fourfold; JSON lists too). Archives,
  // images and fonts are left alone: `compression` only touches types listed as compressible. Server-sent
  // events are left alone too (Nest marks them Cache-Control: no-transform), so each arrives as it is sent.
  // Downloads (attachments: the cut pack's files) go out byte for byte as stored, as their Repr-Digest and
  // recorded checksum describe them.
  app.use(compression({ filter: (req, res) => !isAttachment(res) && compression.filter(req, res) }));
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
  // Same-origin by default; KW_CORS_ORIGIN allows exactly one other origin (echoed only to that origin).
  app.enableCors(config.corsOrigin ? { origin: [config.corsOrigin], credentials: false } : { origin: false });
  app.use(apiResponseHeaders);
  app.useBodyParser('json', { limit: JSON_BODY_LIMIT });
  app.setGlobalPrefix('api');
  app.useGlobalPipes(createValidationPipe());
  app.enableShutdownHooks();
  mountApiDocs(app);
  serveWebApp(app, config.webDist);
  return app;
}

/**
 * API answers hold account and workshop data: browsers and proxies must not keep them (OWASP ASVS 8.2.1),
 * and one opened directly is saved rather than rendered (ASVS 14.4.2). Downloads set their own
 * disposition; the API documentation pages are left alone.
 */
function apiResponseHeaders(req: Request, res: Response, next: NextFunction): void {
  if (req.path.startsWith('/api/') && !req.path.startsWith('/api/docs')) {
    res.setHeader('Cache-Control', 'no-store');
    if (!FILE_DOWNLOAD.test(req.path))
      res.setHeader('Content-Disposition', 'attachment; filename="api.json"');
  }
  next();
}

/** Cut-pack downloads name their own file (Nest does not replace a disposition already set). */
const FILE_DOWNLOAD = /^\/api\/exports\/[^/]+\/files\//;

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
  const isApi = (req: Request) => req.path === '/api' || req.path.startsWith('/api/');
  // Source maps stay on the server's disk for reading error reports; they are not published.
  const isSourceMap = (req: Request) => req.path.endsWith('.map');
  const files = express.static(webDist, { index: false, maxAge: '1h', setHeaders: noCacheForHtml });
  // API requests never look for a file on disk (a stat per request was measurable under load).
  app.use((req: Request, res: Response, next: NextFunction) => {
    if (isApi(req)) return next();
    if (isSourceMap(req)) return res.status(404).end();
    return files(req, res, next);
  });
  app.use((req: Request, res: Response, next: NextFunction) => {
    if (req.method !== 'GET' || isApi(req)) return next();
    res.setHeader('Cache-Control', 'no-cache');
    res.sendFile(index);
  });
}

function isAttachment(res: Response): boolean {
  const disposition = res.getHeader('Content-Disposition');
  return typeof disposition === 'string' && disposition.startsWith('attachment');
}

function noCacheForHtml(res: Response, filePath: string): void {
  if (filePath.endsWith('.html')) res.setHeader('Cache-Control', 'no-cache');
}
