import { createHash } from 'node:crypto';
import { createReadStream } from 'node:fs';
import {
  type CallHandler,
  type ExecutionContext,
  Injectable,
  type NestInterceptor,
  SetMetadata,
} from '@nestjs/common';
import { HTTP_CODE_METADATA } from '@nestjs/common/constants';
import { Reflector } from '@nestjs/core';
import type { Request, Response } from 'express';
import { from, lastValueFrom, type Observable } from 'rxjs';
import { DataSource } from 'typeorm';
import type { Principal } from '../auth/auth.decorators';
import { AppError } from '../common/app-error';
import { RequestTransaction } from './request-transaction';

export const IDEMPOTENCY_HEADER = 'Idempotency-Key';
const NO_REPLAY = 'beadroll:no-replay';
const HANDLED = Symbol('beadroll.idempotency');
const KEY = /^[\x21-\x7e]{1,255}$/;

/**
 * The route accepts an idempotency key but never answers from a stored copy: its answer sets
 * cookies or is a file, and repeating it writes nothing a second time anyway (signing in
 * again opens another session; a tag sheet is only printed).
 */
export const NoReplay = () => SetMetadata(NO_REPLAY, true);

async function fileDigest(path: string): Promise<string> {
  const hash = createHash('sha256');
  for await (const chunk of createReadStream(path)) hash.update(chunk as Buffer);
  return hash.digest('hex');
}

/** SHA-256 of what makes two requests the same request: method, path and query, body, uploaded file. */
async function requestDigest(req: Request): Promise<string> {
  // An exhibit upload's storage has taken the file's SHA-256 as it was written: not read again.
  const file = (req as Request & { file?: { path?: string; sha256?: string } }).file;
  const parts = [
    req.method,
    req.originalUrl,
    req.body ?? null,
    file?.sha256 ?? (file?.path ? await fileDigest(file.path) : null),
  ];
  return createHash('sha256').update(JSON.stringify(parts)).digest('hex');
}

function refusal(reason: string): AppError {
  return AppError.validation([{ field: IDEMPOTENCY_HEADER, reason }]);
}

/**
 * Idempotent writes. A write that carries an `Idempotency-Key` header runs in one transaction
 * that begins by claiming the key for the account (`idempotency_keys`, a row keyed by account
 * and key) and ends by storing the answer in that row: the key, the digest of the request and
 * the answer commit together with the write, or none of them does. A repeat of the same request
 * with the same key is answered from the row (marked `Idempotent-Replayed: true`) and runs
 * nothing; the same key with another request is a 422; a repeat sent while the first is still
 * running waits for it (the claim's row lock) and then gets its answer. A refused request
 * stores nothing, so its repeat is decided afresh. Keys are forgotten after 24 hours.
 *
 * Global for JSON requests; a multipart upload lists it again after its file interceptor, so
 * the digest covers the file's bytes.
 */
@Injectable()
export class IdempotencyInterceptor implements NestInterceptor {
  constructor(
    private readonly dataSource: DataSource,
    private readonly reflector: Reflector,
  ) {}

  intercept(ctx: ExecutionContext, next: CallHandler): Observable<unknown> {
    if (ctx.getType() !== 'http') return next.handle();
    const req = ctx.switchToHttp().getRequest<Request & { [HANDLED]?: true; file?: unknown }>();
    const raw = req.headers['idempotency-key'];
    if (raw === undefined || req.method === 'GET' || req.method === 'HEAD' || req[HANDLED])
      return next.handle();
    if (typeof raw !== 'string' || !KEY.test(raw))
      throw refusal('must be 1 to 255 visible characters (letters, digits, punctuation), sent once');
    // A multipart body is read by the route's own file interceptor: wait for it there.
    if (req.is('multipart/form-data') && req.file === undefined) return next.handle();
    req[HANDLED] = true;
    if (this.reflector.getAllAndOverride<boolean>(NO_REPLAY, [ctx.getHandler(), ctx.getClass()]))
      return next.handle();
    const status =
      (Reflect.getMetadata(HTTP_CODE_METADATA, ctx.getHandler()) as number | undefined) ??
      (req.method === 'POST' ? 201 : 200);
    const res = ctx.switchToHttp().getResponse<Response>();
    return from(this.once(req, res, raw, status, next));
  }

  private async once(
    req: Request,
    res: Response,
    key: string,
    status: number,
    next: CallHandler,
  ): Promise<unknown> {
    const account = (req as Request & { account?: Principal }).account?.id ?? '';
    const digest = await requestDigest(req);
    const tx = await RequestTransaction.begin(this.dataSource);
    try {
      await tx.query(
        `DELETE FROM "idempotency_keys" WHERE "account" = $1 AND "key" = $2 AND "created_at" < now() - interval '24 hours'`,
        [account, key],
      );
      // Waits while another request holding this key is still running, then finds its row.
      const claimed: unknown[] = await tx.query(
        `INSERT INTO "idempotency_keys" ("account", "key", "request_digest", "status") VALUES ($1, $2, $3, 102)
         ON CONFLICT ON CONSTRAINT "pk_idempotency_keys" DO NOTHING RETURNING 1`,
        [account, key, digest],
      );
      if (claimed.length === 0) {
        await tx.rollback();
        return await this.replay(res, account, key, digest);
      }
      const body: unknown = await tx.run(() => lastValueFrom(next.handle(), { defaultValue: undefined }));
      await tx.query(
        `UPDATE "idempotency_keys" SET "status" = $3, "body" = $4 WHERE "account" = $1 AND "key" = $2`,
        [account, key, status, body === undefined ? null : JSON.stringify(body)],
      );
      await tx.commit();
      return body;
    } catch (err) {
      await tx.rollback();
      throw err;
    }
  }

  private async replay(res: Response, account: string, key: string, digest: string): Promise<unknown> {
    const rows: Array<{ request_digest: string; status: number; body: string | null }> =
      await this.dataSource.query(
        `SELECT "request_digest", "status", "body" FROM "idempotency_keys" WHERE "account" = $1 AND "key" = $2`,
        [account, key],
      );
    const row = rows[0];
    // Swept between the claim and this look: nothing to answer from; the client may send it again.
    if (!row) throw new AppError('conflict', 'That request is being handled; send it again in a moment.');
    if (row.request_digest !== digest)
      throw new AppError(
        'idempotency_key_reused',
        'This idempotency key was already used for a different request; send the new request with a new key.',
      );
    res.setHeader('Idempotent-Replayed', 'true');
    res.status(row.status);
    return row.body === null ? undefined : JSON.parse(row.body);
  }
}
