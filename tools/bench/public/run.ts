// Benchmark of the public lot data: GET /api/public/lots/{code} of a listed 50-entry lot, served
// by the built app and by a bare node:http + pg server running the same SQL (baseline.mjs) and
// answering the same JSON text (checked byte for byte before measuring), both
// on the same throw-away PostgreSQL, measured with autocannon at 64 connections, interleaved
// three times in one run. Prints the throughputs and p99 latencies, the ratios of the medians
// (targets: throughput ≥ 0.8×, p99 ≤ 1.5×) with the load average, and the public page's JS+CSS
// gzip size (target ≤ 120 KB). The lot's head is covered by a checkpoint, so every answer carries
// an inclusion proof (see baseline.mjs for how the bare servers make the same bytes).
// Usage: npm run build && npm run bench:public [-- SECONDS_PER_ROUND]
import { spawn, spawnSync, type ChildProcess } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import { existsSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { loadavg, tmpdir } from 'node:os';
import { join } from 'node:path';
import { DATA_DIR, readDemoReport, REPO } from '../../lib/app-env.ts';
import { pgEnv, startPrivateCluster, type PrivateCluster } from '../../lib/pg.ts';
import { freePort, onShutdown, stopChildren, track, waitFor } from '../../lib/proc.ts';
import { BUDGET_BYTES, measurePublicEntry } from './size.mjs';

interface CannonResult {
  requests: { average: number };
  latency: { p99: number };
  non2xx: number;
  errors: number;
  timeouts: number;
}
type Cannon = (opts: Record<string, unknown>) => Promise<CannonResult>;
const autocannon = createRequire(import.meta.url)('autocannon') as Cannon;

const SECONDS = Number(process.argv[2] ?? 8);
const CONNECTIONS = 64;
const ENTRIES = 50;
const SERVER = join(REPO, 'packages/server/dist');
const BASE = join(DATA_DIR, 'bench-public-pg');
let cluster: PrivateCluster | undefined;
let dataDir: string | undefined;

async function cleanup(): Promise<void> {
  await stopChildren();
  cluster?.stop();
  cluster = undefined;
  rmSync(BASE, { recursive: true, force: true });
  if (dataDir) rmSync(dataDir, { recursive: true, force: true });
}

function startNode(file: string, env: NodeJS.ProcessEnv): ChildProcess {
  return track(spawn('node', [file], { cwd: REPO, env, stdio: ['ignore', 'ignore', 'inherit'] }));
}

async function up(url: string, what: string): Promise<void> {
  await waitFor(async () => (await fetch(url)).status < 500, 60_000, what);
}

/** Signs in as the first demo dealer and writes a listed lot with `ENTRIES` entries through the API. */
async function makeLot(base: string, data: string): Promise<string> {
  const dealer = readDemoReport(data)?.signIns.find((s) => s.role === 'dealer');
  if (!dealer) throw new Error('the demo scenario has no dealer sign-in');
  const headers: Record<string, string> = { 'content-type': 'application/json', 'x-beadroll-request': '1' };
  const signIn = await fetch(`${base}/api/auth/sign-in`, {
    method: 'POST',
    headers,
    body: JSON.stringify({ email: dealer.email, password: dealer.password }),
  });
  if (!signIn.ok) throw new Error(`sign-in failed: ${signIn.status} ${await signIn.text()}`);
  headers.cookie = signIn.headers
    .getSetCookie()
    .map((c) => c.split(';')[0])
    .join('; ');
  const post = async (path: string, body: unknown) => {
    const r = await fetch(`${base}${path}`, { method: 'POST', headers, body: JSON.stringify(body) });
    if (!r.ok) throw new Error(`POST ${path}: ${r.status} ${await r.text()}`);
    return (await r.json()) as { code: string };
  };
  const lot = await post('/api/lots', {
    description: {
      title: 'Benchmark strand of amber drawn beads',
      form: 'strand',
      count: { value: 80, estimated: false },
      colours: ['amber'],
      baseGlass: ['transparent'],
      decoration: [],
      listed: true,
    },
  });
  for (let i = 1; i < ENTRIES; i++) {
    await post(`/api/lots/${lot.code}/observations`, {
      observations: {
        hole: 'clean',
        surface: i % 2 ? 'glossy' : 'worn',
        note: `Looked at again, round ${i}.`,
      },
    });
  }
  return lot.code;
}

async function measure(url: string): Promise<CannonResult> {
  return autocannon({ url, connections: CONNECTIONS, duration: SECONDS, pipelining: 1 });
}

/** The machine's load averages (1, 5 and 15 min): the figures mean little on a busy machine. */
const loadAverage = () =>
  `load average ${loadavg()
    .map((x) => x.toFixed(2))
    .join(', ')}`;

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)]!;

