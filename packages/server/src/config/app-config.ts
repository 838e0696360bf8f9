import { hostname } from 'node:os';
import { isAbsolute, resolve } from 'node:path';

/** The one typed configuration of the server, validated once at boot from the environment. */
export interface AppConfig {
  readonly port: number;
  readonly host: string;
  readonly publicBaseUrl: string;
  readonly dataDir: string;
  readonly webDist: string;
  /** The offline verifier page built by packages/verify, served at /verify. */
  readonly verifyPage: string;
  readonly demoMode: boolean;
  readonly devMailbox: boolean;
  /** Name of this server process, shown by /api/health and on every response (`Beadroll-Instance`). */
  readonly instanceName: string;
  /**
   * A streaming hot standby of the database (same role and database), for public reads while
   * its replay lag is under `maxLagMs`; null when there is none.
   */
  readonly standby: { readonly host: string; readonly port: number; readonly maxLagMs: number } | null;
  readonly db: {
    readonly host: string;
    readonly port: number;
    readonly user: string;
    readonly password: string;
    readonly database: string;
  };
  readonly mail: {
    readonly smtpHost: string;
    readonly smtpPort: number;
    readonly from: string;
    /** Start an in-process fake SMTP server on smtpPort (0 = any free port) and keep what it receives. */
    readonly fakeSmtp: boolean;
    /**
     * Where the mailbox page reads mail from when several instances share one fake SMTP server
     * (`GET {mailboxUrl}/messages`); '' = this process's own fake SMTP server.
     */
    readonly mailboxUrl: string;
  };
  readonly jwtSecretFile: string;
  /** The ledger-wide log: its Ed25519 signing key (made on first start) and how often it signs. */
  readonly log: {
    readonly keyFile: string;
    /** A new checkpoint is signed when the log has grown, at most this often. */
    readonly checkpointSeconds: number;
  };
  readonly scrypt: {
    readonly cost: number;
    readonly blockSize: number;
    readonly parallelization: number;
    /** Password hashes computed at once (each needs about 128·N·r bytes); the rest wait their turn. */
    readonly concurrency: number;
  };
  /** Limits applied to every request body before it is validated. */
  readonly requests: {
    /** Largest JSON or form body, in bytes. */
    readonly maxJsonBytes: number;
    /** Deepest nesting of objects and lists in a body or query. */
    readonly maxDepth: number;
  };
  readonly throttle: { readonly limit: number; readonly ttlMs: number };
  readonly transfers: {
    /** An offer nobody answered lapses after this many days. */
    readonly lapseDays: number;
    /** How often each server looks for offers to lapse (0 = never; the job can still be run by hand). */
    readonly lapseCheckSeconds: number;
  };
  /** Opinions one author may record on one lot in any 24 hours. */
  readonly opinions: { readonly perDay: number };
  readonly session: {
    /** Lifetime of the access-token cookie (a signed JWT). */
    readonly accessTtlSeconds: number;
    /** Lifetime of one refresh token; each use replaces it with a new one. */
    readonly refreshTtlSeconds: number;
    /** Cookies get the Secure flag when the public address is https. */
    readonly secureCookies: boolean;
  };
  /** Where exhibit files are kept: a content-addressed folder (default) or an S3 bucket. */
  readonly storage: {
    readonly driver: 'fs' | 's3';
    readonly dir: string;
    readonly s3: {
      readonly bucket: string;
      readonly endpoint: string;
      readonly region: string;
      readonly accessKeyId: string;
      readonly secretAccessKey: string;
      readonly forcePathStyle: boolean;
    };
  };
  /** Limits on uploaded exhibit files. */
  readonly exhibits: {
    readonly maxFileBytes: number;
    readonly maxPixels: number;
    /** Bytes of exhibits one account may add in all. */
    readonly quotaBytes: number;
    /** Uploads whose images are decoded and re-encoded at the same time; the rest wait their turn. */
    readonly processingConcurrency: number;
  };
}

export class ConfigError extends Error {
  constructor(
    readonly variable: string,
    reason: string,
  ) {
    super(`configuration: ${variable} ${reason}`);
  }
}

type Env = Record<string, string | undefined>;

