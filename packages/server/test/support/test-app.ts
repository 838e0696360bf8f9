import { randomBytes } from 'node:crypto';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { NestExpressApplication } from '@nestjs/platform-express';
import { Test } from '@nestjs/testing';
import { Client } from 'pg';
import type { DataSource } from 'typeorm';
import { AppModule } from '../../src/app.module';
import { configureApp } from '../../src/bootstrap';
import { loadConfig } from '../../src/config/app-config';
import { createDataSource } from '../../src/database/data-source';

/** A database created for one test file on the cluster `npm test` started; dropped at the end. */
export interface TestDatabase {
  name: string;
  drop(): Promise<void>;
}

// The database `npm test` created for the run; each test file makes its own beside it.
const ADMIN_DATABASE = process.env.PGDATABASE;

function adminClient(database = ADMIN_DATABASE): Client {
  return new Client({
    host: process.env.PGHOST,
    port: Number(process.env.PGPORT),
    user: process.env.PGUSER,
    password: process.env.PGPASSWORD,
    database,
  });
}

/** Creates an empty database with a random name beside the run's own, and returns the name. */
async function newDatabase(): Promise<string> {
  if (!process.env.PGHOST) throw new Error('PGHOST is not set: run the server tests through `npm test`.');
  const name = `bt_${randomBytes(6).toString('hex')}`;
  const admin = adminClient();
  await admin.connect();
  await admin.query(`CREATE DATABASE ${name}`);
  await admin.end();
  return name;
}

/** Creates an empty database with a random name and runs every migration on it. */
export async function createTestDatabase(): Promise<TestDatabase> {
  const name = await newDatabase();
  const dataSource = createDataSource(loadConfig({ ...process.env, PGDATABASE: name }));
  await dataSource.initialize();
  await dataSource.runMigrations({ transaction: 'each' });
  await dataSource.destroy();
  return {
    name,
    async drop() {
      // FORCE ends the database's other sessions; one that is not the app role's (an autovacuum
      // worker, a tamper test's superuser) only a superuser may end, so drop as one if the run
      // has one. The client is closed however the drop goes: an open one keeps Jest running.
      const client = process.env.BEADROLL_TEST_PG_SUPERUSER
        ? await superuserClient(ADMIN_DATABASE!)
        : adminClient();
      try {
        if (!process.env.BEADROLL_TEST_PG_SUPERUSER) await client.connect();
        await client.query(`DROP DATABASE IF EXISTS ${name} WITH (FORCE)`);
      } finally {
        await client.end();
      }
    },
  };
}

/** An empty database (no migrations run) beside the test databases, for restores; dropped by `drop()`. */
export async function createEmptyDatabase(): Promise<TestDatabase> {
  const name = await newDatabase();
  return {
    name,
    async drop() {
      const client = adminClient();
      await client.connect();
      try {
        await client.query(`DROP DATABASE IF EXISTS ${name} WITH (FORCE)`);
      } finally {
        await client.end();
      }
    },
  };
}

/** A superuser connection to a test database, for tests that tamper with stored rows on purpose. */
export async function superuserClient(database: string): Promise<Client> {
  const user = process.env.BEADROLL_TEST_PG_SUPERUSER;
  if (!user) throw new Error('no superuser available for tamper tests');
  const client = new Client({
    host: process.env.PGHOST,
    port: Number(process.env.PGPORT),
    user,
    password: process.env.BEADROLL_TEST_PG_SUPERPASSWORD,
    database,
  });
  await client.connect();
  return client;
}

export interface TestApp {
  app: NestExpressApplication;
  db: TestDatabase;
  dataDir: string;
  close(): Promise<void>;
}

/**
 * Boots the whole server (the same module graph and setup as main.ts) on a fresh database.
 * `env` adds or overrides configuration variables for this app.
 */
export async function createTestApp(env: Record<string, string> = {}): Promise<TestApp> {
  const db = await createTestDatabase();
  const dataDir = mkdtempSync(join(tmpdir(), 'beadroll-test-'));
  const secret = join(dataDir, 'jwt.key');
  writeFileSync(secret, randomBytes(32).toString('hex'));
  Object.assign(process.env, {
    PGDATABASE: db.name,
    DATA_DIR: dataDir,
    JWT_SECRET_FILE: secret,
    WEB_DIST: join(dataDir, 'no-web'),
    SCRYPT_COST: '1024',
    THROTTLE_LIMIT: '100000',
    FAKE_SMTP: 'true',
    SMTP_PORT: '0',
    DEV_MAILBOX: 'true',
    PUBLIC_BASE_URL: 'http://beadroll.example',
    ...env,
  });
  const moduleRef = await Test.createTestingModule({ imports: [AppModule] }).compile();
  const app = moduleRef.createNestApplication<NestExpressApplication>({ logger: ['error', 'warn'] });
  configureApp(app);
  await app.init();
  return {
    app,
    db,
    dataDir,
    async close() {
      await app.close();
      await db.drop();
      rmSync(dataDir, { recursive: true, force: true });
    },
  };
}

/**
 * The app for the tests of the enclosing `describe`: booted on a fresh database before them (with
 * `env()` added to its configuration) and closed after. The returned object reads through to it.
 */
export function useTestApp(env: () => Record<string, string> = () => ({})): TestApp {
  let current: TestApp | undefined;
  beforeAll(async () => {
    current = await createTestApp(env());
  });
  afterAll(async () => {
    await current?.close();
  });
  return readThrough(() => current, ['app', 'db', 'dataDir', 'close']);
}

/**
 * An object whose properties `keys` read through, at each use, to what `current()` returns then:
 * for a value a `beforeAll` makes, handed out while its `describe` is being declared.
 */
export function readThrough<T extends object>(current: () => T | undefined, keys: (keyof T)[]): T {
  const view = {} as T;
  for (const key of keys) Object.defineProperty(view, key, { enumerable: true, get: () => current()![key] });
  return view;
}

/**
 * Runs `sql` on the test database as a superuser with triggers switched off for its session: the
 * one way to change a stored row of the append-only tables, as an attacker with the database would.
 */
export async function tamper(t: TestApp, sql: string, params: unknown[] = []): Promise<void> {
  const su = await superuserClient(t.db.name);
  try {
    await su.query('SET session_replication_role = replica');
    await su.query(sql, params);
  } finally {
    await su.end();
  }
}

/** Expects the database to refuse `sql` from the app's own role and from a superuser alike. */
export async function expectRefusedToAll(t: TestApp, appRole: DataSource, sql: string): Promise<void> {
  await expect(appRole.query(sql)).rejects.toThrow(/refused/);
  const su = await superuserClient(t.db.name);
  try {
    await expect(su.query(sql)).rejects.toThrow(/refused/);
  } finally {
    await su.end();
  }
}
