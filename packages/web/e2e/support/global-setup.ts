import { spawn, spawnSync, type ChildProcess } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import { existsSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { createServer } from 'node:net';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import type { TestProject } from 'vitest/node';

const REPO = resolve(__dirname, '..', '..', '..', '..');
const SERVER = join(REPO, 'packages/server/dist');

function freePort(): Promise<number> {
  return new Promise((ok, fail) => {
    const s = createServer();
    s.once('error', fail);
    s.listen(0, '127.0.0.1', () => {
      const a = s.address();
      s.close(() => ok(typeof a === 'object' && a ? a.port : 0));
    });
  });
}

function psql(sql: string, database = process.env.PGDATABASE ?? 'postgres'): void {
  const r = spawnSync('psql', ['-XtAq', '-v', 'ON_ERROR_STOP=1', '-d', database, '-c', sql], {
    encoding: 'utf8',
    env: process.env,
  });
  if (r.status !== 0) throw new Error(`psql failed: ${r.stderr}`);
}

declare module 'vitest' {
  export interface ProvidedContext {
    baseUrl: string;
    database: string;
  }
}

/**
 * Starts the built server, with the demo scenario, on a fresh database and a free port, for the
 * browser journeys; everything is removed again at the end.
 */
export default async function setup(project: TestProject): Promise<() => Promise<void>> {
  if (!existsSync(join(SERVER, 'main.js'))) throw new Error('build the server first (npm run build)');
  const database = `be_${randomBytes(5).toString('hex')}`;
  psql(`CREATE DATABASE ${database}`);
  const dataDir = mkdtempSync(join(tmpdir(), 'beadroll-e2e-'));
  const secret = join(dataDir, 'jwt.key');
  writeFileSync(secret, randomBytes(32).toString('hex'));
  const port = await freePort();
  const env = {
    ...process.env,
    PGDATABASE: database,
    PORT: String(port),
    HOST: '127.0.0.1',
    PUBLIC_BASE_URL: `http://127.0.0.1:${port}`,
    DATA_DIR: dataDir,
    JWT_SECRET_FILE: secret,
    DEMO_MODE: 'true',
    FAKE_SMTP: 'true',
    SMTP_PORT: '0',
    DEV_MAILBOX: 'true',
    SCRYPT_COST: '1024',
    THROTTLE_LIMIT: '100000',
  };
  for (const script of ['migrate.js', 'demo/seed.js']) {
    const file = join(SERVER, script);
    if (!existsSync(file)) continue;
    const r = spawnSync('node', [file], { env, encoding: 'utf8' });
    if (r.status !== 0) throw new Error(`${script} failed:\n${r.stdout}\n${r.stderr}`);
  }
  const server: ChildProcess = spawn('node', [join(SERVER, 'main.js')], {
    env,
    stdio: ['ignore', 'ignore', 'inherit'],
  });
  const baseUrl = `http://127.0.0.1:${port}`;
  const deadline = Date.now() + 60_000;
  for (;;) {
    if (server.exitCode !== null) throw new Error(`the server exited with ${server.exitCode}`);
    try {
      if ((await fetch(`${baseUrl}/api/health`)).ok) break;
    } catch {
      // not up yet
    }
    if (Date.now() > deadline) throw new Error('the server did not come up');
    await new Promise((r) => setTimeout(r, 200));
  }
  project.provide('baseUrl', baseUrl);
  project.provide('database', database);
  return async () => {
    server.kill('SIGTERM');
    await new Promise((r) => server.once('exit', r));
    psql(`DROP DATABASE IF EXISTS ${database} WITH (FORCE)`);
    rmSync(dataDir, { recursive: true, force: true });
  };
}
