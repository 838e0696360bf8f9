import { randomUUID } from 'node:crypto';
import { Injectable, Logger, type NestMiddleware } from '@nestjs/common';
import type { NextFunction, Request, Response } from 'express';

const REQUEST_ID = Symbol('requestId');
const logger = new Logger('http');

/** The id given to a request by RequestIdMiddleware (or "-" before it ran). */
export function requestIdOf(req: Request): string {
  return (req as unknown as Record<symbol, string>)[REQUEST_ID] ?? '-';
}

/**
 * Gives a request its id (echoed as X-Request-Id) and logs one line when its answer is sent,
 * timed from `started` (process.hrtime.bigint()). Logs carry the path only: query strings can
 * hold one-time tokens.
 */
export function tagRequest(req: Request, res: Response, started = process.hrtime.bigint()): void {
  const id = randomUUID();
  (req as unknown as Record<symbol, string>)[REQUEST_ID] = id;
  res.setHeader('X-Request-Id', id);
  res.on('finish', () => {
    const ms = Number(process.hrtime.bigint() - started) / 1e6;
    const url = req.originalUrl ?? req.url;
    const query = url.indexOf('?');
    const path = query < 0 ? url : url.slice(0, query);
    // A load balancer asks for the health report every second or so: log only when it is not 200.
    if (path === '/api/health' && res.statusCode === 200) return;
    logger.log(`${id} ${req.method} ${path} ${res.statusCode} ${ms.toFixed(1)}ms`);
  });
}

/** Gives every request an id and a log line (see {@link tagRequest}). */
@Injectable()
export class RequestIdMiddleware implements NestMiddleware {
  use(req: Request, res: Response, next: NextFunction): void {
    tagRequest(req, res);
    next();
  }
}
