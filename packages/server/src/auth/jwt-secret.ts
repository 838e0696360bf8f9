import { randomBytes } from 'node:crypto';
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { dirname } from 'node:path';

/** The algorithm every access token is signed and checked with; nothing else is accepted. */
export const JWT_ALGORITHM = 'HS256';

/**
 * Reads the session-signing secret, creating it (256 random bits, owner-only) on first start.
 * It lives in the data folder, never in git.
 */
export function loadJwtSecret(file: string): string {
  if (!existsSync(file)) {
    mkdirSync(dirname(file), { recursive: true, mode: 0o700 });
    writeFileSync(file, randomBytes(32).toString('hex'), { mode: 0o600, flag: 'wx' });
  }
  const secret = readFileSync(file, 'utf8').trim();
  if (secret.length < 64) throw new Error(`the session secret in ${file} is shorter than 256 bits`);
  return secret;
}
