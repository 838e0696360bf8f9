// The built app on a throw-away PostgreSQL cluster with the demo scenario loaded, for the
// benchmarks that need a whole running server (page load, transferred bytes, scale).
import { spawn, spawnSync } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import { existsSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { DATA_DIR, readDemoReport, REPO, type DemoReport } from '../../lib/app-env.ts';
import { pgEnv, startPrivateCluster, type PrivateCluster } from '../../lib/pg.ts';
import { freePort, onShutdown, stopChildren, track, waitFor } from '../../lib/proc.ts';

export interface BenchApp {
  origin: string;
  env: NodeJS.ProcessEnv;
  demo: DemoReport;
  pid: number;
  stop(): Promise<void>;
}

const SERVER = join(REPO, 'packages/server/dist');

/**
 * Starts a private cluster under `.data/<name>-pg`, migrates, loads the demo scenario and starts
 * the built server in production mode. `stop()` (also run on Ctrl+C) ends both and deletes them.
 */
export async function startBenchApp(name: string, extraEnv: NodeJS.ProcessEnv = {}): Promise<BenchApp> {
  for (const f of ['main.js', 'migrate.js', 'demo/seed.js'])
    if (!existsSync(join(SERVER, f))) throw new Error(`build first (npm run build): ${f} is missing`);
  const base = join(DATA_DIR, `${name}-pg`);
  rmSync(base, { recursive: true, force: true });
  let cluster: PrivateCluster | undefined;
  const dataDir = mkdtempSync(join(tmpdir(), `beadroll-${name}-`));
  const stop = async () => {
    await stopChildren();
    cluster?.stop();
    cluster = undefined;
    rmSync(base, { recursive: true, force: true });
    rmSync(dataDir, { recursive: true, force: true });
  };
  onShutdown(stop);
  cluster = await startPrivateCluster({
    base,
    port: await freePort(),
    durable: false,
    appUser: 'beadroll_bench',
    database: 'beadroll_bench',
  });
  const secret = join(dataDir, 'jwt.key');
  writeFileSync(secret, randomBytes(32).toString('hex'));
  const port = await freePort();
  const env: NodeJS.ProcessEnv = {
    ...process.env,
    ...pgEnv(cluster.target),
    NODE_ENV: 'production',
    PORT: String(port),
    HOST: '127.0.0.1',
    PUBLIC_BASE_URL: `http://127.0.0.1:${port}`,
    DATA_DIR: dataDir,
    JWT_SECRET_FILE: secret,
    DEMO_MODE: 'true',
    FAKE_SMTP: 'true',
    SMTP_PORT: '0',
    SCRYPT_COST: '1024',
    THROTTLE_LIMIT: '1000000',
    MALLOC_ARENA_MAX: '2',
    MALLOC_MMAP_THRESHOLD_: '69632',
    ...extraEnv,
  };
  for (const script of ['migrate.js', 'demo/seed.js']) {
    const r = spawnSync('node', [join(SERVER, script)], { env, encoding: 'utf8' });
    if (r.status !== 0) throw new Error(`${script} failed:\n${r.stdout}\n${r.stderr}`);
  }
  const child = track(
    spawn('node', [join(SERVER, 'main.js')], { cwd: REPO, env, stdio: ['ignore', 'ignore', 'inherit'] }),
  );
  const origin = `http://127.0.0.1:${port}`;
  await waitFor(async () => (await fetch(`${origin}/api/health`)).ok, 60_000, 'the app');
  const demo = readDemoReport(dataDir);
  if (!demo) throw new Error('the demo scenario wrote no report');
  return { origin, env, demo, pid: child.pid!, stop };
}
