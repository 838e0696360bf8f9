// Races: requests that contend for the same lot, sent at the same moment. Exactly one of each
// contest wins, nobody gets a 5xx, no roll forks, and no lot ends with two holders.
import type { PgTarget } from '../lib/pg.ts';
import {
  audit,
  type Answer,
  type Client,
  description,
  type Row,
  type ServerProcess,
  signedIn,
  sql,
} from './harness.ts';

const ok2xx = (a: Answer) => a.status >= 200 && a.status < 300;

async function register(c: Client, title: string, count = 40): Promise<string> {
  const a = await c.write('POST', '/api/lots', { description: description(title, count, false) });
  if (a.status !== 201) throw new Error(`registering ${title}: ${a.status}`);
  return (a.body as { code: string }).code;
}

export async function raceSection(
  server: ServerProcess,
  target: PgTarget,
  database: string,
  rounds: number,
): Promise<Row[]> {
  const rows: Row[] = [];
  const a = await signedIn(server, target, database, 'dealer');
  const b = await signedIn(server, target, database, 'dealer');
  const registrar = await signedIn(server, target, database, 'registrar');
  const fiveHundreds: string[] = [];
  const note = (what: string, answers: Answer[]) => {
    for (const x of answers) if (x.status >= 500) fiveHundreds.push(`${what}: ${x.status}`);
  };

  // Accept against withdraw: one wins; the holder is the recipient exactly when the accept won.
  let acceptWrong = 0;
  for (let r = 0; r < rounds; r++) {
    const code = await register(a, `Race offer ${r}`);
    const offer = await a.write('POST', '/api/transfers/offers', { lot: code, recipient: b.id });
    const id = (offer.body as { offer: { id: string } }).offer.id;
    const [acc, wd] = await Promise.all([
      b.send('POST', `/api/transfers/offers/${id}/accept`, {}, { key: crypto.randomUUID() }),
      a.send('POST', `/api/transfers/offers/${id}/withdraw`, {}, { key: crypto.randomUUID() }),
    ]);
    note('accept/withdraw', [acc, wd]);
    const kinds = (
      await sql<{ kind: string }>(
        target,
        database,
        `SELECT e."kind" FROM "entries" e JOIN "lots" l ON l."id" = e."lot_id" WHERE l."code" = $1 AND e."seq" > 1 ORDER BY e."seq"`,
        [code],
      )
    ).map((k) => k.kind);
    const [view] = await sql<{ holder: string; state_holder: string }>(
      target,
      database,
      `SELECT v."holder", l."state"->>'holder' AS "state_holder" FROM "lot_views" v JOIN "lots" l ON l."id" = v."lot_id" WHERE v."code" = $1`,
      [code],
    );
    const wins = [acc, wd].filter(ok2xx).length;
    const expected = ok2xx(acc) ? ['transfer-accepted'] : ['transfer-withdrawn'];
    const holderOk = view!.holder === view!.state_holder && view!.holder === (ok2xx(acc) ? b.id : a.id);
    if (wins !== 1 || JSON.stringify(kinds) !== JSON.stringify(expected) || !holderOk) acceptWrong++;
  }
  rows.push({
    section: 'races',
    check: `accept against withdraw, ${rounds}×`,
    detail: acceptWrong
      ? `${acceptWrong} round(s) with two winners, none, or a wrong holder`
      : 'one winner each; holder follows it',
    ok: acceptWrong === 0,
  });

  // Two splits of the same lot, each taking more than half: exactly one is written.
  let splitWrong = 0;
  for (let r = 0; r < rounds; r++) {
    const code = await register(a, `Race split ${r}`, 40);
    const split = () =>
      a.send(
        'POST',
        `/api/lots/${code}/splits`,
        {
          children: [
            { description: description('Part', 15, false) },
            { description: description('Part', 10, false) },
          ],
        },
        { key: crypto.randomUUID() },
      );
    const answers = await Promise.all([split(), split()]);
    note('double split', answers);
    const [n] = await sql<{ splits: number; remaining: number }>(
      target,
      database,
      `SELECT (SELECT count(*)::int FROM "entries" e WHERE e."lot_id" = l."id" AND e."kind" = 'split') AS "splits",
              (l."state"->'remaining'->>'value')::int AS "remaining" FROM "lots" l WHERE l."code" = $1`,
      [code],
    );
    if (answers.filter(ok2xx).length !== 1 || n!.splits !== 1 || n!.remaining !== 15) splitWrong++;
  }
  rows.push({
    section: 'races',
    check: `double split, ${rounds}×`,
    detail: splitWrong ? `${splitWrong} round(s) wrong` : 'one split each; the beads add up',
    ok: splitWrong === 0,
  });

  // Three combinations crossing over three lots, each taking two whole lots: one wins.
  let combineWrong = 0;
  for (let r = 0; r < rounds; r++) {
    const [x, y, z] = [
      await register(a, `Race X ${r}`),
      await register(a, `Race Y ${r}`),
      await register(a, `Race Z ${r}`),
    ];
    const combine = (p: string, q: string) =>
      a.send(
        'POST',
        '/api/combinations',
        { parts: [{ lot: p }, { lot: q }], description: description('Combined strand', 80, false) },
        { key: crypto.randomUUID() },
      );
    const answers = await Promise.all([combine(x, y), combine(y, z), combine(z, x)]);
    note('crossing combinations', answers);
    const [n] = await sql<{ combined: number }>(
      target,
      database,
      `SELECT count(*)::int AS "combined" FROM "entries" e JOIN "lots" l ON l."id" = e."lot_id"
        WHERE l."code" = ANY($1) AND e."kind" = 'combined'`,
      [[x, y, z]],
    );
    if (answers.filter(ok2xx).length !== 1 || n!.combined !== 2) combineWrong++;
  }
  rows.push({
    section: 'races',
    check: `crossing combinations, ${rounds}×`,
    detail: combineWrong ? `${combineWrong} round(s) wrong` : 'one combination each, from two lots',
    ok: combineWrong === 0,
  });

  rows.push({
    section: 'races',
    check: 'answers of 500 or more',
    detail: fiveHundreds.length ? fiveHundreds.slice(0, 3).join('; ') : '0',
    ok: fiveHundreds.length === 0,
  });
  const [forks] = await sql<{ n: number }>(
    target,
    database,
    `SELECT count(*)::int AS "n" FROM (SELECT 1 FROM "entries" GROUP BY "lot_id", substring("header" from '"prev":"([0-9a-f]{64})"') HAVING count(*) > 1) f`,
  );
  const [holders] = await sql<{ n: number }>(
    target,
    database,
    `SELECT count(*)::int AS "n" FROM "lot_views" v JOIN "lots" l ON l."id" = v."lot_id" WHERE v."holder" <> l."state"->>'holder'`,
  );
  rows.push({
    section: 'races',
    check: 'forks (two entries after one)',
    detail: String(forks!.n),
    ok: forks!.n === 0,
  });
  rows.push({
    section: 'races',
    check: 'lots with two holders',
    detail: String(holders!.n),
    ok: holders!.n === 0,
  });
  const au = await audit(registrar);
  rows.push({
    section: 'races',
    check: 'audit after the races',
    detail: au.ok ? 'every roll intact' : `${au.broken.length} broken`,
    ok: au.ok,
  });
  return rows;
}
