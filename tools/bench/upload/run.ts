// Benchmark: upload 50 generated ~5 MB photos as exhibits to one lot of a running Beadroll
// server (built, on a throw-away PostgreSQL), one after another and then 4 at a time. Prints throughput against a
// baseline measured in the same run (a bare HTTP server that only writes the same bodies to
// disk) and the server's peak resident memory (VmHWM) while it takes the uploads, against a
// target of 300 MB. The peak is reset (Linux `/proc/PID/clear_refs`, value 5, see proc(5)) once
// the server is up and signed in: a sign-in alone takes scrypt's 128 MB for a moment (128·N·r
// bytes at N = 2^17, r = 8; RFC 7914 §2), which the peak since boot also shows.
// Usage: npm run build && npm run bench:upload [-- COUNT]
import { spawn } from 'node:child_process';
import { openAsBlob, readFileSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { DATA_DIR, REPO } from '../../lib/app-env.ts';
import { pgEnv, startPrivateCluster } from '../../lib/pg.ts';
import { freePort, runInherit, stopChildren, track, waitFor } from '../../lib/proc.ts';
import { benchPhotos } from './photos.ts';
import { startSink } from './sink.ts';

const COUNT = Number(process.argv[2] ?? 50);
const RSS_TARGET_MB = 300;
const base = join(DATA_DIR, 'bench-upload');

function vm(pid: number, key: 'VmHWM' | 'VmRSS'): number {
  const line = readFileSync(`/proc/${pid}/status`, 'utf8')
    .split('\n')
    .find((l) => l.startsWith(key));
  return line ? Number(line.replace(/\D+/g, '')) / 1024 : NaN; // kB → MB
}

async function uploadOne(url: string, file: string, i: number, headers: Record<string, string>) {
  const form = new FormData();
  form.append('kind', 'close-up');
  form.append('caption', `Bench photo ${i + 1}`);
  form.append('file', await openAsBlob(file, { type: 'image/jpeg' }), 'photo.jpg');
  const t = performance.now();
  const res = await fetch(url, { method: 'POST', body: form, headers });
  if (res.status !== 201) throw new Error(`upload ${i} answered ${res.status}: ${await res.text()}`);
  await res.arrayBuffer();
  return performance.now() - t;
}

/** Uploads `files` with `parallel` requests in flight; per-file times in ms. */
async function uploadAll(
  url: (i: number) => string,
  files: string[],
  headers: Record<string, string>,
  parallel = 1,
) {
  const start = performance.now();
  const times: number[] = [];
  let next = 0;
  await Promise.all(
    Array.from({ length: parallel }, async () => {
      while (next < files.length) {
        const i = next++;
        times.push(await uploadOne(url(i), files[i]!, i, headers));
      }
    }),
  );
  const bytes = files.reduce((n, f) => n + statSync(f).size, 0);
  const seconds = (performance.now() - start) / 1000;
  const sorted = times.sort((a, b) => a - b);
  const at = (p: number) => sorted[Math.min(sorted.length - 1, Math.floor(sorted.length * p))]!;
  return {
    seconds,
    mbPerSecond: bytes / 1024 / 1024 / seconds,
    filesPerSecond: files.length / seconds,
    p50: at(0.5),
    p95: at(0.95),
  };
}

async function main(): Promise<void> {
  console.log(`generating ${COUNT} photos (cached in .data/bench-upload/photos)…`);
  const files = await benchPhotos(join(base, 'photos'), COUNT);
  const avg = files.reduce((n, f) => n + statSync(f).size, 0) / files.length / 1024 / 1024;
  console.log(`  average size ${avg.toFixed(1)} MB`);

  const pgPort = await freePort();
  rmSync(join(base, 'pg'), { recursive: true, force: true });
  rmSync(join(base, 'data'), { recursive: true, force: true });
  const cluster = await startPrivateCluster({ base: join(base, 'pg'), port: pgPort, durable: false });
  const port = await freePort();
  const env: NodeJS.ProcessEnv = {
    ...process.env,
    ...pgEnv(cluster.target),
    PORT: String(port),
    DATA_DIR: join(base, 'data'),
    JWT_SECRET_FILE: join(base, 'jwt.key'),
    DEMO_MODE: 'true',
    FAKE_SMTP: 'true',
    THROTTLE_LIMIT: '1000000',
    EXHIBIT_QUOTA_BYTES: String(10 * 1024 * 1024 * 1024),
    // glibc's allocator set as tools/start.ts sets it for the app (see there and mallopt(3)).
    MALLOC_ARENA_MAX: process.env.MALLOC_ARENA_MAX ?? '2',
    MALLOC_MMAP_THRESHOLD_: process.env.MALLOC_MMAP_THRESHOLD_ ?? '69632',
  };
  const { ensureJwtSecret } = await import('../../lib/app-env.ts');
  env.JWT_SECRET_FILE = ensureJwtSecret(join(base, 'data'));
  try {
    const server = join(REPO, 'packages/server/dist');
    if ((await runInherit('node', [join(server, 'migrate.js')], { cwd: REPO, env })) !== 0)
      throw new Error('migrations failed');
    if ((await runInherit('node', [join(server, 'demo/seed.js')], { cwd: REPO, env })) !== 0)
      throw new Error('the demo scenario failed to load');
    const app = track(spawn('node', [join(server, 'main.js')], { cwd: REPO, env, stdio: 'inherit' }));
    const origin = `http://127.0.0.1:${port}`;
    await waitFor(async () => (await fetch(`${origin}/api/health`)).ok, 60_000, 'the server');

    const report = JSON.parse(readFileSync(join(base, 'data', 'demo-report.json'), 'utf8')) as {
      signIns: Array<{ role: string; email: string; password: string }>;
    };
    const dealer = report.signIns.find((s) => s.role === 'dealer');
    if (!dealer) throw new Error('the demo scenario has no dealer sign-in');
    const signIn = await fetch(`${origin}/api/auth/sign-in`, {
      method: 'POST',
      headers: { 'Content-Type': 'application/json', 'X-Beadroll-Request': '1' },
      body: JSON.stringify({ email: dealer.email, password: dealer.password }),
    });
    if (!signIn.ok) throw new Error(`sign-in answered ${signIn.status}`);
    const cookie = signIn.headers
      .getSetCookie()
      .map((c) => c.split(';')[0])
      .join('; ');
    const headers = { Cookie: cookie, 'X-Beadroll-Request': '1' };
    const created = await fetch(`${origin}/api/lots`, {
      method: 'POST',
      headers: { ...headers, 'Content-Type': 'application/json' },
      body: JSON.stringify({
        description: {
          title: 'Benchmark lot',
          form: 'loose',
          count: { value: 100, estimated: true },
          colours: ['amber'],
          baseGlass: ['transparent'],
          decoration: [],
          listed: false,
        },
      }),
    });
    if (created.status !== 201)
      throw new Error(`creating the lot answered ${created.status}: ${await created.text()}`);
    const { code } = (await created.json()) as { code: string };

    const pid = app.pid!;
    const idleMb = vm(pid, 'VmRSS');
    const bootPeakMb = vm(pid, 'VmHWM');
    writeFileSync(`/proc/${pid}/clear_refs`, '5');
    const sink = await startSink(join(base, 'sink'));
    console.log(`baseline: ${COUNT} bodies to a bare HTTP server that writes them to disk…`);
    const baseline = await uploadAll(() => `${sink.url}/`, files, {});
    sink.server.close();
    console.log(`exhibits: ${COUNT} photos to lot ${code}…`);
    const measured = await uploadAll(() => `${origin}/api/lots/${code}/exhibits`, files, headers);
    const onePeakMb = vm(pid, 'VmHWM');
    writeFileSync(`/proc/${pid}/clear_refs`, '5');
    // A slow machine can outlast the 15-minute access token: renew it (no password hashing, so
    // the memory peak stays the uploads' own).
    const renewed = await fetch(`${origin}/api/auth/session/refresh`, { method: 'POST', headers });
    if (!renewed.ok) throw new Error(`renewing the session answered ${renewed.status}`);
    const fresh = new Map(cookie.split('; ').map((c) => [c.split('=')[0], c] as const));
    for (const c of renewed.headers.getSetCookie()) fresh.set(c.split('=')[0]!, c.split(';')[0]!);
    headers.Cookie = [...fresh.values()].join('; ');
    console.log(`exhibits: the same ${COUNT} photos again, 4 at a time, to lot ${code}…`);
    const together = await uploadAll(() => `${origin}/api/lots/${code}/exhibits`, files, headers, 4);
    const fourPeakMb = vm(pid, 'VmHWM');
    const peakMb = Math.max(onePeakMb, fourPeakMb);

    console.log('');
    console.log(
      `baseline   ${baseline.mbPerSecond.toFixed(1)} MB/s  ${baseline.filesPerSecond.toFixed(2)} files/s`,
    );
    console.log(
      `exhibits   ${measured.mbPerSecond.toFixed(1)} MB/s  ${measured.filesPerSecond.toFixed(2)} files/s`,
    );
    console.log(
      `ratio      exhibits / baseline = ${(measured.mbPerSecond / baseline.mbPerSecond).toFixed(3)}`,
    );
    const ms = (x: number) => `${(x / 1000).toFixed(2)} s`;
    console.log(
      `per file, one at a time   p50 ${ms(measured.p50)}  p95 ${ms(measured.p95)}  (target p50 ≤ 1 s) ${measured.p50 <= 1000 ? 'met' : 'NOT met'}`,
    );
    console.log(
      `per file, 4 at a time     p50 ${ms(together.p50)}  p95 ${ms(together.p95)}  (${together.filesPerSecond.toFixed(2)} files/s)`,
    );
    console.log(
      `server RSS idle ${idleMb.toFixed(0)} MB, peak through both runs ${peakMb.toFixed(0)} MB (target < ${RSS_TARGET_MB} MB): ${peakMb < RSS_TARGET_MB ? 'met' : 'NOT met'}`,
    );
    console.log(
      `server RSS peak one at a time ${onePeakMb.toFixed(0)} MB, 4 at a time ${fourPeakMb.toFixed(0)} MB, after both ${vm(pid, 'VmRSS').toFixed(0)} MB`,
    );
    console.log(`server RSS peak from boot to the first upload (start, sign-in) ${bootPeakMb.toFixed(0)} MB`);
  } finally {
    await stopChildren();
    cluster.stop();
    rmSync(join(base, 'pg'), { recursive: true, force: true });
    rmSync(join(base, 'sink'), { recursive: true, force: true });
  }
}

main().catch(async (err: unknown) => {
  console.error(err);
  await stopChildren();
  process.exit(1);
});
