// Benchmark at scale: a ledger of ENTRIES entries over LOTS lots (default 1,000,000 over
// 100,000), held by one demo dealer, built in bulk through core's entry builder and reducer (in
// worker threads, build-worker.mjs) and written with PostgreSQL's COPY, next to the demo scenario, on a throw-away cluster. At 1,000
// entries and again at the full size, once the log has numbered and signed every entry, it
// prints: public lot data p50/p99 (autocannon, the medians of three rounds), append
// p50/p99 (an observation through the API, one at a time), inventory search p95 (the dealer's
// lot list with a text query) and the full-ledger audit's entries/s and peak memory (the
// `npm run audit` program). Targets: public data and append at full size ≤ 1.2× at 1,000;
// search ≤ 100 ms; the audit ≥ 50,000 entries/s in flat memory.
// Usage: npm run build && npm run bench:scale [-- --entries N] [--lots M] [--audit-only] [--hold]
//   (M defaults to N / 10; `--entries 20000` runs in about two minutes on a small machine)
import { spawn } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { availableParallelism, loadavg } from 'node:os';
import { Worker } from 'node:worker_threads';
import { createRequire } from 'node:module';
import { join } from 'node:path';
import { pipeline } from 'node:stream/promises';
import { Readable } from 'node:stream';
import pg from 'pg';
import { from as copyFrom } from 'pg-copy-streams';
import { AUDIT_NODE_OPTIONS, REPO } from '../../lib/app-env.ts';
import { startBenchApp, type BenchApp } from '../lib/bench-app.ts';
import { COLOURS, WORDS } from './words.mjs';

const arg = (name: string) => {
  const i = process.argv.indexOf(name);
  return i > 0 ? Number(process.argv[i + 1]) : undefined;
};
const ENTRIES = arg('--entries') ?? 1_000_000;
const LOTS = arg('--lots') ?? Math.max(1, Math.round(ENTRIES / 10));
const SMALL = 1000;
/** Public data: autocannon rounds (a different listed lot each), connections and seconds per round. */
const PUBLIC_ROUNDS = 3;
const PUBLIC_CONNECTIONS = 16;
const PUBLIC_SECONDS = 5;
/** Appends and searches made before the timed ones at each size. */
const WARM_UP = 50;
/** Timed appends at each size (p99 is then the fifth slowest), spread over the same number of lots. */
const APPENDS = 500;
const APPEND_LOTS = 50;
// --audit-only: measure the audit alone; --hold: after loading, print the cluster's environment
// and keep it (and the app) until Ctrl+C, for profiling the audit by hand.
const AUDIT_ONLY = process.argv.includes('--audit-only');
const HOLD = process.argv.includes('--hold');

interface CannonResult {
  latency: { p50: number; p99: number };
  requests: { average: number };
  non2xx: number;
  errors: number;
}
const SEQUENCER_LOCK_KEY = (
  createRequire(import.meta.url)(join(REPO, 'packages/server/dist/ledger/log-sequencer.js')) as {
    SEQUENCER_LOCK_KEY: bigint;
  }
).SEQUENCER_LOCK_KEY;
const autocannon = createRequire(import.meta.url)('autocannon') as (
  o: Record<string, unknown>,
) => Promise<CannonResult>;

async function copy(client: pg.PoolClient, sql: string, text: string): Promise<void> {
  if (text) await pipeline(Readable.from([text]), client.query(copyFrom(sql)));
}

interface Built {
  id: number;
  lots: string;
  entries: string;
  bodies: string;
  views: string;
  written: number;
}

/** Lots per job a worker builds and the main thread writes in one transaction. */
const BATCH = 2000;

/**
 * Writes `lots` lots with `entries` entries in all, as the ledger would: each roll built by
 * core's buildEntry and reduced by core's reduceEntry, in worker threads (one per core, see
 * build-worker.mjs), while the main thread writes what they built by COPY, a batch of lots per
 * transaction: lots, entries, entry bodies (entry ids taken as one range beforehand, so no join)
 * and the lot view.
 */
