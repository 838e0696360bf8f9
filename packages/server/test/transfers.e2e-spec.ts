import { parseBundleText, reduceRoll, SYSTEM_ACTOR, verifyBundle, verifyRoll } from '@beadroll/core';
import { DataSource } from 'typeorm';
import { LedgerClock } from '../src/ledger/ledger.clock';
import { RollReaderService } from '../src/ledger/roll-reader.service';
import { LotsService } from '../src/lots/lots.service';
import { LAPSE_LOCK_KEY, OfferLapseService } from '../src/transfers/offer-lapse.service';
import { TransfersService } from '../src/transfers/transfers.service';
import { createAccount, type TestAccount, useAccount } from './support/accounts';
import { description } from './support/lot-fixtures';
import { lastMailTo, linkIn } from './support/mail';
import { useTestApp } from './support/test-app';

const W = { 'X-Beadroll-Request': '1' };
const BASE = 'http://beadroll.example';

describe('transfers between dealers and sales to private buyers', () => {
  let db: DataSource;

  const t = useTestApp();
  const a = useAccount(t, {
    role: 'dealer',
    displayName: 'Mira Tollan',
    business: 'Tollan Glass Cabinet',
    handle: 'mira-tollan',
  });
  const b = useAccount(t, {
    role: 'dealer',
    displayName: 'Oskar Wendle',
    business: 'Wendle Bead Barrow',
    handle: 'oskar-wendle',
  });
  const c = useAccount(t, { role: 'dealer' });
  beforeAll(async () => {
    db = t.app.get(DataSource);
  });
  afterAll(async () => {
    jest.restoreAllMocks();
  });

  async function register(owner: TestAccount, listed = true): Promise<string> {
    const res = await owner.agent
      .post('/api/lots')
      .set(W)
      .send({
        description: description({ listed }),
        sealed: {
          storageLocation: 'tray 7',
          acquisition: { source: 'estate of a button maker', cost: { amount: 8800, currency: 'EUR' } },
        },
      });
    expect(res.status).toBe(201);
    return res.body.code as string;
  }

  async function headSeq(code: string): Promise<number> {
    const [{ s }] = (await db.query('SELECT "head_seq" AS s FROM "lots" WHERE "code" = $1', [
      code,
    ])) as Array<{
      s: number;
    }>;
    return s;
  }

  async function offer(from: TestAccount, code: string, to: TestAccount, extra: object = {}) {
    const res = await from.agent
      .post('/api/transfers/offers')
      .set(W)
      .send({ lot: code, recipient: to.id, ...extra });
    expect(res.status).toBe(201);
    return res.body.offer as { id: string; offerSeq: number };
  }

  async function roll(code: string) {
    const reader = t.app.get(RollReaderService);
    return reader.entries((await reader.findLot(code))!.id);
  }

  it('finds verified dealers by name, handle or business, never oneself or the unverified', async () => {
    const pending = await createAccount(t, { role: 'dealer', status: 'pending', business: 'Wendle Pending' });
    for (const q of ['oskar', 'WENDLE', 'bead barrow']) {
      const res = await a.agent.get('/api/transfers/dealers').query({ q });
      expect(res.status).toBe(200);
      expect(res.body.items.map((d: { id: string }) => d.id)).toEqual([b.id]);
    }
    expect(
      JSON.stringify((await a.agent.get('/api/transfers/dealers').query({ q: 'wendle' })).body),
    ).not.toContain(pending.id);
    expect((await a.agent.get('/api/transfers/dealers').query({ q: 'mira' })).body.items).toEqual([]);
    const short = await a.agent.get('/api/transfers/dealers').query({ q: 'o' });
    expect(short.status).toBe(400);
    expect(short.body.error.fields[0].field).toBe('q');
  });

  it('runs the whole flow: offer, e-mailed link, accept, who sees what, sale with a receipt', async () => {
    // Unlisted, so only its dealers may read it.
    const code = await register(a, false);
    const res = await a.agent
      .post('/api/transfers/offers')
      .set(W)
      .send({
        lot: code,
        recipient: b.id,
        note: 'as agreed at the Murrine Vale fair',
        price: { amount: 12500, currency: 'EUR' },
      });
    expect(res.status).toBe(201);
    expect(res.body.made).toBe('offer');
    const o = res.body.offer;
    expect(o).toMatchObject({
      status: 'open',
      viewerIs: 'offerer',
      price: { amount: 12500, currency: 'EUR' },
    });
    expect(o.offerer.displayName).toBe('Mira Tollan');
    expect(o.recipient.business).toBe('Wendle Bead Barrow');

    // Both dealers hear of it; the price is never in a letter.
    const toB = lastMailTo(t, b.email);
    expect(toB.subject).toContain('Mira Tollan');
    expect(toB.text).not.toMatch(/12500|125[.,]00/);
    expect(lastMailTo(t, a.email).subject).toContain('Your offer');
    const link = linkIn(toB, `${BASE}/transfers/offers/`);
    const id = link.pathname.split('/').pop()!;
    expect(id).toBe(o.id);

    // The recipient sees the offer and its price; a third dealer does not see it at all.
    const seen = await b.agent.get(`/api/transfers/offers/${id}`);
    expect(seen.body).toMatchObject({ viewerIs: 'recipient', status: 'open', price: { amount: 12500 } });
    expect(seen.body.lapsesAt).toBeDefined();
    expect((await c.agent.get(`/api/transfers/offers/${id}`)).status).toBe(404);
    const incoming = await b.agent.get('/api/transfers/offers').query({ box: 'incoming', status: 'open' });
    expect(incoming.body.items.map((x: { id: string }) => x.id)).toContain(id);
    const outgoing = await a.agent.get('/api/transfers/offers').query({ box: 'outgoing' });
    expect(outgoing.body.items.map((x: { id: string }) => x.id)).toContain(id);

    // Only the recipient answers.
    const self = await a.agent.post(`/api/transfers/offers/${id}/accept`).set(W).send({});
    expect(self.status).toBe(403);
    const accepted = await b.agent
      .post(`/api/transfers/offers/${id}/accept`)
      .set(W)
      .send({ note: 'thank you' });
    expect(accepted.status).toBe(200);
    expect(accepted.body).toMatchObject({ status: 'accepted', answerNote: 'thank you' });

    // The holder moved in the same transaction: the lot view follows.
    const forB = await b.agent.get(`/api/lots/${code}`);
    expect(forB.body).toMatchObject({ holder: b.id, viewerIsHolder: true, status: 'held' });
    expect(forB.body.sealed).toEqual({});
    const mine = await b.agent.get('/api/lots').query({ mine: true });
    expect(mine.body.items.map((l: { code: string }) => l.code)).toContain(code);
    expect(lastMailTo(t, a.email).subject).toBe(`Offer accepted: ${description().title}`);
    expect(lastMailTo(t, b.email).text).toContain(`${BASE}/lots/${code}`);

    // The new holder sees the transfer price but never the earlier holder's sealed details.
    const rollB = await b.agent.get(`/api/lots/${code}/roll`);
    const sealedB = rollB.body.entries.flatMap((e: { sealed?: Array<{ name: string }> }) => e.sealed ?? []);
    expect(sealedB.map((f: { name: string }) => f.name)).toEqual(['transfer-price']);
    expect(JSON.stringify(rollB.body)).not.toContain('button maker');

    // B adds to the roll; A keeps reading the history up to the handover, and nothing later.
    await b.agent
      .post(`/api/lots/${code}/observations`)
      .set(W)
      .send({ observations: { note: 'restrung on silk by the new holder' } })
      .expect(201);
    const handover = accepted.body.answerSeq as number;
    const rollA = await a.agent.get(`/api/lots/${code}/roll`);
    expect(rollA.status).toBe(200);
    expect(rollA.body.entries.map((e: { seq: number }) => e.seq).pop()).toBe(handover);
    expect(JSON.stringify(rollA.body)).not.toContain('restrung on silk');
    expect(verifyRoll(rollA.body.entries, { lot: code }).ok).toBe(true);
    const detailA = await a.agent.get(`/api/lots/${code}`);
    expect(detailA.body).toMatchObject({ historyUpTo: handover, holder: b.id, viewerIsHolder: false });
    expect(detailA.body.sealed.acquisitionSource).toBe('estate of a button maker');
    expect((await a.agent.get(`/api/lots/${code}/verification`)).body).toMatchObject({
      ok: true,
      headSeq: handover,
    });
    const bundleA = await a.agent.get(`/api/lots/${code}/bundle`);
    expect(verifyBundle(parseBundleText(bundleA.text)).ok).toBe(true);
    // The previous holder cannot write any more.
    const late = await a.agent
      .post(`/api/lots/${code}/observations`)
      .set(W)
      .send({ observations: { note: 'not mine now' } });
    expect(late.status).toBeGreaterThanOrEqual(400);
    expect(late.status).toBeLessThan(500);
    expect(await headSeq(code)).toBe(handover + 1);

    // B lists it and records a sale at a fair, with a receipt to the buyer.
    await b.agent.put(`/api/lots/${code}/listing`).set(W).send({ listed: true }).expect(200);
    const sale = await b.agent
      .post('/api/transfers/sales')
      .set(W)
      .send({
        lot: code,
        date: '2026-05-16',
        price: { amount: 19900, currency: 'EUR' },
        buyerNote: 'collector from Aventurine Combe, wants first refusal on roses',
        buyerEmail: 'buyer@example.invalid',
      });
    expect(sale.status).toBe(201);
    expect(sale.body).toMatchObject({
      date: '2026-05-16',
      price: { amount: 19900, currency: 'EUR' },
      receiptSent: true,
      listed: true,
    });
    const receipt = lastMailTo(t, 'buyer@example.invalid');
    expect(linkIn(receipt, `${BASE}/l/`).pathname).toBe(`/l/${code}`);
    expect(receipt.text).not.toMatch(/19900|199[.,]00/);
    const entries = await roll(code);
    expect(JSON.stringify(entries)).not.toContain('buyer@example.invalid');
    expect(JSON.stringify(entries)).not.toContain('first refusal');
    const sales = await b.agent.get('/api/transfers/sales');
    expect(sales.body.items[0]).toMatchObject({ lot: { code }, buyerNote: expect.stringContaining('roses') });
    expect((await b.agent.get('/api/transfers/sales').query({ receipt: 'none' })).body.total).toBe(0);
    expect((await a.agent.get('/api/transfers/sales')).body.total).toBe(0);

    // The public page stays up and says it was sold.
    const pub = await b.agent.get(`/api/public/lots/${code}`);
    expect(pub.status).toBe(200);
    const state = reduceRoll(
      pub.body.bundle.rolls[0].entries.map((e: { hash: string; header: string; body: string }) => ({
        header: JSON.parse(e.header),
        hash: e.hash,
        body: JSON.parse(e.body),
      })),
    );
    expect(state).toMatchObject({ status: 'sold', soldOn: '2026-05-16', holder: b.id });
    expect(JSON.stringify(pub.body)).not.toMatch(/12500|19900|first refusal/);
    expect(verifyRoll(entries, { lot: code }).ok).toBe(true);
  });

  it('declines and withdraws, each with a note and e-mails to both; only the offerer withdraws', async () => {
    const code = await register(a);
    const o1 = await offer(a, code, b);
    const res = await b.agent
      .post(`/api/transfers/offers/${o1.id}/decline`)
      .set(W)
      .send({ note: 'not this season' });
    expect(res.body).toMatchObject({ status: 'declined', answerNote: 'not this season' });
    expect(lastMailTo(t, a.email).subject).toBe(`Offer declined: ${description().title}`);
    const o2 = await offer(a, code, b);
    expect((await b.agent.post(`/api/transfers/offers/${o2.id}/withdraw`).set(W).send({})).status).toBe(403);
    const w = await a.agent
      .post(`/api/transfers/offers/${o2.id}/withdraw`)
      .set(W)
      .send({ note: 'sold it elsewhere' });
    expect(w.body.status).toBe('withdrawn');
    expect(lastMailTo(t, b.email).subject).toBe(`Offer withdrawn: ${description().title}`);
    const filtered = await b.agent
      .get('/api/transfers/offers')
      .query({ box: 'incoming', status: 'declined' });
    expect(filtered.body.items.map((x: { id: string }) => x.id)).toEqual(expect.arrayContaining([o1.id]));
    expect(filtered.body.items.every((x: { status: string }) => x.status === 'declined')).toBe(true);
    expect((await roll(code)).map((e) => e.kind)).toEqual([
      'registered',
      'transfer-offered',
      'transfer-declined',
      'transfer-offered',
      'transfer-withdrawn',
    ]);
  });

  it('refuses bad offers and sales with a clear 4xx and writes nothing', async () => {
    const code = await register(a);
    const unlisted = await register(a, false);
    const pending = await createAccount(t, { role: 'dealer', status: 'pending' });
    const suspended = await createAccount(t, { role: 'dealer', status: 'suspended' });
    const assessor = await createAccount(t, { role: 'assessor' });
    const before = await headSeq(code);
    const bad = async (who: TestAccount, body: object, status: number, field?: string) => {
      const res = await who.agent.post('/api/transfers/offers').set(W).send(body);
      expect({ body, status: res.status }).toEqual({ body, status });
      if (field) expect(res.body.error.fields.map((f: { field: string }) => f.field)).toContain(field);
      expect(res.body.error.message).toEqual(expect.any(String));
    };
    await bad(a, { lot: code, recipient: a.id }, 400, 'recipient');
    await bad(a, { lot: code, email: a.email.toUpperCase() }, 400, 'email');
    await bad(a, { lot: code, recipient: pending.id }, 400, 'recipient');
    await bad(a, { lot: code, recipient: suspended.id }, 400, 'recipient');
    await bad(a, { lot: code, recipient: assessor.id }, 400, 'recipient');
    await bad(a, { lot: code, email: suspended.email }, 400, 'email');
    await bad(a, { lot: code }, 400, 'recipient');
    await bad(a, { lot: code, recipient: b.id, email: 'x@example.invalid' }, 400, 'recipient');
    await bad(a, { lot: 'not-a-code', recipient: b.id }, 400, 'lot');
    await bad(a, { lot: code, recipient: b.id, price: { amount: -1, currency: 'EUR' } }, 400, 'price.amount');
    await bad(
      a,
      { lot: code, recipient: b.id, price: { amount: 100, currency: 'XYZ' } },
      400,
      'price.currency',
    );
    await bad(a, { lot: code, recipient: b.id, note: 'x'.repeat(5001) }, 400, 'note');
    await bad(a, { lot: code, recipient: b.id, surprise: true }, 400);
    // A lot held by someone else: unlisted → the same 404 as unknown; listed → only the holder offers.
    await bad(c, { lot: unlisted, recipient: b.id }, 404);
    await bad(c, { lot: code, recipient: b.id }, 403);
    expect(await headSeq(code)).toBe(before);

    const o = await offer(a, code, b);
    await bad(a, { lot: code, recipient: c.id }, 409);
    const sale = await a.agent
      .post('/api/transfers/sales')
      .set(W)
      .send({ lot: code, date: '2026-05-16', price: { amount: 100, currency: 'EUR' } });
    expect(sale.status).toBe(409);
    expect(sale.body.error.message).toMatch(/open offer/);
    await a.agent.post(`/api/transfers/offers/${o.id}/withdraw`).set(W).send({}).expect(200);
    const again = await b.agent.post(`/api/transfers/offers/${o.id}/accept`).set(W).send({});
    expect(again.status).toBe(409);
    expect(again.body.error).toMatchObject({
      code: 'offer_closed',
      message: expect.stringMatching(/withdrawn/),
    });
    const afterOffer = await headSeq(code);

    const badSale = async (body: object, status: number, field?: string) => {
      const res = await a.agent.post('/api/transfers/sales').set(W).send(body);
      expect({ body, status: res.status }).toEqual({ body, status });
      if (field) expect(res.body.error.fields.map((f: { field: string }) => f.field)).toContain(field);
    };
    const price = { amount: 4200, currency: 'GBP' };
    await badSale({ lot: code, date: '2026-02-30', price }, 400, 'date');
    await badSale({ lot: code, date: '16/05/2026', price }, 400, 'date');
    await badSale({ lot: code, date: '2999-01-01', price }, 400, 'date');
    await badSale({ lot: code, date: '2026-05-16' }, 400, 'price');
    await badSale({ lot: code, date: '2026-05-16', price, buyerEmail: 'nope' }, 400, 'buyerEmail');
    await badSale(
      { lot: unlisted, date: '2026-05-16', price, buyerEmail: 'b@example.invalid' },
      400,
      'buyerEmail',
    );
    expect(await headSeq(code)).toBe(afterOffer);
    expect(await headSeq(unlisted)).toBe(0);
    await a.agent
      .post('/api/transfers/sales')
      .set(W)
      .send({ lot: code, date: '2026-05-16', price })
      .expect(201);
    await badSale({ lot: code, date: '2026-05-17', price }, 409);
    await bad(a, { lot: code, recipient: b.id }, 409);
  });

  it('invites an address without an account; the offer is written once the registrar verifies them', async () => {
    const code = await register(a);
    const res = await a.agent
      .post('/api/transfers/offers')
      .set(W)
      .send({ lot: code, email: 'Newcomer-1@Example.invalid', price: { amount: 3000, currency: 'SEK' } });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ made: 'invitation', invitation: { status: 'waiting' } });
    const invite = lastMailTo(t, 'newcomer-1@example.invalid');
    expect(linkIn(invite, `${BASE}/sign-up`).searchParams.get('email')).toBe('Newcomer-1@Example.invalid');
    expect(invite.text).not.toContain('3000');
    expect(await headSeq(code)).toBe(0);
    const dup = await a.agent
      .post('/api/transfers/offers')
      .set(W)
      .send({ lot: code, email: 'newcomer-1@example.invalid' });
    expect(dup.status).toBe(409);

    // They apply (an unverified account with that address), then the registrar verifies them.
    const newcomer = await createAccount(t, { role: 'dealer', status: 'pending', handle: 'newcomer-1' });
    const registrar = await createAccount(t, { role: 'registrar' });
    await registrar.agent.post(`/api/registry/accounts/${newcomer.id}/approve`).set(W).send({}).expect(200);
    const entries = await roll(code);
    expect(entries.map((e) => e.kind)).toEqual(['registered', 'transfer-offered']);
    expect(entries[1]!.actor).toBe(a.id);
    expect(JSON.parse(entries[1]!.body!).recipient).toBe(newcomer.id);
    expect(JSON.stringify(entries).toLowerCase()).not.toContain('newcomer-1@example.invalid');
    const incoming = await newcomer.agent.get('/api/transfers/offers').query({ box: 'incoming' });
    expect(incoming.body.items[0]).toMatchObject({ lot: { code }, price: { amount: 3000, currency: 'SEK' } });
    expect(lastMailTo(t, newcomer.email).subject).toContain('offers you a lot');
    const list = await a.agent.get('/api/transfers/invitations');
    expect(list.body.items[0]).toMatchObject({ status: 'offered', offerId: incoming.body.items[0].id });

    // An unverified account's address waits too; if the lot is gone by then, it stalls.
    const other = await register(a);
    const waiting = await createAccount(t, { role: 'dealer', status: 'pending' });
    const inv = await a.agent.post('/api/transfers/offers').set(W).send({ lot: other, email: waiting.email });
    expect(inv.body.made).toBe('invitation');
    await a.agent
      .post('/api/transfers/sales')
      .set(W)
      .send({ lot: other, date: '2026-05-16', price: { amount: 1, currency: 'EUR' } })
      .expect(201);
    await registrar.agent.post(`/api/registry/accounts/${waiting.id}/approve`).set(W).send({}).expect(200);
    const stalled = (await a.agent.get('/api/transfers/invitations')).body.items.find(
      (i: { id: string }) => i.id === inv.body.invitation.id,
    );
    expect(stalled).toMatchObject({ status: 'stalled', statusReason: expect.stringMatching(/sold/) });
    const retry = await a.agent.post(`/api/transfers/invitations/${stalled.id}/offer`).set(W).send({});
    expect(retry.status).toBe(409);
    const cancel = await a.agent.post(`/api/transfers/invitations/${stalled.id}/cancel`).set(W).send({});
    expect(cancel.body.status).toBe('cancelled');
    expect(
      (await c.agent.post(`/api/transfers/invitations/${stalled.id}/cancel`).set(W).send({})).status,
    ).toBe(404);
  });

  it('lapses offers left unanswered for the configured 14 days, as the system account', async () => {
    const clock = t.app.get(LedgerClock);
    const lapse = t.app.get(OfferLapseService);
    const code = await register(a);
    const fresh = await register(a);
    const o = await offer(a, code, b);
    const start = Date.now();
    const at = (days: number) =>
      jest.spyOn(clock, 'now').mockReturnValue(new Date(start + days * 86_400_000));
    at(10);
    const f = await offer(a, fresh, b);
    at(13.9);
    expect(await lapse.runOnce()).toEqual({ ran: true, lapsed: 0 });
    at(14.01);
    // Offers left open by earlier tests lapse too.
    expect((await lapse.runOnce()).lapsed).toBeGreaterThanOrEqual(1);
    expect((await a.agent.get(`/api/transfers/offers/${f.id}`)).body.status).toBe('open');
    const entries = await roll(code);
    expect(entries.map((e) => [e.kind, e.actor]).pop()).toEqual(['transfer-lapsed', SYSTEM_ACTOR]);
    expect(verifyRoll(entries, { lot: code }).ok).toBe(true);
    expect(lastMailTo(t, b.email).subject).toBe(`Offer lapsed: ${description().title}`);
    const late = await b.agent.post(`/api/transfers/offers/${o.id}/accept`).set(W).send({});
    expect(late.status).toBe(409);
    expect(late.body.error.message).toMatch(/lapsed/);
    expect((await a.agent.get(`/api/transfers/offers/${o.id}`)).body.status).toBe('lapsed');
    // While another server holds the job's lock, this one does nothing.
    at(30);
    const other = db.createQueryRunner();
    await other.connect();
    await other.query('SELECT pg_advisory_lock($1::bigint)', [LAPSE_LOCK_KEY.toString()]);
    expect(await lapse.runOnce()).toEqual({ ran: false, lapsed: 0 });
    await other.query('SELECT pg_advisory_unlock($1::bigint)', [LAPSE_LOCK_KEY.toString()]);
    await other.release();
    expect(await lapse.runOnce()).toEqual({ ran: true, lapsed: 1 });
    expect((await a.agent.get(`/api/transfers/offers/${f.id}`)).body.status).toBe('lapsed');
    jest.restoreAllMocks();
  });

  it('races accept, withdraw and lapse on 100 offers: one winner each, losers 409, every roll verifies', async () => {
    const clock = t.app.get(LedgerClock);
    const lapse = t.app.get(OfferLapseService);
    const lots = t.app.get(LotsService);
    const transfers = t.app.get(TransfersService);
    const me = {
      id: a.id,
      role: 'dealer',
      status: 'verified',
      handle: a.handle,
      displayName: 'Mira Tollan',
    } as const;
    const offers: Array<{ code: string; id: string }> = [];
    for (let batch = 0; batch < 10; batch++) {
      const made = await Promise.all(
        Array.from({ length: 10 }, async () => {
          const { code } = await lots.register(me, { description: description() } as never);
          const res = await transfers.offer(me, { lot: code, recipient: b.id });
          return { code, id: res.offer!.id };
        }),
      );
      offers.push(...made);
    }
    const codes = offers.map((o) => o.code);
    jest.spyOn(clock, 'now').mockReturnValue(new Date(Date.now() + 15 * 86_400_000));
    const answers = offers.flatMap((o) => [
      b.agent.post(`/api/transfers/offers/${o.id}/accept`).set(W).send({}),
      a.agent.post(`/api/transfers/offers/${o.id}/withdraw`).set(W).send({}),
    ]);
    const [lapsed, ...results] = await Promise.all([lapse.runOnce(), ...answers]);
    jest.restoreAllMocks();
    const statuses = results.map((r) => r.status);
    expect(statuses.filter((s) => s >= 500)).toEqual([]);
    expect(statuses.every((s) => s === 200 || s === 409)).toBe(true);
    for (const r of results.filter((x) => x.status === 409)) expect(r.body.error.code).toBe('offer_closed');
    let accepted = 0;
    for (let i = 0; i < offers.length; i++) {
      const o = offers[i]!;
      const wins = [results[2 * i]!, results[2 * i + 1]!].filter((r) => r.status === 200).length;
      const entries = await roll(o.code);
      const endings = entries.filter((e) => e.kind !== 'registered' && e.kind !== 'transfer-offered');
      expect(endings).toHaveLength(1);
      // The lapse job is the third competitor: when it won, both answers lost.
      expect(wins).toBe(endings[0]!.kind === 'transfer-lapsed' ? 0 : 1);
      const r = verifyRoll(entries, { lot: o.code });
      expect(r.ok).toBe(true);
      if (!r.ok) continue;
      const [view] = (await db.query('SELECT "holder", "status" FROM "lot_views" WHERE "code" = $1', [
        o.code,
      ])) as Array<{ holder: string; status: string }>;
      const holder = endings[0]!.kind === 'transfer-accepted' ? b.id : a.id;
      if (holder === b.id) accepted += 1;
      expect({ state: r.state.holder, view: view!.holder, status: view!.status }).toEqual({
        state: holder,
        view: holder,
        status: 'held',
      });
    }
    expect(accepted + lapsed.lapsed).toBeLessThanOrEqual(100);
    const [{ n }] = (await db.query(
      `SELECT count(*)::int AS n FROM "transfer_offers" WHERE "status" = 'open' AND "code" = ANY($1)`,
      [codes],
    )) as Array<{ n: number }>;
    expect(n).toBe(0);
  }, 180_000);
});
