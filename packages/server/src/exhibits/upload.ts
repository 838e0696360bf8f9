import { mkdirSync } from 'node:fs';
import { rm } from 'node:fs/promises';
import { join } from 'node:path';
import {
  type CallHandler,
  type ExecutionContext,
  HttpException,
  Inject,
  Injectable,
  type NestInterceptor,
} from '@nestjs/common';
import type { MulterModuleOptions } from '@nestjs/platform-express';
import type { Request, Response } from 'express';
import type { StorageEngine } from 'multer';
import { catchError, finalize, type Observable, throwError } from 'rxjs';
import { AppError } from '../common/app-error';
import type { AppConfig } from '../config/app-config';
import { APP_CONFIG } from '../config/config.module';
import { freshFileIn, spoolToFile } from '../storage/hashing';

/** Folder for uploads in flight; files there have random names and never outlive their request. */
export function uploadDir(config: AppConfig): string {
  return join(config.dataDir, 'tmp', 'uploads');
}

/** The uploaded file as the storage below leaves it: `sha256` is of the bytes as sent. */
export interface UploadedExhibitFile {
  path: string;
  size?: number;
  sha256?: string;
}

/**
 * Multer storage that writes the file to a random name in `dir` and takes its SHA-256 on the
 * way, so the bytes as sent are never read back just to hash them. A write that fails or is cut
 * off removes its partial file; multer removes finished ones when the request fails later.
 */
class HashingDiskStorage implements StorageEngine {
  constructor(private readonly dir: string) {}

  _handleFile(_req: Request, file: Express.Multer.File, cb: (error?: unknown, info?: object) => void): void {
    const spool = async (): Promise<UploadedExhibitFile> => {
      const path = await freshFileIn(this.dir);
      try {
        return { path, ...(await spoolToFile(file.stream, path)) };
      } catch (err) {
        await rm(path, { force: true });
        throw err;
      }
    };
    spool().then((info) => cb(null, info), cb);
  }

  _removeFile(_req: Request, file: Express.Multer.File, cb: (error: Error | null) => void): void {
    rm(file.path, { force: true }).then(() => cb(null), cb);
  }
}

/**
 * Multer settings: straight to a temporary file on disk (never held whole in memory) under a
 * random name (the client's file name is never used in a path), hashed as it is written, with
 * limits on every part.
 */
export function multerOptions(config: AppConfig): MulterModuleOptions {
  const dir = uploadDir(config);
  mkdirSync(dir, { recursive: true, mode: 0o700 });
  return {
    storage: new HashingDiskStorage(dir),
    limits: {
      fileSize: config.exhibits.maxFileBytes,
      files: 1,
      fields: 3,
      parts: 4,
      fieldNameSize: 20,
      fieldSize: 4000,
      headerPairs: 50,
    },
  };
}

// Multer's messages (as Nest passes them on) and the field and reason a dealer sees instead.
const MULTER_PROBLEMS: Array<[RegExp, (c: AppConfig) => { field: string; reason: string; status?: 413 }]> = [
  [
    /too large/i,
    (c) => ({ field: 'file', reason: `is over the limit of ${c.exhibits.maxFileBytes} bytes`, status: 413 }),
  ],
  [
    /too many files|unexpected field/i,
    () => ({ field: 'file', reason: 'send exactly one file, in the "file" field' }),
  ],
  [
    /too many (parts|fields)/i,
    () => ({ field: 'body', reason: 'has more fields than kind, caption and sealed' }),
  ],
  [/field name too long/i, () => ({ field: 'body', reason: 'has a field name that is too long' })],
  [/field value too long/i, () => ({ field: 'caption', reason: 'is too long' })],
  [
    /multipart|boundary|unexpected end/i,
    () => ({ field: 'body', reason: 'is not a complete multipart/form-data request' }),
  ],
];

/**
 * Wraps the file interceptor: turns multer's refusals into the usual field errors, and removes
 * the temporary file when the request ends, however it ends (multer itself removes partial
 * files when a request is aborted or goes over a limit).
 */
@Injectable()
export class UploadGuardInterceptor implements NestInterceptor {
  constructor(@Inject(APP_CONFIG) private readonly config: AppConfig) {}

  intercept(ctx: ExecutionContext, next: CallHandler): Observable<unknown> {
    const req = ctx.switchToHttp().getRequest<Request>();
    const res = ctx.switchToHttp().getResponse<Response>();
    const remove = () => {
      const path = (req as Request & { file?: { path: string } }).file?.path;
      if (path) void rm(path, { force: true });
    };
    res.once('close', remove);
    return next.handle().pipe(
      catchError((err: unknown) => {
        // The client went away mid-upload: multer has removed the partial file already.
        if (err instanceof Error && /^Request (aborted|closed)$/.test(err.message))
          return throwError(() =>
            AppError.validation([
              { field: 'file', reason: 'the upload stopped before the file was complete' },
            ]),
          );
        if (err instanceof HttpException && !(err instanceof AppError)) {
          const status = err.getStatus();
          const message = err.message;
          for (const [pattern, problem] of MULTER_PROBLEMS) {
            if (!pattern.test(message)) continue;
            const p = problem(this.config);
            const fields = [{ field: p.field, reason: p.reason }];
            return throwError(() =>
              p.status === 413
                ? new AppError('payload_too_large', 'The file is too large.', fields)
                : AppError.validation(fields),
            );
          }
          if (status === 400 || status === 413)
            return throwError(() => AppError.validation([{ field: 'body', reason: message }]));
        }
        return throwError(() => err);
      }),
      finalize(remove),
    );
  }
}
