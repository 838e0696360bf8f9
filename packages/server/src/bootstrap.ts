import { existsSync, readFileSync } from 'node:fs';
import type { ServerResponse } from 'node:http';
import { basename, join } from 'node:path';
import type { NestExpressApplication } from '@nestjs/platform-express';
import { SwaggerModule } from '@nestjs/swagger';
import compression from 'compression';
import cookieParser from 'cookie-parser';
import type { NextFunction, Request, Response } from 'express';
import expressStaticGzip from 'express-static-gzip';
import helmet from 'helmet';
import type { AppConfig } from './config/app-config';
import { APP_CONFIG } from './config/config.module';
import { bodyParsers, InputSafetyPipe } from './common/input-safety';
import { createValidationPipe } from './common/validation';
import { RollReaderService } from './ledger/roll-reader.service';
import { installPublicLotFastPath } from './lots/public-lot-fast-path';
import { publicLotPage, publicPageScriptHashes, publicPageSender } from './lots/public-lot-page';
import { CheckpointsService } from './log/checkpoints.service';
import { createOpenApiDocument, UNPREFIXED } from './openapi/openapi-document';

/**
 * Applies everything a running server needs on top of the module graph: the public lot data's
 * fast path (ahead of express), security headers, cookies, the /api prefix, validation, the OpenAPI document and the built web app.
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
        // The public lot page's first script is written into the page: allowed by its hash.
        scriptSrc: ["'self'", ...publicPageScriptHashes(config.webDist)],
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
  // Dynamic answers over 1 KB (the roll JSON, bundles, lists) are compressed for clients that
  // ask; the built web files are compressed at build time and served as they are (serveWeb).
  app.use(compression({ threshold: 1024 }));
  app.use(securityHeaders);
  installPublicLotFastPath(app.getHttpServer(), app, config.instanceName, securityHeaders);
  app.use(cookieParser());
  const limits = { maxBytes: config.requests.maxJsonBytes, maxDepth: config.requests.maxDepth };
  for (const parser of bodyParsers(limits)) app.use(parser);
  app.setGlobalPrefix('api', { exclude: UNPREFIXED });
  app.useGlobalPipes(new InputSafetyPipe(limits.maxDepth), createValidationPipe());

  SwaggerModule.setup('api/docs', app, () => createOpenApiDocument(app), {
    jsonDocumentUrl: 'api/docs-json',
  });

  serveWeb(
    app,
    config.webDist,
    app.get(CheckpointsService, { strict: false }).verifierKey(),
    publicLotPage(app, config.webDist),
  );
  return config;
}

/**
 * A public lot page that does not carry its lot's data asks for it: name it in a preload link,
 * so the browser fetches it while it still loads the page's script. The address is the one the
 * page itself asks for (the canonical code), fetched the same way (CORS mode, cookies of this
 * site only), so the browser hands the preloaded answer to the page.
 */
function preloadPublicLot(code: string | null, res: Response): void {
  if (code) res.setHeader('Link', `</api/public/lots/${code}>; rel=preload; as=fetch; crossorigin=anonymous`);
}

/** The canonical lot code a public page's address names, or null when it names none. */
function publicLotCode(path: string): string | null {
  const segment = /^\/[lL]\/([^/]+)(?:\/[^/]+)?\/?$/.exec(path)?.[1];
  try {
    return segment === undefined ? null : RollReaderService.canonicalCode(decodeURIComponent(segment));
  } catch {
    return null; // a malformed %-escape: the page says the lot was not found
  }
}

/**
 * A lot page installed as an app opens that lot: its manifest link names the lot (and whether
 * the page was opened from a tag, `/L/`, whose worker covers `/L/`), and the manifest is
 * answered with that start address and scope. Browsers install only a manifest that names its
 * start address.
 */
function withLotManifest(html: string, code: string | null, fromTag: boolean): string {
  if (!code) return html;
  const query = `lot=${code}${fromTag ? '&amp;tag=1' : ''}`;
  return html.replace(/(<link rel="manifest" href="\/lot\.webmanifest)(")/, `$1?${query}$2`);
}

