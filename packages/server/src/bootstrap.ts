import { existsSync } from 'node:fs';
import { join } from 'node:path';
import { RequestMethod } from '@nestjs/common';
import type { NestExpressApplication } from '@nestjs/platform-express';
import { DocumentBuilder, SwaggerModule } from '@nestjs/swagger';
import cookieParser from 'cookie-parser';
import express, { type NextFunction, type Request, type Response } from 'express';
import helmet from 'helmet';
import type { AppConfig } from './config/app-config';
import { APP_CONFIG } from './config/config.module';
import { bodyParsers, InputSafetyPipe } from './common/input-safety';
import { createValidationPipe } from './common/validation';
import { publicLotFastPath } from './lots/public-lot-fast-path';

/** Paths served outside the /api prefix (development pages). */
const UNPREFIXED = [{ path: 'dev/{*rest}', method: RequestMethod.ALL }];

/**
 * Applies everything a running server needs on top of the module graph: the public lot data's
 * fast path, security headers, cookies, the /api prefix, validation, the OpenAPI document and the built web app.
 * Used by main.ts and by the e2e tests, so both run the same stack.
 */
export function configureApp(app: NestExpressApplication): AppConfig {
  const config = app.get<AppConfig>(APP_CONFIG);
  app.disable('x-powered-by');
  app.set('trust proxy', 'loopback');
  const securityHeaders = helmet({
    contentSecurityPolicy: {
      directives: {
        defaultSrc: ["'self'"],
        scriptSrc: ["'self'"],
        // Fluent UI inserts its generated styles at run time.
        styleSrc: ["'self'", "'unsafe-inline'"],
        imgSrc: ["'self'", 'data:', 'blob:'],
        fontSrc: ["'self'"],
        connectSrc: ["'self'"],
        mediaSrc: ["'self'", 'blob:'],
        objectSrc: ["'none'"],
        frameAncestors: ["'none'"],
        upgradeInsecureRequests: null,
      },
    },
    crossOriginEmbedderPolicy: false,
  });
  // Which server process answered: with several behind a load balancer, logs and people can tell.
  app.use((_req: Request, res: Response, next: NextFunction) => {
    res.setHeader('Beadroll-Instance', config.instanceName);
    next();
  });
  app.use(publicLotFastPath(app, securityHeaders));
  app.use(securityHeaders);
  app.use(cookieParser());
  const limits = { maxBytes: config.requests.maxJsonBytes, maxDepth: config.requests.maxDepth };
  for (const parser of bodyParsers(limits)) app.use(parser);
  app.setGlobalPrefix('api', { exclude: UNPREFIXED });
  app.useGlobalPipes(new InputSafetyPipe(limits.maxDepth), createValidationPipe());

  const openApi = new DocumentBuilder()
    .setTitle('Beadroll API')
    .setDescription('Provenance rolls for antique and vintage glass beads')
    .setVersion('1')
    .build();
  SwaggerModule.setup('api/docs', app, () => SwaggerModule.createDocument(app, openApi), {
    jsonDocumentUrl: 'api/docs-json',
  });

  serveWeb(app, config.webDist);
  return config;
}

/** Paths the server answers itself (the API and the development pages), never the web app. */
function isServerPath(path: string): boolean {
  return path.startsWith('/api/') || path === '/api' || path.startsWith('/dev/');
}

/** Serves the built web app; unknown non-API paths fall back to the right HTML entry. */
function serveWeb(app: NestExpressApplication, webDist: string): void {
  const appHtml = join(webDist, 'index.html');
  const publicHtml = join(webDist, 'public.html');
  if (!existsSync(appHtml)) return;
  app.use(
    '/assets',
    express.static(join(webDist, 'assets'), { immutable: true, maxAge: '365d', index: false }),
  );
  // API and development paths never name a file: skip the file lookup for them.
  const files = express.static(webDist, { index: false, maxAge: '1h' });
  app.use((req: Request, res: Response, next: NextFunction) =>
    isServerPath(req.path) ? next() : files(req, res, next),
  );
  app.use((req: Request, res: Response, next: NextFunction) => {
    if (req.method !== 'GET' && req.method !== 'HEAD') return next();
    if (isServerPath(req.path)) return next();
    const isPublic = /^\/[lL]\//.test(req.path) && existsSync(publicHtml);
    res.setHeader('Cache-Control', 'no-cache');
    res.sendFile(isPublic ? publicHtml : appHtml);
  });
}
