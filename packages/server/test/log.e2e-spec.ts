import { mkdtempSync, readdirSync, readFileSync } from 'node:fs';
import type { AddressInfo } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import {
  base64Decode,
  checkConsistency,
  entryLeafHash,
  MerkleTree,
  openCheckpoint,
  parseVerifierKey,
  verifyBundle,
  verifyBundleCheckpoint,
  verifyInclusion,
  decodeProof,
} from '@beadroll/core';
import request from 'supertest';
import { DataSource } from 'typeorm';
import { runWitness, witnessVerifierKey, loadWitnessSigner } from '@beadroll/witness';
import { LedgerService } from '../src/ledger/ledger.service';
import { CheckpointsService } from '../src/log/checkpoints.service';
import { LogTreeService, RECHECK_LEAVES } from '../src/log/log-tree.service';
import { LogLeavesService } from '../src/ledger/log-leaves.service';
import { LogSequencer } from '../src/ledger/log-sequencer';
import { createAccount } from './support/accounts';
import { description } from './support/lot-fixtures';
import { superuserClient, tamper, useTestApp } from './support/test-app';

const CSRF: [string, string] = ['X-Beadroll-Request', '1'];

describe('the ledger-wide log', () => {
  let ledger: LedgerService;
  let checkpoints: CheckpointsService;
  let sequencer: LogSequencer;
  let actor: string;
  let base: string;
  const lots: string[] = [];

  const t = useTestApp(() => ({ CHECKPOINT_SECONDS: '3600' }));
  beforeAll(async () => {
    ledger = t.app.get(LedgerService);
    checkpoints = t.app.get(CheckpointsService);
    sequencer = t.app.get(LogSequencer);
    const d = await createAccount(t, { role: 'dealer' });
    actor = d.id;
    await t.app.listen(0, '127.0.0.1');
    base = `http://127.0.0.1:${(t.app.getHttpServer().address() as AddressInfo).port}`;
  });

  const http = () => request(t.app.getHttpServer());
  /** Numbers every committed entry, then signs a checkpoint now. */
  const sign = async () => {
    await sequencer.settle();
    return checkpoints.signIfDue(true);
  };

  async function logKey() {
    const res = await http().get('/api/log/key').expect(200);
    expect(res.headers['content-type']).toMatch(/^text\/plain/);
    return parseVerifierKey(res.text.trim());
  }

  /** A witness of this log named `name`, keeping its state, key and evidence in a fresh folder. */
  function witnessIn(name: string) {
    const dir = mkdtempSync(join(tmpdir(), 'witness-'));
    const evidenceDir = join(dir, 'evidence');
    return { url: base, stateFile: join(dir, 'state.json'), keyFile: join(dir, 'w.key'), name, evidenceDir };
  }

  async function checkpoint() {
    const res = await http().get('/api/log/checkpoint').expect(200);
    expect(res.headers['content-type']).toMatch(/^text\/plain/);
    return { note: res.text, cp: openCheckpoint(res.text, await logKey()) };
  }

  it('gives every committed entry the next log index, densely, also under concurrent appends', async () => {
    for (let i = 0; i < 3; i++) lots.push((await ledger.register({ actor, description: description() })).lot);
    await Promise.all(
      Array.from({ length: 24 }, (_, i) =>
        ledger.append(lots[i % 3]!, { kind: 'note', actor, body: { text: `note ${i}` } }),
      ),
    );
    await sequencer.settle();
    const rows: Array<{ log_index: string; lot_id: string; seq: number }> = await t.app
      .get(DataSource)
      .query('SELECT "log_index", "lot_id", "seq" FROM "entries" ORDER BY "log_index"');
    expect(rows.map((r) => Number(r.log_index))).toEqual(rows.map((_, i) => i));
    // Within a roll, log order is seq order (commit order).
    const last = new Map<string, number>();
    for (const r of rows) {
      expect(r.seq).toBe((last.get(r.lot_id) ?? -1) + 1);
      last.set(r.lot_id, r.seq);
    }
  });

  it('signs a C2SP checkpoint of the whole log with the key it serves; proofs and leaves agree with it', async () => {
    expect((await sign()).signed).toBe(true);
    const { cp } = await checkpoint();
    // The host of PUBLIC_BASE_URL (with its port, if any), then /log.
    expect(cp.origin).toBe(`${new URL(process.env.PUBLIC_BASE_URL!).host}/log`);
    expect(cp.size).toBe(27);
    const leaves = await http().get('/api/log/leaves?start=0&end=27').expect(200);
    expect(leaves.body.start).toBe(0);
    expect(leaves.body.end).toBe(27);
    const tree = new MerkleTree((leaves.body.leaves as string[]).map(entryLeafHash));
    expect(Buffer.from(tree.root()).equals(Buffer.from(cp.root))).toBe(true);
    for (const i of [0, 5, 26]) {
      const p = await http().get(`/api/log/proof/inclusion?index=${i}&size=27`).expect(200);
      expect(p.body).toMatchObject({ index: i, size: 27 });
      const leaf = entryLeafHash(leaves.body.leaves[i]);
      expect(verifyInclusion(leaf, i, 27, decodeProof(p.body.proof)!, cp.root)).toBe(true);
    }
  });

  it('a later checkpoint is consistent with the earlier one', async () => {
    const before = (await checkpoint()).cp;
    await ledger.append(lots[0]!, { kind: 'note', actor, body: { text: 'one more' } });
    // Not due yet: at most one checkpoint per CHECKPOINT_SECONDS.
    expect((await checkpoints.signIfDue()).signed).toBe(false);
    expect((await sign()).signed).toBe(true);
    const after = (await checkpoint()).cp;
    expect(after.size).toBe(before.size + 1);
    const c = await http().get(`/api/log/proof/consistency?from=${before.size}&to=${after.size}`).expect(200);
    expect(c.body).toMatchObject({ from: before.size, to: after.size });
    expect(checkConsistency(before.size, before.root, after.size, after.root, c.body.proof)).toBe(true);
  });

  it.each([
    ['/api/log/proof/inclusion?index=x&size=3', 'index'],
    ['/api/log/proof/inclusion?index=1', 'size'],
    ['/api/log/proof/inclusion?index=3&size=3', 'index'],
    ['/api/log/proof/inclusion?index=0&size=999', 'size'],
    ['/api/log/proof/inclusion?index=-1&size=3', 'index'],
    ['/api/log/proof/inclusion?index=01&size=3', 'index'],
    ['/api/log/proof/consistency?from=5&to=3', 'from'],
    ['/api/log/proof/consistency?from=1&to=99999', 'to'],
    ['/api/log/leaves?start=0&end=1001', 'end'],
    ['/api/log/leaves?start=2&end=2', 'start'],
    ['/api/log/leaves?start=0&end=500', 'end'],
    ['/api/log/leaves?start=0', 'end'],
  ])('%s is a 400 naming %s', async (url, field) => {
    const res = await http().get(url).expect(400);
    expect(res.body.error.fields.map((f: { field: string }) => f.field)).toContain(field);
  });

  it('the bundle and the public data carry the checkpoint and an inclusion proof of the head', async () => {
    const key = await logKey();
    const pub = await http().get(`/api/public/lots/${lots[0]}`).expect(200);
    const bundle = pub.body.bundle;
    expect(verifyBundle(bundle).ok).toBe(true);
    expect(bundle.checkpoints).toHaveLength(1);
    const head = bundle.rolls[0].entries.at(-1);
    expect(head.logIndex).toEqual(expect.any(Number));
    expect(bundle.checkpoints[0].inclusions).toEqual([
      expect.objectContaining({ lot: lots[0], seq: JSON.parse(head.header).seq, logIndex: head.logIndex }),
    ]);
    expect(verifyBundleCheckpoint(bundle.checkpoints[0], bundle.rolls, key).ok).toBe(true);
    // The head written after the checkpoint: the proof is of the latest covered entry.
    await ledger.append(lots[1]!, { kind: 'note', actor, body: { text: 'after the checkpoint' } });
    const pub2 = await http().get(`/api/public/lots/${lots[1]}`).expect(200);
    const inc = pub2.body.bundle.checkpoints[0].inclusions[0];
    expect(inc.seq).toBe(pub2.body.bundle.rolls[0].entries.length - 2);
    expect(verifyBundleCheckpoint(pub2.body.bundle.checkpoints[0], pub2.body.bundle.rolls, key).ok).toBe(
      true,
    );
  });

  it('a registered witness cosigns; the checkpoint then carries its cosignature; others are refused', async () => {
    const opts = witnessIn('witness.example/w1');
    const wkey = witnessVerifierKey(loadWitnessSigner(opts.keyFile, opts.name));
    // Not registered yet: refused.
    expect(await runWitness(opts)).toMatchObject({
      status: 'failed',
      message: expect.stringContaining('403'),
    });
    const { agent } = await createAccount(t, { role: 'registrar' });
    await agent
      .post('/api/registry/witnesses')
      .set(...CSRF)
      .send({ key: 'not a key' })
      .expect(400);
    await agent
      .post('/api/registry/witnesses')
      .set(...CSRF)
      .send({ key: (await logKey()).name + '+00000000+AA==' })
      .expect(400);
    await agent
      .post('/api/registry/witnesses')
      .set(...CSRF)
      .send({ key: wkey })
      .expect(201);
    await sign();
    const out = await runWitness(opts);
    expect(out).toMatchObject({ status: 'cosigned' });
    checkpoints.invalidate();
    const { cp } = await checkpoint();
    const opened = openCheckpoint((await checkpoint()).note, await logKey(), [parseVerifierKey(wkey)]);
    expect(opened.cosigned.map((c) => c.name)).toEqual(['witness.example/w1']);
    expect(cp.size).toBeGreaterThan(0);
    const list = await agent.get('/api/registry/witnesses').expect(200);
    expect(list.body.items[0]).toMatchObject({ name: 'witness.example/w1', lastCosignedSize: cp.size });
    expect(list.body.items[0].lastCosignedAt).toEqual(expect.any(String));
    // A forged cosignature line for the registered name is refused.
    const forged = (await checkpoint()).note.split('\n').filter((l) => l.startsWith('— witness'))[0]!;
    const bad = forged.slice(0, -6) + (forged.endsWith('AAAA==') ? 'BBBB==' : 'AAAA==');
    await http()
      .post('/api/log/cosignatures')
      .set(...CSRF)
      .send({ checkpoint: (await checkpoint()).note, cosignature: bad })
      .expect(400);
  });

  it('a past entry rewritten in the database: the log refuses to sign, and a log that signs anyway is caught by the witness with evidence', async () => {
    const opts = witnessIn('witness.example/w2');
    const { agent } = await createAccount(t, { role: 'registrar' });
    const wkey = witnessVerifierKey(loadWitnessSigner(opts.keyFile, opts.name));
    await agent
      .post('/api/registry/witnesses')
      .set(...CSRF)
      .send({ key: wkey })
      .expect(201);
    expect(await runWitness(opts)).toMatchObject({ status: 'cosigned' });
    const seen = JSON.parse(readFileSync(opts.stateFile, 'utf8')).checkpoint as string;

    await tamper(t, `UPDATE entries SET hash = repeat('ab', 32) WHERE log_index = 3`);
    await ledger.append(lots[2]!, { kind: 'note', actor, body: { text: 'after the rewrite' } });
    const refused = await sign();
    expect(refused).toMatchObject({ signed: false, refused: expect.stringContaining('not consistent') });

    // An operator who also deletes the signed checkpoints gets a new one signed…
    const su2 = await superuserClient(t.db.name);
    try {
      await su2.query('DELETE FROM log_checkpoints');
    } finally {
      await su2.end();
    }
    expect((await sign()).signed).toBe(true);
    checkpoints.invalidate();
    // …and the witness refuses it, keeping both signed checkpoints.
    const out = await runWitness(opts);
    expect(out).toMatchObject({ status: 'inconsistent' });
    if (out.status !== 'inconsistent') return;
    expect(readdirSync(out.evidence).sort()).toEqual([
      'detail.json',
      'latest.checkpoint',
      'previous.checkpoint',
    ]);
    expect(readFileSync(join(out.evidence, 'previous.checkpoint'), 'utf8')).toBe(seen);
    const latest = readFileSync(join(out.evidence, 'latest.checkpoint'), 'utf8');
    const key = await logKey();
    const a = openCheckpoint(seen, key);
    const b = openCheckpoint(latest, key);
    expect(b.size).toBeGreaterThan(a.size);
    // Both carry valid log signatures: the evidence stands on its own.
    expect(base64Decode(latest.split('\n')[2]!)).not.toBeNull();
  });

  it('refuses to sign while an entry the log numbered is missing, and signs again once it is back', async () => {
    const { lot } = await ledger.register({ actor, description: description() });
    await sequencer.settle();
    const su = await superuserClient(t.db.name);
    try {
      const { rows } = await su.query<{ entry: { log_index: string }; body: unknown }>(
        `SELECT row_to_json(e) AS "entry", (SELECT row_to_json(b) FROM entry_bodies b WHERE b.entry_id = e.id) AS "body"
           FROM entries e JOIN lots l ON l.id = e.lot_id WHERE l.code = $1 AND e.seq = 0`,
        [lot],
      );
      const index = Number(rows[0]!.entry.log_index);
      // Someone with the database's keys removes an entry (and its body), then the checkpoints.
      await su.query('BEGIN');
      await su.query('SET LOCAL session_replication_role = replica');
      await su.query(
        'DELETE FROM entry_bodies WHERE entry_id IN (SELECT id FROM entries WHERE log_index = $1)',
        [index],
      );
      expect((await su.query('DELETE FROM entries WHERE log_index = $1', [index])).rowCount).toBe(1);
      await su.query('DELETE FROM log_checkpoints');
      await su.query('COMMIT');
      await ledger.register({ actor, description: description() });
      const refused = await sign();
      expect(refused).toMatchObject({
        signed: false,
        refused: expect.stringContaining(`no entry at index ${index}: an entry was removed`),
      });
      checkpoints.invalidate();
      await http().get('/api/log/checkpoint').expect(503);
      // The standing refusal shows in the service's health, in words that name no lot nor entry.
      const health = await http().get('/api/health').expect(200);
      expect(health.body).toMatchObject({
        status: 'degraded',
        database: 'ok',
        log: 'refusing',
        reasons: ['the log’s signer refuses to sign: an entry the log numbered is missing'],
      });
      expect(health.text).not.toContain(lot);

      // Restored from a backup, the log is whole again and the next pass signs it.
      await su.query('BEGIN');
      await su.query('SET LOCAL session_replication_role = replica');
      await su.query(
        'INSERT INTO entries OVERRIDING SYSTEM VALUE SELECT * FROM json_populate_record(NULL::entries, $1)',
        [rows[0]!.entry],
      );
      if (rows[0]!.body)
        await su.query(
          'INSERT INTO entry_bodies OVERRIDING SYSTEM VALUE SELECT * FROM json_populate_record(NULL::entry_bodies, $1)',
          [rows[0]!.body],
        );
      await su.query('COMMIT');
    } finally {
      await su.end();
    }
    expect(await sign()).toMatchObject({ signed: true });
    expect((await http().get('/api/health').expect(200)).body).toMatchObject({
      status: 'ok',
      log: 'ok',
      reasons: [],
    });
  });

  it('reads only the new leaves for a signature, and finds a changed past entry within a round of the log', async () => {
    const tree = t.app.get(LogTreeService);
    const leaves = t.app.get(LogLeavesService);
    const { lot } = await ledger.register({ actor, description: description() });
    const { lot: other } = await ledger.register({ actor, description: description() });
    const note = () => ledger.append(lot, { kind: 'note', actor, body: { text: 'one more' } });
    expect(await sign()).toMatchObject({ signed: true });
    const size = await leaves.size();
    const [{ index, hash }] = (await t.app.get(DataSource).query(
      `SELECT e."log_index"::int AS "index", e."hash" FROM "entries" e JOIN "lots" l ON l."id" = e."lot_id"
        WHERE l."code" = $1`,
      [other],
    )) as Array<{ index: number; hash: string }>;
    tree.recheckLeaves = 4;
    const read = jest.spyOn(leaves, 'leaves');
    try {
      await note();
      expect(await sign()).toMatchObject({ signed: true, size: size + 1 });
      // The one new leaf; the four compared are digested in the database, not read.
      expect(read.mock.calls).toEqual([[size, size + 1]]);

      // A past entry far behind the window is rewritten: a pass that does not compare it signs
      // the leaves as first read; the pass that reaches it reads everything again and refuses.
      await tamper(t, `UPDATE entries SET hash = repeat('cd', 32) WHERE log_index = $1`, [index]);
      let passes = 0;
      let run;
      do {
        await note();
        run = await sign();
        passes++;
      } while (run.signed && passes < size);
      expect(run).toMatchObject({ signed: false, refused: expect.stringContaining('not consistent') });
      // Four leaves compared a pass while the log grows by one: a round takes about size / 3.
      expect(passes).toBeLessThanOrEqual(Math.ceil(size / 3) + 2);
      await tamper(t, `UPDATE entries SET hash = $1 WHERE log_index = $2`, [hash, index]);
      await note();
      expect(await sign()).toMatchObject({ signed: true });
    } finally {
      read.mockRestore();
      tree.recheckLeaves = RECHECK_LEAVES;
    }
  });

  it('the proof routes are public', async () => {
    await http().get('/api/log/key').expect(200);
  });
});
