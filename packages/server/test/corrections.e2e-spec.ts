import { verifyRoll } from '@beadroll/core';
import { LedgerClock } from '../src/ledger/ledger.clock';
import { useAccount } from './support/accounts';
import { description } from './support/lot-fixtures';
import { useTestApp } from './support/test-app';

const W = { 'X-Beadroll-Request': '1' };
const HOUR = 3_600_000;

describe('corrections and voided sales', () => {
  const t = useTestApp();
  const seller = useAccount(t, { role: 'dealer' });
  const other = useAccount(t, { role: 'dealer' });
  afterAll(async () => {
    jest.restoreAllMocks();
  });

  async function register(): Promise<string> {
    const res = await seller.agent.post('/api/lots').set(W).send({ description: description() });
    expect(res.status).toBe(201);
    return res.body.code as string;
  }

  async function sell(code: string) {
    const res = await seller.agent
      .post('/api/transfers/sales')
      .set(W)
      .send({
        lot: code,
        date: new Date().toISOString().slice(0, 10),
        price: { amount: 4500, currency: 'EUR' },
      });
    expect(res.status).toBe(201);
  }

  async function roll(code: string) {
    const res = await seller.agent.get(`/api/lots/${code}/roll`);
    return res.body as { entries: Array<{ hash: string; header: string; body: string | null }> };
  }

  function at(ms: number) {
    jest.spyOn(t.app.get(LedgerClock), 'now').mockReturnValue(new Date(ms));
  }

  it('the seller voids a sale within 24 hours: the lot is held again, off the sales list, and its roll verifies', async () => {
    const start = Date.now();
    at(start);
    const code = await register();
    await sell(code);
    at(start + 23 * HOUR);
    expect((await other.agent.post(`/api/transfers/sales/${code}/void`).set(W).send({})).status).toBe(403);
    const res = await seller.agent
      .post(`/api/transfers/sales/${code}/void`)
      .set(W)
      .send({ reason: 'Recorded on the wrong lot' });
    expect(res.status).toBe(204);
    const lot = await seller.agent.get(`/api/lots/${code}`);
    expect(lot.body.status).toBe('held');
    const sales = await seller.agent.get('/api/transfers/sales');
    expect(sales.body.items.map((s: { lot: { code: string } }) => s.lot.code)).not.toContain(code);
    const r = await roll(code);
    const v = verifyRoll(r.entries.map((e) => ({ hash: e.hash, header: e.header, body: e.body })));
    expect(v).toMatchObject({ ok: true, entries: 3 });
    // A void of a lot that is no longer sold is refused; nothing is written.
    const again = await seller.agent.post(`/api/transfers/sales/${code}/void`).set(W).send({});
    expect(again.status).toBe(409);
    expect((await roll(code)).entries).toHaveLength(3);
  });

  it('refuses a void more than 24 hours after the sale and writes nothing', async () => {
    const start = Date.now();
    at(start);
    const code = await register();
    await sell(code);
    at(start + 24 * HOUR + 1000);
    const res = await seller.agent.post(`/api/transfers/sales/${code}/void`).set(W).send({});
    expect(res.status).toBe(409);
    expect(res.body.error.message).toMatch(/within 24 hours/);
    expect((await roll(code)).entries).toHaveLength(2);
    expect((await seller.agent.get(`/api/lots/${code}`)).body.status).toBe('sold');
  });

  it('a new description says which entry it corrects and why; a wrong target is refused', async () => {
    jest.restoreAllMocks();
    const code = await register();
    const ok = await seller.agent
      .post(`/api/lots/${code}/descriptions`)
      .set(W)
      .send({
        description: description({ title: 'Corrected title' }),
        corrects: { seq: 0, reason: 'The title named the wrong town' },
      });
    expect(ok.status).toBe(201);
    const obs = await seller.agent
      .post(`/api/lots/${code}/observations`)
      .set(W)
      .send({ observations: { hole: 'clean' }, corrects: { seq: 1, reason: 'x' } });
    expect(obs.status).toBe(409);
    const noReason = await seller.agent
      .post(`/api/lots/${code}/descriptions`)
      .set(W)
      .send({ description: description(), corrects: { seq: 0, reason: '' } });
    expect(noReason.status).toBe(400);
    expect(noReason.body.error.fields).toEqual([{ field: 'corrects.reason', reason: 'Say what was wrong' }]);
    const r = await roll(code);
    expect(JSON.parse(r.entries[1]!.body!).corrects).toEqual({
      seq: 0,
      reason: 'The title named the wrong town',
    });
  });

  it('answers implausible values with what to enter, one reason per field', async () => {
    const res = await seller.agent
      .post('/api/lots')
      .set(W)
      .send({
        description: description({ diameterMm: { min: 4, max: 99999 } }),
        sealed: { acquisition: { cost: { amount: 100, currency: 'ZZZ' } } },
      });
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toEqual([
      {
        field: 'description.diameterMm.max',
        reason: 'Enter a bead size between 0.5 and 100 mm, to at most one decimal place',
      },
      {
        field: 'sealed.acquisition.cost.currency',
        reason: 'Choose a currency by its three-letter ISO 4217 code, such as EUR, GBP or USD',
      },
    ]);
  });
});
