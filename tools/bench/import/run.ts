// Benchmark: import a 500-row CSV of lots (one request: checks every row, then registers all in
// one transaction) into a running Beadroll server (built, on a throw-away PostgreSQL), against a
// target of 20 s on this machine. The baseline, measured in the same run, registers the same 500
// lots one request at a time through the register endpoint, as the form does.
// Usage: npm run build && npm run bench:import [-- ROWS]
import { spawn } from 'node:child_process';
import { readFileSync, rmSync } from 'node:fs';
import { join } from 'node:path';
import { DATA_DIR, REPO, ensureJwtSecret } from '../../lib/app-env.ts';
import { pgEnv, startPrivateCluster } from '../../lib/pg.ts';
import { freePort, runInherit, stopChildren, track, waitFor } from '../../lib/proc.ts';

const ROWS = Number(process.argv[2] ?? 500);
const TARGET_SECONDS = 20;
const base = join(DATA_DIR, 'bench-import');
const HEADERS = [
  'Title',
  'Form',
  'Number of beads',
  'Bead size largest (mm)',
  'Colours',
  'Base glass',
  'Cost',
  'Currency',
];

function row(i: number): string[] {
  return [
    `Bench strand ${i}`,
    'strand',
    String(40 + (i % 30)),
    '8',
    'white; rose pink',
    'opaque',
    '12.50',
    'EUR',
  ];
}

function description(i: number) {
  return {
    title: `Bench strand ${i}`,
    form: 'strand',
    count: { value: 40 + (i % 30), estimated: false },
    diameterMm: { min: 8, max: 8 },
    colours: ['white', 'rose pink'],
    baseGlass: ['opaque'],
    decoration: [],
    listed: false,
  };
}

async function main(): Promise<void> {
  const pgPort = await freePort();
  rmSync(base, { recursive: true, force: true });
  const cluster = await startPrivateCluster({ base: join(base, 'pg'), port: pgPort, durable: false });
  const port = await freePort();
  const env: NodeJS.ProcessEnv = {
    ...process.env,
    ...pgEnv(cluster.target),
    PORT: String(port),
    DATA_DIR: join(base, 'data'),
    DEMO_MODE: 'true',
    FAKE_SMTP: 'true',
    THROTTLE_LIMIT: '1000000',
  };
  env.JWT_SECRET_FILE = ensureJwtSecret(join(base, 'data'));
  try {
    const server = join(REPO, 'packages/server/dist');
    if ((await runInherit('node', [join(server, 'migrate.js')], { cwd: REPO, env })) !== 0)
      throw new Error('migrations failed');
    if ((await runInherit('node', [join(server, 'demo/seed.js')], { cwd: REPO, env })) !== 0)
      throw new Error('the demo scenario failed to load');
    track(spawn('node', [join(server, 'main.js')], { cwd: REPO, env, stdio: 'inherit' }));
    const origin = `http://127.0.0.1:${port}`;
    await waitFor(async () => (await fetch(`${origin}/api/health`)).ok, 60_000, 'the server');
    const report = JSON.parse(readFileSync(join(base, 'data', 'demo-report.json'), 'utf8')) as {
      signIns: Array<{ role: string; email: string; password: string }>;
    };
    const dealer = report.signIns.find((s) => s.role === 'dealer')!;
    const signIn = await fetch(`${origin}/api/auth/sign-in`, {
      method: 'POST',
      headers: { 'Content-Type': 'application/json', 'X-Beadroll-Request': '1' },
      body: JSON.stringify({ email: dealer.email, password: dealer.password }),
    });
    if (!signIn.ok) throw new Error(`sign-in answered ${signIn.status}`);
    const headers = {
      Cookie: signIn.headers
        .getSetCookie()
        .map((c) => c.split(';')[0])
        .join('; '),
      'X-Beadroll-Request': '1',
    };

    console.log(`baseline: ${ROWS} lots registered one request at a time…`);
    let start = performance.now();
    for (let i = 0; i < ROWS; i++) {
      const res = await fetch(`${origin}/api/lots`, {
        method: 'POST',
        headers: { ...headers, 'Content-Type': 'application/json' },
        body: JSON.stringify({ description: description(i) }),
      });
      if (res.status !== 201) throw new Error(`register ${i} answered ${res.status}: ${await res.text()}`);
      await res.arrayBuffer();
    }
    const baseline = (performance.now() - start) / 1000;

    console.log(`import: a ${ROWS}-row CSV in one request…`);
    const csv = [HEADERS, ...Array.from({ length: ROWS }, (_, i) => row(i))]
      .map((r) => r.map((c) => `"${c}"`).join(','))
      .join('\n');
    const form = new FormData();
    form.append('file', new Blob([csv], { type: 'text/csv' }), 'lots.csv');
    start = performance.now();
    const res = await fetch(`${origin}/api/lot-imports`, { method: 'POST', body: form, headers });
    const text = await res.text();
    const seconds = (performance.now() - start) / 1000;
    const last = JSON.parse(text.trim().split('\n').at(-1)!) as { codes?: string[] };
    if (res.status !== 201 || last.codes?.length !== ROWS)
      throw new Error(`the import answered ${res.status}: ${text.slice(0, 500)}`);

    console.log('');
    console.log(
      `baseline   ${baseline.toFixed(2)} s  (${(ROWS / baseline).toFixed(1)} lots/s, one request each)`,
    );
    console.log(`import     ${seconds.toFixed(2)} s  (${(ROWS / seconds).toFixed(1)} lots/s, one request)`);
    console.log(`ratio      import / baseline = ${(seconds / baseline).toFixed(3)}`);
    console.log(
      `target     ${ROWS} rows in at most ${TARGET_SECONDS} s: ${seconds <= TARGET_SECONDS ? 'met' : 'NOT met'}`,
    );
  } finally {
    await stopChildren();
    cluster.stop();
    rmSync(join(base, 'pg'), { recursive: true, force: true });
  }
}

main().catch(async (err: unknown) => {
  console.error(err);
  await stopChildren();
  process.exit(1);
});
