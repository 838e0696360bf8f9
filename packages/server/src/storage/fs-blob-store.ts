import { createReadStream } from 'node:fs';
import { access, copyFile, link, mkdir, rename, rm, stat } from 'node:fs/promises';
import { join } from 'node:path';
import type { Readable } from 'node:stream';
import {
  assertBlobName,
  BlobNotFoundError,
  type BlobSource,
  type BlobStore,
  type PutResult,
} from './blob-store';
import { freshFileIn, hashFile, spoolToFile } from './hashing';

/**
 * Blobs as files under `root`, fanned out by the first two hex pairs of their name:
 * `root/ab/cd/abcd…`. Writes go to `root/tmp` first and are renamed into place, so a reader
 * never sees a half-written blob.
 */
export class FsBlobStore implements BlobStore {
  constructor(private readonly root: string) {}

  private pathOf(sha256: string): string {
    assertBlobName(sha256);
    return join(this.root, sha256.slice(0, 2), sha256.slice(2, 4), sha256);
  }

  async put(source: BlobSource): Promise<PutResult> {
    const tmp = await freshFileIn(join(this.root, 'tmp'));
    try {
      let digest: { sha256: string; size: number };
      if ('path' in source) {
        digest = await hashFile(source.path);
        if (await this.exists(digest.sha256)) return { ...digest, created: false };
        // A hard link costs nothing when the source is on the same file system.
        await link(source.path, tmp).catch(() => copyFile(source.path, tmp));
      } else {
        digest = await spoolToFile(source.stream, tmp);
        if (await this.exists(digest.sha256)) return { ...digest, created: false };
      }
      const target = this.pathOf(digest.sha256);
      await mkdir(join(target, '..'), { recursive: true });
      await rename(tmp, target);
      return { ...digest, created: true };
    } finally {
      await rm(tmp, { force: true });
    }
  }

  async get(sha256: string): Promise<Readable> {
    const path = this.pathOf(sha256);
    try {
      await access(path);
    } catch {
      throw new BlobNotFoundError(sha256);
    }
    return createReadStream(path);
  }

  async exists(sha256: string): Promise<boolean> {
    try {
      return (await stat(this.pathOf(sha256))).isFile();
    } catch {
      return false;
    }
  }

  async delete(sha256: string): Promise<void> {
    await rm(this.pathOf(sha256), { force: true });
  }
}
