// `npm run test:cluster`: Beadroll past one machine, tried on this one. Starts two app instances
// behind HAProxy, a PostgreSQL primary with a streaming hot standby and a fake S3 (a throw-away
// cluster in .data/test-cluster), then checks that both instances serve, a session works on
// either, every instance's mail lands in one mailbox, writes go through both, public reads (lot
// data, lots with parents, bundles, exhibit files) come from the standby while a writer reads
// their own writes, a killed instance loses
// no acknowledged write while the balancer keeps serving, and the full-ledger audit passes.
// Prints a table and ends with "N passed, M failed". `--built` skips the build.
import { rmSync } from 'node:fs';
import { join } from 'node:path';
import pg from 'pg';
import { DATA_DIR, readDemoReport, REPO } from './lib/app-env.ts';
import { startCluster, type Cluster } from './lib/cluster.ts';
import { freePort, onShutdown, runInherit, stopChildren, UserFacingError } from './lib/proc.ts';

const dir = join(DATA_DIR, 'test-cluster');
let cluster: Cluster | undefined;
const results: Array<{ check: string; ok: boolean; detail: string }> = [];

function record(check: string, ok: boolean, detail: string): void {
  results.push({ check, ok, detail });
  console.log(`${ok ? 'PASS' : 'FAIL'}  ${check}: ${detail}`);
}

const description = (title: string) => ({
  title,
  form: 'strand',
  count: { value: 30, estimated: false },
  colours: ['white'],
  baseGlass: ['opaque'],
  decoration: ['roses'],
  listed: true,
});

/** Runs `n` tasks, `width` at a time, in order of index. */
async function pool<T>(n: number, width: number, task: (i: number) => Promise<T>): Promise<T[]> {
  const out = new Array<T>(n);
  let next = 0;
  await Promise.all(
    Array.from({ length: width }, async () => {
      while (next < n) {
        const i = next++;
        out[i] = await task(i);
      }
    }),
  );
  return out;
}