async function main(): Promise<void> {
  onShutdown(cleanup);
  for (const f of ['main.js', 'migrate.js', 'demo/seed.js'])
    if (!existsSync(join(SERVER, f))) throw new Error(`build first (npm run build): ${f} is missing`);
  rmSync(BASE, { recursive: true, force: true });
  cluster = await startPrivateCluster({
    base: BASE,
    port: await freePort(),
    durable: false,
    appUser: 'beadroll_bench',
    database: 'beadroll_bench',
  });
  dataDir = mkdtempSync(join(tmpdir(), 'beadroll-bench-'));
  const secret = join(dataDir, 'jwt.key');
  writeFileSync(secret, randomBytes(32).toString('hex'));
  const appPort = await freePort();
  const env: NodeJS.ProcessEnv = {
    ...process.env,
    ...pgEnv(cluster.target),
    NODE_ENV: 'production',
    PORT: String(appPort),
    HOST: '127.0.0.1',
    PUBLIC_BASE_URL: `http://127.0.0.1:${appPort}`,
    DATA_DIR: dataDir,
    JWT_SECRET_FILE: secret,
    DEMO_MODE: 'true',
    FAKE_SMTP: 'true',
    SMTP_PORT: '0',
    SCRYPT_COST: '1024',
    THROTTLE_LIMIT: '1000000',
    // A checkpoint follows the lot's last entry within a second or two, before measuring starts.
    CHECKPOINT_SECONDS: '1',
  };
  for (const script of ['migrate.js', 'demo/seed.js']) {
    const r = spawnSync('node', [join(SERVER, script)], { env, encoding: 'utf8' });
    if (r.status !== 0) throw new Error(`${script} failed:\n${r.stdout}\n${r.stderr}`);
  }
  startNode(join(SERVER, 'main.js'), env);
  const app = `http://127.0.0.1:${appPort}`;
  await up(`${app}/api/health`, 'the app');
  console.log(`writing a listed lot of ${ENTRIES} entries through the API…`);
  const code = await makeLot(app, dataDir);
  // Measured as a buyer sees a lot most of the time: its head covered by a signed checkpoint,
  // so the answer carries an inclusion proof. Nothing is written after this.
  let served = '';
  await waitFor(
    async () => {
      served = await (await fetch(`${app}/api/public/lots/${code}`)).text();
      const c = JSON.parse(served) as { bundle: { checkpoints: { inclusions: { seq: number }[] }[] } };
      return c.bundle.checkpoints[0]?.inclusions[0]?.seq === ENTRIES - 1;
    },
    30_000,
    'a checkpoint covering the lot',
  );
  const check = JSON.parse(served) as { bundle: { rolls: { entries: unknown[] }[] } };
  if (check.bundle.rolls[0]!.entries.length !== ENTRIES) throw new Error('the lot does not have 50 entries');

  // Two bare servers on the same pool size and the same kind of port (TCP on 127.0.0.1): the
  // plain one (the statement's text sent with each query) is the baseline the target is judged
  // by; the prepared one (a named statement, as the app runs it) is shown beside it.
  const bare = { baseline: await freePort(), prepared: await freePort() };
  startNode(join(REPO, 'tools/bench/public/baseline.mjs'), { ...env, PORT: String(bare.baseline) });
  startNode(join(REPO, 'tools/bench/public/baseline.mjs'), {
    ...env,
    PORT: String(bare.prepared),
    PREPARED: '1',
  });
  const targets = {
    beadroll: `${app}/api/public/lots/${code}`,
    baseline: `http://127.0.0.1:${bare.baseline}/api/public/lots/${code}`,
    prepared: `http://127.0.0.1:${bare.prepared}/api/public/lots/${code}`,
  };
  type Name = keyof typeof targets;
  const names = Object.keys(targets) as Name[];
  for (const name of ['baseline', 'prepared'] as const) {
    await up(targets[name], `the ${name} bare server`);
    if ((await (await fetch(targets[name])).text()) !== served)
      throw new Error(`the ${name} bare server does not serve the same JSON text`);
  }

  console.log(`warming up each for 2 s…`);
  for (const url of Object.values(targets)) await autocannon({ url, connections: CONNECTIONS, duration: 2 });
  const results: Record<Name, CannonResult[]> = { beadroll: [], baseline: [], prepared: [] };
  for (let round = 1; round <= 3; round++) {
    for (const name of names) {
      const r = await measure(targets[name]);
      if (r.non2xx || r.errors || r.timeouts)
        throw new Error(`${name}: ${r.non2xx} non-2xx, ${r.errors} errors, ${r.timeouts} timeouts`);
      results[name].push(r);
      console.log(
        `round ${round} ${name.padEnd(8)} ${r.requests.average.toFixed(0).padStart(6)} req/s  p99 ${r.latency.p99} ms`,
      );
    }
  }
  const rps = (n: Name) => median(results[n].map((r) => r.requests.average));
  const p99 = (n: Name) => median(results[n].map((r) => r.latency.p99));
  console.log('');
  console.log(
    `public data of a ${ENTRIES}-entry lot, ${CONNECTIONS} connections, ${SECONDS} s × 3 rounds each; ${loadAverage()}`,
  );
  for (const name of names)
    console.log(`  ${name.padEnd(8)}  median ${rps(name).toFixed(0)} req/s, p99 median ${p99(name)} ms`);
  const met = (ok: boolean) => (ok ? 'met' : 'NOT met');
  const ratio = rps('beadroll') / rps('baseline');
  const tail = p99('beadroll') / p99('baseline');
  console.log(`  throughput beadroll / baseline: ${ratio.toFixed(2)} (target ≥ 0.80) ${met(ratio >= 0.8)}`);
  console.log(`  p99 beadroll / baseline: ${tail.toFixed(2)} (target ≤ 1.5) ${met(tail <= 1.5)}`);
  console.log(
    `  for information, against the prepared bare server: throughput ${(rps('beadroll') / rps('prepared')).toFixed(2)}, ` +
      `p99 ${(p99('beadroll') / p99('prepared')).toFixed(2)}`,
  );
  const size = measurePublicEntry();
  console.log(
    `  public page JS+CSS: ${size.total} B gzip (${(size.total / 1024).toFixed(1)} KB; target ≤ ${BUDGET_BYTES / 1024} KB)`,
  );
  await cleanup();
}

main().catch(async (err: unknown) => {
  console.error(err);
  await cleanup();
  process.exit(1);
});
