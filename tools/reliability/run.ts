// `npm run test:reliability`: tamper, crashes, races, fuzz, memory under a burst of sign-ins,
// and a backup's round trip, against a throw-away PostgreSQL cluster and the built server.
// Prints one table and ends with `N passed, M failed`. `--no-build` uses the existing build.
import { mkdirSync, rmSync } from 'node:fs';
import { join } from 'node:path';
import { DATA_DIR } from '../lib/app-env.ts';
import { backup, buildServer, restore } from '../lib/backup.ts';
import { pgEnv, startPrivateCluster, type PrivateCluster } from '../lib/pg.ts';
import { freePort, onShutdown, UserFacingError } from '../lib/proc.ts';
import { crashSection } from './crashes.ts';
import { fuzzSection } from './fuzz.ts';
import { description, type Row, ServerProcess, signedIn, sql } from './harness.ts';
import { PNG } from 'pngjs';
import { memorySection } from './memory.ts';
import { raceSection } from './races.ts';
import { tamperSection } from './tamper.ts';

const args = process.argv.slice(2);
const only = args
  .find((a) => a.startsWith('--only='))
  ?.slice(7)
  .split(',');
const want = (s: string) => !only || only.includes(s);
const work = join(DATA_DIR, 'reliability');
let cluster: PrivateCluster | undefined;
const servers: ServerProcess[] = [];

async function cleanup(): Promise<void> {
  for (const s of servers) await s.stop().catch(() => undefined);
  cluster?.stop();
  cluster = undefined;
  rmSync(work, { recursive: true, force: true });
}

function print(rows: Row[], seconds: number): number {
  const w1 = Math.max(...rows.map((r) => r.section.length), 7);
  const w2 = Math.max(...rows.map((r) => r.check.length), 5);
  console.log('');
  console.log(`${'section'.padEnd(w1)}  ${'check'.padEnd(w2)}  result  detail`);
  console.log(`${'-'.repeat(w1)}  ${'-'.repeat(w2)}  ------  ${'-'.repeat(40)}`);
  for (const r of rows)
    console.log(
      `${r.section.padEnd(w1)}  ${r.check.padEnd(w2)}  ${(r.ok === null ? 'n/a' : r.ok ? 'pass' : 'FAIL').padEnd(6)}  ${r.detail}`,
    );
  const passed = rows.filter((r) => r.ok === true).length;
  const failed = rows.filter((r) => r.ok === false).length;
  const skipped = rows.filter((r) => r.ok === null).length;
  console.log(`\n(${skipped} not applicable; ${seconds.toFixed(0)} s)`);
  console.log(`${passed} passed, ${failed} failed`);
  return failed;
}

async function main(): Promise<number> {
  const t0 = Date.now();
  onShutdown(cleanup);
  rmSync(work, { recursive: true, force: true });
  mkdirSync(work, { recursive: true });
  if (!args.includes('--no-build')) await buildServer();
  const base = join(work, 'pg');
  const port = await freePort();
  console.log(
    `starting a throw-away PostgreSQL on 127.0.0.1:${port} (durable settings, for the crash checks)…`,
  );
  cluster = await startPrivateCluster({
    base,
    port,
    durable: true,
    appUser: 'beadroll_rel',
    database: 'beadroll_rel',
    createdb: true,
  });
  const target = cluster.target;
  const rows: Row[] = [];
  const section = async (name: string, fn: () => Promise<Row[]>) => {
    if (!want(name)) return;
    console.log(`── ${name}`);
    try {
      rows.push(...(await fn()));
    } catch (err) {
      rows.push({
        section: name,
        check: 'ran to the end',
        detail: (err as Error).message.split('\n')[0]!,
        ok: false,
      });
    }
  };

  await section('tamper', () => tamperSection(target, work));

  // One server and database for crashes, races, fuzz and the backup.
  const server = await ServerProcess.create(target, target.database, join(work, 'main'));
  servers.push(server);
  await server.migrate();
  await server.start();
  await section('crashes', () =>
    crashSection(server, target, target.database, { base, port }, { kills: 10, pgStops: 3, writers: 6 }),
  );
  await section('races', () => raceSection(server, target, target.database, 10));
  await section('fuzz', () => fuzzSection(server, target, target.database, 12, 20261205));
  await section('memory', () => memorySection(target, target.database, work, 20));
  await section('backup', async () => {
    // A lot with a photo, so the backup carries exhibit files whose digests the restore checks.
    const dealer = await signedIn(server, target, target.database, 'dealer');
    const lot = await dealer.write('POST', '/api/lots', { description: description('Backed-up lot') });
    const code = (lot.body as { code: string }).code;
    const png = new PNG({ width: 64, height: 48 });
    png.data.fill(180);
    const form = new FormData();
    form.append('kind', 'close-up');
    form.append('file', new Blob([new Uint8Array(PNG.sync.write(png))], { type: 'image/png' }), 'photo.png');
    const added = await dealer.send('POST', `/api/lots/${code}/exhibits`, undefined, { raw: form });
    if (added.status !== 201) throw new Error(`adding a photo answered ${added.status}`);
    await server.stop();
    const dir = join(work, 'backup');
    const env = { ...process.env, ...pgEnv(target), DATA_DIR: join(work, 'main') };
    await backup(dir, env, () => undefined);
    await sql(target, 'postgres', 'DROP DATABASE IF EXISTS rel_restored WITH (FORCE)', [], true);
    await sql(target, 'postgres', `CREATE DATABASE rel_restored OWNER "${target.user}"`, [], true);
    const r = await restore(
      dir,
      { ...env, PGDATABASE: 'rel_restored', DATA_DIR: join(work, 'restored') },
      () => undefined,
    );
    return [
      {
        section: 'backup',
        check: 'backup, then restore into an empty database and folder',
        detail: `${r.lots} lots, ${r.entries} entries, ${r.exhibitFiles} exhibit files; audit ${r.auditOk ? 'passes' : 'FAILS'}; exhibit digests ${r.exhibitsOk ? 'match' : 'DO NOT MATCH'}`,
        ok: r.auditOk && r.exhibitsOk && r.lots > 0,
      },
    ];
  });
  const failed = print(rows, (Date.now() - t0) / 1000);
  await cleanup();
  return failed === 0 && rows.length > 0 ? 0 : 1;
}

main().then(
  (code) => process.exit(code),
  async (err: unknown) => {
    console.error(err instanceof UserFacingError ? `npm run test:reliability: ${err.message}` : err);
    await cleanup();
    console.log('0 passed, 1 failed');
    process.exit(1);
  },
);
