import { createHash, randomBytes } from 'node:crypto';
import { createWriteStream } from 'node:fs';
import { mkdir, open } from 'node:fs/promises';
import { join } from 'node:path';
import { Transform, type Readable } from 'node:stream';
import { pipeline } from 'node:stream/promises';

/**
 * SHA-256 (hex) and size of a file, read in 256 KiB steps into one buffer: a photo is hashed
 * several times on its way into the store, and a stream's fresh 64 KiB chunks each time are
 * garbage the collector must sweep while other uploads want the CPU.
 */
export async function hashFile(path: string): Promise<{ sha256: string; size: number }> {
  const hash = createHash('sha256');
  const buf = Buffer.allocUnsafe(256 * 1024);
  const fh = await open(path, 'r');
  let size = 0;
  try {
    for (;;) {
      const { bytesRead } = await fh.read(buf, 0, buf.length, size);
      if (bytesRead === 0) break;
      hash.update(buf.subarray(0, bytesRead));
      size += bytesRead;
    }
  } finally {
    await fh.close();
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
