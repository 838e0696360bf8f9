// Appends per second with the log sequencer against the same appends without it, measured in
// one run on a private PostgreSQL: npm run bench:log [-- --workers 8 --seconds 4 --rounds 3]
// With the sequencer, each commit kicks it as LedgerService does, and it numbers the committed
// entries in the background; the target is ≥ 0.8× the appends per second without it. Each
// round then waits for the sequencer to finish and checks the log is dense.
import { createRequire } from 'node:module';
import { rmSync } from 'node:fs';
import { join } from 'node:path';
import { parseArgs } from 'node:util';
import { DATA_DIR, REPO } from '../../lib/app-env.ts';
import { pgEnv, startPrivateCluster } from '../../lib/pg.ts';
import { freePort, runInherit } from '../../lib/proc.ts';

const { values } = parseArgs({
  options: {
    workers: { type: 'string', default: '8' },
    seconds: { type: 'string', default: '4' },
    rounds: { type: 'string', default: '3' },
  },
});
const WORKERS = Number(values.workers);
const SECONDS = Number(values.seconds);
const ROUNDS = Number(values.rounds);
const TARGET = 0.8;
const base = join(DATA_DIR, 'bench-log');
const server = join(REPO, 'packages/server/dist');
const require = createRequire(import.meta.url);

const DESCRIPTION = {
  title: 'Bench lot of wound beads',
  form: 'loose',
  count: { value: 100, estimated: false },
  colours: ['blue'],
  baseGlass: ['opaque'],
  decoration: [],
  listed: true,
};

async function main(): Promise<void> {
  rmSync(base, { recursive: true, force: true });
  const cluster = await startPrivateCluster({
    base: join(base, 'pg'),
    port: await freePort(),
    durable: false,
  });
  const env = { ...process.env, ...pgEnv(cluster.target), DATA_DIR: join(base, 'data') };
  try {
    if ((await runInherit('node', [join(server, 'migrate.js')], { cwd: REPO, env })) !== 0)
      throw new Error('migrations failed');
    const { loadConfig } = require(join(server, 'config/app-config.js'));
    const { createDataSource } = require(join(server, 'database/data-source.js'));
    const { RollTransaction } = require(join(server, 'ledger/ledger.service.js'));
    const { LogSequencer } = require(join(server, 'ledger/log-sequencer.js'));
    const core = await import('@beadroll/core');
    const ds = createDataSource(loadConfig(env));
    await ds.initialize();
    const sequencer = new LogSequencer(ds);
    const actor = 'acct-bench-1';
    // The same transaction LedgerService.withLots runs, then (or not) the sequencer's kick.
    const append = async (code: string | null, sequenced: boolean) => {
      const lot = await ds.transaction('READ COMMITTED', async (m: unknown) => {
        const tx = new RollTransaction(m, core.secureRandom, [], new Date().toISOString());
        const e = code
          ? await tx.append(code, { kind: 'note', actor, body: { text: 'bench note' } })
          : await tx.register({ actor, description: DESCRIPTION });
        return e.lot as string;
      });
      if (sequenced) sequencer.kick();
      return lot;
    };
    const lots: string[] = [];
    for (let i = 0; i < WORKERS; i++) lots.push(await append(null, true));

    const measure = async (sequenced: boolean): Promise<number> => {
      let count = 0;
      const end = performance.now() + SECONDS * 1000;
      await Promise.all(
        lots.map(async (code) => {
          while (performance.now() < end) {
            await append(code, sequenced);
            count++;
          }
        }),
      );
      const rate = count / SECONDS;
      await sequencer.settle();
      const [gaps] = await ds.query(
        `SELECT count(*) FILTER (WHERE "log_index" IS NULL) AS "unnumbered",
                (SELECT "size" FROM "log_head") - count(*) FILTER (WHERE "log_index" IS NOT NULL) AS "gap",
                max("log_index") + 1 - count("log_index") AS "holes"
           FROM "entries"`,
      );
      if (Number(gaps.unnumbered) + Number(gaps.gap) + Number(gaps.holes) !== 0)
        throw new Error(`the log is not dense after the round: ${JSON.stringify(gaps)}`);
      return rate;
    };
    await measure(true); // warm-up
    const without: number[] = [];
    const withSeq: number[] = [];
    for (let r = 0; r < ROUNDS; r++) {
      without.push(await measure(false));
      withSeq.push(await measure(true));
      console.log(
        `round ${r + 1}: without ${without[r]!.toFixed(0)}/s, with the sequencer ${withSeq[r]!.toFixed(0)}/s`,
      );
    }
    const median = (a: number[]) => [...a].sort((x, y) => x - y)[Math.floor(a.length / 2)]!;
    const ratio = median(withSeq) / median(without);
    console.log(
      `appends/s (median of ${ROUNDS}, ${WORKERS} concurrent writers on ${WORKERS} lots): ` +
        `without ${median(without).toFixed(0)}, with the sequencer ${median(withSeq).toFixed(0)}`,
    );
    console.log(`ratio ${ratio.toFixed(2)}× (target ≥ ${TARGET}×): ${ratio >= TARGET ? 'PASS' : 'FAIL'}`);
    await ds.destroy();
    process.exitCode = ratio >= TARGET ? 0 : 1;
  } finally {
    cluster.stop();
  }
}

await main();
