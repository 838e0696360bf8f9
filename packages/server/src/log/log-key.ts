import { randomBytes } from 'node:crypto';
import { existsSync, linkSync, mkdirSync, readFileSync, unlinkSync, writeFileSync } from 'node:fs';
import { dirname } from 'node:path';

/**
 * Reads the 32-byte Ed25519 seed the log signs checkpoints with (64 hex digits), creating it
 * (owner-only, beside the other secrets) on first start. Every instance of the service must
 * share it, as they share the session secret.
 */
export function loadLogSeed(file: string): Uint8Array {
  if (!existsSync(file)) {
    mkdirSync(dirname(file), { recursive: true, mode: 0o700 });
    // Written whole beside it, then linked into place: instances starting together all read
    // the one key that got there first, never a half-written file.
    const tmp = `${file}.${process.pid}.${randomBytes(4).toString('hex')}`;
    writeFileSync(tmp, randomBytes(32).toString('hex'), { mode: 0o600, flag: 'wx' });
    try {
      linkSync(tmp, file);
    } catch (e) {
      if ((e as NodeJS.ErrnoException).code !== 'EEXIST') throw e;
    } finally {
      unlinkSync(tmp);
    }
  }
  const hex = readFileSync(file, 'utf8').trim();
  if (!/^[0-9a-f]{64}$/.test(hex)) throw new Error(`the log signing key in ${file} is not 64 hex digits`);
  return Uint8Array.from(Buffer.from(hex, 'hex'));
}
