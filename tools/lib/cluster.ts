// Several Beadroll servers behind HAProxy, a PostgreSQL primary with a streaming hot standby,
// exhibits in S3 (a local fake S3 server) and one fake SMTP server every instance sends to, whose
// mail each instance's /dev/mailbox page shows: used by `npm run start:cluster` and by the
// cluster test. Everything listens on 127.0.0.1.
import { spawn, type ChildProcess } from 'node:child_process';
import { existsSync, mkdirSync, writeFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import type { AddressInfo } from 'node:net';
import { join } from 'node:path';
import { ensureJwtSecret, REPO } from './app-env.ts';
import { pgEnv, startPrivateCluster, startStandby, type PrivateCluster, type Standby } from './pg.ts';
import { aptInstall, freePort, runInherit, track, UserFacingError, waitFor } from './proc.ts';

/** One running app instance. */
export interface Instance {
  name: string;
  port: number;
  process: ChildProcess;
}

export interface Cluster {
  /** The balancer's address: what users and tests talk to. */
  url: string;
  instances: Instance[];
  primary: PrivateCluster;
  standby: Standby;
  /** Environment of the app instances (PG*, storage, secrets) for one-off commands (audit, seed). */
  env: NodeJS.ProcessEnv;
  /** Kills one instance at once (SIGKILL), as a crash would. */
  kill(name: string): void;
  stop(): Promise<void>;
}

export interface ClusterOptions {
  /** Folder for the primary, the standby, the fake S3's files and the balancer's configuration. */
  dir: string;
  /** Port of the balancer. */
  port: number;
  /** Port of the primary; the standby takes a free port. */
  pgPort: number;
  instances: number;
  /** false for throw-away test clusters (no fsync). */
  durable: boolean;
  /** Data folder of the app (secrets, upload scratch space, demo report). */
  dataDir: string;
  /** Load the demo scenario once, before the instances start. */
  demo: boolean;
  /** Extra environment for every instance. */
  extraEnv?: NodeJS.ProcessEnv;
  log?: (line: string) => void;
}

const HAPROXY = '/usr/sbin/haproxy';
const BUCKET = 'beadroll-exhibits';

function haproxyConfig(port: number, instances: Array<{ name: string; port: number }>): string {
  return [
    'global',
    '  maxconn 4096',
    'defaults',
    '  mode http',
    '  timeout connect 2s',
    '  timeout client 120s',
    '  timeout server 120s',
    // A request that could not reach a server (refused connection) goes to another one;
    // a request a server received is never sent twice.
    '  retries 3',
    '  option redispatch',
    '  option forwardfor',
    'frontend beadroll',
    `  bind 127.0.0.1:${port}`,
    '  default_backend app',
    'backend app',
    '  balance roundrobin',
    '  option httpchk GET /api/health',
    '  http-check expect status 200',
    '  default-server inter 1s fall 2 rise 1',
    ...instances.map((i) => `  server ${i.name} 127.0.0.1:${i.port} check`),
    '',
  ].join('\n');
}

/** Starts the whole cluster. The caller has built the project (`npm run build`). */
export async function startCluster(opts: ClusterOptions): Promise<Cluster> {
  const log = opts.log ?? ((line: string) => console.log(line));
  if (!existsSync(HAPROXY)) aptInstall(['haproxy'], 'the load balancer of the cluster');
  mkdirSync(opts.dir, { recursive: true });

  log(`starting the PostgreSQL primary on 127.0.0.1:${opts.pgPort}…`);
  const primary = await startPrivateCluster({
    base: join(opts.dir, 'pg'),
    port: opts.pgPort,
    durable: opts.durable,
  });
  const standbyPort = await freePort();
  log(`starting its streaming hot standby on 127.0.0.1:${standbyPort}…`);
  const standby = await startStandby({
    primaryBase: join(opts.dir, 'pg'),
    primaryPort: opts.pgPort,
    appUser: primary.target.user,
    base: join(opts.dir, 'pg-standby'),
    port: standbyPort,
    durable: opts.durable,
  });

  const s3Port = await freePort();
  // The fake S3 server the tests use, in this process; exhibits live in its folder.
  const S3rver = createRequire(import.meta.url)('s3rver') as new (o: Record<string, unknown>) => {
    run(): Promise<unknown>;
    close(): Promise<void>;
  };
  const s3 = new S3rver({
    port: s3Port,
    address: '127.0.0.1',
    silent: true,
    directory: join(opts.dir, 's3'),
    configureBuckets: [{ name: BUCKET }],
  });
  await s3.run();
  log(`fake S3 on 127.0.0.1:${s3Port} (bucket ${BUCKET})`);

  // One mailbox for the whole cluster (unless FAKE_SMTP=false asks for a real SMTP server): a
  // fake SMTP server in this process that every instance sends to, its messages served to the
  // instances' mailbox pages (MAILBOX_URL).
  let mail: { smtpPort: number; url: string; close(): Promise<void> } | undefined;
  if ((process.env.FAKE_SMTP ?? 'true') !== 'false') {
    const { MailCatcher, serveMessages } = createRequire(import.meta.url)(
      join(REPO, 'packages/server/dist/mail/mail-catcher.js'),
    ) as typeof import('../../packages/server/src/mail/mail-catcher.ts');
    const catcher = new MailCatcher();
    const smtpPort = await catcher.listen(0);
    const http = await serveMessages(catcher, 0);
    const url = `http://127.0.0.1:${(http.address() as AddressInfo).port}`;
    mail = {
      smtpPort,
      url,
      async close() {
        await catcher.close();
        await new Promise((r) => http.close(r));
      },
    };
    log(`fake SMTP on 127.0.0.1:${smtpPort}, the one mailbox of every instance`);
  }

  const publicBaseUrl = process.env.PUBLIC_BASE_URL ?? `http://127.0.0.1:${opts.port}`;
  const env: NodeJS.ProcessEnv = {
    ...process.env,
    ...pgEnv(primary.target),
    PG_STANDBY_HOST: '127.0.0.1',
    PG_STANDBY_PORT: String(standbyPort),
    PUBLIC_BASE_URL: publicBaseUrl,
    DATA_DIR: opts.dataDir,
    JWT_SECRET_FILE: ensureJwtSecret(opts.dataDir),
    STORAGE_DRIVER: 's3',
    S3_BUCKET: BUCKET,
    S3_ENDPOINT: `http://127.0.0.1:${s3Port}`,
    S3_REGION: 'us-east-1',
    S3_ACCESS_KEY_ID: 'S3RVER',
    S3_SECRET_ACCESS_KEY: 'S3RVER',
    S3_FORCE_PATH_STYLE: 'true',
    DEMO_MODE: opts.demo ? 'true' : (process.env.DEMO_MODE ?? 'false'),
    ...(mail
      ? {
          FAKE_SMTP: 'false',
          SMTP_HOST: '127.0.0.1',
          SMTP_PORT: String(mail.smtpPort),
          MAILBOX_URL: mail.url,
        }
      : { FAKE_SMTP: 'false' }),
    MALLOC_ARENA_MAX: process.env.MALLOC_ARENA_MAX ?? '2',
    MALLOC_MMAP_THRESHOLD_: process.env.MALLOC_MMAP_THRESHOLD_ ?? '69632',
    ...opts.extraEnv,
  };
  delete env.PORT;

  const server = join(REPO, 'packages/server/dist');
  if ((await runInherit('node', [join(server, 'migrate.js')], { cwd: REPO, env })) !== 0)
    throw new UserFacingError('database migrations failed (see above).');
  if (opts.demo && (await runInherit('node', [join(server, 'demo/seed.js')], { cwd: REPO, env })) !== 0)
    throw new UserFacingError('loading the demo scenario failed (see above).');

  const instances: Instance[] = [];
  for (let i = 0; i < opts.instances; i++) {
    const port = await freePort();
    const name = `app-${i + 1}`;
    const child = track(
      spawn('node', [join(server, 'main.js')], {
        cwd: REPO,
        env: { ...env, PORT: String(port), INSTANCE_NAME: name },
        stdio: ['ignore', 'inherit', 'inherit'],
      }),
    );
    instances.push({ name, port, process: child });
  }
  for (const i of instances)
    await waitFor(
      async () => (await fetch(`http://127.0.0.1:${i.port}/api/health`)).ok,
      60_000,
      `${i.name} to answer /api/health`,
    );

  const cfg = join(opts.dir, 'haproxy.cfg');
  writeFileSync(cfg, haproxyConfig(opts.port, instances));
  const balancer = track(spawn(HAPROXY, ['-f', cfg, '-db'], { stdio: ['ignore', 'inherit', 'inherit'] }));
  const url = `http://127.0.0.1:${opts.port}`;
  await waitFor(async () => (await fetch(`${url}/api/health`)).ok, 30_000, 'HAProxy to answer /api/health');
  log(`HAProxy on ${url}, balancing ${instances.map((i) => `${i.name} (:${i.port})`).join(', ')}`);

  return {
    url,
    instances,
    primary,
    standby,
    env,
    kill(name: string) {
      instances.find((i) => i.name === name)?.process.kill('SIGKILL');
    },
    async stop() {
      balancer.kill('SIGTERM');
      for (const i of instances) i.process.kill('SIGTERM');
      await Promise.all(
        [balancer, ...instances.map((i) => i.process)].map(
          (c) =>
            new Promise((r) => (c.exitCode !== null || c.signalCode !== null ? r(null) : c.once('exit', r))),
        ),
      );
      await s3.close();
      await mail?.close();
      standby.stop();
      primary.stop();
    },
  };
}
