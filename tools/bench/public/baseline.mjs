// Baseline for the public-data benchmark: a bare node:http server with a pg pool of the same
// size as the app's, running the very statement the service runs for GET /api/public/lots/{code}
// of a lot without parents (imported from the built server) and answering the same JSON text,
// with none of the framework around it. Started by run.ts with PG* and PORT set.
import http from 'node:http';
import pg from 'pg';
import { PUBLIC_LOT_SQL, publicLotText } from '../../../packages/server/dist/lots/public-lot-text.js';

const pool = new pg.Pool({ max: Number(process.env.POOL_SIZE ?? 10) });
const NOT_FOUND = JSON.stringify({ error: { code: 'not_found', message: 'Not found.' } });

async function publicLot(code) {
  const { rows } = await pool.query(PUBLIC_LOT_SQL, [code]);
  const row = rows[0];
  if (!row) return null;
  if (row.has_parents) throw new Error('the baseline serves only lots without parents');
  return publicLotText(code, row);
}

const server = http.createServer((req, res) => {
  const m = /^\/api\/public\/lots\/([0-9A-Z]{9})$/.exec(req.url ?? '');
  const send = (status, text) => {
    res.writeHead(status, { 'content-type': 'application/json; charset=utf-8' });
    res.end(text);
  };
  if (!m) return send(404, NOT_FOUND);
  publicLot(m[1]).then(
    (text) => send(text ? 200 : 404, text ?? NOT_FOUND),
    () => send(500, JSON.stringify({ error: { code: 'internal', message: 'Internal error.' } })),
  );
});
server.listen(Number(process.env.PORT), '127.0.0.1', () => console.log('baseline ready'));
process.on('SIGTERM', () => server.close(() => pool.end().then(() => process.exit(0))));
