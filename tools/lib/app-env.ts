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

/**
 * The demo lines of a start banner: the sign-ins, and a public page for each demo story (a
 * dissent, a change of hands, a split child, a combined piece), each code once, or the first
 * listed lot when the scenario has no story.
 */
export function demoBanner(report: DemoReport, base: string): string[] {
  const lines = ['demo sign-ins (demo mode only):'];
  for (const s of report.signIns)
    lines.push(`  ${s.role.padEnd(9)} ${s.email}  password: ${s.password}  (${s.name})`);
  const stories = report.publicLots.filter((l) => !l.why.startsWith('a listed lot'));
  const shown = stories.length > 0 ? stories : report.publicLots.slice(0, 1);
  const seen = new Set<string>();
  for (const lot of shown) {
    if (seen.has(lot.code)) continue;
    seen.add(lot.code);
    lines.push(`demo public page (${lot.why}): ${base}/l/${lot.code}`);
  }
  return lines;
}

/**
 * Node's options for the command-line audit (`npm run audit`, and the scale benchmark runs it
 * the same way): a fixed heap. The audit keeps a batch of lots at a time, about 50 MB live
 * however large the ledger is; without a limit V8 lets garbage grow the heap to a few hundred
 * MB before collecting it.
 */
export const AUDIT_NODE_OPTIONS = ['--max-old-space-size=160'];
