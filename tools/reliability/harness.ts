// Shared pieces of the reliability suite: a server process that can be killed and restarted,
// a small HTTP client with a session cookie and idempotent retries, and direct SQL.
import { spawn, type ChildProcess } from 'node:child_process';
import { randomBytes, randomUUID, scryptSync } from 'node:crypto';
import { closeSync, mkdirSync, openSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import pg from 'pg';
import { REPO } from '../lib/app-env.ts';
import { pgEnv, type PgTarget } from '../lib/pg.ts';
import { freePort, waitFor } from '../lib/proc.ts';

export const SERVER_DIST = join(REPO, 'packages', 'server', 'dist');

/** One row of the printed table. */
export interface Row {
  section: string;
  check: string;
  detail: string;
  ok: boolean | null;
}

export const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

/** A Beadroll server run as its own process (the built `dist/main.js`), on its own port. */
export class ServerProcess {
  child?: ChildProcess;
  readonly base: string;

  private constructor(
    readonly port: number,
    readonly env: NodeJS.ProcessEnv,
    private readonly log: string,
  ) {
    this.base = `http://127.0.0.1:${port}`;
  }

  /** Environment for a server on `db` with its data in `dataDir`; `extra` overrides. */
  static async create(
    target: PgTarget,
    database: string,
    dataDir: string,
    extra: Record<string, string> = {},
  ): Promise<ServerProcess> {
    const port = await freePort();
    mkdirSync(dataDir, { recursive: true });
    const secret = join(dataDir, 'jwt.key');
    writeFileSync(secret, randomBytes(32).toString('hex'));
    const env: NodeJS.ProcessEnv = {
      ...process.env,
      ...pgEnv({ ...target, database }),
      PORT: String(port),
      HOST: '127.0.0.1',
      PUBLIC_BASE_URL: `http://127.0.0.1:${port}`,
      DATA_DIR: dataDir,
      JWT_SECRET_FILE: secret,
      WEB_DIST: join(dataDir, 'no-web'),
      FAKE_SMTP: 'true',
      SMTP_PORT: '0',
      SCRYPT_COST: '1024',
      THROTTLE_LIMIT: '1000000',
      OPINIONS_PER_DAY: '1000',
      OFFER_LAPSE_CHECK_SECONDS: '0',
      MALLOC_ARENA_MAX: '2',
      MALLOC_MMAP_THRESHOLD_: '69632',
      NODE_ENV: 'production',
      ...extra,
    };
    return new ServerProcess(port, env, join(dataDir, 'server.log'));
  }

  /** Runs the migrations (once, before the first start). */
  async migrate(): Promise<void> {
    await new Promise<void>((resolve, reject) => {
      const c = spawn('node', [join(SERVER_DIST, 'migrate.js')], { env: this.env, stdio: 'ignore' });
      c.on('exit', (code) => (code === 0 ? resolve() : reject(new Error(`migrations exited with ${code}`))));
    });
  }

  async start(): Promise<void> {
    const fd = openSync(this.log, 'a');
    this.child = spawn('node', [join(SERVER_DIST, 'main.js')], { env: this.env, stdio: ['ignore', fd, fd] });
    closeSync(fd);
    await waitFor(
      async () => (await fetch(`${this.base}/api/health`).catch(() => null))?.ok === true,
      60_000,
      'the server to answer',
    );
  }

  /** SIGKILL: no shutdown hooks, no finished requests. */
  async kill9(): Promise<void> {
    const c = this.child;
    if (!c || c.exitCode !== null) return;
    await new Promise<void>((resolve) => {
      c.once('exit', () => resolve());
      c.kill('SIGKILL');
    });
  }

  async stop(): Promise<void> {
    const c = this.child;
    if (!c || c.exitCode !== null || c.signalCode !== null) return;
    await new Promise<void>((resolve) => {
      const timer = setTimeout(() => c.kill('SIGKILL'), 10_000);
      c.once('exit', () => {
        clearTimeout(timer);
        resolve();
      });
      c.kill('SIGTERM');
    });
  }

  get pid(): number {
    return this.child!.pid!;
  }
}

export interface Answer {
  status: number;
  body: unknown;
  replayed: boolean;
}

/** A signed-in (or anonymous) client of one server. */
export class Client {
  cookie = '';

  constructor(public server: ServerProcess) {}

  async send(
    method: string,
    path: string,
    body?: unknown,
    opts: { key?: string; raw?: string | FormData; contentType?: string; csrf?: boolean } = {},
  ): Promise<Answer> {
    const headers: Record<string, string> = { Accept: 'application/json' };
    if (method !== 'GET' && opts.csrf !== false) headers['X-Beadroll-Request'] = '1';
    if (opts.key) headers['Idempotency-Key'] = opts.key;
    if (this.cookie) headers.Cookie = this.cookie;
    let payload: string | FormData | undefined;
    if (opts.raw !== undefined) {
      payload = opts.raw;
      if (opts.contentType) headers['Content-Type'] = opts.contentType;
    } else if (body !== undefined) {
      payload = JSON.stringify(body);
      headers['Content-Type'] = 'application/json';
    }
    const res = await fetch(`${this.server.base}${path}`, { method, headers, body: payload });
    const text = await res.text();
    let parsed: unknown = text;
    try {
      parsed = JSON.parse(text);
    } catch {
      // not JSON: kept as text
    }
    return { status: res.status, body: parsed, replayed: res.headers.get('idempotent-replayed') === 'true' };
  }

  /**
   * Sends one write with one idempotency key until it is answered (not a network failure or a
   * 5xx), as the web client does, however long the server is away (up to `giveUpMs`).
   */
  async write(
    method: string,
    path: string,
    body: unknown,
    giveUpMs = 120_000,
  ): Promise<Answer & { tries: number }> {
    const key = randomUUID();
    const deadline = Date.now() + giveUpMs;
    for (let tries = 1; ; tries++) {
      try {
        const a = await this.send(method, path, body, { key });
        if (a.status < 500) return { ...a, tries };
      } catch {
        // no answer: the server is down or restarting
      }
      if (Date.now() > deadline) throw new Error(`${method} ${path}: no answer after ${tries} tries`);
      await sleep(100 + Math.random() * 150);
    }
  }

  async signIn(email: string, password: string): Promise<void> {
    const res = await fetch(`${this.server.base}/api/auth/sign-in`, {
      method: 'POST',
      headers: { 'Content-Type': 'application/json', 'X-Beadroll-Request': '1' },
      body: JSON.stringify({ email, password }),
    });
    if (res.status !== 200) throw new Error(`sign-in of ${email} answered ${res.status}`);
    this.cookie = res.headers
      .getSetCookie()
      .map((c) => c.split(';')[0]!)
      .filter((c) => c.startsWith('beadroll_access='))
      .join('; ');
  }
}

/** A scrypt hash in the server's stored form (`scrypt$N$r$p$salt$key`). */
export function passwordHash(password: string, N = 1024): string {
  const salt = randomBytes(16);
  const key = scryptSync(password.normalize('NFC'), salt, 32, { N, r: 8, p: 1, maxmem: 256 * N * 8 + 1024 });
  return ['scrypt', N, 8, 1, salt.toString('base64url'), key.toString('base64url')].join('$');
}

export async function sql<T = Record<string, unknown>>(
  target: PgTarget,
  database: string,
  text: string,
  params: unknown[] = [],
  superuser = false,
): Promise<T[]> {
  const c = new pg.Client({
    host: target.host,
    port: target.port,
    user: superuser ? target.superuser!.user : target.user,
    password: superuser ? target.superuser!.password : target.password,
    database,
  });
  await c.connect();
  try {
    return (await (params.length ? c.query(text, params) : c.query(text))).rows as T[];
  } finally {
    await c.end();
  }
}

let accounts = 0;

/** A verified account made straight in the database; returns its id, e-mail and password. */
export async function account(
  target: PgTarget,
  database: string,
  role: 'dealer' | 'assessor' | 'registrar',
  cost = 1024,
): Promise<{ id: string; email: string; password: string }> {
  accounts += 1;
  const handle = `${role}-${accounts}-${randomBytes(3).toString('hex')}`;
  const email = `${handle}@reliability.invalid`;
  const password = `pw-${randomBytes(9).toString('base64url')}`;
  const [row] = await sql<{ id: string }>(
    target,
    database,
    `INSERT INTO "accounts" ("role", "status", "handle", "email", "display_name", "business", "town", "country",
       "password_hash", "email_verified_at", "verified_at")
     VALUES ($1, 'verified', $2, $3, $4, 'Invented Bead Stall', 'Nowhere Vale', 'Testland', $5, now(), now())
     RETURNING "id"`,
    [role, handle, email, `Invented ${role} ${accounts}`, passwordHash(password, cost)],
  );
  return { id: row!.id, email, password };
}

/** A signed-in client for a new verified account of `role`. */
export async function signedIn(
  server: ServerProcess,
  target: PgTarget,
  database: string,
  role: 'dealer' | 'assessor' | 'registrar',
): Promise<Client & { id: string }> {
  const a = await account(target, database, role);
  const c = new Client(server) as Client & { id: string };
  c.id = a.id;
  await c.signIn(a.email, a.password);
  return c;
}

/** A small valid lot description (invented). */
export function description(title: string, count = 40, listed = true): Record<string, unknown> {
  return {
    title,
    form: 'strand',
    count: { value: count, estimated: false },
    diameterMm: { min: 6, max: 8 },
    colours: ['blue'],
    baseGlass: ['opaque'],
    decoration: ['trailing'],
    listed,
  };
}

/** Runs the full-ledger audit through the registrar's route; the lots it reports broken. */
export async function audit(
  registrar: Client,
): Promise<{ ok: boolean; broken: Array<{ lot: string; seq: number; reason: string }> }> {
  const res = await registrar.send('GET', '/api/audit/ledger');
  const lines = String(typeof res.body === 'string' ? res.body : JSON.stringify(res.body))
    .split('\n')
    .filter(Boolean)
    .map((l) => JSON.parse(l) as { type: string; ok?: boolean; lot?: string; seq?: number; reason?: string });
  const broken = lines
    .filter((l) => l.type === 'broken')
    .map((l) => ({ lot: l.lot!, seq: l.seq!, reason: l.reason! }));
  const done = lines.find((l) => l.type === 'done');
  return { ok: done?.ok === true, broken };
}
