import { randomBytes } from 'node:crypto';
import {
  chmodSync,
  chownSync,
  existsSync,
  mkdirSync,
  readdirSync,
  readFileSync,
  rmSync,
  statSync,
  writeFileSync,
} from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { aptInstall, isRoot, portInUse, run, UserFacingError } from './proc.ts';

/** How to reach a PostgreSQL database, with a superuser for setup (and tamper tests). */
export interface PgTarget {
  host: string;
  port: number;
  user: string;
  password: string;
  database: string;
  superuser?: { user: string; password: string };
}

export interface PrivateCluster {
  target: PgTarget;
  stop(): void;
}

interface Credentials {
  superuserPassword: string;
  appPassword: string;
}

function pgBin(): string | undefined {
  const root = '/usr/lib/postgresql';
  if (!existsSync(root)) return undefined;
  const versions = readdirSync(root)
    .filter((v) => existsSync(join(root, v, 'bin', 'initdb')))
    .sort((a, b) => Number(b) - Number(a));
  return versions.length ? join(root, versions[0], 'bin') : undefined;
}

/** The PostgreSQL server binaries, installed from Debian's packages when missing. */
export function ensurePgBinaries(): string {
  let bin = pgBin();
  if (!bin) {
    aptInstall(['postgresql'], 'the private PostgreSQL cluster');
    bin = pgBin();
  }
  if (!bin)
    throw new UserFacingError(
      'PostgreSQL was installed but its binaries were not found under /usr/lib/postgresql.',
    );
  return bin;
}

/** Runs a PostgreSQL program as the cluster's owner (the postgres user when we are root). */
function asOwner(cmd: string, args: string[]): string {
  return isRoot
    ? run('runuser', ['-u', 'postgres', '--', cmd, ...args], { quiet: true })
    : run(cmd, args, { quiet: true });
}

function ensurePostgresUser(): void {
  if (!isRoot) return;
  try {
    run('id', ['-u', 'postgres'], { quiet: true });
  } catch {
    run('useradd', ['--system', '--home-dir', '/var/lib/postgresql', '--shell', '/bin/bash', 'postgres'], {
      quiet: true,
    });
  }
}

function ownerIds(): { uid: number; gid: number } {
  if (!isRoot) return { uid: process.getuid!(), gid: process.getgid!() };
  return {
    uid: Number(run('id', ['-u', 'postgres'], { quiet: true }).trim()),
    gid: Number(run('id', ['-g', 'postgres'], { quiet: true }).trim()),
  };
}

/** Makes every parent folder of `dir` traversable by others (the postgres user must reach the data folder). */
function makeParentsTraversable(dir: string): void {
  if (!isRoot) return;
  let current = dirname(resolve(dir));
  while (true) {
    const mode = statSync(current).mode;
    if ((mode & 0o001) === 0) chmodSync(current, mode | 0o001);
    const parent = dirname(current);
    if (parent === current) break;
    current = parent;
  }
}

function chownTree(path: string, uid: number, gid: number): void {
  chownSync(path, uid, gid);
  if (statSync(path).isDirectory())
    for (const name of readdirSync(path)) chownTree(join(path, name), uid, gid);
}

function psql(bin: string, sock: string, port: number, sql: string): string {
  return asOwner(join(bin, 'psql'), [
    '-h',
    sock,
    '-p',
    String(port),
    '-U',
    'postgres',
    '-d',
    'postgres',
    '-XtAq',
    '-v',
    'ON_ERROR_STOP=1',
    '-c',
    sql,
  ]);
}

function quoteLiteral(value: string): string {
  return `'${value.replace(/'/g, "''")}'`;
}

/**
 * Starts the cluster in `data` with the server `settings` unless pg_ctl says it is already
 * running; refuses when something else holds the port, and shows the log's tail when it fails.
 */