function serveLotManifest(webDist: string) {
  return (req: Request, res: Response, next: NextFunction) => {
    const file = join(webDist, 'lot.webmanifest');
    if (req.method !== 'GET' && req.method !== 'HEAD') return next();
    const code = typeof req.query.lot === 'string' ? publicLotCode(`/l/${req.query.lot}`) : null;
    if (!code || !existsSync(file)) return next();
    const under = req.query.tag === '1' ? '/L/' : '/l/';
    const manifest = JSON.parse(readFileSync(file, 'utf8')) as Record<string, unknown>;
    res.setHeader('Cache-Control', 'no-cache');
    res.type('application/manifest+json');
    res.send(
      JSON.stringify({ ...manifest, id: `${under}${code}`, start_url: `${under}${code}`, scope: under }),
    );
  };
}

/** Paths the server answers itself (the API, the development pages, the verifier page), never the web app. */
function isServerPath(path: string): boolean {
  return (
    path.startsWith('/api/') ||
    path === '/api' ||
    path.startsWith('/dev/') ||
    path === '/verify' ||
    path === '/verify/download'
  );
}

/**
 * The service workers and web app manifests keep their names from one release to the next:
 * the browser must ask again each time (never immutable, never an hour old), or a phone would
 * keep an old worker and its old files.
 */
function offlineAppHeaders(res: ServerResponse, path: string): void {
  const name = basename(path).replace(/\.(br|gz)$/, '');
  if (/^(app|lot)-sw\.js$/.test(name)) res.setHeader('Cache-Control', 'no-cache');
  else if (name.endsWith('.webmanifest')) {
    res.setHeader('Cache-Control', 'no-cache');
    res.setHeader('Content-Type', 'application/manifest+json; charset=utf-8');
  }
}

/** The public page with the log's verifier key written into its `beadroll-log-key` meta element. */
function withLogKey(html: string, logKey: string): string {
  const safe = logKey.replace(/[^A-Za-z0-9./:+=_-]/g, '');
  return html.replace(/(<meta name="beadroll-log-key" content=")[^"]*(")/, `$1${safe}$2`);
}

/**
 * Serves the built web app; unknown non-API paths fall back to the right HTML entry. The build
 * writes a brotli (`.br`) and a gzip (`.gz`) copy beside each compressible file; the one the
 * browser accepts is sent with its Content-Encoding and `Vary: Accept-Encoding`. Files under
 * /assets have a content hash in their names, so they never change: cached as immutable. The
 * public lot page carries the log's verifier key built in, so it can check checkpoints with it,
 * and a listed lot's page carries that lot's public data (`withLotData`).
 */
function serveWeb(
  app: NestExpressApplication,
  webDist: string,
  logKey: string,
  withLotData: ReturnType<typeof publicLotPage>,
): void {
  const appHtml = join(webDist, 'index.html');
  const publicHtml = join(webDist, 'public.html');
  if (!existsSync(appHtml)) return;
  const precompressed = { enableBrotli: true, orderPreference: ['br', 'gzip'], index: false };
  const sendPage = publicPageSender();
  app.use(
    '/assets',
    expressStaticGzip(join(webDist, 'assets'), {
      ...precompressed,
      serveStatic: { immutable: true, maxAge: '365d', index: false },
    }),
  );
  // API and development paths never name a file: skip the file lookup for them.
  const files = expressStaticGzip(webDist, {
    ...precompressed,
    serveStatic: { index: false, maxAge: '1h', setHeaders: offlineAppHeaders },
  });
  app.use('/lot.webmanifest', serveLotManifest(webDist));
  app.use((req: Request, res: Response, next: NextFunction) =>
    isServerPath(req.path) ? next() : files(req, res, next),
  );
  app.use((req: Request, res: Response, next: NextFunction) => {
    if (req.method !== 'GET' && req.method !== 'HEAD') return next();
    if (isServerPath(req.path)) return next();
    const isPublic = /^\/[lL]\//.test(req.path) && existsSync(publicHtml);
    res.setHeader('Cache-Control', 'no-cache');
    if (!isPublic) return res.sendFile(appHtml); // under 1 KB: compression gains nothing
    const code = publicLotCode(req.path);
    const html = withLotManifest(
      withLogKey(readFileSync(publicHtml, 'utf8'), logKey),
      code,
      req.path.startsWith('/L/'),
    );
    const send = (page: string | null) => {
      if (page === null) preloadPublicLot(code, res);
      if (!sendPage(req.headers['accept-encoding'], res, page ?? html)) res.type('html').send(page ?? html);
    };
    if (!code) return send(null);
    withLotData(html, req.path, code, req.headers.cookie !== undefined).then(send, next);
  });
}