async function bulkLoad(pool: pg.Pool, actor: string, startLot: number, lots: number, entries: number) {
  const perLot = Math.floor(entries / lots);
  let extra = entries - perLot * lots;
  // Entry ids (an identity column) taken from its sequence as one range; COPY writes given ids.
  const seq = `pg_get_serial_sequence('entries', 'id')`;
  const [{ start }] = (await pool.query(`SELECT nextval(${seq})::text AS "start"`)).rows as Array<{
    start: string;
  }>;
  await pool.query(`SELECT setval(${seq}, $1::bigint + $2)`, [start, entries]);
  let entryId = Number(start);
  const jobs: Array<{ id: number; first: number; counts: number[]; actor: string; firstEntryId: number }> =
    [];
  for (let b = 0; b < lots; b += BATCH) {
    const counts: number[] = [];
    for (let l = b; l < Math.min(lots, b + BATCH); l++) counts.push(perLot + (extra-- > 0 ? 1 : 0));
    jobs.push({ id: jobs.length, first: startLot + b, counts, actor, firstEntryId: entryId });
    entryId += counts.reduce((a, c) => a + c, 0);
  }
  const threads = Math.max(1, Math.min(availableParallelism(), jobs.length));
  const workers = Array.from(
    { length: threads },
    () => new Worker(new URL('./build-worker.mjs', import.meta.url)),
  );
  const done = new Map<number, Built>();
  const waiting = new Map<number, { resolve: (b: Built) => void; reject: (e: Error) => void }>();
  let failed: Error | undefined;
  let queued = 0;
  const builtBy = new Map<number, Worker>();
  const feed = (w: Worker) => {
    // Each worker holds at most two jobs, so built text waiting to be written stays bounded.
    if (queued >= jobs.length) return;
    builtBy.set(queued, w);
    w.postMessage(jobs[queued++]);
  };
  for (const w of workers) {
    w.on('message', (b: Built) => {
      const wake = waiting.get(b.id);
      if (wake) {
        waiting.delete(b.id);
        wake.resolve(b);
      } else done.set(b.id, b);
    });
    w.on('error', (e) => {
      failed = e;
      for (const w of waiting.values()) w.reject(e);
      waiting.clear();
    });
    feed(w);
    feed(w);
  }
  const next = (id: number) =>
    new Promise<Built>((resolve, reject) => {
      if (failed) return reject(failed);
      const b = done.get(id);
      if (b) {
        done.delete(id);
        return resolve(b);
      }
      waiting.set(id, { resolve, reject });
    });
  let written = 0;
  try {
    for (const job of jobs) {
      const b = await next(job.id);
      // The worker that built it takes the next job.
      feed(builtBy.get(job.id)!);
      const client = await pool.connect();
      try {
        await client.query('BEGIN');
        // Each entry gets its log index as the log's sequencer gives it after a commit (under its
        // lock, after the log's size, in the order written), so the log is as a running ledger's.
        await client.query('SELECT pg_advisory_xact_lock($1::bigint)', [SEQUENCER_LOCK_KEY.toString()]);
        const [{ size }] = (
          await client.query('SELECT "size"::text AS "size" FROM "log_head" WHERE "id" = 1')
        ).rows as Array<{ size: string }>;
        let logIndex = Number(size);
        await copy(
          client,
          'COPY "lots" ("id", "code", "head_seq", "head_hash", "head_time", "state") FROM STDIN',
          b.lots,
        );
        await copy(
          client,
          'COPY "entries" ("id", "lot_id", "seq", "kind", "actor", "time", "hash", "header", "log_index") FROM STDIN',
          b.entries.replace(/\n/g, () => `\t${logIndex++}\n`),
        );
        await client.query('UPDATE "log_head" SET "size" = $1 WHERE "id" = 1', [logIndex]);
        await copy(client, 'COPY "entry_bodies" ("entry_id", "body") FROM STDIN', b.bodies);
        await copy(
          client,
          `COPY "lot_views" ("lot_id", "code", "title", "form", "status", "holder", "listed", "origin",
             "count_value", "count_estimated", "dissent_count", "offer_recipient", "observations", "head_seq",
             "search_text", "registered_at", "updated_at") FROM STDIN`,
          b.views,
        );
        await client.query('COMMIT');
      } catch (e) {
        await client.query('ROLLBACK');
        throw e;
      } finally {
        client.release();
      }
      written += b.written;
      if (lots > BATCH) process.stdout.write(`\r  ${written.toLocaleString('en')} entries written`);
    }
  } finally {
    await Promise.all(workers.map((w) => w.terminate()));
  }
  if (lots > BATCH) process.stdout.write('\n');
  // A running ledger's tables are vacuumed and analysed by autovacuum as they grow; a bulk load
  // leaves that undone, and autovacuum would then work through it while the figures are taken.
  await pool.query('VACUUM (ANALYZE)');
}