async function startIfStopped(
  bin: string,
  data: string,
  log: string,
  port: number,
  settings: string[],
  words: { portTaken: string; failed: string },
): Promise<void> {
  try {
    asOwner(join(bin, 'pg_ctl'), ['-D', data, 'status']);
    return;
  } catch {
    // not running: start it below
  }
  if (await portInUse(port)) throw new UserFacingError(words.portTaken);
  try {
    asOwner(join(bin, 'pg_ctl'), [
      '-D',
      data,
      '-l',
      log,
      '-w',
      '-t',
      '60',
      '-o',
      settings.join(' '),
      'start',
    ]);
  } catch (err) {
    const tail = existsSync(log) ? readFileSync(log, 'utf8').trim().split('\n').slice(-5).join('\n') : '';
    throw new UserFacingError(`${words.failed} (log: ${log}):\n${tail || (err as Error).message}`);
  }
}

/**
 * Starts (creating it on first use) a PostgreSQL cluster in `base` listening on 127.0.0.1:port,
 * with an application role and database. `durable: false` trades crash safety for speed (tests only).
 * Credentials are generated once and kept in `base/credentials.json`, never in git.
 */
export async function startPrivateCluster(opts: {
  base: string;
  port: number;
  durable: boolean;
  appUser?: string;
  database?: string;
  createdb?: boolean;
}): Promise<PrivateCluster> {
  const bin = ensurePgBinaries();
  ensurePostgresUser();
  const base = resolve(opts.base);
  const data = join(base, 'data');
  const sock = join(base, 'sock');
  const log = join(base, 'server.log');
  const credsFile = join(base, 'credentials.json');
  const appUser = opts.appUser ?? 'beadroll';
  const database = opts.database ?? 'beadroll';
  mkdirSync(base, { recursive: true });
  makeParentsTraversable(base);
  const { uid, gid } = ownerIds();

  const fresh = !existsSync(join(data, 'PG_VERSION'));
  if (fresh) {
    // A half-made cluster from an interrupted first run is thrown away, not reused.
    rmSync(data, { recursive: true, force: true });
    const creds: Credentials = {
      superuserPassword: randomBytes(18).toString('base64url'),
      appPassword: randomBytes(18).toString('base64url'),
    };
    writeFileSync(credsFile, JSON.stringify(creds, null, 2), { mode: 0o600 });
    mkdirSync(data, { recursive: true, mode: 0o700 });
    mkdirSync(sock, { recursive: true });
    const pwfile = join(base, 'pwfile');
    writeFileSync(pwfile, creds.superuserPassword, { mode: 0o600 });
    chownTree(base, uid, gid);
    chownSync(credsFile, process.getuid!(), process.getgid!());
    chmodSync(data, 0o700);
    try {
      asOwner(join(bin, 'initdb'), [
        '-D',
        data,
        '-U',
        'postgres',
        '-E',
        'UTF8',
        '--locale=C.UTF-8',
        '--auth-local=trust',
        '--auth-host=scram-sha-256',
        `--pwfile=${pwfile}`,
      ]);
    } catch (err) {
      rmSync(data, { recursive: true, force: true });
      throw new UserFacingError(`initdb failed for ${data}: ${(err as Error).message}`);
    } finally {
      rmSync(pwfile, { force: true });
    }
  }
  const creds = JSON.parse(readFileSync(credsFile, 'utf8')) as Credentials;
  mkdirSync(sock, { recursive: true });
  chownSync(sock, uid, gid);

  const settings = ['-p', String(opts.port), '-k', sock, '-c', 'listen_addresses=127.0.0.1'];
  if (!opts.durable)
    settings.push('-c', 'fsync=off', '-c', 'synchronous_commit=off', '-c', 'full_page_writes=off');
  await startIfStopped(bin, data, log, opts.port, settings, {
    portTaken: `PGPORT ${opts.port} is already in use on 127.0.0.1: stop what holds it, or set PGPORT to a free port.`,
    failed: 'PostgreSQL failed to start',
  });

  const roleExists = psql(
    bin,
    sock,
    opts.port,
    `SELECT 1 FROM pg_roles WHERE rolname = ${quoteLiteral(appUser)}`,
  ).trim();
  const roleSql = `ROLE "${appUser}" LOGIN ${opts.createdb ? 'CREATEDB' : 'NOCREATEDB'} PASSWORD ${quoteLiteral(creds.appPassword)}`;
  psql(bin, sock, opts.port, roleExists ? `ALTER ${roleSql}` : `CREATE ${roleSql}`);
  const dbExists = psql(
    bin,
    sock,
    opts.port,
    `SELECT 1 FROM pg_database WHERE datname = ${quoteLiteral(database)}`,
  ).trim();
  if (!dbExists) psql(bin, sock, opts.port, `CREATE DATABASE "${database}" OWNER "${appUser}"`);

  return {
    target: {
      host: '127.0.0.1',
      port: opts.port,
      user: appUser,
      password: creds.appPassword,
      database,
      superuser: { user: 'postgres', password: creds.superuserPassword },
    },
    stop() {
      try {
        asOwner(join(bin, 'pg_ctl'), ['-D', data, '-m', 'fast', '-w', 'stop']);
      } catch {
        // already stopped
      }
    },
  };
}