const REPO_ROOT = resolve(__dirname, '..', '..', '..', '..');

function str(env: Env, name: string, fallback: string, maxLength = 2048): string {
  const raw = env[name];
  if (raw === undefined || raw === '') return fallback;
  if (raw.length > maxLength) throw new ConfigError(name, `is longer than ${maxLength} characters`);
  return raw;
}

function int(env: Env, name: string, fallback: number, min: number, max: number): number {
  const raw = env[name];
  if (raw === undefined || raw === '') return fallback;
  if (!/^\d+$/.test(raw)) throw new ConfigError(name, `must be a whole number, got "${raw}"`);
  const value = Number(raw);
  if (value < min || value > max)
    throw new ConfigError(name, `must be between ${min} and ${max}, got ${raw}`);
  return value;
}

function bool(env: Env, name: string, fallback: boolean): boolean {
  const raw = env[name];
  if (raw === undefined || raw === '') return fallback;
  if (['1', 'true', 'yes', 'on'].includes(raw.toLowerCase())) return true;
  if (['0', 'false', 'no', 'off'].includes(raw.toLowerCase())) return false;
  throw new ConfigError(name, `must be true or false, got "${raw}"`);
}

function oneOf<T extends string>(env: Env, name: string, fallback: T, allowed: readonly T[]): T {
  const raw = str(env, name, fallback);
  if (!(allowed as readonly string[]).includes(raw))
    throw new ConfigError(name, `must be one of ${allowed.join(', ')}, got "${raw}"`);
  return raw as T;
}

function optionalUrl(env: Env, name: string): string {
  return env[name] ? url(env, name, '') : '';
}

function path(env: Env, name: string, fallback: string): string {
  const raw = str(env, name, fallback);
  return isAbsolute(raw) ? raw : resolve(REPO_ROOT, raw);
}

function url(env: Env, name: string, fallback: string): string {
  const raw = str(env, name, fallback);
  let parsed: URL;
  try {
    parsed = new URL(raw);
  } catch {
    throw new ConfigError(name, `must be an absolute http(s) URL, got "${raw}"`);
  }
  if (parsed.protocol !== 'http:' && parsed.protocol !== 'https:') {
    throw new ConfigError(name, `must use http or https, got "${parsed.protocol}"`);
  }
  return parsed.origin;
}

/**
 * Reads and validates the environment. Throws ConfigError naming the first bad variable.
 * This is the only place in the server that reads environment variables.
 */