/**
 * Waits until the log has caught up with a bulk load, as it would have on a running ledger
 * (which numbers each entry as it commits and signs checkpoints as the log grows): every entry
 * has a log index and a checkpoint covers them all. Answers the seconds it took.
 */
async function logCaughtUp(pool: pg.Pool): Promise<number> {
  const t = performance.now();
  for (;;) {
    const [r] = (
      await pool.query(
        `SELECT NOT EXISTS (SELECT 1 FROM "entries" WHERE "log_index" IS NULL) AS "numbered",
                (SELECT "size" FROM "log_head") <= (SELECT coalesce(max("size"), 0) FROM "log_checkpoints") AS "signed"`,
      )
    ).rows as Array<{ numbered: boolean; signed: boolean }>;
    if (r!.numbered && r!.signed) return (performance.now() - t) / 1000;
    await new Promise((resolve) => setTimeout(resolve, 500));
  }
}

const pct = (xs: number[], p: number) =>
  [...xs].sort((a, b) => a - b)[Math.min(xs.length - 1, Math.floor(xs.length * p))]!;

async function signIn(app: BenchApp): Promise<{ headers: Record<string, string>; email: string }> {
  const dealer = app.demo.signIns.find((s) => s.role === 'dealer')!;
  const res = await fetch(`${app.origin}/api/auth/sign-in`, {
    method: 'POST',
    headers: { 'content-type': 'application/json', 'x-beadroll-request': '1' },
    body: JSON.stringify({ email: dealer.email, password: dealer.password }),
  });
  if (!res.ok) throw new Error(`sign-in answered ${res.status}`);
  const cookie = res.headers
    .getSetCookie()
    .map((c) => c.split(';')[0])
    .join('; ');
  return {
    headers: { cookie, 'x-beadroll-request': '1', 'content-type': 'application/json' },
    email: dealer.email,
  };
}

/**
 * Runs the audit program as `npm run audit` does (with its heap limit), with the app paused,
 * and samples its peak resident memory (VmHWM). The rate is timed from its first line
 * ("auditing N lots…"), after the program has started and connected.
 */
function audit(
  app: BenchApp,
): Promise<{ seconds: number; entries: number; peakMb: number; cpu: number; load: string }> {
  // The app is paused meanwhile, so its timed passes (the log's sequencer and signer, offer
  // lapses) take no CPU from the audit: only the audit is measured. No request is sent then.
  process.kill(app.pid, 'SIGSTOP');
  return auditProgram(app).finally(() => process.kill(app.pid, 'SIGCONT'));
}

