import { useAccount } from './support/accounts';
import { description } from './support/lot-fixtures';
import { useTestApp } from './support/test-app';

const W = { 'X-Beadroll-Request': '1' };

const OPINION = {
  origin: 'bohemia-czech',
  period: { from: 1900, to: 1930, approximate: true },
  technique: 'pressed-moulded',
  qualifier: 'attributed-to',
  confidence: 'medium',
  rationale: 'Mould seams on every bead; the glass is a Bohemian pink.',
  exhibits: [],
};

describe('opinions on request', () => {
  async function newLot(listed = false): Promise<string> {
    const res = await holder.agent
      .post('/api/lots')
      .set(W)
      .send({ description: description({ listed }) })
      .expect(201);
    return res.body.code as string;
  }

  function ask(lot: string, body: object = {}) {
    return holder.agent
      .post('/api/opinion-requests')
      .set(W)
      .send({ lot, ...body });
  }

  const t = useTestApp();
  const holder = useAccount(t, { role: 'dealer', displayName: 'Mirela Holt' });
  const other = useAccount(t, { role: 'dealer' });
  const thea = useAccount(t, { role: 'assessor', displayName: 'Thea Quill' });
  const ravi = useAccount(t, { role: 'assessor', displayName: 'Ravi Ostrander' });
  const pending = useAccount(t, { role: 'assessor', status: 'pending' });

  it('lets a named assessor read an unlisted lot and answer with an opinion once it is listed, which closes the request', async () => {
    const code = await newLot();
    await thea.agent.get(`/api/lots/${code}`).expect(404);
    const made = await ask(code, { assessor: thea.id, note: 'Look at the seams, please.' }).expect(201);
    expect(made.body).toMatchObject({
      status: 'open',
      note: 'Look at the seams, please.',
      assessor: { id: thea.id, displayName: 'Thea Quill' },
      lot: { code, listed: false },
    });

    const queue = await thea.agent.get('/api/opinion-requests').query({ box: 'received' }).expect(200);
    expect(queue.body.items.map((r: { id: string }) => r.id)).toEqual([made.body.id]);
    // Only the named assessor: another assessor and another dealer still get the bare 404.
    await ravi.agent.get(`/api/lots/${code}`).expect(404);
    await other.agent.get(`/api/lots/${code}`).expect(404);
    expect((await ravi.agent.get('/api/opinion-requests').query({ box: 'received' })).body.items).toEqual([]);

    await thea.agent.get(`/api/lots/${code}`).expect(200);
    await thea.agent.get(`/api/lots/${code}/roll`).expect(200);
    await thea.agent.get(`/api/lots/${code}/opinions`).expect(200);
    // The ledger's rules: only the holder writes an opinion on an unlisted lot's roll.
    const early = await thea.agent.post(`/api/lots/${code}/opinions`).set(W).send(OPINION).expect(409);
    expect(early.body.error.message).toMatch(/unlisted/);
    await holder.agent.put(`/api/lots/${code}/listing`).set(W).send({ listed: true }).expect(200);
    const opinion = await thea.agent.post(`/api/lots/${code}/opinions`).set(W).send(OPINION).expect(201);

    const sent = await holder.agent.get('/api/opinion-requests').query({ box: 'sent' }).expect(200);
    expect(sent.body.items[0]).toMatchObject({
      status: 'answered',
      opinionSeq: opinion.body.seq,
      answeredBy: { id: thea.id },
    });
    // Answered: the request no longer opens the lot (it stays readable while listed).
    await holder.agent.put(`/api/lots/${code}/listing`).set(W).send({ listed: false }).expect(200);
    await thea.agent.get(`/api/lots/${code}`).expect(404);
    const after = await thea.agent.get('/api/opinion-requests').query({ box: 'received' }).expect(200);
    expect(after.body.items[0]).toMatchObject({ status: 'answered', opinionSeq: opinion.body.seq });
  });

  it('asks any verified assessor: each may read until one answers', async () => {
    const code = await newLot();
    await ask(code).expect(201);
    await thea.agent.get(`/api/lots/${code}`).expect(200);
    await ravi.agent.get(`/api/lots/${code}`).expect(200);
    await pending.agent.get(`/api/lots/${code}`).expect(404);
    await holder.agent.put(`/api/lots/${code}/listing`).set(W).send({ listed: true }).expect(200);
    await ravi.agent.post(`/api/lots/${code}/opinions`).set(W).send(OPINION).expect(201);
    await holder.agent.put(`/api/lots/${code}/listing`).set(W).send({ listed: false }).expect(200);
    await thea.agent.get(`/api/lots/${code}`).expect(404);
    await thea.agent.post(`/api/lots/${code}/opinions`).set(W).send(OPINION).expect(404);
  });

  it('ends the assessor’s access when the holder cancels', async () => {
    const code = await newLot();
    const made = await ask(code, { assessor: thea.id }).expect(201);
    await ask(code, { assessor: thea.id }).expect(409);
    await thea.agent.get(`/api/lots/${code}`).expect(200);
    await other.agent.post(`/api/opinion-requests/${made.body.id}/cancel`).set(W).expect(404);
    const cancelled = await holder.agent
      .post(`/api/opinion-requests/${made.body.id}/cancel`)
      .set(W)
      .expect(200);
    expect(cancelled.body.status).toBe('cancelled');
    await holder.agent.post(`/api/opinion-requests/${made.body.id}/cancel`).set(W).expect(409);
    await thea.agent.get(`/api/lots/${code}`).expect(404);
    await thea.agent.post(`/api/lots/${code}/opinions`).set(W).send(OPINION).expect(404);
  });

  it('refuses requests on lots one does not hold, and names the field of bad input', async () => {
    const code = await newLot(true);
    await other.agent.post('/api/opinion-requests').set(W).send({ lot: code }).expect(403);
    const bad = await ask('not-a-code').expect(400);
    expect(bad.body.error.fields).toEqual([expect.objectContaining({ field: 'lot' })]);
    const notAssessor = await ask(code, { assessor: other.id }).expect(400);
    expect(notAssessor.body.error.fields).toEqual([expect.objectContaining({ field: 'assessor' })]);
    const unverified = await ask(code, { assessor: pending.id }).expect(400);
    expect(unverified.body.error.fields[0].field).toBe('assessor');
    const box = await holder.agent.get('/api/opinion-requests').query({ box: 'inbox' }).expect(400);
    expect(box.body.error.fields[0].field).toBe('box');
    await holder.agent.get('/api/opinion-requests').query({ box: 'received' }).expect(403);
  });

  it('lists verified assessors to ask, and only them', async () => {
    const res = await holder.agent.get('/api/opinion-requests/assessors').query({ q: 'quill' }).expect(200);
    expect(res.body.items.map((a: { id: string }) => a.id)).toEqual([thea.id]);
    const all = await holder.agent.get('/api/opinion-requests/assessors').expect(200);
    const ids = all.body.items.map((a: { id: string }) => a.id);
    expect(ids).toEqual(expect.arrayContaining([thea.id, ravi.id]));
    expect(ids).not.toContain(pending.id);
  });

  it('lets anyone signed in open a listed lot by its code, and filters offers by lot', async () => {
    const code = await newLot(true);
    await ravi.agent.get(`/api/lots/${code.slice(0, 4)}-${code.slice(4, 8)}-${code.slice(8)}`).expect(200);
    const offers = await holder.agent
      .get('/api/transfers/offers')
      .query({ box: 'outgoing', status: 'open', lot: code })
      .expect(200);
    expect(offers.body.items).toEqual([]);
    const bad = await holder.agent
      .get('/api/transfers/offers')
      .query({ box: 'outgoing', lot: 'zz' })
      .expect(400);
    expect(bad.body.error.fields[0].field).toBe('lot');
  });
});