export function loadConfig(env: Env = process.env): AppConfig {
  const port = int(env, 'PORT', 3000, 1, 65535);
  const host = str(env, 'HOST', '127.0.0.1');
  const dataDir = path(env, 'DATA_DIR', '.data');
  const demoMode = bool(env, 'DEMO_MODE', false);
  const publicBaseUrl = url(env, 'PUBLIC_BASE_URL', `http://127.0.0.1:${port}`);
  return {
    port,
    host,
    publicBaseUrl,
    dataDir,
    webDist: path(env, 'WEB_DIST', 'packages/web/dist'),
    verifyPage: path(env, 'VERIFY_PAGE', 'packages/verify/dist/verify.html'),
    demoMode,
    devMailbox: bool(env, 'DEV_MAILBOX', demoMode),
    instanceName: str(env, 'INSTANCE_NAME', `${hostname()}:${port}`, 100),
    standby: standbyConfig(env),
    db: {
      host: str(env, 'PGHOST', '127.0.0.1'),
      port: int(env, 'PGPORT', 55432, 1, 65535),
      user: str(env, 'PGUSER', 'beadroll'),
      password: str(env, 'PGPASSWORD', ''),
      database: str(env, 'PGDATABASE', 'beadroll'),
    },
    mail: {
      smtpHost: str(env, 'SMTP_HOST', '127.0.0.1'),
      smtpPort: int(env, 'SMTP_PORT', 0, 0, 65535),
      from: str(env, 'MAIL_FROM', 'Beadroll <no-reply@beadroll.invalid>'),
      fakeSmtp: bool(env, 'FAKE_SMTP', demoMode),
      mailboxUrl: optionalUrl(env, 'MAILBOX_URL'),
    },
    jwtSecretFile: path(env, 'JWT_SECRET_FILE', resolve(dataDir, 'secrets', 'jwt.key')),
    log: {
      keyFile: path(env, 'LOG_KEY_FILE', resolve(dataDir, 'secrets', 'log.key')),
      checkpointSeconds: int(env, 'CHECKPOINT_SECONDS', 10, 1, 86_400),
    },
    scrypt: {
      cost: int(env, 'SCRYPT_COST', 131072, 2, 1 << 22),
      blockSize: int(env, 'SCRYPT_BLOCK_SIZE', 8, 1, 64),
      parallelization: int(env, 'SCRYPT_PARALLELIZATION', 1, 1, 16),
      concurrency: int(env, 'SCRYPT_CONCURRENCY', 1, 1, 64),
    },
    requests: {
      maxJsonBytes: int(env, 'REQUEST_MAX_JSON_BYTES', 256 * 1024, 1024, 64 * 1024 * 1024),
      maxDepth: int(env, 'REQUEST_MAX_DEPTH', 32, 4, 1000),
    },
    throttle: {
      limit: int(env, 'THROTTLE_LIMIT', 10, 1, 1_000_000),
      ttlMs: int(env, 'THROTTLE_TTL_MS', 60_000, 1, 86_400_000),
    },
    transfers: {
      lapseDays: int(env, 'OFFER_LAPSE_DAYS', 14, 1, 365),
      lapseCheckSeconds: int(env, 'OFFER_LAPSE_CHECK_SECONDS', 300, 0, 86_400),
    },
    opinions: { perDay: int(env, 'OPINIONS_PER_DAY', 3, 1, 1000) },
    session: {
      accessTtlSeconds: int(env, 'ACCESS_TOKEN_TTL_SECONDS', 900, 1, 86_400),
      refreshTtlSeconds: int(env, 'REFRESH_TOKEN_TTL_SECONDS', 30 * 86_400, 60, 365 * 86_400),
      secureCookies: publicBaseUrl.startsWith('https:'),
    },
    storage: storageConfig(env, dataDir),
    exhibits: {
      maxFileBytes: int(env, 'EXHIBIT_MAX_BYTES', 20 * 1024 * 1024, 1024, 1024 * 1024 * 1024),
      maxPixels: int(env, 'EXHIBIT_MAX_PIXELS', 50_000_000, 10_000, 268_402_689),
      quotaBytes: int(env, 'EXHIBIT_QUOTA_BYTES', 2 * 1024 * 1024 * 1024, 0, Number.MAX_SAFE_INTEGER),
      processingConcurrency: int(env, 'EXHIBIT_PROCESSING_CONCURRENCY', 2, 1, 64),
    },
  };
}

function standbyConfig(env: Env): AppConfig['standby'] {
  const host = str(env, 'PG_STANDBY_HOST', '');
  if (host === '') return null;
  return {
    host,
    port: int(env, 'PG_STANDBY_PORT', 5432, 1, 65535),
    maxLagMs: int(env, 'STANDBY_MAX_LAG_MS', 2000, 0, 3_600_000),
  };
}

function storageConfig(env: Env, dataDir: string): AppConfig['storage'] {
  const driver = oneOf(env, 'STORAGE_DRIVER', 'fs', ['fs', 's3'] as const);
  const bucket = str(env, 'S3_BUCKET', '', 63);
  if (driver === 's3' && !bucket) throw new ConfigError('S3_BUCKET', 'must be set when STORAGE_DRIVER is s3');
  return {
    driver,
    dir: path(env, 'STORAGE_DIR', resolve(dataDir, 'exhibits')),
    s3: {
      bucket,
      endpoint: optionalUrl(env, 'S3_ENDPOINT'),
      region: str(env, 'S3_REGION', 'us-east-1', 64),
      accessKeyId: str(env, 'S3_ACCESS_KEY_ID', ''),
      secretAccessKey: str(env, 'S3_SECRET_ACCESS_KEY', ''),
      forcePathStyle: bool(env, 'S3_FORCE_PATH_STYLE', false),
    },
  };
}
