import { randomUUID } from 'node:crypto';
import {
  bodyDigest,
  entryHash,
  parseBundleText,
  SYSTEM_ACTOR,
  verifyBundle,
  verifyRoll,
  verifySealedDisclosure,
  type EntryHeader,
} from '@beadroll/core';
import { DataSource } from 'typeorm';
import { AuditService, type AuditEvent } from '../src/audit/audit.service';
import { AppError } from '../src/common/app-error';
import { BundleService } from '../src/ledger/bundle.service';
import { LedgerService } from '../src/ledger/ledger.service';
import { LogSequencer } from '../src/ledger/log-sequencer';
import { RollReaderService } from '../src/ledger/roll-reader.service';
import { LotsService } from '../src/lots/lots.service';
import { dealer, description } from './support/lot-fixtures';
import { expectRefusedToAll, tamper, useTestApp } from './support/test-app';

describe('the ledger on PostgreSQL', () => {
  let ledger: LedgerService;
  let lots: LotsService;
  let reader: RollReaderService;
  let db: DataSource;

  const t = useTestApp();
  beforeAll(async () => {
    ledger = t.app.get(LedgerService);
    lots = t.app.get(LotsService);
    reader = t.app.get(RollReaderService);
    db = t.app.get(DataSource);
  });

  async function storedRoll(code: string) {
    const lot = await reader.findLot(code);
    return reader.entries(lot!.id);
  }

  async function count(table: string): Promise<number> {
    const [{ n }] = (await db.query(`SELECT count(*)::int AS n FROM "${table}"`)) as Array<{ n: number }>;
    return n;
  }

  it('registers, describes and observes a lot; the stored roll verifies and the head follows', async () => {
    const me = dealer();
    const lot = await lots.register(me, {
      description: description(),
      observations: { hole: 'powder', windingMarks: 'seen' },
      sealed: {
        storageLocation: 'drawer 4',
        acquisition: {
          date: '2026-03-02',
          source: 'house clearance',
          cost: { amount: 4500, currency: 'EUR' },
        },
      },
    } as never);
    expect(lot.headSeq).toBe(1);
    expect(lot.sealed).toEqual({
      storageLocation: 'drawer 4',
      acquisitionDate: '2026-03-02',
      acquisitionSource: 'house clearance',
      acquisitionCost: { amount: 4500, currency: 'EUR' },
    });
    await lots.describe(me, lot.code, {
      description: description({ title: 'Rose beads, re-strung' }),
    } as never);
    await lots.observe(me, lot.displayCode.toLowerCase(), { observations: { uvA: 'none' } } as never);
    const entries = await storedRoll(lot.code);
    expect(entries.map((e) => e.kind)).toEqual(['registered', 'observed', 'described', 'observed']);
    const r = verifyRoll(entries, { lot: lot.code });
    expect(r.ok).toBe(true);
    const detail = await lots.detail(me, lot.code);
    expect(detail.title).toBe('Rose beads, re-strung');
    expect(detail.observations).toEqual({ uvA: 'none' });
    expect(detail.headHash).toBe(entries[3]!.hash);
    expect((await lots.verify(me, lot.code)).ok).toBe(true);
  });

  it('shows sealed values only to the dealer who recorded them, and they open against the header', async () => {
    const me = dealer();
    const other = dealer();
    const lot = await lots.register(me, {
      description: description(),
      sealed: { acquisition: { cost: { amount: 1200, currency: 'GBP' } } },
    } as never);
    const mine = await lots.roll(me, lot.code);
    const f = mine.entries[0]!.sealed![0]!;
    expect(f).toMatchObject({ name: 'acquisition-cost', value: { amount: 1200, currency: 'GBP' } });
    const header = JSON.parse(mine.entries[0]!.header) as EntryHeader;
    expect(
      verifySealedDisclosure(
        { name: 'acquisition-cost', salt: f.salt, value: f.value, commitments: f.commitments },
        header.sealed!,
      ),
    ).toBe(true);
    const theirs = await lots.roll(other, lot.code);
    expect(theirs.entries[0]!.sealed).toBeUndefined();
    expect(JSON.stringify(theirs)).not.toContain('1200');
    const registrar = await lots.roll({ id: randomUUID(), role: 'registrar' }, lot.code);
    expect(registrar.entries[0]!.sealed).toBeUndefined();
    expect((await lots.detail(other, lot.code)).sealed).toEqual({});
  });

  it('serialises 200 concurrent appends to one lot: contiguous seqs, no fork, the roll verifies', async () => {
    const me = dealer();
    const lot = await lots.register(me, { description: description() } as never);
    await Promise.all(
      Array.from({ length: 200 }, (_, i) =>
        ledger.append(lot.code, {
          kind: 'observed',
          actor: me.id,
          body: { observations: { note: `look ${i}` } },
        }),
      ),
    );
    const entries = await storedRoll(lot.code);
    expect(entries.map((e) => e.seq)).toEqual(Array.from({ length: 201 }, (_, i) => i));
    expect(new Set(entries.map((e) => (JSON.parse(e.header) as EntryHeader).prev)).size).toBe(201);
    expect(verifyRoll(entries, { lot: lot.code }).ok).toBe(true);
    expect((await lots.detail(me, lot.code)).headSeq).toBe(200);
  });

  it('runs 200 concurrent appends across 20 lots; every roll verifies', async () => {
    const me = dealer();
    const codes: string[] = [];
    for (let i = 0; i < 20; i++)
      codes.push(
        (await lots.register(me, { description: description({ title: `Lot ${i}` }) } as never)).code,
      );
    await Promise.all(
      Array.from({ length: 200 }, (_, i) =>
        ledger.append(codes[i % 20]!, {
          kind: 'observed',
          actor: me.id,
          body: { observations: { note: `look ${i}` } },
        }),
      ),
    );
    for (const code of codes) {
      const entries = await storedRoll(code);
      expect(entries.map((e) => e.seq)).toEqual(Array.from({ length: 11 }, (_, i) => i));
      expect(verifyRoll(entries, { lot: code }).ok).toBe(true);
    }
  });

  it('lets appends to other lots through while one lot is locked', async () => {
    const me = dealer();
    const a = await lots.register(me, { description: description() } as never);
    const b = await lots.register(me, { description: description() } as never);
    let release!: () => void;
    const held = new Promise<void>((r) => (release = r));
    let locked!: () => void;
    const isLocked = new Promise<void>((r) => (locked = r));
    const holder = ledger.withLots([a.code], async () => {
      locked();
      await held;
    });
    await isLocked;
    const onA = ledger.append(a.code, {
      kind: 'observed',
      actor: me.id,
      body: { observations: { hole: 'clean' } },
    });
    // B is not blocked by A's lock.
    const onB = await ledger.append(b.code, {
      kind: 'observed',
      actor: me.id,
      body: { observations: { hole: 'clean' } },
    });
    expect(onB.seq).toBe(1);
    const state = await Promise.race([
      onA.then(() => 'written'),
      new Promise((r) => setTimeout(() => r('waiting'), 200)),
    ]);
    expect(state).toBe('waiting');
    release();
    await holder;
    expect((await onA).seq).toBe(1);
  });

  it('refuses a write the rules do not allow, and leaves nothing behind', async () => {
    const me = dealer();
    const lot = await lots.register(me, { description: description() } as never);
    const before = await count('entries');
    await expect(
      lots.observe(dealer(), lot.code, { observations: { hole: 'clean' } } as never),
    ).rejects.toMatchObject({ code: 'forbidden' });
    await expect(
      ledger.append(lot.code, { kind: 'transfer-accepted', actor: me.id, body: { offerSeq: 0 } }),
    ).rejects.toMatchObject({ code: 'roll_rule' });
    await expect(
      ledger.append(lot.code, { kind: 'transfer-lapsed', actor: SYSTEM_ACTOR, body: { offerSeq: 0 } }),
    ).rejects.toMatchObject({ code: 'roll_rule' });
    expect(await count('entries')).toBe(before);
  });

  it("maps core's field issues to request fields and writes nothing", async () => {
    const me = dealer();
    const lotsBefore = await count('lots');
    // 150 astral characters are 300 UTF-16 code units, over the 200 a title may have (ledger format §6).
    const err = (await lots
      .register(me, { description: description({ title: '\u{1F535}'.repeat(150) }) } as never)
      .catch((e: unknown) => e)) as AppError;
    expect(err).toBeInstanceOf(AppError);
    expect(err.code).toBe('validation');
    expect(err.fields).toEqual([{ field: 'description.title', reason: 'must be at most 200 characters' }]);
    const err2 = (await lots
      .register(me, {
        description: description(),
        sealed: { acquisition: { cost: { amount: 1.5, currency: 'EUR' } } },
      } as never)
      .catch((e: unknown) => e)) as AppError;
    expect(err2.fields?.[0]?.field).toBe('sealed.acquisition.cost.amount');
    expect(await count('lots')).toBe(lotsBefore);
  });

  it('rolls back a whole transaction when a later step fails', async () => {
    const me = dealer();
    const lotsBefore = await count('lots');
    await expect(
      ledger.withLots([], async (tx) => {
        await tx.register({ actor: me.id, description: description() });
        throw new Error('stop');
      }),
    ).rejects.toThrow('stop');
    expect(await count('lots')).toBe(lotsBefore);
    expect(await count('lot_views')).toBe(lotsBefore);
  });

  it('lists and unlists through described entries', async () => {
    const me = dealer();
    const lot = await lots.register(me, { description: description({ listed: false }) } as never);
    await expect(lots.detail(dealer(), lot.code)).rejects.toMatchObject({ code: 'not_found' });
    await lots.setListing(me, lot.code, true);
    expect((await lots.detail(dealer(), lot.code)).listed).toBe(true);
    await lots.setListing(me, lot.code, false);
    const kinds = (await storedRoll(lot.code)).map((e) => e.kind);
    expect(kinds).toEqual(['registered', 'described', 'described']);
  });

  it('lists with filters, paging, sorting and text search', async () => {
    const me = dealer();
    const other = dealer();
    await lots.register(me, {
      description: description({ title: 'Aventurine swirl beads', form: 'loose' }),
    } as never);
    await lots.register(me, {
      description: description({
        title: 'Forget-me-not strand',
        summary: 'tiny blue flowers',
        listed: false,
      }),
    } as never);
    await lots.register(other, {
      description: description({ title: 'Hidden roses', listed: false }),
    } as never);
    const mine = await lots.list(me, { mine: true, sort: 'title', order: 'asc' });
    expect(mine.items.map((i) => i.title)).toEqual(['Aventurine swirl beads', 'Forget-me-not strand']);
    expect((await lots.list(me, { q: 'flowers', mine: true })).items.map((i) => i.title)).toEqual([
      'Forget-me-not strand',
    ]);
    expect((await lots.list(me, { form: 'loose', mine: true })).total).toBe(1);
    expect((await lots.list(me, { listed: false, mine: true })).total).toBe(1);
    // Another dealer's unlisted lot is not in the list at all.
    expect((await lots.list(me, { q: 'hidden' })).total).toBe(0);
    const page = await lots.list(me, { mine: true, pageSize: 1, page: 2, sort: 'title', order: 'asc' });
    expect(page).toMatchObject({ total: 2, page: 2, pageSize: 1 });
    expect(page.items[0]!.title).toBe('Forget-me-not strand');
  });

  it('splits under one transaction with the parent locked; the child bundle verifies (full or link scope)', async () => {
    const me = dealer();
    for (const listed of [true, false]) {
      const parent = await lots.register(me, { description: description({ listed }) } as never);
      const children = await ledger.withLots([parent.code], async (tx) => {
        const codes = [await tx.newCode(), await tx.newCode()];
        const split = await tx.append(parent.code, {
          kind: 'split',
          actor: me.id,
          body: { children: codes.map((lot) => ({ lot, count: { value: 20, estimated: false } })) },
        });
        for (const code of codes) {
          await tx.register({
            code,
            actor: me.id,
            description: description({ count: { value: 20, estimated: false } }),
            parents: [{ lot: parent.code, seq: split.seq, hash: split.hash }],
          });
        }
        return codes;
      });
      expect((await lots.detail(me, parent.code)).status).toBe('split');
      const bundle = (await t.app.get(BundleService).bundleFor(children[0]!))!;
      expect(bundle.rolls.map((r) => [r.lot, r.scope])).toEqual([
        [children[0], 'full'],
        [parent.code, listed ? 'full' : 'inherited'],
      ]);
      const v = verifyBundle(parseBundleText(JSON.stringify(bundle)));
      expect(v.failures).toEqual([]);
      expect(v.links).toBe(1);
    }
  });

  it('redacts a body only through the redaction path; the roll still verifies', async () => {
    const me = dealer();
    const lot = await lots.register(me, { description: description() } as never);
    await lots.observe(me, lot.code, { observations: { note: 'a personal detail' } } as never);
    const [{ id }] = (await db.query(
      `SELECT e.id FROM entries e JOIN lots l ON l.id = e.lot_id WHERE l.code = $1 AND e.seq = 1`,
      [lot.code],
    )) as Array<{ id: string }>;
    await expect(db.query('DELETE FROM entry_bodies WHERE entry_id = $1', [id])).rejects.toThrow(/refused/);
    await ledger.withLots([lot.code], (tx) => tx.redact(lot.code, randomUUID(), 1, 'personal-data'));
    const entries = await storedRoll(lot.code);
    expect(entries[1]!.body).toBeNull();
    expect(verifyRoll(entries, { lot: lot.code }).ok).toBe(true);
    expect((await lots.detail(me, lot.code)).observations).toBeNull();
  });

  describe('the database itself', () => {
    let code: string;
    beforeAll(async () => {
      code = (
        await lots.register(dealer(), { description: description(), sealed: { privateNote: 'x' } } as never)
      ).code;
    });

    it.each([
      ['UPDATE entries SET kind = kind'],
      ["UPDATE entries SET header = header || ' '"],
      ['DELETE FROM entries'],
      ['UPDATE entry_bodies SET body = body'],
      ['DELETE FROM entry_bodies'],
      ['UPDATE sealed_fields SET value = value'],
      ['DELETE FROM sealed_fields'],
      ['DELETE FROM lots'],
      ['TRUNCATE entries CASCADE'],
    ])('refuses %s, even to a superuser', async (sql) => {
      await expectRefusedToAll(t, db, sql);
      expect(verifyRoll(await storedRoll(code), { lot: code }).ok).toBe(true);
    });

    it('lets the log index be filled in once (by the log sequencer), and never changed after', async () => {
      await t.app.get(LogSequencer).settle();
      const lot = await reader.findLot(code);
      const [{ n }] = await db.query(
        'SELECT count(*) FILTER (WHERE log_index IS NULL) AS n FROM entries WHERE lot_id = $1',
        [lot!.id],
      );
      expect(Number(n)).toBe(0);
      await expect(
        db.query('UPDATE entries SET log_index = log_index + 1000 WHERE lot_id = $1', [lot!.id]),
      ).rejects.toThrow(/refused/);
    });
  });

  describe('tampering', () => {
    it('a changed body, header or hash is named by the verifier and by the audit', async () => {
      const me = dealer();
      const made: string[] = [];
      for (let i = 0; i < 3; i++) {
        const lot = await lots.register(me, { description: description() } as never);
        await lots.observe(me, lot.code, { observations: { hole: 'clean' } } as never);
        await lots.observe(me, lot.code, { observations: { hole: 'powder' } } as never);
        made.push(lot.code);
      }
      const entryId = async (code: string, seq: number) =>
        (
          (await db.query(
            'SELECT e.id FROM entries e JOIN lots l ON l.id = e.lot_id WHERE l.code = $1 AND e.seq = $2',
            [code, seq],
          )) as Array<{ id: string }>
        )[0]!.id;
      // 1: a body changed in place.
      await tamper(
        t,
        `UPDATE entry_bodies SET body = replace(body, '"powder"', '"clean"') WHERE entry_id = $1`,
        [await entryId(made[0]!, 2)],
      );
      // 2: a header changed: its kind no longer fits its rule facts, which a verifier reads
      // before it recomputes the hash (the stored hash no longer matches either).
      await tamper(
        t,
        `UPDATE entries SET header = replace(header, '"observed"', '"described"') WHERE id = $1`,
        [await entryId(made[1]!, 1)],
      );
      // 3: a body dropped without a redaction.
      await tamper(t, 'DELETE FROM entry_bodies WHERE entry_id = $1', [await entryId(made[2]!, 1)]);

      const expected = [
        { lot: made[0], seq: 2, reason: 'bad-body-digest' },
        { lot: made[1], seq: 1, reason: 'bad-facts' },
        { lot: made[2], seq: 1, reason: 'missing-body' },
      ];
      for (const e of expected) {
        const v = await lots.verify(me, e.lot!);
        expect(v).toMatchObject({ ok: false, failure: { seq: e.seq, reason: e.reason } });
      }
      const events: AuditEvent[] = [];
      for await (const ev of t.app.get(AuditService).run()) events.push(ev);
      const broken = events.filter((e) => e.type === 'broken');
      for (const e of expected) expect(broken).toContainEqual(expect.objectContaining(e));
      const done = events.at(-1)!;
      expect(done).toMatchObject({ type: 'done', ok: false });
      // Sanity: the helpers agree with core on what was stored before the tamper.
      const intact = (await storedRoll(made[0]!))[0]!;
      expect(entryHash(intact.header)).toBe(intact.hash);
      expect(bodyDigest(intact.body!)).toBe((JSON.parse(intact.header) as EntryHeader).body);
    });
  });
});
