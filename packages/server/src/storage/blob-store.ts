import type { Readable } from 'node:stream';

/** What a put stored (or found already stored). */
export interface PutResult {
  /** SHA-256 of the exact bytes, 64 lower-case hex digits: the blob's name. */
  sha256: string;
  size: number;
  /** False when a blob with the same bytes was already there (nothing new was written). */
  created: boolean;
}

/** Bytes to store: a file on disk (preferred: it is hashed in one pass) or a stream. */
export type BlobSource = { path: string } | { stream: Readable };

/**
 * Content-addressed blob storage: every blob is named by the SHA-256 of its bytes, so the same
 * file stored twice is kept once. Drivers: file system (default) and S3.
 */
export interface BlobStore {
  put(source: BlobSource): Promise<PutResult>;
  /** The bytes of a stored blob; rejects with BlobNotFoundError when it is absent. */
  get(sha256: string): Promise<Readable>;
  exists(sha256: string): Promise<boolean>;
  /** Removes the blob (every stored version of it where the store keeps versions). Absent is fine. */
  delete(sha256: string): Promise<void>;
}

/** Injection token of the configured BlobStore. */
export const BLOB_STORE = Symbol('BLOB_STORE');

export class BlobNotFoundError extends Error {
  constructor(readonly sha256: string) {
    super(`blob ${sha256} is not stored`);
  }
}

const HEX64 = /^[0-9a-f]{64}$/;

/** Refuses anything but a lower-case SHA-256 hex name, so a name can never become a path trick. */
export function assertBlobName(sha256: string): void {
  if (!HEX64.test(sha256)) throw new Error('blob names are 64 lower-case hex digits');
}
