import type { INestApplicationContext } from '@nestjs/common';
import type { NextFunction, Request, RequestHandler, Response } from 'express';
import { tagRequest } from '../common/request-id.middleware';
import { PublicLotsService, READ_FROM_HEADER } from './public-lots.service';

/** `GET /api/public/lots/{code}` in its plain form: a code of letters and digits, no query. */
const PLAIN_LOT_URL = /^\/api\/public\/lots\/([0-9A-Za-z]{1,32})$/;

/**
 * The public lot data (PublicLotsController.lot) answered ahead of the router, because a buyer's
 * phone at a fair asks for nothing more often. Only an anonymous plain GET of a listed lot is
 * answered here, with the same service, security headers, request id, log line, ETag and body as
 * the controller gives; anything else (a cookie, HEAD, a query, an unusual spelling, a code that
 * is not a listed lot, a failure) goes on to the controller untouched, which answers it as it
 * always does: so the bare 404 and every error body come from one place.
 */
export function publicLotFastPath(
  app: INestApplicationContext,
  securityHeaders: RequestHandler,
): RequestHandler {
  const lots = app.get(PublicLotsService, { strict: false });
  return (req: Request, res: Response, next: NextFunction): void => {
    if (req.method !== 'GET' || req.headers.cookie !== undefined) return next();
    const code = PLAIN_LOT_URL.exec(req.url)?.[1];
    if (code === undefined) return next();
    const started = process.hrtime.bigint();
    lots.lotRead(code).then(
      ({ text, from }) => {
        securityHeaders(req, res, (err?: unknown) => {
          if (err) return next(err);
          tagRequest(req, res, started);
          res.setHeader('Content-Type', 'application/json; charset=utf-8');
          res.setHeader(READ_FROM_HEADER, from);
          res.send(text);
        });
      },
      () => next(),
    );
  };
}
