import type { IncomingMessage, Server, ServerResponse } from 'node:http';
import { brotliCompressSync, constants as zlib, gzipSync } from 'node:zlib';
import type { INestApplicationContext } from '@nestjs/common';
import type { Request, RequestHandler, Response } from 'express';
import { tagRequest } from '../common/request-id.middleware';
import { PublicLotsService, READ_FROM_HEADER, type PublicLotAnswer } from './public-lots.service';

/** `GET /api/public/lots/{code}` in its plain form: a code of letters and digits, no query. */
const PLAIN_LOT_URL = /^\/api\/public\/lots\/([0-9A-Za-z]{1,32})$/;

/** Answers below this many bytes go out uncompressed (as the compression middleware's threshold). */
const COMPRESS_FROM = 1024;

export type Encoding = 'br' | 'gzip' | 'identity';

/**
 * The encoding to send: brotli, else gzip, when the request accepts it (RFC 9110 §12.5.3,
 * a q-value of 0 refuses), the order the compression middleware prefers.
 */
export function chosenEncoding(acceptEncoding: string | undefined): Encoding {
  if (!acceptEncoding) return 'identity';
  const q = new Map<string, number>();
  for (const part of acceptEncoding.split(',')) {
    const [name, ...params] = part.trim().toLowerCase().split(';');
    const qp = params.map((p) => p.trim()).find((p) => p.startsWith('q='));
    const value = qp === undefined ? 1 : Number(qp.slice(2));
    if (name) q.set(name, Number.isFinite(value) ? value : 0);
  }
  const accepts = (e: string) => (q.get(e) ?? q.get('*') ?? 0) > 0;
  if (accepts('br')) return 'br';
  if (accepts('gzip')) return 'gzip';
  return 'identity';
}

/** Whether a conditional GET's validators match `etag` (weak comparison, as express judges it). */
function notModified(req: IncomingMessage, etag: string): boolean {
  const match = req.headers['if-none-match'];
  if (!match) return false;
  if (/(?:^|,)\s*no-cache\s*(?:,|$)/.test(req.headers['cache-control'] ?? '')) return false;
  if (match.trim() === '*') return true;
  const bare = etag.replace(/^W\//, '');
  return match.split(',').some((m) => m.trim().replace(/^W\//, '') === bare);
}

/** The body of `answer` in `encoding`, compressed once per answer and kept beside it. */
function bodyIn(answer: PublicLotAnswer, encoding: Encoding): Buffer {
  let body = answer.copies[encoding];
  if (!body) {
    const raw = Buffer.from(answer.text, 'utf8');
    body =
      encoding === 'br'
        ? brotliCompressSync(raw, {
            params: { [zlib.BROTLI_PARAM_QUALITY]: 4, [zlib.BROTLI_PARAM_SIZE_HINT]: raw.length },
          })
        : encoding === 'gzip'
          ? gzipSync(raw)
          : raw;
    answer.copies[encoding] = body;
  }
  return body;
}

/** The headers a middleware sets on every answer (helmet's security headers), in its order. */
function fixedHeaders(middleware: RequestHandler): Array<[string, string]> {
  const headers = new Map<string, string>();
  const res = {
    setHeader: (name: string, value: unknown) => headers.set(name, String(value)),
    removeHeader: (name: string) => headers.delete(name),
    getHeader: (name: string) => headers.get(name),
  };
  middleware({ headers: {}, method: 'GET', url: '/' } as Request, res as unknown as Response, () => {});
  return [...headers];
}

/**
 * The public lot data (PublicLotsController.lot) answered ahead of express, because a buyer's
 * phone at a fair asks for nothing more often and the middleware chain costs more than the
 * answer itself. Only an anonymous plain GET of a listed lot is answered here, with the same
 * service, instance name, security headers, request id, log line, ETag (and 304), body and
 * compression as express and the controller give, the compressed copies made once per answer;
 * anything else (a cookie, HEAD, a query, an unusual spelling, a code that is not a listed lot, a
 * failure) goes on to express untouched, which answers it as it always does: so the bare 404 and
 * every error body come from one place.
 */
export function installPublicLotFastPath(
  server: Server,
  app: INestApplicationContext,
  instanceName: string,
  securityHeaders: RequestHandler,
): void {
  const lots = app.get(PublicLotsService, { strict: false });
  const security = fixedHeaders(securityHeaders);
  const others = server.listeners('request') as Array<(req: IncomingMessage, res: ServerResponse) => void>;
  const express = others[0];
  if (others.length !== 1 || !express) throw new Error('the HTTP server has no single request handler');
  server.removeAllListeners('request');
  server.on('request', (req: IncomingMessage, res: ServerResponse) => {
    if (req.method !== 'GET' || req.headers.cookie !== undefined) return express(req, res);
    const code = PLAIN_LOT_URL.exec(req.url ?? '')?.[1];
    if (code === undefined) return express(req, res);
    const started = process.hrtime.bigint();
    lots.lotRead(code).then(
      ({ answer, from }) => {
        res.setHeader('Beadroll-Instance', instanceName);
        for (const [name, value] of security) res.setHeader(name, value);
        tagRequest(req as Request, res as Response, started);
        res.setHeader('Content-Type', 'application/json; charset=utf-8');
        res.setHeader(READ_FROM_HEADER, from);
        res.setHeader('ETag', answer.etag);
        if (notModified(req, answer.etag)) {
          res.statusCode = 304;
          res.removeHeader('Content-Type');
          res.end();
          return;
        }
        const encoding =
          Buffer.byteLength(answer.text) < COMPRESS_FROM
            ? 'identity'
            : chosenEncoding(req.headers['accept-encoding']);
        const body = bodyIn(answer, encoding);
        res.setHeader('Content-Length', body.length);
        res.setHeader('Vary', 'Accept-Encoding');
        if (encoding !== 'identity') res.setHeader('Content-Encoding', encoding);
        res.end(body);
      },
      () => express(req, res),
    );
  });
}