function auditProgram(
  app: BenchApp,
): Promise<{ seconds: number; entries: number; peakMb: number; cpu: number; load: string }> {
  return new Promise((resolve, reject) => {
    const started = performance.now();
    const child = spawn(
      'node',
      [...AUDIT_NODE_OPTIONS, join(REPO, 'packages/server/dist/audit/audit-cli.js')],
      {
        cwd: REPO,
        env: app.env,
        stdio: ['ignore', 'pipe', 'inherit'],
      },
    );
    let out = '';
    let peakKb = 0;
    let cpuTicks = 0;
    let auditing = started;
    const sample = setInterval(() => {
      try {
        const m = /VmHWM:\s+(\d+)/.exec(readFileSync(`/proc/${child.pid}/status`, 'utf8'));
        if (m) peakKb = Math.max(peakKb, Number(m[1]));
        // The program's CPU time (user and system, every thread), in clock ticks of 1/100 s.
        const stat = readFileSync(`/proc/${child.pid}/stat`, 'utf8').split(') ')[1]!.split(' ');
        cpuTicks = Number(stat[11]) + Number(stat[12]);
      } catch {
        // the program has just ended
      }
    }, 50);
    child.stdout!.on('data', (d: Buffer) => {
      if (!out.includes('auditing')) auditing = performance.now();
      out += d.toString();
    });
    child.on('exit', (code) => {
      clearInterval(sample);
      const seconds = (performance.now() - auditing) / 1000;
      const m = /every roll intact: \d+ lots, (\d+) entries/.exec(out);
      if (code !== 0 || !m) return reject(new Error(`the audit ended with ${code}:\n${out.slice(-2000)}`));
      resolve({
        seconds,
        entries: Number(m[1]),
        peakMb: peakKb / 1024,
        cpu: cpuTicks / 100,
        load: loadavg()
          .map((l) => l.toFixed(1))
          .join(' '),
      });
    });
  });
}

interface Figures {
  entries: number;
  publicP50: number;
  publicP99: number;
  appendP50: number;
  appendP99: number;
  searchP95: number;
  auditRate: number;
  auditPeakMb: number;
  /** The audit program's CPU seconds, sampled every 50 ms (its start included). */
  auditCpu: number;
  /** The machine's load averages (1, 5, 15 min) as the audit ended. */
  auditLoad: string;
}

/**
 * A GET, asked again once when the connection was reset before an answer (a kept-alive
 * connection the server closed just then); a server that has gone is named as such.
 */
async function getOnce(url: string, headers: Record<string, string>, app: BenchApp): Promise<Response> {
  try {
    return await fetch(url, { headers });
  } catch (e) {
    const code = ((e as Error).cause as { code?: string } | undefined)?.code;
    try {
      process.kill(app.pid, 0);
    } catch {
      throw new Error(`the app has ended (${code ?? String(e)})`);
    }
    if (code !== 'ECONNRESET') throw e;
    console.log(`  (connection reset; asked again: ${url.replace(app.origin, '')})`);
    return fetch(url, { headers });
  }
}

