import { createHash, randomBytes } from 'node:crypto';
import { createReadStream, createWriteStream } from 'node:fs';
import { mkdir } from 'node:fs/promises';
import { join } from 'node:path';
import { Transform, type Readable } from 'node:stream';
import { pipeline } from 'node:stream/promises';

/** SHA-256 (hex) and size of a file, read as a stream. */
export async function hashFile(path: string): Promise<{ sha256: string; size: number }> {
  const hash = createHash('sha256');
  let size = 0;
  for await (const chunk of createReadStream(path)) {
    hash.update(chunk as Buffer);
    size += (chunk as Buffer).length;
  }
  return { sha256: hash.digest('hex'), size };
}

/** Copies a stream into a file while hashing it; returns the SHA-256 (hex) and size written. */
export async function spoolToFile(stream: Readable, path: string): Promise<{ sha256: string; size: number }> {
  const hash = createHash('sha256');
  let size = 0;
  const tap = new Transform({
    transform(chunk: Buffer, _enc, cb) {
      hash.update(chunk);
      size += chunk.length;
      cb(null, chunk);
    },
  });
  await pipeline(stream, tap, createWriteStream(path, { flags: 'wx', mode: 0o600 }));
  return { sha256: hash.digest('hex'), size };
}

/** A new random file name in `dir` (made if missing), for spooling or staging a blob. */
export async function freshFileIn(dir: string): Promise<string> {
  await mkdir(dir, { recursive: true });
  return join(dir, randomBytes(16).toString('hex'));
}
