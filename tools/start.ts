// `npm start`: PostgreSQL (private cluster unless PGHOST is set), migrations, demo scenario,
// fake SMTP, the built web app, and one NestJS process serving it all.
import { spawn } from 'node:child_process';
import { existsSync } from 'node:fs';
import { join } from 'node:path';
import { DATA_DIR, demoBanner, ensureJwtSecret, portFromEnv, readDemoReport, REPO } from './lib/app-env.ts';
import { pgEnv, startPrivateCluster, type PgTarget, type PrivateCluster } from './lib/pg.ts';
import {
  onShutdown,
  portInUse,
  runInherit,
  stopChildren,
  track,
  UserFacingError,
  waitFor,
} from './lib/proc.ts';

let cluster: PrivateCluster | undefined;
let stopping = false;

async function main(): Promise<void> {
  const port = portFromEnv('PORT', 3000);
  if (await portInUse(port)) {
    throw new UserFacingError(
      `PORT ${port} is already in use on 127.0.0.1: stop what holds it, or set PORT to another port.`,
    );
  }

  onShutdown(async () => {
    stopping = true;
    await stopChildren();
    cluster?.stop();
  });

  let target: PgTarget;
  if (process.env.PGHOST) {
    target = {
      host: process.env.PGHOST,
      port: portFromEnv('PGPORT', 5432),
      user: process.env.PGUSER ?? 'beadroll',
      password: process.env.PGPASSWORD ?? '',
      database: process.env.PGDATABASE ?? 'beadroll',
    };
    console.log(`using PostgreSQL at ${target.host}:${target.port}/${target.database}`);
  } else {
    const pgPort = portFromEnv('PGPORT', 55432);
    console.log(`starting PostgreSQL on 127.0.0.1:${pgPort} (data in .data/pg)…`);
    cluster = await startPrivateCluster({ base: join(DATA_DIR, 'pg'), port: pgPort, durable: true });
    target = cluster.target;
  }

  const env: NodeJS.ProcessEnv = {
    ...process.env,
    ...pgEnv(target),
    PORT: String(port),
    HOST: process.env.HOST ?? '127.0.0.1',
    PUBLIC_BASE_URL: process.env.PUBLIC_BASE_URL ?? `http://127.0.0.1:${port}`,
    DATA_DIR,
    JWT_SECRET_FILE: ensureJwtSecret(DATA_DIR),
    DEMO_MODE: 'true',
    FAKE_SMTP: process.env.FAKE_SMTP ?? 'true',
    DEV_MAILBOX: 'true',
    // glibc gives each thread that allocates (libvips' workers decoding photos) an arena of its
    // own, and freed memory stays in them: two arenas keep the resident size of the server down.
    // A fixed mmap threshold makes large image buffers go back to the system when freed, instead
    // of the threshold growing until they stay in the heap. 68 KiB: just above Node's 64 KiB
    // stream chunks (those stay in the heap), below libvips' line buffers for a photo scaled to
    // 1600–2000 px (about 75–100 KiB), which otherwise stay behind in the arenas.
    // Both are glibc tunables read at process start (mallopt(3): M_ARENA_MAX, M_MMAP_THRESHOLD).
    MALLOC_ARENA_MAX: process.env.MALLOC_ARENA_MAX ?? '2',
    MALLOC_MMAP_THRESHOLD_: process.env.MALLOC_MMAP_THRESHOLD_ ?? '69632',
  };

  console.log('building core, the verifier, server and web…');
  if ((await runInherit('npm', ['run', '--silent', 'build'], { cwd: REPO })) !== 0) {
    throw new UserFacingError('the build failed (see above).');
  }
  const server = join(REPO, 'packages/server/dist');
  if ((await runInherit('node', [join(server, 'migrate.js')], { cwd: REPO, env })) !== 0) {
    throw new UserFacingError('database migrations failed (see above).');
  }
  const seed = join(server, 'demo/seed.js');
  if (existsSync(seed) && (await runInherit('node', [seed], { cwd: REPO, env })) !== 0) {
    throw new UserFacingError('loading the demo scenario failed (see above).');
  }

  const app = track(spawn('node', [join(server, 'main.js')], { cwd: REPO, env, stdio: 'inherit' }));
  app.on('exit', (code) => {
    if (stopping) return;
    console.error(`the server stopped (exit ${code}).`);
    cluster?.stop();
    process.exit(code || 1);
  });
  const base = `http://127.0.0.1:${port}`;
  await waitFor(
    async () => (await fetch(`${base}/api/health`)).ok,
    60_000,
    'the server to answer /api/health',
  );

  const report = readDemoReport(DATA_DIR);
  const lines = ['', `Beadroll is running at ${env.PUBLIC_BASE_URL}/`, `API documentation: ${base}/api/docs`];
  lines.push(`development mailbox: ${base}/dev/mailbox`);
  const logKey = await fetch(`${base}/api/log/key`).then((r) => (r.ok ? r.text() : ''));
  if (logKey) lines.push(`public log verifier key (also at ${base}/api/log/key): ${logKey.trim()}`);
  if (report) lines.push(...demoBanner(report, base));
  lines.push('Press Ctrl+C to stop.', '');
  console.log(lines.join('\n'));
}

main().catch(async (err: unknown) => {
  console.error(err instanceof UserFacingError ? `npm start: ${err.message}` : err);
  await stopChildren();
  cluster?.stop();
  process.exit(1);
});
