import { createHash } from 'node:crypto';
import { Readable } from 'node:stream';
import {
  type CallHandler,
  type ExecutionContext,
  HttpException,
  Injectable,
  type NestInterceptor,
} from '@nestjs/common';
import { catchError, type Observable, throwError } from 'rxjs';
import { AppError } from '../common/app-error';
import type { BlobStore } from '../storage/blob-store';

/** The largest applicant document accepted: 10 MiB. */
export const APPLICANT_DOCUMENT_MAX_BYTES = 10 * 1024 * 1024;

/** The document as multer hands it over (held in memory: it is small). */
export interface UploadedDocument {
  originalname: string;
  size: number;
  buffer: Buffer;
}

/** The stored document: what the account records. */
export interface StoredDocument {
  sha256: string;
  type: string;
  size: number;
  name: string;
}

// Each type by the first bytes of its file, never by the name or the type the browser claims.
const SIGNATURES: Array<{ type: string; magic: number[] }> = [
  { type: 'application/pdf', magic: [0x25, 0x50, 0x44, 0x46, 0x2d] }, // "%PDF-"
  { type: 'image/jpeg', magic: [0xff, 0xd8, 0xff] },
  { type: 'image/png', magic: [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a] },
];

const TOO_LARGE = `is too large: send a PDF, JPEG or PNG file of at most ${APPLICANT_DOCUMENT_MAX_BYTES / 1024 / 1024} MB`;

/** The media type of a PDF, JPEG or PNG file by its first bytes, or null. */
export function documentType(bytes: Buffer): string | null {
  for (const s of SIGNATURES) if (s.magic.every((b, i) => bytes[i] === b)) return s.type;
  return null;
}

/**
 * Checks an applicant's document: refuses anything but a PDF, JPEG or PNG file of 1 byte to
 * {@link APPLICANT_DOCUMENT_MAX_BYTES} with a 400 naming `document`, and gives what the account
 * records of it (its SHA-256 computed here, before anything is stored).
 */
export function checkApplicantDocument(file: UploadedDocument): StoredDocument {
  if (file.size === 0)
    throw AppError.validation([{ field: 'document', reason: 'is empty: send a PDF, JPEG or PNG file' }]);
  if (file.size > APPLICANT_DOCUMENT_MAX_BYTES)
    throw AppError.validation([{ field: 'document', reason: TOO_LARGE }]);
  const type = documentType(file.buffer);
  if (!type)
    throw AppError.validation([
      {
        field: 'document',
        reason: 'must be a PDF, JPEG or PNG file (a scan or photo of your trade document)',
      },
    ]);
  // Control characters and slashes become "_": the name is shown, never used as a path.
  const name =
    [...file.originalname]
      .map((c) => (c < ' ' || c === '\u007f' || c === '/' || c === '\\' ? '_' : c))
      .join('')
      .slice(0, 200) || 'document';
  const sha256 = createHash('sha256').update(file.buffer).digest('hex');
  return { sha256, type, size: file.buffer.length, name };
}

/**
 * Stores a checked document by its SHA-256. The caller holds the name's shared blob lock in the
 * transaction that records the account, so a deletion of the same bytes (an account closing)
 * either finishes first, or waits and then finds the new account naming them.
 */
export async function storeApplicantDocument(
  store: BlobStore,
  file: UploadedDocument,
  checked: StoredDocument,
): Promise<void> {
  const put = await store.put({ stream: Readable.from(file.buffer) });
  if (put.sha256 !== checked.sha256)
    throw new AppError('internal', 'the document changed while it was being stored');
}

/** Multer's limits for the sign-up form: one file, a little over the limit so the check above speaks. */
export const SIGN_UP_UPLOAD = {
  limits: { fileSize: APPLICANT_DOCUMENT_MAX_BYTES + 1, files: 1, fields: 20, fieldSize: 10_000 },
};

/** Turns multer's refusals on the sign-up form into a 400 naming the field, as for any bad input. */
@Injectable()
export class SignUpUploadInterceptor implements NestInterceptor {
  intercept(_ctx: ExecutionContext, next: CallHandler): Observable<unknown> {
    return next.handle().pipe(
      catchError((err: unknown) => {
        if (!(err instanceof HttpException) || err instanceof AppError) return throwError(() => err);
        const message = String((err.getResponse() as { message?: unknown })?.message ?? err.message);
        if (/too large/i.test(message))
          return throwError(() => AppError.validation([{ field: 'document', reason: TOO_LARGE }]));
        if (/unexpected field|too many files/i.test(message))
          return throwError(() =>
            AppError.validation([
              { field: 'document', reason: 'send at most one file, in the "document" field' },
            ]),
          );
        if (/multipart|boundary|unexpected end|too many/i.test(message))
          return throwError(() =>
            AppError.validation([{ field: 'body', reason: 'is not a complete sign-up form' }]),
          );
        return throwError(() => err);
      }),
    );
  }
}
