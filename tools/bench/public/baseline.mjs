// Baseline for the public-data benchmark: a bare node:http server with a pg pool of the same
// size as the app's, running the same SQL as the service for GET /api/public/lots/{code} of a
// lot without parents (listed check, lot row, entries with bodies) and answering the same JSON
// shape, with none of the framework around it. Started by run.ts with PG* and PORT set.
import http from 'node:http';
import pg from 'pg';

const pool = new pg.Pool({ max: Number(process.env.POOL_SIZE ?? 10) });

async function publicLot(code) {
  const listed = await pool.query('SELECT 1 FROM "lot_views" WHERE "code" = $1 AND "listed"', [code]);
  if (listed.rowCount === 0) return null;
  const lots = await pool.query(
    'SELECT "id", "code", "head_seq", "head_hash" FROM "lots" WHERE "code" = $1',
    [code],
  );
  const lot = lots.rows[0];
  if (!lot) return null;
  const rows = await pool.query(
    `SELECT e."seq", e."kind", e."actor", e."time", e."hash", e."header", b."body", e."log_index"
     FROM "entries" e LEFT JOIN "entry_bodies" b ON b."entry_id" = e."id"
     WHERE e."lot_id" = $1 AND e."seq" >= $2 AND ($4::text[] IS NULL OR e."kind" = ANY($4))
     ORDER BY e."seq" LIMIT $3`,
    [lot.id, 0, 1_000_000, null],
  );
  const entries = rows.rows.map((r) => ({
    hash: r.hash,
    header: r.header,
    body: r.body,
    logIndex: r.log_index === null ? null : Number(r.log_index),
  }));
  return {
    code,
    bundle: {
      format: 'beadroll-bundle',
      version: 1,
      rolls: [{ lot: code, scope: 'full', entries }],
      checkpoints: [],
    },
    cards: {},
  };
}

const server = http.createServer((req, res) => {
  const m = /^\/api\/public\/lots\/([0-9A-Z]{9})$/.exec(req.url ?? '');
  const send = (status, body) => {
    res.writeHead(status, { 'content-type': 'application/json; charset=utf-8' });
    res.end(JSON.stringify(body));
  };
  if (!m) return send(404, { error: { code: 'not_found', message: 'Not found.' } });
  publicLot(m[1]).then(
    (body) => (body ? send(200, body) : send(404, { error: { code: 'not_found', message: 'Not found.' } })),
    () => send(500, { error: { code: 'internal', message: 'Internal error.' } }),
  );
});
server.listen(Number(process.env.PORT), '127.0.0.1', () => console.log('baseline ready'));
process.on('SIGTERM', () => server.close(() => pool.end().then(() => process.exit(0))));
