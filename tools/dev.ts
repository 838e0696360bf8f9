// `npm run dev`: the API (rebuilt and restarted on change) and Vite with hot reload, /api proxied.
import { spawn } from 'node:child_process';
import { join } from 'node:path';
import { DATA_DIR, ensureJwtSecret, portFromEnv, REPO } from './lib/app-env.ts';
import { pgEnv, startPrivateCluster, type PrivateCluster } from './lib/pg.ts';
import { onShutdown, runInherit, stopChildren, track, UserFacingError } from './lib/proc.ts';

let cluster: PrivateCluster | undefined;

async function main(): Promise<void> {
  const port = portFromEnv('PORT', 3000);
  onShutdown(async () => {
    await stopChildren();
    cluster?.stop();
  });
  const pg = process.env.PGHOST
    ? {}
    : pgEnv(
        (cluster = await startPrivateCluster({
          base: join(DATA_DIR, 'pg'),
          port: portFromEnv('PGPORT', 55432),
          durable: true,
        })).target,
      );
  const env: NodeJS.ProcessEnv = {
    ...process.env,
    ...pg,
    PORT: String(port),
    DATA_DIR,
    JWT_SECRET_FILE: ensureJwtSecret(DATA_DIR),
    PUBLIC_BASE_URL: process.env.PUBLIC_BASE_URL ?? 'http://127.0.0.1:5173',
    DEMO_MODE: 'true',
    FAKE_SMTP: 'true',
    DEV_MAILBOX: 'true',
  };
  await runInherit('npm', ['run', '--silent', 'build', '-w', '@beadroll/core'], { cwd: REPO });
  await runInherit('npm', ['run', '--silent', 'build', '-w', '@beadroll/verify'], { cwd: REPO });
  await runInherit('npm', ['run', '--silent', 'build', '-w', '@beadroll/server'], { cwd: REPO });
  await runInherit('node', ['packages/server/dist/migrate.js'], { cwd: REPO, env });
  const server = join(REPO, 'packages/server');
  track(
    spawn('npx', ['tsc', '-p', 'tsconfig.build.json', '--watch', '--preserveWatchOutput'], {
      cwd: server,
      stdio: 'ignore',
    }),
  );
  track(spawn('node', ['--watch', 'dist/main.js'], { cwd: server, env, stdio: 'inherit' }));
  track(
    spawn('npx', ['vite', '--port', '5173', '--strictPort'], {
      cwd: join(REPO, 'packages/web'),
      env,
      stdio: 'inherit',
    }),
  );
  console.log('\ndev: web with hot reload at http://127.0.0.1:5173/ (API on port ' + port + ')\n');
}

main().catch(async (err: unknown) => {
  console.error(err instanceof UserFacingError ? `npm run dev: ${err.message}` : err);
  await stopChildren();
  cluster?.stop();
  process.exit(1);
});
