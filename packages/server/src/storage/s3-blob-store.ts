import { createReadStream } from 'node:fs';
import { rm } from 'node:fs/promises';
import type { Readable } from 'node:stream';
import {
  DeleteObjectCommand,
  DeleteObjectsCommand,
  GetObjectCommand,
  HeadObjectCommand,
  ListObjectVersionsCommand,
  PutObjectCommand,
  S3Client,
  type S3ClientConfig,
} from '@aws-sdk/client-s3';
import {
  assertBlobName,
  BlobNotFoundError,
  type BlobSource,
  type BlobStore,
  type PutResult,
} from './blob-store';
import { freshFileIn, hashFile, spoolToFile } from './hashing';

export interface S3BlobStoreOptions {
  bucket: string;
  endpoint?: string;
  region: string;
  accessKeyId?: string;
  secretAccessKey?: string;
  forcePathStyle: boolean;
  /** Folder for spooling streamed input before upload (its hash names the object). */
  spoolDir: string;
}

/** A store without object versions (or a fake one) refuses the versions listing. */
function isNoVersioning(err: unknown): boolean {
  const e = err as { name?: string; $metadata?: { httpStatusCode?: number } };
  return (
    ['MethodNotAllowed', 'NotImplemented'].includes(e?.name ?? '') || e?.$metadata?.httpStatusCode === 501
  );
}

function isNotFound(err: unknown): boolean {
  const e = err as { name?: string; $metadata?: { httpStatusCode?: number } };
  return e?.name === 'NotFound' || e?.name === 'NoSuchKey' || e?.$metadata?.httpStatusCode === 404;
}

/** Blobs as objects `exhibits/<sha256>` in one S3 bucket. */
export class S3BlobStore implements BlobStore {
  readonly client: S3Client;
  private readonly bucket: string;

  constructor(private readonly options: S3BlobStoreOptions) {
    const config: S3ClientConfig = {
      region: options.region,
      forcePathStyle: options.forcePathStyle,
      // The SHA-256 we send is the integrity check; no extra streamed checksum trailers.
      requestChecksumCalculation: 'WHEN_REQUIRED',
      responseChecksumValidation: 'WHEN_REQUIRED',
    };
    if (options.endpoint) config.endpoint = options.endpoint;
    if (options.accessKeyId && options.secretAccessKey)
      config.credentials = { accessKeyId: options.accessKeyId, secretAccessKey: options.secretAccessKey };
    this.client = new S3Client(config);
    this.bucket = options.bucket;
  }

  private keyOf(sha256: string): string {
    assertBlobName(sha256);
    return `exhibits/${sha256}`;
  }

  async put(source: BlobSource): Promise<PutResult> {
    let path: string;
    let spooled: string | undefined;
    let digest: { sha256: string; size: number };
    if ('path' in source) {
      path = source.path;
      digest = await hashFile(path);
    } else {
      spooled = path = await freshFileIn(this.options.spoolDir);
      digest = await spoolToFile(source.stream, path);
    }
    try {
      if (await this.exists(digest.sha256)) return { ...digest, created: false };
      await this.client.send(
        new PutObjectCommand({
          Bucket: this.bucket,
          Key: this.keyOf(digest.sha256),
          Body: createReadStream(path),
          ContentLength: digest.size,
          ContentType: 'application/octet-stream',
          ChecksumSHA256: Buffer.from(digest.sha256, 'hex').toString('base64'),
        }),
      );
      return { ...digest, created: true };
    } finally {
      if (spooled) await rm(spooled, { force: true });
    }
  }

  async get(sha256: string): Promise<Readable> {
    try {
      const out = await this.client.send(
        new GetObjectCommand({ Bucket: this.bucket, Key: this.keyOf(sha256) }),
      );
      return out.Body as Readable;
    } catch (err) {
      if (isNotFound(err)) throw new BlobNotFoundError(sha256);
      throw err;
    }
  }

  async exists(sha256: string): Promise<boolean> {
    try {
      await this.client.send(new HeadObjectCommand({ Bucket: this.bucket, Key: this.keyOf(sha256) }));
      return true;
    } catch (err) {
      if (isNotFound(err)) return false;
      throw err;
    }
  }

  async delete(sha256: string): Promise<void> {
    const key = this.keyOf(sha256);
    // The plain delete removes the object on an unversioned bucket; on a versioned one it adds a
    // delete marker, which the version sweep below removes along with every older version.
    await this.client.send(new DeleteObjectCommand({ Bucket: this.bucket, Key: key }));
    let keyMarker: string | undefined;
    let versionIdMarker: string | undefined;
    for (;;) {
      const page = await this.client
        .send(
          new ListObjectVersionsCommand({
            Bucket: this.bucket,
            Prefix: key,
            KeyMarker: keyMarker,
            VersionIdMarker: versionIdMarker,
          }),
        )
        .catch((err: unknown) => {
          if (isNoVersioning(err)) return undefined;
          throw err;
        });
      if (!page) break;
      const ids = [...(page.Versions ?? []), ...(page.DeleteMarkers ?? [])]
        .filter((v) => v.Key === key && v.VersionId && v.VersionId !== 'null')
        .map((v) => ({ Key: key, VersionId: v.VersionId }));
      if (ids.length > 0)
        await this.client.send(
          new DeleteObjectsCommand({ Bucket: this.bucket, Delete: { Objects: ids, Quiet: true } }),
        );
      if (!page.IsTruncated) break;
      keyMarker = page.NextKeyMarker;
      versionIdMarker = page.NextVersionIdMarker;
    }
  }
}
