// Crashes: a burst of writes from clients that retry with their idempotency keys, while the
// server is killed with SIGKILL and PostgreSQL is stopped without a checkpoint. Afterwards every
// acknowledged write is on its roll exactly once, and the audit passes.
import { join } from 'node:path';
import { isRoot, run } from '../lib/proc.ts';
import { ensurePgBinaries, type PgTarget, startPrivateCluster } from '../lib/pg.ts';
import {
  audit,
  type Client,
  description,
  type Row,
  type ServerProcess,
  signedIn,
  sleep,
  sql,
} from './harness.ts';

interface Ack {
  title: string;
  code: string;
}

/** The PostgreSQL cluster the suite runs, so it can be stopped hard and started again. */
export interface ClusterHandle {
  base: string;
  port: number;
}

function immediateStop(cluster: ClusterHandle): void {
  const pgCtl = join(ensurePgBinaries(), 'pg_ctl');
  const args = ['-D', join(cluster.base, 'data'), '-m', 'immediate', '-w', 'stop'];
  if (isRoot) run('runuser', ['-u', 'postgres', '--', pgCtl, ...args], { quiet: true });
  else run(pgCtl, args, { quiet: true });
}

export async function crashSection(
  server: ServerProcess,
  target: PgTarget,
  database: string,
  cluster: ClusterHandle,
  opts: { kills: number; pgStops: number; writers: number },
): Promise<Row[]> {
  const rows: Row[] = [];
  const writers: Array<Client & { id: string }> = [];
  for (let i = 0; i < opts.writers; i++) writers.push(await signedIn(server, target, database, 'dealer'));
  const registrar = await signedIn(server, target, database, 'registrar');
  const acks: Ack[] = [];
  const failures: string[] = [];
  let stop = false;
  let retried = 0;

  // Each writer registers lots and describes the lots it made, one action at a time.
  const loops = writers.map(async (w, wi) => {
    const mine: string[] = [];
    for (let i = 0; !stop; i++) {
      const title = `Crash burst ${wi}-${i}`;
      try {
        const describe = mine.length > 0 && i % 3 === 2;
        const a = describe
          ? await w.write('POST', `/api/lots/${mine[i % mine.length]}/descriptions`, {
              description: description(title),
            })
          : await w.write('POST', '/api/lots', { description: description(title) });
        if (a.tries > 1) retried++;
        if (a.status !== 201) {
          failures.push(`${title}: ${a.status} ${JSON.stringify(a.body).slice(0, 120)}`);
          continue;
        }
        const code = (a.body as { code: string }).code;
        if (!describe) mine.push(code);
        acks.push({ title, code });
      } catch (err) {
        failures.push(`${title}: ${(err as Error).message}`);
      }
    }
  });

  const started = Date.now();
  for (let k = 0; k < opts.kills; k++) {
    await sleep(400 + Math.random() * 800);
    await server.kill9();
    await server.start();
  }
  rows.push({
    section: 'crashes',
    check: `server killed (SIGKILL) ${opts.kills}×`,
    detail: 'restarted each time',
    ok: true,
  });
  for (let k = 0; k < opts.pgStops; k++) {
    await sleep(400 + Math.random() * 800);
    immediateStop(cluster);
    await sleep(300);
    await startPrivateCluster({
      base: cluster.base,
      port: cluster.port,
      durable: true,
      appUser: target.user,
      database: target.database,
      createdb: true,
    });
  }
  rows.push({
    section: 'crashes',
    check: `PostgreSQL stopped (immediate) ${opts.pgStops}×`,
    detail: 'started again each time',
    ok: true,
  });
  await sleep(500);
  stop = true;
  await Promise.all(loops);
  const seconds = ((Date.now() - started) / 1000).toFixed(0);

  // What the rolls hold: every title written, by entry, with the lot it is on.
  const stored = await sql<{ title: string; code: string; n: number }>(
    target,
    database,
    `SELECT b."body"::jsonb->'description'->>'title' AS "title", l."code", count(*)::int AS "n"
       FROM "entries" e JOIN "entry_bodies" b ON b."entry_id" = e."id" JOIN "lots" l ON l."id" = e."lot_id"
      WHERE e."kind" IN ('registered', 'described') AND b."body" LIKE '%Crash burst %'
      GROUP BY 1, 2`,
  );
  const byTitle = new Map<string, Array<{ code: string; n: number }>>();
  for (const s of stored) byTitle.set(s.title, [...(byTitle.get(s.title) ?? []), { code: s.code, n: s.n }]);
  const lost = acks.filter((a) => !(byTitle.get(a.title) ?? []).some((s) => s.code === a.code));
  const duplicated = [...byTitle.values()].filter((list) => list.reduce((n, s) => n + s.n, 0) > 1);
  const unacked = [...byTitle.keys()].filter((t) => !acks.some((a) => a.title === t));
  rows.push({
    section: 'crashes',
    check: 'acknowledged writes lost',
    detail: `${lost.length} of ${acks.length} (${retried} needed a retry; ${seconds} s)`,
    ok: lost.length === 0 && acks.length > 0,
  });
  rows.push({
    section: 'crashes',
    check: 'writes duplicated',
    detail: `${duplicated.length}`,
    ok: duplicated.length === 0,
  });
  rows.push({
    section: 'crashes',
    check: 'writes never answered',
    detail: failures.length
      ? failures.slice(0, 2).join('; ')
      : `0 (${unacked.length} written with no answer kept)`,
    ok: failures.length === 0,
  });
  const a = await audit(registrar);
  rows.push({
    section: 'crashes',
    check: 'audit after the crashes',
    detail: a.ok ? 'every roll intact' : `${a.broken.length} broken`,
    ok: a.ok,
  });
  return rows;
}
