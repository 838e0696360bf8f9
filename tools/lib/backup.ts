// Backup and restore of a Beadroll registry: the database (pg_dump's custom format) and every
// exhibit file the database names, with a manifest of SHA-256 digests of everything written.
import { createHash } from 'node:crypto';
import {
  createReadStream,
  existsSync,
  mkdirSync,
  readdirSync,
  readFileSync,
  statSync,
  writeFileSync,
} from 'node:fs';
import { join, resolve } from 'node:path';
import pg from 'pg';
import { REPO } from './app-env.ts';
import { ensurePgBinaries } from './pg.ts';
import { run, runInherit, UserFacingError } from './proc.ts';

export const MANIFEST = 'manifest.json';
const FORMAT = 'beadroll-backup/1';
const SERVER_DIST = join(REPO, 'packages', 'server', 'dist');

export interface ManifestFile {
  /** Path inside the backup folder. */
  path: string;
  sha256: string;
  bytes: number;
}

export interface Manifest {
  format: typeof FORMAT;
  createdAt: string;
  database: ManifestFile & { migrations: string[]; counts: Record<string, number> };
  exhibits: { driver: string; files: ManifestFile[] };
}

async function sha256File(path: string): Promise<string> {
  const hash = createHash('sha256');
  for await (const chunk of createReadStream(path)) hash.update(chunk as Buffer);
  return hash.digest('hex');
}

async function describe(dir: string, path: string): Promise<ManifestFile> {
  const full = join(dir, path);
  return { path, sha256: await sha256File(full), bytes: statSync(full).size };
}

function client(env: NodeJS.ProcessEnv): pg.Client {
  return new pg.Client({
    host: env.PGHOST,
    port: Number(env.PGPORT),
    user: env.PGUSER,
    password: env.PGPASSWORD,
    database: env.PGDATABASE,
  });
}

async function query<T>(env: NodeJS.ProcessEnv, sql: string): Promise<T[]> {
  const c = client(env);
  await c.connect();
  try {
    return (await c.query(sql)).rows as T[];
  } finally {
    await c.end();
  }
}

function pgArgs(env: NodeJS.ProcessEnv): string[] {
  return ['-h', env.PGHOST!, '-p', String(env.PGPORT), '-U', env.PGUSER!, '-d', env.PGDATABASE!];
}

/** Runs one of the server's command-line programs (built JavaScript) and returns its JSON line. */
async function serverCli(
  env: NodeJS.ProcessEnv,
  script: string,
  args: string[],
): Promise<{ code: number; out: string }> {
  const { spawnSync } = await import('node:child_process');
  const r = spawnSync('node', [join(SERVER_DIST, script), ...args], { cwd: REPO, env, encoding: 'utf8' });
  if (r.error) throw r.error;
  if (r.status === 2) throw new UserFacingError(`${script} could not run: ${(r.stderr || r.stdout).trim()}`);
  return { code: r.status ?? 1, out: (r.stdout ?? '').trim() };
}

/** Makes sure the server's built programs exist (the backup and restore use its exhibit store). */
export async function buildServer(): Promise<void> {
  for (const ws of ['@beadroll/core', '@beadroll/server'])
    if ((await runInherit('npm', ['run', '--silent', 'build', '-w', ws], { cwd: REPO })) !== 0)
      throw new UserFacingError('the build failed (see above).');
}

/**
 * Writes a backup of the database `env` names (PG*) and of the exhibit store its configuration
 * names (STORAGE_DRIVER, STORAGE_DIR or S3_*) into `dir`, which must be empty or absent.
 */
export async function backup(dir: string, env: NodeJS.ProcessEnv, log = console.log): Promise<Manifest> {
  dir = resolve(dir);
  if (existsSync(dir) && readdirSync(dir).length > 0)
    throw new UserFacingError(`${dir} is not empty: give a new or empty folder for the backup.`);
  mkdirSync(join(dir, 'exhibits'), { recursive: true });
  const bin = ensurePgBinaries();
  log('dumping the database…');
  run(
    join(bin, 'pg_dump'),
    [...pgArgs(env), '-Fc', '--no-owner', '--no-privileges', '-f', join(dir, 'database.dump')],
    {
      quiet: true,
      env,
    },
  );
  const migrations = (
    await query<{ name: string }>(env, 'SELECT "name" FROM "migrations" ORDER BY "id"')
  ).map((r) => r.name);
  const counts: Record<string, number> = {};
  for (const table of ['lots', 'entries', 'exhibits', 'accounts'])
    counts[table] = (await query<{ n: number }>(env, `SELECT count(*)::int AS n FROM "${table}"`))[0]!.n;
  log('copying the exhibit files…');
  const exported = await serverCli(env, 'cli/exhibit-store.js', ['export', join(dir, 'exhibits')]);
  const result = JSON.parse(exported.out || '{}') as { files?: number; missing?: string[] };
  if (exported.code !== 0)
    throw new UserFacingError(
      `the exhibit store is missing ${result.missing?.length ?? '?'} file(s) the database names: ${(result.missing ?? []).slice(0, 3).join(', ')}`,
    );
  const files: ManifestFile[] = [];
  for (const name of readdirSync(join(dir, 'exhibits')).sort()) {
    const f = await describe(dir, join('exhibits', name));
    if (f.sha256 !== name) throw new UserFacingError(`the stored exhibit ${name} does not match its digest`);
    files.push(f);
  }
  const manifest: Manifest = {
    format: FORMAT,
    createdAt: new Date().toISOString(),
    database: { ...(await describe(dir, 'database.dump')), migrations, counts },
    exhibits: { driver: env.STORAGE_DRIVER ?? 'fs', files },
  };
  writeFileSync(join(dir, MANIFEST), `${JSON.stringify(manifest, null, 2)}\n`);
  log(
    `backup written to ${dir}: ${counts.lots} lots, ${counts.entries} entries, ${files.length} exhibit files`,
  );
  return manifest;
}