/** Environment variables (PG*) that point a process at `target`. */
export function pgEnv(target: PgTarget): Record<string, string> {
  return {
    PGHOST: target.host,
    PGPORT: String(target.port),
    PGUSER: target.user,
    PGPASSWORD: target.password,
    PGDATABASE: target.database,
  };
}

/** A streaming hot standby of a private cluster. */
export interface Standby {
  port: number;
  stop(): void;
}

/** Name of the physical replication slot the standby streams from (the primary keeps its WAL). */
const STANDBY_SLOT = 'beadroll_standby';

/**
 * Starts (creating it on first use with pg_basebackup) a streaming hot standby of the private
 * cluster in `primaryBase`, listening on 127.0.0.1:port with its data in `base`. It streams
 * through a physical replication slot over the primary's local socket (the local `replication`
 * rule initdb writes), and answers read-only queries with the primary's roles and databases.
 */
export async function startStandby(opts: {
  primaryBase: string;
  primaryPort: number;
  /** The application role: it may read the standby's replication status (pg_read_all_stats). */
  appUser: string;
  base: string;
  port: number;
  durable: boolean;
}): Promise<Standby> {
  const bin = ensurePgBinaries();
  const primarySock = join(resolve(opts.primaryBase), 'sock');
  const base = resolve(opts.base);
  const data = join(base, 'data');
  const sock = join(base, 'sock');
  const log = join(base, 'server.log');
  mkdirSync(sock, { recursive: true });
  makeParentsTraversable(base);
  const { uid, gid } = ownerIds();
  chownTree(base, uid, gid);
  psql(bin, primarySock, opts.primaryPort, `GRANT pg_read_all_stats TO "${opts.appUser}"`);
  if (!existsSync(join(data, 'PG_VERSION'))) {
    rmSync(data, { recursive: true, force: true });
    psql(
      bin,
      primarySock,
      opts.primaryPort,
      `SELECT pg_create_physical_replication_slot('${STANDBY_SLOT}')
       WHERE NOT EXISTS (SELECT 1 FROM pg_replication_slots WHERE slot_name = '${STANDBY_SLOT}')`,
    );
    try {
      asOwner(join(bin, 'pg_basebackup'), [
        '-h',
        primarySock,
        '-p',
        String(opts.primaryPort),
        '-U',
        'postgres',
        '-D',
        data,
        '-R',
        '-X',
        'stream',
        '-S',
        STANDBY_SLOT,
        // Checkpoint at once rather than spread over checkpoint_timeout: a spread checkpoint can
        // keep the copy waiting for minutes on a busy machine.
        '--checkpoint=fast',
      ]);
    } catch (err) {
      rmSync(data, { recursive: true, force: true });
      throw new UserFacingError(`pg_basebackup failed for the standby: ${(err as Error).message}`);
    }
  }
  const settings = ['-p', String(opts.port), '-k', sock, '-c', 'listen_addresses=127.0.0.1'];
  settings.push('-c', 'hot_standby=on');
  if (!opts.durable) settings.push('-c', 'fsync=off', '-c', 'full_page_writes=off');
  await startIfStopped(bin, data, log, opts.port, settings, {
    portTaken: `port ${opts.port} for the standby is already in use on 127.0.0.1.`,
    failed: 'the standby failed to start',
  });
  return {
    port: opts.port,
    stop() {
      try {
        asOwner(join(bin, 'pg_ctl'), ['-D', data, '-m', 'fast', '-w', 'stop']);
      } catch {
        // already stopped
      }
    },
  };
}
