import { randomBytes } from 'node:crypto';
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { UserFacingError } from './proc.ts';

export const REPO = resolve(dirname(fileURLToPath(import.meta.url)), '..', '..');
export const DATA_DIR = join(REPO, '.data');

/** Reads a numeric port variable, or the fallback; a bad value is a user-facing error. */
export function portFromEnv(name: string, fallback: number): number {
  const raw = process.env[name];
  if (raw === undefined || raw === '') return fallback;
  if (!/^\d+$/.test(raw) || Number(raw) < 1 || Number(raw) > 65535) {
    throw new UserFacingError(`${name} must be a port number between 1 and 65535, got "${raw}"`);
  }
  return Number(raw);
}

/** The JWT signing secret (256 bits), generated on first start into the data folder. */
export function ensureJwtSecret(dataDir: string): string {
  const file = join(dataDir, 'secrets', 'jwt.key');
  if (!existsSync(file) || readFileSync(file, 'utf8').trim().length < 64) {
    mkdirSync(dirname(file), { recursive: true, mode: 0o700 });
    writeFileSync(file, randomBytes(32).toString('hex'), { mode: 0o600 });
  }
  return file;
}

/** What the demo loader reports for the start banner. */
export interface DemoReport {
  signIns: { role: string; name: string; email: string; password: string }[];
  publicLots: { code: string; why: string }[];
}

export function readDemoReport(dataDir: string): DemoReport | undefined {
  const file = join(dataDir, 'demo-report.json');
  return existsSync(file) ? (JSON.parse(readFileSync(file, 'utf8')) as DemoReport) : undefined;
}
