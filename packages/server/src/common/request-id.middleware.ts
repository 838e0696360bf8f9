import { randomUUID } from 'node:crypto';
import { Injectable, Logger, type NestMiddleware } from '@nestjs/common';
import type { NextFunction, Request, Response } from 'express';

const REQUEST_ID = Symbol('requestId');

/** The id given to a request by RequestIdMiddleware (or "-" before it ran). */
export function requestIdOf(req: Request): string {
  return (req as unknown as Record<symbol, string>)[REQUEST_ID] ?? '-';
}

/**
 * Gives every request an id (echoed as X-Request-Id) and logs one line per request.
 * Logs carry the path only: query strings can hold one-time tokens.
 */
@Injectable()
export class RequestIdMiddleware implements NestMiddleware {
  private readonly logger = new Logger('http');

  use(req: Request, res: Response, next: NextFunction): void {
    const id = randomUUID();
    (req as unknown as Record<symbol, string>)[REQUEST_ID] = id;
    res.setHeader('X-Request-Id', id);
    const started = process.hrtime.bigint();
    res.on('finish', () => {
      const ms = Number(process.hrtime.bigint() - started) / 1e6;
      const path = (req.originalUrl ?? req.url).split('?')[0];
      this.logger.log(`${id} ${req.method} ${path} ${res.statusCode} ${ms.toFixed(1)}ms`);
    });
    next();
  }
}
