// Benchmark of inventory search: 100,000 lots held by 200 invented dealers (half listed), each
// lot with a description's words, an attribution on record and its holder's storage place.
// It calls the server's own LotsService.list (the code the route runs) as one dealer over the
// lots they hold, as the inventory page does, for a mix of searches (words, accented words,
// several words, a code with and without hyphens, the start of a code, a storage place, a
// search with a filter and a sort), and, interleaved, the plain first page of the inventory as
// the baseline. Prints p50/p95 of both, their ratio, and the target: search p95 ≤ 100 ms; then,
// for information, searches across every listed lot ("all I can see").
// Usage: npm run build && npm run bench:search [-- ROUNDS]
import { existsSync, rmSync } from 'node:fs';
import { createRequire } from 'node:module';
import { join } from 'node:path';
import { performance } from 'node:perf_hooks';
import { crockfordCheckSymbol } from '@beadroll/core';
import { DATA_DIR, REPO } from '../../lib/app-env.ts';
import { pgEnv, startPrivateCluster, type PrivateCluster } from '../../lib/pg.ts';
import { freePort, onShutdown } from '../../lib/proc.ts';

const LOTS = 100_000;
const DEALERS = 200;
const ROUNDS = Number(process.argv[2] ?? 20);
const SERVER = join(REPO, 'packages/server/dist');
const BASE = join(DATA_DIR, 'bench-search-pg');
const require = createRequire(import.meta.url);

interface DataSourceLike {
  initialize(): Promise<unknown>;
  runMigrations(o: object): Promise<unknown>;
  query(sql: string, params?: unknown[]): Promise<unknown>;
  destroy(): Promise<void>;
}
type ListQuery = Record<string, unknown>;
interface Lister {
  list(viewer: { id: string; role: string }, q: ListQuery): Promise<{ total: number; items: unknown[] }>;
}

let cluster: PrivateCluster | undefined;

async function cleanup(): Promise<void> {
  cluster?.stop();
  cluster = undefined;
  rmSync(BASE, { recursive: true, force: true });
}

const SYMBOLS = '0123456789ABCDEFGHJKMNPQRSTVWXYZ';
const ORIGINS = ['venice-murano', 'bohemia-czech', 'india', 'china', 'japan', 'other-european', 'unknown'];
const TECHNIQUES = ['wound-lampwork', 'drawn', 'pressed-moulded', 'furnace-wound'];
const ORIGIN_WORDS: Record<string, string> = {
  'venice-murano': 'Venice Murano Venetian Italy Italian',
  'bohemia-czech': 'Bohemia Bohemian Czech',
  india: 'India Indian',
  china: 'China Chinese',
  japan: 'Japan Japanese',
  'other-european': 'Europe European',
  unknown: 'unknown',
};
const NOUNS = ['beads', 'strand', 'necklace', 'rounds', 'bicones', 'tubes', 'chevrons', 'buttons', 'spacers'];
const ADJECTIVES = [
  'white',
  'pink',
  'amber',
  'cobalt',
  'black',
  'green',
  'striped',
  'foiled',
  'satin',
  'frosted',
];
const DECOR = [
  'roses',
  'forget-me-nots',
  'trailing',
  'gold foil',
  'aventurine',
  'pâte de verre',
  'millefiori',
];
const PLACES = ['drawer', 'tray', 'box', 'cabinet', 'shelf', 'Élise room', 'attic'];

/** A small seeded generator, so every run builds the same data. */
function rng(seed: number): () => number {
  let s = seed >>> 0;
  return () => {
    s = (s * 1664525 + 1013904223) >>> 0;
    return s / 2 ** 32;
  };
}

