import {
  parseBundle,
  seededRandom,
  verifyBundle,
  verifyRoll,
  type Bundle,
  type CombinedBody,
  type EntryHeader,
  type LotDescription,
  type RegisteredBody,
  type SplitBody,
} from '@beadroll/core';
import request from 'supertest';
import { DataSource } from 'typeorm';
import { AppError } from '../src/common/app-error';
import { LedgerService } from '../src/ledger/ledger.service';
import { RollReaderService } from '../src/ledger/roll-reader.service';
import { type TestAccount, useAccount } from './support/accounts';
import { description, offerOnRoll, registerLot } from './support/lot-fixtures';
import { tamper, useTestApp } from './support/test-app';

const CSRF = ['X-Beadroll-Request', '1'] as const;

describe('splits and combinations', () => {
  let ledger: LedgerService;
  let reader: RollReaderService;
  let db: DataSource;

  const t = useTestApp();
  const odile = useAccount(t, { role: 'dealer' });
  const teodor = useAccount(t, { role: 'dealer' });
  beforeAll(async () => {
    ledger = t.app.get(LedgerService);
    reader = t.app.get(RollReaderService);
    db = t.app.get(DataSource);
  });

  async function register(who: TestAccount, over: Partial<LotDescription> = {}): Promise<string> {
    return (await registerLot(who, over)).code;
  }

  /** Odile asks to split `code` into `children`. */
  function postSplit(code: string, children: object[]) {
    return odile.agent
      .post(`/api/lots/${code}/splits`)
      .set(...CSRF)
      .send({ children });
  }

  function child(value: number, over: Partial<LotDescription> = {}, estimated = false) {
    return {
      description: description({ title: `Strand of ${value}`, count: { value, estimated }, ...over }),
    };
  }

  async function roll(code: string) {
    const lot = await reader.findLot(code);
    return reader.entries(lot!.id);
  }

  async function totals(): Promise<{ lots: number; entries: number }> {
    const [r] = (await db.query(
      'SELECT (SELECT count(*)::int FROM "lots") AS lots, (SELECT count(*)::int FROM "entries") AS entries',
    )) as Array<{ lots: number; entries: number }>;
    return r!;
  }

  async function status(code: string) {
    const res = await odile.agent.get(`/api/lots/${code}`);
    return res.body as { status: string; remaining: { value: number; estimated: boolean } };
  }

  async function bundleOf(who: TestAccount, code: string): Promise<Bundle> {
    const res = await who.agent.get(`/api/lots/${code}/bundle`);
    expect(res.status).toBe(200);
    return parseBundle(JSON.parse(res.text));
  }

  describe('split', () => {
    it('divides 60 beads into three strands of 20: parent first, each child names it, the parent is used up', async () => {
      const parent = await register(odile, { count: { value: 60, estimated: false } });
      const res = await postSplit(parent, [child(20), child(20), child(20)]);
      expect(res.status).toBe(201);
      expect(res.body).toMatchObject({ parent, status: 'split', remaining: { value: 0 } });
      const codes = (res.body.children as Array<{ code: string }>).map((c) => c.code);
      expect(new Set(codes).size).toBe(3);

      const entries = await roll(parent);
      const split = entries.at(-1)!;
      expect(split.kind).toBe('split');
      const body = JSON.parse(split.body!) as SplitBody;
      expect(body.children).toEqual(codes.map((lot) => ({ lot, count: { value: 20, estimated: false } })));
      for (const c of codes) {
        const [reg] = await roll(c);
        const h = JSON.parse(reg!.header) as EntryHeader;
        expect(h.parents).toEqual([{ lot: parent, seq: split.seq, hash: split.hash }]);
        expect(h.time >= (JSON.parse(split.header) as EntryHeader).time).toBe(true);
        const v = verifyBundle(await bundleOf(odile, c));
        expect(v.ok).toBe(true);
        expect(v.links).toBe(1);
      }
      // The used-up parent leaves the inventory of held lots; the children are in it.
      expect((await status(parent)).status).toBe('split');
      const held = await odile.agent.get('/api/lots?mine=true&status=held&pageSize=100');
      const heldCodes = (held.body.items as Array<{ code: string }>).map((i) => i.code);
      expect(heldCodes).not.toContain(parent);
      for (const c of codes) expect(heldCodes).toContain(c);
    });

    it('keeps the remainder with the parent and shows it', async () => {
      const parent = await register(odile, { count: { value: 60, estimated: false } });
      const res = await postSplit(parent, [child(25), child(15)]);
      expect(res.status).toBe(201);
      expect(res.body).toMatchObject({ status: 'held', remaining: { value: 20, estimated: false } });
      expect(await status(parent)).toMatchObject({ status: 'held', remaining: { value: 20 } });
    });

    it('marks estimated counts: an estimated child makes the remainder an estimate', async () => {
      const parent = await register(odile, { count: { value: 120, estimated: true } });
      const res = await postSplit(parent, [child(40, {}, true), child(40)]);
      expect(res.status).toBe(201);
      expect(res.body.remaining).toEqual({ value: 40, estimated: true });
      expect(res.body.children[0].count).toEqual({ value: 40, estimated: true });
    });

    it('refuses counts that do not add up, a single child and an empty child, writing nothing', async () => {
      const parent = await register(odile, { count: { value: 60, estimated: false } });
      const before = await totals();
      const over = await postSplit(parent, [child(30), child(31)]);
      expect(over.status).toBe(400);
      expect(over.body.error.fields).toEqual([
        { field: 'children', reason: 'the new lots hold 61 beads but the lot has 60' },
      ]);
      const one = await postSplit(parent, [child(30)]);
      expect(one.status).toBe(400);
      expect(one.body.error.fields[0].field).toBe('children');
      const empty = await postSplit(parent, [child(30), child(0)]);
      expect(empty.status).toBe(400);
      expect(empty.body.error.fields).toEqual([
        {
          field: 'children.1.description.count.value',
          reason: 'Enter a whole number of beads between 1 and 1,000,000',
        },
      ]);
      const badTitle = await postSplit(parent, [child(30), child(10, { title: '' })]);
      expect(badTitle.status).toBe(400);
      expect(badTitle.body.error.fields[0].field).toBe('children.1.description.title');
      expect(await totals()).toEqual(before);
    });

    it('refuses a lot the dealer does not hold, and one with an open offer', async () => {
      const unlisted = await register(teodor, { listed: false });
      const listed = await register(teodor);
      const offered = await register(odile);
      await offerOnRoll(ledger, offered, odile, teodor);
      const before = await totals();
      const send = (code: string) => postSplit(code, [child(10), child(10)]);
      expect((await send(unlisted)).status).toBe(404);
      const notHeld = await send(listed);
      expect(notHeld.status).toBe(403);
      expect(notHeld.body.error.code).toBe('forbidden');
      const open = await send(offered);
      expect(open.status).toBe(409);
      expect(open.body.error.message).toMatch(/open offer/);
      expect(await totals()).toEqual(before);
    });
  });

  describe('combine', () => {
    it('makes a necklace from one lot whole and part of another; each parent names it, it names each parent', async () => {
      const a = await register(odile, { count: { value: 24, estimated: false } });
      const b = await register(odile, { count: { value: 40, estimated: false } });
      const res = await odile.agent
        .post('/api/combinations')
        .set(...CSRF)
        .send({
          parts: [{ lot: a }, { lot: b.toLowerCase(), count: { value: 16, estimated: false } }],
          description: description({
            title: 'Necklace',
            form: 'necklace',
            count: { value: 40, estimated: false },
          }),
        });
      expect(res.body).toMatchObject({ lot: {} });
      expect(res.status).toBe(201);
      const made = res.body.lot.code as string;
      expect(await status(a)).toMatchObject({ status: 'combined', remaining: { value: 0 } });
      expect(await status(b)).toMatchObject({ status: 'held', remaining: { value: 24 } });
      const [reg] = await roll(made);
      const parents = (JSON.parse(reg!.header) as EntryHeader).parents!;
      expect(parents.map((p) => p.lot).sort()).toEqual([a, b].sort());
      for (const p of parents) {
        const e = (await roll(p.lot))[p.seq]!;
        expect(e.kind).toBe('combined');
        expect(e.hash).toBe(p.hash);
        expect((JSON.parse(e.body!) as CombinedBody).child).toBe(made);
      }
      expect((JSON.parse(reg!.body!) as RegisteredBody).description.count).toEqual({
        value: 40,
        estimated: false,
      });
      expect(verifyBundle(await bundleOf(odile, made)).ok).toBe(true);
    });

    it('refuses bad combinations with the field and the reason, writing nothing', async () => {
      const a = await register(odile, { count: { value: 30, estimated: false } });
      const b = await register(odile, { count: { value: 30, estimated: false } });
      const est = await register(odile, { count: { value: 50, estimated: true } });
      const theirs = await register(teodor);
      const hidden = await register(teodor, { listed: false });
      const offered = await register(odile);
      await offerOnRoll(ledger, offered, odile, teodor);
      // A lot made from `a`: combining it with `a` would count the same beads twice.
      const split = await postSplit(a, [child(5), child(5)]);
      const fromA = split.body.children[0].code as string;
      const grand = await postSplit(fromA, [child(2), child(2)]);
      const fromFromA = grand.body.children[0].code as string;
      const before = await totals();
      const send = (parts: unknown[], count: number, estimated = false) =>
        odile.agent
          .post('/api/combinations')
          .set(...CSRF)
          .send({ parts, description: description({ form: 'piece', count: { value: count, estimated } }) });
      const fields = async (p: Promise<request.Response>) => {
        const r = await p;
        expect(r.status).toBe(400);
        return r.body.error.fields as Array<{ field: string; reason: string }>;
      };
      const ten = { value: 10, estimated: false };
      expect(
        await fields(
          send(
            [
              { lot: a, count: ten },
              { lot: b, count: ten },
            ],
            21,
          ),
        ),
      ).toEqual([
        { field: 'description.count.value', reason: 'the new lot holds the beads taken from its parts: 20' },
      ]);
      // With whole lots the sum depends on what is left now, so a mismatch is a conflict.
      const whole = await send([{ lot: a }, { lot: b }], 61);
      expect(whole.status).toBe(409);
      expect(whole.body.error.fields).toEqual([
        { field: 'description.count.value', reason: 'the new lot holds the beads taken from its parts: 50' },
      ]);
      expect(
        await fields(send([{ lot: a, count: { value: 31, estimated: false } }, { lot: b }], 61)),
      ).toEqual([{ field: 'parts.0.count.value', reason: 'the lot has 30 beads' }]);
      // Beads that went into other lots: the lot's present state refuses, naming the field.
      const gone = await send([{ lot: a, count: { value: 21, estimated: false } }, { lot: b }], 51);
      expect(gone.status).toBe(409);
      expect(gone.body.error.fields).toEqual([
        { field: 'parts.0.count.value', reason: 'only 20 beads of the lot are left' },
      ]);
      expect(await fields(send([{ lot: b }, { lot: est }], 80))).toEqual([
        {
          field: 'description.count.estimated',
          reason: 'a count taken from a part is estimated, so this one is too',
        },
      ]);
      expect((await fields(send([{ lot: b }, { lot: theirs }], 70)))[0]).toEqual({
        field: 'parts.1.lot',
        reason: 'you do not hold this lot',
      });
      expect((await fields(send([{ lot: b }, { lot: hidden }], 70)))[0]).toEqual({
        field: 'parts.1.lot',
        reason: 'no lot you hold has this code',
      });
      expect((await fields(send([{ lot: b }, { lot: b }], 60)))[0]).toEqual({
        field: 'parts.1.lot',
        reason: 'names a lot already in this combination',
      });
      expect((await fields(send([{ lot: b }, { lot: 'NOT-A-LOT' }], 60)))[0]!.field).toBe('parts.1.lot');
      expect((await fields(send([{ lot: b }], 30)))[0]!.field).toBe('parts');
      expect(await fields(send([{ lot: a }, { lot: fromFromA }], 22))).toEqual([
        {
          field: 'parts.1.lot',
          reason: expect.stringMatching(
            /^was made from lot .* also in this combination: the same beads would be counted twice$/,
          ),
        },
      ]);
      const open = await send([{ lot: b }, { lot: offered }], 70);
      expect(open.status).toBe(409);
      expect(open.body.error.message).toMatch(/open offer/);
      expect(await totals()).toEqual(before);
    });

    it('runs 50 concurrent combinations over overlapping lots: counts conserved, losers 409, every roll verifies', async () => {
      const START = 30;
      const lots: string[] = [];
      for (let i = 0; i < 6; i++)
        lots.push(await register(odile, { title: `Pool ${i}`, count: { value: START, estimated: false } }));
      const random = seededRandom('fifty combinations');
      const pick = (n: number) => random(1)[0]! % n;
      const requests = Array.from({ length: 50 }, () => {
        const first = pick(6);
        const second = (first + 1 + pick(5)) % 6;
        const parts = [first, second].map((i) => ({
          lot: lots[i]!,
          count: { value: 3 + pick(8), estimated: false },
        }));
        const count = parts.reduce((s, p) => s + p.count.value, 0);
        return odile.agent
          .post('/api/combinations')
          .set(...CSRF)
          .send({
            parts,
            description: description({ form: 'piece', count: { value: count, estimated: false } }),
          });
      });
      const answers = await Promise.all(requests);
      const statuses = answers.map((r) => r.status);
      expect(statuses.filter((s) => s !== 201 && s !== 409)).toEqual([]);
      expect(statuses.filter((s) => s === 201).length).toBeGreaterThan(0);
      expect(statuses.filter((s) => s === 409).length).toBeGreaterThan(0);
      for (const r of answers.filter((x) => x.status === 409)) expect(r.body.error.code).toBe('roll_rule');

      const takenBy = new Map<string, number>();
      for (const code of lots) {
        const entries = await roll(code);
        expect(verifyRoll(entries, { lot: code }).ok).toBe(true);
        let taken = 0;
        for (const e of entries.filter((x) => x.kind === 'combined')) {
          const b = JSON.parse(e.body!) as CombinedBody;
          taken += b.count.value;
          takenBy.set(b.child, (takenBy.get(b.child) ?? 0) + b.count.value);
        }
        const s = await status(code);
        expect(s.remaining.value + taken).toBe(START);
        expect(s.status).toBe(s.remaining.value === 0 ? 'combined' : 'held');
      }
      const made = answers.filter((r) => r.status === 201).map((r) => r.body.lot.code as string);
      expect(new Set(takenBy.keys())).toEqual(new Set(made));
      for (const code of made) {
        const [reg] = await roll(code);
        expect((JSON.parse(reg!.body!) as RegisteredBody).description.count.value).toBe(takenBy.get(code));
        expect(verifyBundle(await bundleOf(odile, code)).ok).toBe(true);
      }
    }, 60_000);

    it('races whole-lot combinations against transfer offers: exactly one wins each time, never a 500', async () => {
      for (let round = 0; round < 10; round++) {
        const a = await register(odile, { count: { value: 10, estimated: false } });
        const b = await register(odile, { count: { value: 10, estimated: false } });
        const combine = odile.agent
          .post('/api/combinations')
          .set(...CSRF)
          .send({
            parts: [{ lot: a }, { lot: b }],
            description: description({ count: { value: 20, estimated: false } }),
          });
        const offer = ledger
          .append(a, { kind: 'transfer-offered', actor: odile.id, body: { recipient: teodor.id } })
          .then(
            () => 'offered',
            (e: unknown) => {
              expect(e).toBeInstanceOf(AppError);
              expect((e as AppError).status).toBe(409);
              return 'refused';
            },
          );
        const [c, o] = await Promise.all([combine, offer]);
        expect([201, 409]).toContain(c.status);
        expect(c.status === 201 ? o === 'refused' : o === 'offered').toBe(true);
        const after = await status(a);
        expect(after.status).toBe(c.status === 201 ? 'combined' : 'offered');
        for (const code of [a, b]) expect(verifyRoll(await roll(code), { lot: code }).ok).toBe(true);
      }
    }, 60_000);
  });

  describe('ancestry in bundles and public data', () => {
    it('a tampered parent breaks the child’s verification', async () => {
      const parent = await register(odile, { count: { value: 40, estimated: false } });
      const res = await postSplit(parent, [child(20), child(20)]);
      const kid = res.body.children[0].code as string;
      expect(verifyBundle(await bundleOf(odile, kid)).ok).toBe(true);
      // Change the count the split gave this child, in the stored body.
      await tamper(
        t,
        `UPDATE entry_bodies SET body = replace(body, '"value":20', '"value":21') WHERE entry_id =
             (SELECT e.id FROM entries e JOIN lots l ON l.id = e.lot_id WHERE l.code = $1 AND e.kind = 'split')`,
        [parent],
      );
      const v = verifyBundle(await bundleOf(odile, kid));
      expect(v.ok).toBe(false);
      expect(v.failures).toContainEqual(expect.objectContaining({ lot: parent, reason: 'bad-body-digest' }));
      // The child's own roll is intact; only its link to the parent fails.
      expect(v.failures).toContainEqual(expect.objectContaining({ lot: kid, reason: 'bad-parent' }));
    });

    it('a listed child of an unlisted lot publishes only its parent’s registration header and linking entry', async () => {
      const SECRET_TITLE = 'Private lot from the Marlow attic';
      const SECRET_NOTE = 'bought with the brass box';
      const parent = await register(odile, {
        title: SECRET_TITLE,
        listed: false,
        count: { value: 30, estimated: false },
      });
      await odile.agent
        .post(`/api/lots/${parent}/observations`)
        .set(...CSRF)
        .send({ observations: { note: SECRET_NOTE } });
      const res = await postSplit(parent, [child(10, { listed: true }), child(10, { listed: false })]);
      const [listedKid, hiddenKid] = (res.body.children as Array<{ code: string }>).map((c) => c.code);
      const pub = await request(t.app.getHttpServer()).get(`/api/public/lots/${listedKid}`);
      expect(pub.status).toBe(200);
      const bundle = parseBundle(pub.body.bundle);
      expect(bundle.rolls.map((r) => [r.lot, r.scope])).toEqual([
        [listedKid, 'full'],
        [parent, 'inherited'],
      ]);
      const link = bundle.rolls[1]!;
      expect(link.entries.map((e) => (JSON.parse(e.header) as EntryHeader).kind)).toEqual([
        'registered',
        'split',
      ]);
      expect(link.entries[0]!.body).toBeNull();
      expect(pub.text).not.toContain(SECRET_TITLE);
      expect(pub.text).not.toContain(SECRET_NOTE);
      expect(verifyBundle(bundle).ok).toBe(true);
      // The unlisted sibling has no public page, though its code is on the linking entry.
      expect((await request(t.app.getHttpServer()).get(`/api/public/lots/${hiddenKid}`)).status).toBe(404);
      // The dealer who holds the parent gets it in full in her own export.
      const own = await bundleOf(odile, listedKid);
      expect(own.rolls.find((r) => r.lot === parent)!.scope).toBe('full');
      // Another dealer gets the inherited scope, like the public.
      const other = await bundleOf(teodor, listedKid);
      expect(other.rolls.find((r) => r.lot === parent)!.scope).toBe('inherited');
      expect(JSON.stringify(other)).not.toContain(SECRET_TITLE);
    });

    it('draws ancestors and descendants, following only lots the viewer may read', async () => {
      const top = await register(odile, {
        title: 'Top lot',
        listed: false,
        count: { value: 40, estimated: false },
      });
      const other = await register(odile, { title: 'Other lot', count: { value: 10, estimated: false } });
      const s = await postSplit(top, [child(20, { title: 'Left half' }), child(20, { title: 'Right half' })]);
      const [left, right] = (s.body.children as Array<{ code: string }>).map((c) => c.code);
      const c = await odile.agent
        .post('/api/combinations')
        .set(...CSRF)
        .send({
          parts: [{ lot: left }, { lot: other, count: { value: 4, estimated: false } }],
          description: description({
            title: 'Bracelet',
            form: 'piece',
            count: { value: 24, estimated: false },
          }),
        });
      const bracelet = c.body.lot.code as string;

      const mine = await odile.agent.get(`/api/lots/${left}/ancestry`);
      expect(mine.status).toBe(200);
      const byCode = new Map((mine.body.nodes as Array<{ code: string }>).map((n) => [n.code, n]));
      expect(byCode.get(top)).toMatchObject({ depth: -1, readable: true, title: 'Top lot' });
      expect(byCode.get(left)).toMatchObject({ depth: 0, title: 'Left half' });
      expect(byCode.get(bracelet)).toMatchObject({ depth: 1, title: 'Bracelet' });
      expect(byCode.has(right)).toBe(false); // a sibling is neither ancestor nor descendant
      expect(byCode.has(other)).toBe(false);
      expect(mine.body.edges).toEqual(
        expect.arrayContaining([
          expect.objectContaining({
            from: top,
            to: left,
            kind: 'split',
            count: { value: 20, estimated: false },
          }),
          expect.objectContaining({
            from: left,
            to: bracelet,
            kind: 'combined',
            count: { value: 20, estimated: false },
          }),
        ]),
      );

      const theirs = await teodor.agent.get(`/api/lots/${bracelet}/ancestry`);
      const nodes = new Map((theirs.body.nodes as Array<{ code: string }>).map((n) => [n.code, n]));
      expect(nodes.get(other)).toMatchObject({ depth: -1, readable: true });
      expect(nodes.get(left)).toMatchObject({ depth: -1, readable: true });
      expect(nodes.get(top)).toEqual({
        code: top,
        displayCode: expect.any(String),
        depth: -2,
        readable: false,
        title: null,
        status: null,
        listed: null,
        count: null,
      });
      expect(JSON.stringify(theirs.body)).not.toContain('Top lot');
      expect((await teodor.agent.get(`/api/lots/${top}/ancestry`)).status).toBe(404);
    });
  });
});
