import { createHash, randomBytes } from 'node:crypto';
import { parseBundleText, SYSTEM_ACTOR, verifyBundle, verifyRoll, type EntryHeader } from '@beadroll/core';
import request from 'supertest';
import { DataSource } from 'typeorm';
import { AuditService, type AuditEvent } from '../src/audit/audit.service';
import { LedgerService } from '../src/ledger/ledger.service';
import { RollReaderService } from '../src/ledger/roll-reader.service';
import { LotsService } from '../src/lots/lots.service';
import { BlockedDigestsService } from '../src/registry/blocked-digests.service';
import { createAccount, type TestAccount, useAccount } from './support/accounts';
import { description } from './support/lot-fixtures';
import { lastMailTo } from './support/mail';
import { expectRefusedToAll, useTestApp } from './support/test-app';

const CSRF = ['X-Beadroll-Request', '1'] as const;

// SHA-256 from node:crypto, the reference implementation exhibits are named by (FIPS 180-4).
const sha256Hex = (b: Buffer) => createHash('sha256').update(b).digest('hex');

describe("the registrar's tools", () => {
  let db: DataSource;
  let lots: LotsService;
  let ledger: LedgerService;
  let reader: RollReaderService;
  const http = () => request(t.app.getHttpServer());

  const t = useTestApp();
  const registrar = useAccount(t, { role: 'registrar' });
  const holder = useAccount(t, { role: 'dealer', displayName: 'Marit Quell' });
  const other = useAccount(t, { role: 'dealer' });
  beforeAll(async () => {
    db = t.app.get(DataSource);
    lots = t.app.get(LotsService);
    ledger = t.app.get(LedgerService);
    reader = t.app.get(RollReaderService);
  });

  async function newLot(by: TestAccount = holder, over = {}): Promise<string> {
    const lot = await lots.register({ id: by.id, role: 'dealer' }, {
      description: description(over),
      observations: { hole: 'powder', note: 'bought from a neighbour, Mrs K. at 4 Elm Row' },
      sealed: { privateNote: 'paid in cash', storageLocation: 'drawer 2' },
    } as never);
    return lot.code;
  }

  async function roll(code: string) {
    const lot = await reader.findLot(code);
    return reader.entries(lot!.id);
  }

  async function tableCounts(): Promise<Record<string, number>> {
    const out: Record<string, number> = {};
    for (const table of ['entries', 'entry_bodies', 'registrar_actions', 'blocked_digests', 'reports']) {
      const [{ n }] = (await db.query(`SELECT count(*)::int AS n FROM "${table}"`)) as Array<{ n: number }>;
      out[table] = n;
    }
    return out;
  }

  async function audit(): Promise<Extract<AuditEvent, { type: 'done' }>> {
    let done: AuditEvent | undefined;
    for await (const e of t.app.get(AuditService).run()) done = e;
    return done as Extract<AuditEvent, { type: 'done' }>;
  }

  const redact = (body: Record<string, unknown>, who: TestAccount = registrar) =>
    who.agent
      .post('/api/registry/redactions')
      .set(...CSRF)
      .send(body);

  describe('redaction', () => {
    it('removes a body: the roll verifies, the public data shows the removal, the record has it', async () => {
      const code = await newLot();
      const res = await redact({ lot: code, seq: 1, reason: 'personal-data', note: 'a neighbour’s address' });
      expect(res.status).toBe(200);
      expect(res.body).toMatchObject({ lot: code, seq: 1, redactionSeq: 2, reason: 'personal-data' });

      const entries = await roll(code);
      expect(entries.map((e) => e.kind)).toEqual(['registered', 'observed', 'redacted']);
      expect(entries[1]!.body).toBeNull();
      // The digest of the removed body stays in its header.
      expect((JSON.parse(entries[1]!.header) as EntryHeader).body).toMatch(/^[0-9a-f]{64}$/);
      expect(verifyRoll(entries, { lot: code }).ok).toBe(true);

      const pub = await http().get(`/api/public/lots/${code}`).expect(200);
      expect(JSON.stringify(pub.body)).not.toContain('Elm Row');
      const v = verifyBundle(parseBundleText(JSON.stringify(pub.body.bundle)));
      expect(v.failures).toEqual([]);
      const redacted = pub.body.bundle.rolls[0].entries[2];
      expect(JSON.parse(redacted.body)).toMatchObject({ target: 1, reason: 'personal-data' });
      expect(pub.body.bundle.rolls[0].entries[1].body).toBeNull();

      const rec = await registrar.agent.get('/api/registry/actions').expect(200);
      expect(rec.body.items[0]).toMatchObject({
        actor: registrar.id,
        action: 'redacted',
        subject: `${code}/1`,
        reason: 'a neighbour’s address',
      });
      expect((await audit()).ok).toBe(true);
    });

    it('removes an exhibit and blocks its bytes from being uploaded again', async () => {
      const code = await newLot();
      const original = randomBytes(64);
      const web = randomBytes(32);
      const file = (b: Buffer) => ({ sha256: sha256Hex(b), size: b.length, mediaType: 'image/jpeg' });
      await ledger.append(code, {
        kind: 'exhibit-added',
        actor: holder.id,
        body: {
          exhibit: {
            kind: 'whole-lot',
            original: file(original),
            derivatives: [{ ...file(web), role: 'web' }],
          },
        },
      });
      const blocked = t.app.get(BlockedDigestsService);
      await expect(blocked.assertAllowed([sha256Hex(original)])).resolves.toBeUndefined();
      const res = await redact({ lot: code, seq: 2, reason: 'unlawful-content' }).expect(200);
      expect(res.body.blockedDigests.sort()).toEqual([sha256Hex(original), sha256Hex(web)].sort());
      expect(await blocked.isBlocked(sha256Hex(web))).toBe(true);
      await expect(blocked.assertAllowed([sha256Hex(original)])).rejects.toMatchObject({
        code: 'blocked_content',
      });
      expect(verifyRoll(await roll(code), { lot: code }).ok).toBe(true);
    });

    it.each([
      ['the registered entry (seq 0)', 0, 'seq'],
      ['an entry that does not exist', 99, 'seq'],
    ])('refuses to redact %s with a 400 naming the field, changing nothing', async (_what, seq, field) => {
      const code = await newLot();
      const before = await tableCounts();
      const res = await redact({ lot: code, seq, reason: 'abuse' });
      expect(res.status).toBe(400);
      expect(res.body.error.fields[0].field).toBe(field);
      expect(await tableCounts()).toEqual(before);
    });

    it('refuses a second redaction of the same entry, and a redaction of the redaction', async () => {
      const code = await newLot();
      await redact({ lot: code, seq: 1, reason: 'abuse' }).expect(200);
      const before = await tableCounts();
      for (const seq of [1, 2]) {
        const res = await redact({ lot: code, seq, reason: 'abuse' });
        expect(res.status).toBe(400);
        expect(res.body.error.fields[0]).toMatchObject({ field: 'seq' });
      }
      expect(await tableCounts()).toEqual(before);
    });

    it('answers bad requests clearly: unknown lot, bad reason, malformed code', async () => {
      const unknown = await redact({ lot: '0000-0000-0', seq: 1, reason: 'abuse' });
      expect([400, 404]).toContain(unknown.status);
      const reason = await redact({ lot: await newLot(), seq: 1, reason: 'because' });
      expect(reason.status).toBe(400);
      expect(reason.body.error.fields[0].field).toBe('reason');
      const code = await redact({ lot: 'not a code', seq: 1, reason: 'abuse' });
      expect(code.status).toBe(400);
      expect(code.body.error.fields[0].field).toBe('lot');
    });

    it('lets only a registrar redact', async () => {
      const code = await newLot();
      const res = await redact({ lot: code, seq: 1, reason: 'abuse' }, holder);
      expect(res.status).toBe(403);
      expect(await roll(code)).toHaveLength(2);
    });

    it('takes a holder’s request for their own entry; the registrar grants or declines it', async () => {
      const code = await newLot();
      const ask = (who: TestAccount, seq: number) =>
        who.agent
          .post(`/api/lots/${code}/redaction-requests`)
          .set(...CSRF)
          .send({ seq, note: 'my old address is in it' });
      expect((await ask(other, 1)).status).toBe(403);
      const made = await ask(holder, 1).expect(201);
      expect((await ask(holder, 1)).status).toBe(409);
      const queue = await registrar.agent.get('/api/registry/redaction-requests').expect(200);
      expect(queue.body.map((r: { id: string }) => r.id)).toContain(made.body.id);
      const granted = await registrar.agent
        .post(`/api/registry/redaction-requests/${made.body.id}/approve`)
        .set(...CSRF)
        .send({})
        .expect(200);
      expect(granted.body).toMatchObject({ reason: 'holder-request', seq: 1 });
      expect((await roll(code))[1]!.body).toBeNull();

      const code2 = await newLot();
      const second = await holder.agent
        .post(`/api/lots/${code2}/redaction-requests`)
        .set(...CSRF)
        .send({ seq: 1, note: 'please remove' })
        .expect(201);
      await registrar.agent
        .post(`/api/registry/redaction-requests/${second.body.id}/decline`)
        .set(...CSRF)
        .send({ reason: 'nothing personal in it' })
        .expect(200);
      expect((await roll(code2))[1]!.body).not.toBeNull();
      const rec = await registrar.agent.get('/api/registry/actions?action=redaction-declined').expect(200);
      expect(rec.body.items[0]).toMatchObject({ subject: `${code2}/1`, reason: 'nothing personal in it' });
    });
  });

  describe('reports', () => {
    it('files a report into the queue and tells the holder without the reporter’s address', async () => {
      const code = await newLot();
      const reporter = `buyer-${randomBytes(3).toString('hex')}@example.invalid`;
      const res = await http()
        .post(`/api/public/lots/${code}/reports`)
        .set(...CSRF)
        .send({
          category: 'counterfeit',
          text: 'These look like new beads from a recent mould.',
          email: reporter,
        })
        .expect(202);
      const queue = await registrar.agent.get('/api/registry/reports?status=open').expect(200);
      const item = queue.body.items.find((r: { id: string }) => r.id === res.body.id);
      expect(item).toMatchObject({ lot: code, category: 'counterfeit', status: 'open', answerWanted: true });

      const mail = lastMailTo(t, holder.email);
      expect(mail.subject).toContain('reported');
      expect(mail.text).toContain('recent mould');
      expect(mail.text).not.toContain(reporter);
      expect(mail.html).not.toContain(reporter);
      expect(mail.to).toEqual([holder.email]);

      await registrar.agent
        .post(`/api/registry/reports/${res.body.id}/close`)
        .set(...CSRF)
        .send({ resolution: 'The holder has corrected the attribution.' })
        .expect(200);
      expect(lastMailTo(t, reporter).text).toContain('corrected the attribution');
      const closed = await registrar.agent.get('/api/registry/reports?status=closed').expect(200);
      expect(closed.body.items.map((r: { id: string }) => r.id)).toContain(res.body.id);
    });

    it.each([
      ['no reason', { text: 'Something is wrong here.' }, 'category'],
      ['an unknown reason', { category: 'price', text: 'Too dear.' }, 'category'],
      ['over-long text', { category: 'other', text: 'x'.repeat(2001) }, 'text'],
      ['no text', { category: 'other' }, 'text'],
      ['a bad e-mail address', { category: 'other', text: 'Look at entry 3.', email: 'nobody' }, 'email'],
    ])('refuses a report with %s (400, nothing stored)', async (_what, body, field) => {
      const code = await newLot();
      const before = await tableCounts();
      const res = await http()
        .post(`/api/public/lots/${code}/reports`)
        .set(...CSRF)
        .send(body);
      expect(res.status).toBe(400);
      expect(res.body.error.fields.map((f: { field: string }) => f.field)).toContain(field);
      expect(await tableCounts()).toEqual(before);
    });

    it('answers a report on anything but a listed lot with the bare 404', async () => {
      const unlisted = await newLot(holder, { listed: false });
      for (const code of [unlisted, '0000-0000-0', 'nonsense']) {
        const res = await http()
          .post(`/api/public/lots/${code}/reports`)
          .set(...CSRF)
          .send({ category: 'other', text: 'Something is wrong.' });
        expect(res.status).toBe(404);
        expect(res.body.error).toMatchObject({ code: 'not_found', message: 'Not found.' });
      }
    });
  });

  describe('suspension', () => {
    it('lapses the suspended account’s open offers at once; lifting it restores writing', async () => {
      const seller = await createAccount(t, { role: 'dealer' });
      const code = await newLot(seller);
      const incoming = await newLot(other);
      await ledger.append(code, {
        kind: 'transfer-offered',
        actor: seller.id,
        body: { recipient: other.id },
      });
      await ledger.append(incoming, {
        kind: 'transfer-offered',
        actor: other.id,
        body: { recipient: seller.id },
      });

      await registrar.agent
        .post(`/api/registry/accounts/${seller.id}/suspend`)
        .set(...CSRF)
        .send({ reason: 'selling copies as antiques' })
        .expect(200);
      for (const c of [code, incoming]) {
        const entries = await roll(c);
        const last = entries[entries.length - 1]!;
        expect(last.kind).toBe('transfer-lapsed');
        expect(last.actor).toBe(SYSTEM_ACTOR);
        expect(verifyRoll(entries, { lot: c }).ok).toBe(true);
      }
      const card = await http().get(`/api/public/dealers/${seller.handle}`).expect(200);
      expect(card.body.status).toBe('suspended');
      const pub = await http().get(`/api/public/lots/${code}`).expect(200);
      expect(pub.body.cards[seller.id]).toMatchObject({ status: 'suspended' });
      // A suspended account writes nothing.
      const refused = await seller.agent
        .post(`/api/lots/${code}/observations`)
        .set(...CSRF)
        .send({ observations: { hole: 'powder' } });
      expect([401, 403]).toContain(refused.status);

      await registrar.agent
        .post(`/api/registry/accounts/${seller.id}/reinstate`)
        .set(...CSRF)
        .send({})
        .expect(200);
      expect((await http().get(`/api/public/dealers/${seller.handle}`)).body.status).toBe('verified');
      const rec = await registrar.agent.get('/api/registry/actions').expect(200);
      expect(rec.body.items.slice(0, 2)).toMatchObject([
        { action: 'reinstated', subject: seller.id, actor: registrar.id },
        { action: 'suspended', subject: seller.id, reason: 'selling copies as antiques' },
      ]);
    });
  });

  describe("the registrar's record", () => {
    it('keeps verification decisions, exports JSON and CSV, and the database refuses changes', async () => {
      const applicant = await createAccount(t, { role: 'dealer', status: 'pending' });
      await registrar.agent
        .post(`/api/registry/accounts/${applicant.id}/approve`)
        .set(...CSRF)
        .send({})
        .expect(200);
      const json = await registrar.agent.get('/api/registry/actions/export?format=json').expect(200);
      expect(json.headers['content-disposition']).toContain('registrar-record.json');
      const actions = (JSON.parse(json.text) as { actions: Array<{ action: string; subject: string }> })
        .actions;
      expect(actions.some((a) => a.action === 'approved' && a.subject === applicant.id)).toBe(true);
      const csv = await registrar.agent.get('/api/registry/actions/export?format=csv').expect(200);
      expect(csv.headers['content-type']).toContain('text/csv');
      const lines = csv.text.split('\r\n');
      expect(lines[0]).toBe('id,at,actor,action,subject,reason,details');
      expect(lines.filter((l) => l.includes(applicant.id)).length).toBeGreaterThan(0);
      expect((await registrar.agent.get('/api/registry/actions/export?format=xml')).status).toBe(400);

      for (const sql of ['UPDATE registrar_actions SET reason = NULL', 'DELETE FROM registrar_actions']) {
        await expectRefusedToAll(t, db, sql);
      }
    });
  });

  describe('personal data', () => {
    it('downloads everything held about the dealer, and closing anonymises it; every roll verifies', async () => {
      const leaving = await createAccount(t, {
        role: 'dealer',
        displayName: 'Orla Venn',
        business: 'Venn Beads',
      });
      const code = await newLot(leaving);
      await ledger.append(code, {
        kind: 'transfer-offered',
        actor: leaving.id,
        body: { recipient: other.id },
      });

      const dl = await leaving.agent.get('/api/account/personal-data').expect(200);
      expect(dl.headers['content-disposition']).toContain('attachment');
      expect(dl.body.account).toMatchObject({
        id: leaving.id,
        email: leaving.email,
        displayName: 'Orla Venn',
      });
      expect(dl.body.account.passwordHash).toBeUndefined();
      expect(dl.body.lotsHeld).toContain(code);
      expect(dl.body.entries.map((e: { lot: string }) => e.lot)).toContain(code);
      expect(dl.body.sealedDetails.map((s: { name: string }) => s.name).sort()).toEqual([
        'private-note',
        'storage-location',
      ]);
      // Each owning module answers for its part: the account's sessions are listed too.
      expect(dl.body.sessions.length).toBeGreaterThan(0);
      expect(dl.body.sessions[0]).toMatchObject({ revokedAt: null, revokedWhy: null });
      // Closing must clear the private search words (kept for the sealed storage place) and any
      // e-mailed link; there is one of each before.
      await http()
        .post('/api/auth/forgot-password')
        .set(...CSRF)
        .send({ email: leaving.email })
        .expect(202);
      const count = async (table: string) =>
        (
          (await db.query(`SELECT count(*)::int AS n FROM ${table} WHERE account_id = $1`, [
            leaving.id,
          ])) as Array<{
            n: number;
          }>
        )[0]!.n;
      expect(await count('lot_private_search')).toBeGreaterThan(0);
      expect(await count('email_tokens')).toBeGreaterThan(0);

      const wrong = await leaving.agent
        .post('/api/account/close')
        .set(...CSRF)
        .send({ password: 'not-it-at-all' });
      expect(wrong.status).toBe(400);
      expect(wrong.body.error.fields[0].field).toBe('password');

      await leaving.agent
        .post('/api/account/close')
        .set(...CSRF)
        .send({ password: leaving.password })
        .expect(200);
      const [row] = (await db.query('SELECT * FROM accounts WHERE id = $1', [leaving.id])) as Array<
        Record<string, unknown>
      >;
      expect(row).toMatchObject({ status: 'closed', display_name: 'Former dealer', password_hash: null });
      expect(JSON.stringify(row)).not.toContain('Orla');
      expect(JSON.stringify(row)).not.toContain(leaving.email);
      const [{ n }] = (await db.query(
        `SELECT count(*)::int AS n FROM sealed_fields s JOIN entries e ON e.id = s.entry_id WHERE e.actor = $1`,
        [leaving.id],
      )) as Array<{ n: number }>;
      expect(n).toBe(0);
      expect(await count('lot_private_search')).toBe(0);
      expect(await count('email_tokens')).toBe(0);
      // The rolls keep the entries under the opaque id; the open offer lapsed.
      const entries = await roll(code);
      expect(entries[0]!.actor).toBe(leaving.id);
      expect(entries[entries.length - 1]!.kind).toBe('transfer-lapsed');
      expect(verifyRoll(entries, { lot: code }).ok).toBe(true);
      expect((await audit()).ok).toBe(true);

      const pub = await http().get(`/api/public/lots/${code}`).expect(200);
      expect(JSON.stringify(pub.body)).not.toContain('Orla');
      expect(JSON.stringify(pub.body)).not.toContain('Venn');
      expect(pub.body.cards[leaving.id]).toMatchObject({ displayName: 'Former dealer', status: 'former' });
      expect(verifyBundle(parseBundleText(JSON.stringify(pub.body.bundle))).failures).toEqual([]);
      // The old sign-in is gone.
      expect((await leaving.agent.get('/api/account')).status).toBe(401);
      expect(
        (
          await http()
            .post('/api/auth/sign-in')
            .set(...CSRF)
            .send({ email: leaving.email, password: leaving.password })
        ).status,
      ).toBe(401);
    });

    it('outside the closing path the database still refuses to delete sealed values', async () => {
      await newLot();
      await expect(db.query('DELETE FROM sealed_fields')).rejects.toThrow(/refused/);
      await expect(
        db.transaction(async (m) => {
          await m.query(`SELECT set_config('beadroll.closing_account', $1, true)`, [holder.id]);
          await m.query('DELETE FROM sealed_fields');
        }),
      ).rejects.toThrow(/refused/);
    });
  });
});