async function fill(ds: DataSourceLike): Promise<string[]> {
  const r = rng(20261205);
  const pick = <T>(xs: readonly T[]) => xs[Math.floor(r() * xs.length)]!;
  const dealers = Array.from(
    { length: DEALERS },
    (_, i) => `00000000-0000-4000-8000-${String(i).padStart(12, '0')}`,
  );
  const codes = new Set<string>();
  while (codes.size < LOTS) {
    const data = Array.from({ length: 8 }, () => pick([...SYMBOLS])).join('');
    const check = crockfordCheckSymbol(data);
    if (SYMBOLS.includes(check)) codes.add(data + check);
  }
  const all = [...codes];
  const BATCH = 5000;
  for (let start = 0; start < LOTS; start += BATCH) {
    const rows = all.slice(start, start + BATCH).map((code, i) => {
      const n = start + i;
      const origin = pick(ORIGINS);
      const technique = pick(TECHNIQUES);
      const from = 1700 + Math.floor(r() * 30) * 10;
      const title = `${pick(ADJECTIVES)} ${pick(ADJECTIVES)} ${pick(NOUNS)} with ${pick(DECOR)}`;
      return {
        code,
        holder: dealers[n % DEALERS]!,
        listed: n % 2 === 0,
        title,
        origin,
        technique,
        from,
        to: from + 50,
        text: `${title} ${pick(ADJECTIVES)} ${pick(DECOR)} ${ORIGIN_WORDS[origin]} ${technique.replace('-', ' ')} ${from} ${from + 50}`,
        place: `${pick(PLACES)} ${Math.floor(r() * 40)}`,
        time: new Date(Date.UTC(2026, 0, 1) + n * 60_000).toISOString(),
      };
    });
    const col = <K extends keyof (typeof rows)[number]>(k: K) => rows.map((x) => x[k]);
    await ds.query(
      `INSERT INTO "lots" ("code", "head_seq", "head_hash", "head_time", "state")
       SELECT c, 1, repeat('0', 64), '2026-01-01T00:00:00.000Z', '{}'::jsonb FROM unnest($1::text[]) c`,
      [col('code')],
    );
    await ds.query(
      `INSERT INTO "lot_views" ("lot_id", "code", "title", "form", "status", "holder", "listed", "origin",
         "technique", "period_from", "period_to", "count_value", "count_estimated", "dissent_count",
         "offer_recipient", "observations", "head_seq", "search_text", "registered_at", "updated_at")
       SELECT l."id", x.code, x.title, 'strand', 'held', x.holder, x.listed, x.origin, x.technique, x.pf, x.pt,
              40, false, 0, NULL, NULL, 1, x.text, x.t::timestamptz, x.t::timestamptz
         FROM unnest($1::text[], $2::text[], $3::text[], $4::bool[], $5::text[], $6::text[], $7::int[],
                     $8::int[], $9::text[], $10::text[])
              AS x(code, title, holder, listed, origin, technique, pf, pt, text, t)
         JOIN "lots" l ON l."code" = x.code`,
      [
        col('code'),
        col('title'),
        col('holder'),
        col('listed'),
        col('origin'),
        col('technique'),
        col('from'),
        col('to'),
        col('text'),
        col('time'),
      ],
    );
    await ds.query(
      `INSERT INTO "lot_private_search" ("lot_id", "account_id", "search_text")
       SELECT l."id", x.holder, x.place FROM unnest($1::text[], $2::text[], $3::text[]) AS x(code, holder, place)
         JOIN "lots" l ON l."code" = x.code`,
      [col('code'), col('holder'), col('place')],
    );
  }
  await ds.query('ANALYZE');
  return all;
}

function percentile(xs: number[], p: number): number {
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.min(s.length - 1, Math.ceil((p / 100) * s.length) - 1)]!;
}

