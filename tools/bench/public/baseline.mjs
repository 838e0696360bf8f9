// Baseline for the public-data benchmark: a bare node:http server with a pg pool of the same
// size as the app's (10), answering GET /api/public/lots/{code} of a lot without parents with the
// same bytes as the app and with none of the framework around it. Per request it runs the very
// statement the app runs (PUBLIC_LOT_SQL, imported from the built server) and composes the same
// text (publicLotText); the checkpoint member is made as the app makes it: the latest checkpoint
// read at most once a second (the app's cache), and an inclusion proof of the roll's head from
// the log's Merkle tree held in memory (read from the entries once at start, as the app's log
// tree is). The plain baseline sends the statement's text with each query, as a bare server
// would; with PREPARED=1 it prepares it once per connection, as the app does. Started by run.ts with PG* and PORT set, after the lot's head is covered by a
// checkpoint and nothing is written any more.
import http from 'node:http';
import pg from 'pg';
import { base64Encode, entryLeafHash, MerkleTree } from '@beadroll/core';
import { PUBLIC_LOT_SQL, publicLotText } from '../../../packages/server/dist/lots/public-lot-text.js';

// PREPARED=1: the statement as a named (prepared) one, as the app runs it; shown beside the
// plain baseline so the ratio can be read both ways.
const PREPARED = process.env.PREPARED === '1';
const pool = new pg.Pool({ max: Number(process.env.POOL_SIZE ?? 10) });
const NOT_FOUND = JSON.stringify({ error: { code: 'not_found', message: 'Not found.' } });

const tree = new MerkleTree();
for (const r of (
  await pool.query('SELECT "hash" FROM "entries" WHERE "log_index" IS NOT NULL ORDER BY "log_index"')
).rows)
  tree.append(entryLeafHash(r.hash));

let latest = { at: 0, value: null };
async function latestCheckpoint() {
  if (Date.now() - latest.at < 1000) return latest.value;
  const { rows } = await pool.query(
    `SELECT c."size", c."note",
            (SELECT array_agg(s."line" ORDER BY s."received_at", s."witness_id")
               FROM "log_cosignatures" s WHERE s."checkpoint_size" = c."size") AS "lines"
       FROM "log_checkpoints" c ORDER BY c."size" DESC LIMIT 1`,
  );
  const r = rows[0];
  const value = r
    ? { size: Number(r.size), note: r.note + (r.lines ?? []).map((l) => `${l}\n`).join('') }
    : null;
  latest = { at: Date.now(), value };
  return value;
}

async function publicLot(code) {
  const { rows } = PREPARED
    ? await pool.query({ name: 'public_lot', text: PUBLIC_LOT_SQL, values: [code] })
    : await pool.query(PUBLIC_LOT_SQL, [code]);
  const row = rows[0];
  if (!row) return null;
  if (row.has_parents) throw new Error('the baseline serves only lots without parents');
  const c = await latestCheckpoint();
  const index = row.head_log_index === null ? null : Number(row.head_log_index);
  if (!c || index === null || index >= c.size || c.size > tree.size)
    throw new Error('the baseline serves only lots whose head a checkpoint covers');
  const inclusion = {
    lot: code,
    seq: row.head_seq,
    logIndex: index,
    proof: tree.inclusionProof(index, c.size).map(base64Encode),
  };
  return publicLotText(code, row, JSON.stringify([{ note: c.note, inclusions: [inclusion] }]));
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