async function measure(app: BenchApp, pool: pg.Pool, headers: Record<string, string>, actor: string) {
  const [{ n }] = (await pool.query('SELECT count(*)::int AS n FROM "entries"')).rows as Array<{ n: number }>;
  const codes = (
    await pool.query(
      `SELECT "code" FROM "lot_views" WHERE "holder" = $1 AND "listed" AND "status" = 'held' ORDER BY random() LIMIT 200`,
      [actor],
    )
  ).rows.map((r: { code: string }) => r.code);
  if (codes.length === 0) throw new Error('no listed lot held by the dealer');
  if (AUDIT_ONLY) {
    const a = await audit(app);
    return {
      entries: n,
      publicP50: NaN,
      publicP99: NaN,
      appendP50: NaN,
      appendP99: NaN,
      searchP95: NaN,
      auditRate: a.entries / a.seconds,
      auditPeakMb: a.peakMb,
      auditCpu: a.cpu,
      auditLoad: a.load,
    } satisfies Figures;
  }
  // Three rounds, the median of each figure kept, so one pause of a busy machine does not
  // decide a percentile on its own.
  const rounds: CannonResult[] = [];
  for (let i = 0; i < PUBLIC_ROUNDS; i++) {
    const r = await autocannon({
      url: `${app.origin}/api/public/lots/${codes[i % codes.length]}`,
      connections: PUBLIC_CONNECTIONS,
      duration: PUBLIC_SECONDS,
    });
    if (r.non2xx || r.errors) throw new Error(`public data: ${r.non2xx} non-2xx, ${r.errors} errors`);
    rounds.push(r);
  }
  const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)]!;
  const pub = {
    latency: {
      p50: median(rounds.map((r) => r.latency.p50)),
      p99: median(rounds.map((r) => r.latency.p99)),
    },
  };

  // The first WARM_UP appends and searches of each size are not timed: at 1,000 entries they
  // are the server's first, and would charge its warm-up (compiling, first connections) to the
  // baseline, which the full size, measured after thousands of requests, never pays.
  const appends: number[] = [];
  // The same number of lots at both sizes, so their rolls grow alike.
  const appendTo = codes.slice(0, APPEND_LOTS);
  for (let i = -WARM_UP; i < APPENDS; i++) {
    const code = appendTo[(i + WARM_UP) % appendTo.length]!;
    const t = performance.now();
    const r = await fetch(`${app.origin}/api/lots/${code}/observations`, {
      method: 'POST',
      headers,
      body: JSON.stringify({ observations: { hole: 'clean', surface: 'glossy', note: `Scale check ${i}.` } }),
    });
    await r.arrayBuffer();
    if (!r.ok) throw new Error(`append answered ${r.status}`);
    if (i >= 0) appends.push(performance.now() - t);
  }

  const searches: number[] = [];
  for (let i = -WARM_UP; i < 60; i++) {
    const q = `${COLOURS[(i + 60) % COLOURS.length]} ${WORDS[(i + 60) % WORDS.length]}`;
    const t = performance.now();
    const r = await getOnce(`${app.origin}/api/lots?mine=true&q=${encodeURIComponent(q)}`, headers, app);
    await r.arrayBuffer();
    if (!r.ok) throw new Error(`search answered ${r.status}`);
    if (i >= 0) searches.push(performance.now() - t);
  }

  const a = await audit(app);
  return {
    entries: n,
    publicP50: pub.latency.p50,
    publicP99: pub.latency.p99,
    appendP50: pct(appends, 0.5),
    appendP99: pct(appends, 0.99),
    searchP95: pct(searches, 0.95),
    auditRate: a.entries / a.seconds,
    auditPeakMb: a.peakMb,
    auditCpu: a.cpu,
    auditLoad: a.load,
  } satisfies Figures;
}

function show(f: Figures): string {
  const ms = (x: number) => `${x.toFixed(1)} ms`;
  return [
    `  entries on the ledger   ${f.entries.toLocaleString('en')}`,
    `  public data             p50 ${ms(f.publicP50)}  p99 ${ms(f.publicP99)}  (${PUBLIC_CONNECTIONS} connections, medians of ${PUBLIC_ROUNDS} × ${PUBLIC_SECONDS} s)`,
    `  append (observation)    p50 ${ms(f.appendP50)}  p99 ${ms(f.appendP99)}  (${APPENDS}, one at a time)`,
    `  inventory search        p95 ${ms(f.searchP95)}  (60 text searches of the dealer's lots)`,
    `  full audit              ${Math.round(f.auditRate).toLocaleString('en')} entries/s, peak RSS ${f.auditPeakMb.toFixed(0)} MB, CPU ${f.auditCpu.toFixed(1)} s (load average ${f.auditLoad})`,
  ].join('\n');
}

