import { randomBytes } from 'node:crypto';
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { dirname } from 'node:path';

/**
 * Reads the 32-byte Ed25519 seed the log signs checkpoints with (64 hex digits), creating it
 * (owner-only, beside the other secrets) on first start. Every instance of the service must
 * share it, as they share the session secret.
 */
export function loadLogSeed(file: string): Uint8Array {
  if (!existsSync(file)) {
    mkdirSync(dirname(file), { recursive: true, mode: 0o700 });
    try {
      writeFileSync(file, randomBytes(32).toString('hex'), { mode: 0o600, flag: 'wx' });
    } catch (e) {
      // Another process made it first: read theirs.
      if ((e as NodeJS.ErrnoException).code !== 'EEXIST') throw e;
    }
  }
  const hex = readFileSync(file, 'utf8').trim();
  if (!/^[0-9a-f]{64}$/.test(hex)) throw new Error(`the log signing key in ${file} is not 64 hex digits`);
  return Uint8Array.from(Buffer.from(hex, 'hex'));
}