/** Reads the manifest and checks every file in the backup against its digest; throws on any difference. */
export async function checkBackup(dir: string): Promise<Manifest> {
  const path = join(dir, MANIFEST);
  if (!existsSync(path)) throw new UserFacingError(`${dir} holds no ${MANIFEST}: not a Beadroll backup.`);
  const manifest = JSON.parse(readFileSync(path, 'utf8')) as Manifest;
  if (manifest.format !== FORMAT)
    throw new UserFacingError(`unknown backup format ${String(manifest.format)}`);
  for (const f of [manifest.database, ...manifest.exhibits.files]) {
    const full = join(dir, f.path);
    if (!existsSync(full)) throw new UserFacingError(`the backup is missing ${f.path}`);
    if ((await sha256File(full)) !== f.sha256)
      throw new UserFacingError(`${f.path} does not match its digest in the manifest`);
  }
  return manifest;
}

export interface RestoreReport {
  lots: number;
  entries: number;
  exhibitFiles: number;
  auditOk: boolean;
  exhibitsOk: boolean;
}

/**
 * Restores a backup into the empty database `env` names and the empty exhibit store its
 * configuration names, then runs the full-ledger audit and checks every exhibit file against
 * its digest. Refuses a database that already has tables.
 */
export async function restore(
  dir: string,
  env: NodeJS.ProcessEnv,
  log = console.log,
): Promise<RestoreReport> {
  dir = resolve(dir);
  const manifest = await checkBackup(dir);
  log(`backup of ${manifest.createdAt} checked: every file matches the manifest`);
  const tables = await query<{ n: number }>(
    env,
    `SELECT count(*)::int AS n FROM pg_tables WHERE schemaname = 'public'`,
  );
  if (tables[0]!.n > 0)
    throw new UserFacingError(
      `the database ${env.PGDATABASE} is not empty: restore into a new, empty database (and exhibit folder).`,
    );
  const bin = ensurePgBinaries();
  log('restoring the database…');
  run(
    join(bin, 'pg_restore'),
    [
      ...pgArgs(env),
      '--no-owner',
      '--no-privileges',
      '--exit-on-error',
      '--single-transaction',
      join(dir, 'database.dump'),
    ],
    { quiet: true, env },
  );
  log('restoring the exhibit files…');
  const imported = await serverCli(env, 'cli/exhibit-store.js', ['import', join(dir, 'exhibits')]);
  if (imported.code !== 0) throw new UserFacingError(`the exhibit files did not restore: ${imported.out}`);
  log('auditing every roll…');
  const audit = await serverCli(env, 'audit/audit-cli.js', []);
  log(audit.code === 0 ? (audit.out.trim().split('\n').pop() ?? '') : audit.out.trim());
  const check = await serverCli(env, 'cli/exhibit-store.js', ['check']);
  const checked = JSON.parse(check.out || '{}') as { files?: number };
  const counts = await query<{ lots: number; entries: number }>(
    env,
    `SELECT (SELECT count(*)::int FROM "lots") AS lots, (SELECT count(*)::int FROM "entries") AS entries`,
  );
  const report: RestoreReport = {
    lots: counts[0]!.lots,
    entries: counts[0]!.entries,
    exhibitFiles: checked.files ?? 0,
    auditOk: audit.code === 0,
    exhibitsOk: check.code === 0,
  };
  log(
    `restored ${report.lots} lots, ${report.entries} entries, ${report.exhibitFiles} exhibit files; ` +
      `audit ${report.auditOk ? 'passed' : 'FAILED'}, exhibit digests ${report.exhibitsOk ? 'all match' : 'DO NOT MATCH'}`,
  );
  return report;
}