async function main(): Promise<void> {
  onShutdown(cleanup);
  for (const f of ['lots/lots.service.js', 'database/data-source.js', 'config/app-config.js'])
    if (!existsSync(join(SERVER, f))) throw new Error(`build first (npm run build): ${f} is missing`);
  rmSync(BASE, { recursive: true, force: true });
  cluster = await startPrivateCluster({
    base: BASE,
    port: await freePort(),
    durable: false,
    appUser: 'beadroll_bench',
    database: 'beadroll_bench',
  });
  const { loadConfig } = require(join(SERVER, 'config/app-config.js')) as {
    loadConfig(env: NodeJS.ProcessEnv): unknown;
  };
  const { createDataSource } = require(join(SERVER, 'database/data-source.js')) as {
    createDataSource(c: unknown): DataSourceLike;
  };
  const { LotsService } = require(join(SERVER, 'lots/lots.service.js')) as {
    LotsService: new (ds: DataSourceLike, ...rest: unknown[]) => Lister;
  };
  const ds = createDataSource(
    loadConfig({ ...process.env, ...pgEnv(cluster.target), NODE_ENV: 'production', DATA_DIR: BASE }),
  );
  await ds.initialize();
  await ds.runMigrations({ transaction: 'each' });
  console.log(`writing ${LOTS} lots of ${DEALERS} dealers…`);
  const started = performance.now();
  const codes = await fill(ds);
  console.log(`  done in ${((performance.now() - started) / 1000).toFixed(1)} s`);

  // The service reads only its DataSource when it lists; the ledger's classes are not needed.
  const lots = new LotsService(ds, undefined, undefined, undefined);
  const me = { id: `00000000-0000-4000-8000-${'0'.padStart(12, '0')}`, role: 'dealer' };
  const own = codes[0]!; // held by the first dealer
  // The inventory page searches the lots the dealer holds; "all I can see" every listed lot.
  const inventory: ListQuery[] = [
    { q: 'venice' },
    { q: 'Venetian roses' },
    { q: 'pate de verre' },
    { q: 'bohemian 1850' },
    { q: 'cobalt chevrons' },
    { q: own },
    { q: `${own.slice(0, 4)}-${own.slice(4, 8)}-${own.slice(8)}` },
    { q: own.slice(0, 5) },
    { q: 'drawer 12' },
    { q: 'beads', sort: 'title', order: 'asc' },
    { q: 'pink', origin: 'india', sort: 'period' },
    { sort: 'origin', order: 'asc', page: 3 },
  ].map((q) => ({ page: 1, pageSize: 20, mine: true, ...q }));
  const everywhere: ListQuery[] = [
    { q: own },
    { q: own.slice(0, 6) },
    { q: 'cobalt chevrons millefiori' },
    { q: 'venice' },
  ].map((q) => ({ page: 1, pageSize: 20, ...q }));
  const baseline: ListQuery = { page: 1, pageSize: 20, mine: true };

  for (const q of [...inventory, ...everywhere, baseline]) await lots.list(me, q); // warm up
  const found = await lots.list(me, inventory[5]!);
  if (found.total !== 1) throw new Error(`the code search found ${found.total} lots, not 1`);

  const times = { search: [] as number[], baseline: [] as number[], everywhere: [] as number[] };
  const time = async (into: number[], q: ListQuery) => {
    const t = performance.now();
    await lots.list(me, q);
    into.push(performance.now() - t);
  };
  for (let round = 0; round < ROUNDS; round++) {
    for (const q of inventory) {
      await time(times.search, q);
      await time(times.baseline, baseline);
    }
    for (const q of everywhere) await time(times.everywhere, q);
  }
  await ds.destroy();
  const f = (n: number) => `${n.toFixed(1)} ms`;
  const p95 = percentile(times.search, 95);
  console.log('');
  console.log(
    `inventory search (${LOTS / DEALERS} lots held) among ${LOTS} lots, ${inventory.length} kinds × ${ROUNDS} rounds`,
  );
  console.log(`  search    p50 ${f(percentile(times.search, 50))}  p95 ${f(p95)}`);
  console.log(
    `  baseline  p50 ${f(percentile(times.baseline, 50))}  p95 ${f(percentile(times.baseline, 95))}  (first page, no search)`,
  );
  console.log(
    `  across every listed lot (${LOTS / 2}), for information: p50 ${f(percentile(times.everywhere, 50))}  p95 ${f(percentile(times.everywhere, 95))}`,
  );
  console.log(`  ratio of p95 (search / baseline): ${(p95 / percentile(times.baseline, 95)).toFixed(2)}`);
  console.log(`  search p95 ${f(p95)} (target ≤ 100 ms): ${p95 <= 100 ? 'met' : 'NOT met'}`);
  if (process.env.BENCH_KEEP_DB) {
    console.log(`kept the database: ${JSON.stringify(pgEnv(cluster.target))}`);
    return;
  }
  await cleanup();
}

main().catch(async (err: unknown) => {
  console.error(err);
  await cleanup();
  process.exit(1);
});