async function main(): Promise<number> {
  onShutdown(async () => {
    await cluster?.stop();
    await stopChildren();
  });
  rmSync(dir, { recursive: true, force: true });
  if (!process.argv.includes('--built')) {
    if ((await runInherit('npm', ['run', '--silent', 'build'], { cwd: REPO })) !== 0)
      throw new UserFacingError('the build failed (see above).');
  }
  const started = Date.now();
  cluster = await startCluster({
    dir,
    port: await freePort(),
    pgPort: await freePort(),
    instances: 2,
    durable: false,
    dataDir: join(dir, 'app'),
    demo: true,
    // Fast password hashing and room for the many sign-ins of a test; nothing else differs.
    extraEnv: { SCRYPT_COST: '1024', THROTTLE_LIMIT: '1000' },
  });
  const c = cluster;
  const report = readDemoReport(join(dir, 'app'))!;
  const dealer = report.signIns.find((s) => s.role === 'dealer')!;
  const db = new pg.Client({
    host: String(c.env.PGHOST),
    port: Number(c.env.PGPORT),
    user: String(c.env.PGUSER),
    password: String(c.env.PGPASSWORD),
    database: String(c.env.PGDATABASE),
  });
  await db.connect();
  try {
    // 1. Both instances answer through the balancer.
    const seen = new Set<string>();
    for (let i = 0; i < 10; i++) {
      const r = await fetch(`${c.url}/api/health`);
      seen.add(((await r.json()) as { instance: string }).instance);
    }
    record('both instances serve through the balancer', seen.size === 2, [...seen].sort().join(', '));

    // 2. A session made on one instance works on every instance (shared secret, sessions in PostgreSQL).
    const signIn = await fetch(`${c.url}/api/auth/sign-in`, {
      method: 'POST',
      headers: { 'content-type': 'application/json', 'x-beadroll-request': '1' },
      body: JSON.stringify({ email: dealer.email, password: dealer.password }),
    });
    const cookie = (signIn.headers.getSetCookie?.() ?? []).map((x) => x.split(';')[0]).join('; ');
    const who = new Map<string, number>();
    for (let i = 0; i < 6; i++) {
      const r = await fetch(`${c.url}/api/lots`, { headers: { cookie } });
      const inst = r.headers.get('beadroll-instance') ?? '?';
      who.set(inst, (who.get(inst) ?? 0) + (r.ok ? 1 : 0));
    }
    record(
      'a session works on every instance',
      signIn.ok && who.size === 2 && [...who.values()].every((n) => n === 3),
      [...who].map(([k, v]) => `${k}: ${v} answered`).join(', '),
    );

    // 2b. One mailbox: a letter sent by each instance shows on every instance's mailbox page.
    for (const i of c.instances)
      await fetch(`http://127.0.0.1:${i.port}/api/auth/forgot-password`, {
        method: 'POST',
        headers: { 'content-type': 'application/json', 'x-beadroll-request': '1' },
        body: JSON.stringify({ email: dealer.email }),
      });
    const letters = await Promise.all(
      c.instances.map(async (i) => {
        const html = await (await fetch(`http://127.0.0.1:${i.port}/dev/mailbox`)).text();
        return html.split(`To ${dealer.email}`).length - 1;
      }),
    );
    record(
      'one mailbox: every instance’s mailbox page shows the mail every instance sent',
      letters.every((n) => n >= c.instances.length),
      c.instances.map((i, k) => `${i.name} shows ${letters[k]} letters to the dealer`).join(', '),
    );

    const register = async (title: string) => {
      try {
        const r = await fetch(`${c.url}/api/lots`, {
          method: 'POST',
          headers: { 'content-type': 'application/json', 'x-beadroll-request': '1', cookie },
          body: JSON.stringify({ description: description(title) }),
        });
        const body = (await r.json().catch(() => ({}))) as { code?: string };
        return {
          status: r.status,
          instance: r.headers.get('beadroll-instance'),
          code: body.code ?? null,
          title,
        };
      } catch (e) {
        return { status: 0, instance: null, code: null, title, error: String(e) };
      }
    };

    // 3. Concurrent writes through both instances.
    const run = Date.now().toString(36);
    const first = await pool(30, 6, (i) => register(`cluster ${run} a${i}`));
    const through = new Set(first.map((r) => r.instance));
    record(
      'concurrent writes through both instances',
      first.every((r) => r.status === 201) && through.size === 2,
      `${first.filter((r) => r.status === 201).length}/30 registered, through ${[...through].sort().join(' and ')}`,
    );

    // 4. Public reads of a listed lot come from the standby (once it has replayed the write).
    const code = first.find((r) => r.code)?.code ?? undefined;
    let from = '';
    const until = Date.now() + 15_000;
    while (Date.now() < until) {
      const r = await fetch(`${c.url}/api/public/lots/${code}`);
      from = r.headers.get('beadroll-read-from') ?? `status ${r.status}`;
      if (r.ok && from === 'standby') break;
      await new Promise((res) => setTimeout(res, 250));
    }
    const health = (await (await fetch(`${c.url}/api/health`)).json()) as { standby: { lagMs: number } };
    record(
      'public reads are answered by the standby',
      from === 'standby',
      `read from ${from}, lag ${health.standby.lagMs} ms`,
    );

    // 4b. The other public reads come from the standby too: a lot's export bundle, a lot with
    // parents (its ancestors walked on the standby), and a public exhibit's file.
    const fromStandby = async (path: string): Promise<string> => {
      let seen = '';
      const end = Date.now() + 15_000;
      while (Date.now() < end) {
        const r = await fetch(`${c.url}${path}`);
        await r.arrayBuffer();
        seen = r.ok ? (r.headers.get('beadroll-read-from') ?? 'no header') : `status ${r.status}`;
        if (seen === 'standby') break;
        await new Promise((res) => setTimeout(res, 250));
      }
      return seen;
    };
    const child = report.publicLots.find((p) => p.why === 'split child')?.code;
    const exhibit = (
      await db.query(
        `SELECT x."lot_code" AS "code", x."seq" FROM "exhibits" x
           JOIN "lot_views" v ON v."code" = x."lot_code" AND v."listed"
          WHERE NOT x."sealed" ORDER BY x."lot_code", x."seq" LIMIT 1`,
      )
    ).rows[0] as { code: string; seq: number } | undefined;
    const reads: Array<[string, string | undefined]> = [
      ['a listed lot’s export bundle', code && `/api/public/lots/${code}/bundle`],
      ['a lot with parents (split child)', child && `/api/public/lots/${child}`],
      ['the bundle of a lot with parents', child && `/api/public/lots/${child}/bundle`],
      [
        'a public exhibit’s file',
        exhibit && `/api/public/lots/${exhibit.code}/exhibits/${exhibit.seq}/thumb`,
      ],
    ];
    for (const [what, path] of reads) {
      const seenFrom = path ? await fromStandby(path) : 'nothing to read in the demo data';
      record(`public read from the standby: ${what}`, seenFrom === 'standby', `read from ${seenFrom}`);
    }

    // 4c. A writer reads their own write at once: their reads go to the primary.
    const mine = await register(`cluster ${run} own`);
    const own = await fetch(`${c.url}/api/public/lots/${mine.code}`, { headers: { cookie } });
    const ownBody = (await own.json().catch(() => ({}))) as { code?: string };
    const ownBundle = await fetch(`${c.url}/api/public/lots/${mine.code}/bundle`, { headers: { cookie } });
    await ownBundle.arrayBuffer();
    record(
      'a writer reads their own write at once (from the primary)',
      mine.status === 201 &&
        own.ok &&
        ownBody.code === mine.code &&
        own.headers.get('beadroll-read-from') === 'primary' &&
        ownBundle.ok &&
        ownBundle.headers.get('beadroll-read-from') === 'primary',
      `registered ${mine.status}; public data ${own.status} from ${own.headers.get('beadroll-read-from')}, bundle ${ownBundle.status} from ${ownBundle.headers.get('beadroll-read-from')}`,
    );

    // 5. One instance killed in the middle of a burst.
    let acknowledged = 0;
    let killedAt = -1;
    const burst = await pool(80, 4, async (i) => {
      const r = await register(`cluster ${run} b${i}`);
      if (r.status === 201 && ++acknowledged === 20 && killedAt < 0) {
        killedAt = i;
        c.kill('app-1');
      }
      return r;
    });
    const acked = burst.filter((r) => r.status === 201);
    const tail = burst.slice(-30);
    const stored = (await db.query(
      `SELECT v."title", count(*)::int AS "n" FROM "lot_views" v WHERE v."title" LIKE $1 GROUP BY v."title"`,
      [`cluster ${run} b%`],
    )) as { rows: Array<{ title: string; n: number }> };
    const byTitle = new Map(stored.rows.map((r) => [r.title, r.n]));
    const lost = acked.filter((r) => byTitle.get(r.title) !== 1).length;
    const doubled = stored.rows.filter((r) => r.n > 1).length;
    record(
      'a killed instance loses no acknowledged write; the balancer keeps serving',
      killedAt >= 0 && lost === 0 && doubled === 0 && tail.every((r) => r.status === 201),
      `killed app-1 after request ${killedAt}; ${acked.length}/80 acknowledged, ${lost} lost, ${doubled} written twice, last 30 all answered: ${tail.every((r) => r.status === 201)}`,
    );

    // 6. The full-ledger audit over the primary.
    const audit = await runInherit('node', [join(REPO, 'packages/server/dist/audit/audit-cli.js')], {
      cwd: REPO,
      env: c.env,
      stdio: 'ignore',
    });
    record('the full-ledger audit passes', audit === 0, `exit ${audit}`);
  } finally {
    await db.end();
  }
  const passed = results.filter((r) => r.ok).length;
  const failed = results.length - passed;
  console.log(`\n${'check'.padEnd(72)}result`);
  for (const r of results) console.log(`${r.check.padEnd(72)}${r.ok ? 'pass' : 'FAIL'}`);
  console.log(`(cluster test took ${Math.round((Date.now() - started) / 1000)} s)`);
  console.log(`cluster: ${passed} passed, ${failed} failed`);
  return failed === 0 ? 0 : 1;
}

main()
  .then(async (code) => {
    await cluster?.stop();
    rmSync(dir, { recursive: true, force: true });
    process.exit(code);
  })
  .catch(async (err: unknown) => {
    console.error(err instanceof UserFacingError ? `npm run test:cluster: ${err.message}` : err);
    await cluster?.stop();
    await stopChildren();
    console.log(`cluster: 0 passed, 1 failed`);
    process.exit(1);
  });