async function main(): Promise<void> {
  const started = performance.now();
  console.log(
    `scale benchmark: ${ENTRIES.toLocaleString('en')} entries over ${LOTS.toLocaleString('en')} lots`,
  );
  const app = await startBenchApp('bench-scale');
  const pool = new pg.Pool({
    host: app.env.PGHOST,
    port: Number(app.env.PGPORT),
    user: app.env.PGUSER,
    password: app.env.PGPASSWORD,
    database: app.env.PGDATABASE,
    max: 2,
  });
  try {
    const { headers, email } = await signIn(app);
    const actor = (await pool.query('SELECT "id" FROM "accounts" WHERE "email" = $1', [email])).rows[0]!
      .id as string;
    const smallLots = Math.max(1, Math.round((SMALL * LOTS) / ENTRIES));
    let t = performance.now();
    await bulkLoad(pool, actor, 0, smallLots, SMALL);
    console.log(
      `loaded ${SMALL} entries in ${((performance.now() - t) / 1000).toFixed(1)} s; ` +
        `the log caught up ${(await logCaughtUp(pool)).toFixed(1)} s later; measuring…`,
    );
    const small = await measure(app, pool, headers, actor);
    t = performance.now();
    await bulkLoad(pool, actor, smallLots, LOTS - smallLots, ENTRIES - SMALL);
    const loadSeconds = (performance.now() - t) / 1000;
    console.log(
      `loaded ${(ENTRIES - SMALL).toLocaleString('en')} more entries in ${loadSeconds.toFixed(0)} s ` +
        `(${Math.round((ENTRIES - SMALL) / loadSeconds).toLocaleString('en')} entries/s); ` +
        `the log caught up ${(await logCaughtUp(pool)).toFixed(0)} s later; measuring…`,
    );
    if (HOLD) {
      const keys = ['PGHOST', 'PGPORT', 'PGUSER', 'PGPASSWORD', 'PGDATABASE'];
      console.log(keys.map((k) => `export ${k}='${app.env[k]}'`).join('\n'));
      console.log('holding the cluster and the app; Ctrl+C ends them');
      await new Promise(() => undefined);
    }
    const big = await measure(app, pool, headers, actor);
    const ok = (b: boolean) => (b ? 'met' : 'NOT met');
    console.log('');
    console.log(`at about ${SMALL.toLocaleString('en')} entries`);
    console.log(show(small));
    console.log(`at about ${ENTRIES.toLocaleString('en')} entries`);
    console.log(show(big));
    console.log('');
    const r = (a: number, b: number) => a / b;
    console.log(
      `public data p50 full/small ${r(big.publicP50, small.publicP50).toFixed(2)}×, p99 ${r(big.publicP99, small.publicP99).toFixed(2)}× (target ≤ 1.2×) ${ok(big.publicP99 <= 1.2 * small.publicP99)}`,
    );
    console.log(
      `append p50 full/small ${r(big.appendP50, small.appendP50).toFixed(2)}×, p99 ${r(big.appendP99, small.appendP99).toFixed(2)}× (target ≤ 1.2×) ${ok(big.appendP99 <= 1.2 * small.appendP99)}`,
    );
    console.log(`search p95 ${big.searchP95.toFixed(1)} ms (target ≤ 100 ms) ${ok(big.searchP95 <= 100)}`);
    console.log(
      `audit ${Math.round(big.auditRate).toLocaleString('en')} entries/s (target ≥ 50,000) ${ok(big.auditRate >= 50_000)}; ` +
        `peak RSS ${small.auditPeakMb.toFixed(0)} MB at ${SMALL} entries, ${big.auditPeakMb.toFixed(0)} MB at full size ` +
        `(flat: ${ok(big.auditPeakMb <= small.auditPeakMb * 1.2 + 20)})`,
    );
    console.log(`run time ${((performance.now() - started) / 60_000).toFixed(1)} min`);
  } finally {
    await pool.end();
    await app.stop();
  }
}

main().catch((err: unknown) => {
  console.error(err);
  process.exit(1);
});
