import { verifyRoll } from '@beadroll/core';
import { FakeSmtpService } from '../src/mail/fake-smtp.service';
import { useAccount } from './support/accounts';
import { imageOf } from './support/exhibit-fixtures';
import { upload } from './support/exhibit-http';
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

  /** The stored roll of a lot, as the holder reads it, checked by core's verifier. */
  async function verified(code: string) {
    const res = await holder.agent.get(`/api/lots/${code}/bundle`).expect(200);
    const roll = (res.body.rolls as Array<{ lot: string; entries: [] }>).find((r) => r.lot === code)!;
    const r = verifyRoll(roll.entries, { lot: code });
    if (!r.ok) throw new Error(`${r.reason} at ${r.seq}`);
    return r;
  }

  it('puts the request on the roll, mails the named assessor, who reads the unlisted lot and answers it with evidence and an opinion', async () => {
    const code = await newLot();
    await thea.agent.get(`/api/lots/${code}`).expect(404);
    const fake = t.app.get(FakeSmtpService);
    const before = fake.to(thea.email).length;
    const made = await ask(code, { assessor: thea.id, note: 'Look at the seams, please.' }).expect(201);
    expect(made.body).toMatchObject({
      status: 'open',
      note: 'Look at the seams, please.',
      assessor: { id: thea.id, displayName: 'Thea Quill' },
      lot: { code, listed: false },
    });
    // On the roll, in format version 3, naming the assessor (never the note, which stays private).
    const asked = (await verified(code)).verified.at(-1)!;
    expect(asked.header).toMatchObject({ v: 3, kind: 'opinion-requested', facts: { assessor: thea.id } });
    expect(JSON.stringify(asked.body)).not.toContain('seams');
    const mails = fake.to(thea.email);
    expect(mails.length).toBe(before + 1);
    expect(mails[0]!.subject).toMatch(/^A dealer asks your opinion on lot [0-9A-Z]{4}-[0-9A-Z]{4}-[0-9A-Z]$/);
    expect(mails[0]!.text).toContain('Mirela Holt');
    expect(mails[0]!.text).toContain('your queue');

    const queue = await thea.agent.get('/api/opinion-requests').query({ box: 'received' }).expect(200);
    expect(queue.body.items.map((r: { id: string }) => r.id)).toEqual([made.body.id]);
    // Only the named assessor: another assessor and another dealer still get the bare 404.
    await ravi.agent.get(`/api/lots/${code}`).expect(404);
    await other.agent.get(`/api/lots/${code}`).expect(404);
    expect((await ravi.agent.get('/api/opinion-requests').query({ box: 'received' })).body.items).toEqual([]);

    await thea.agent.get(`/api/lots/${code}`).expect(200);
    await thea.agent.get(`/api/lots/${code}/roll`).expect(200);
    await thea.agent.get(`/api/lots/${code}/opinions`).expect(200);
    // The lot stays unlisted: the assessor's evidence and opinion name the request.
    const photo = await upload(
      thea.agent,
      code,
      await imageOf('png'),
      { kind: 'close-up' },
      'seam.png',
      'image/png',
    ).expect(201);
    const ex = (await verified(code)).verified.at(-1)!;
    expect(ex.header).toMatchObject({
      kind: 'exhibit-added',
      actor: thea.id,
      facts: { request: asked.header.seq },
    });
    expect(photo.status).toBe(201);
    const sha = (ex.header.facts as { original: string }).original;
    const opinion = await thea.agent
      .post(`/api/lots/${code}/opinions`)
      .set(W)
      .send({ ...OPINION, exhibits: [sha] })
      .expect(201);
    const r = await verified(code);
    expect(r.verified.at(-1)!.header).toMatchObject({
      kind: 'opinion',
      actor: thea.id,
      facts: { exhibits: [sha], request: asked.header.seq },
    });
    expect(r.state.openRequests).toEqual([]);
    expect(r.state.listed).toBe(false);

    const sent = await holder.agent.get('/api/opinion-requests').query({ box: 'sent' }).expect(200);
    expect(sent.body.items[0]).toMatchObject({
      status: 'answered',
      opinionSeq: opinion.body.seq,
      answeredBy: { id: thea.id },
    });
    // The holder sees it among the lot's opinions.
    const ops = await holder.agent.get(`/api/lots/${code}/opinions`).expect(200);
    expect(JSON.stringify(ops.body)).toContain('Mould seams on every bead');
    // Answered: the assessor reads the lot as it stood at their answer, no further, and can no
    // longer write on it.
    const kept = await thea.agent.get(`/api/lots/${code}`).expect(200);
    expect(kept.body.historyUpTo).toBe(opinion.body.seq);
    await thea.agent.post(`/api/lots/${code}/opinions`).set(W).send(OPINION).expect(404);
    const after = await thea.agent.get('/api/opinion-requests').query({ box: 'received' }).expect(200);
    expect(after.body.items[0]).toMatchObject({ status: 'answered', opinionSeq: opinion.body.seq });

    // The holder writes on after the answer; the assessor still withdraws their own opinion, as
    // core's rules let an opinion's author do in any state, and sees it gone, but nothing else new.
    await holder.agent
      .post(`/api/lots/${code}/observations`)
      .set(W)
      .send({ observations: { hole: 'powder' } })
      .expect(201);
    const mine = await thea.agent.get(`/api/lots/${code}/opinions`).expect(200);
    expect(mine.body.opinions.map((o: { seq: number }) => o.seq)).toEqual([opinion.body.seq]);
    const withdrawn = await thea.agent
      .post(`/api/lots/${code}/opinions/${opinion.body.seq}/withdrawal`)
      .set(W)
      .send({ note: 'On a second look the seams are later work.' })
      .expect(200);
    expect(withdrawn.body.opinions.opinions).toEqual([]);
    expect((await thea.agent.get(`/api/lots/${code}/opinions`).expect(200)).body.opinions).toEqual([]);
    expect((await thea.agent.get(`/api/lots/${code}`).expect(200)).body.historyUpTo).toBe(opinion.body.seq);
    const w = (await verified(code)).verified.at(-1)!;
    expect(w.header).toMatchObject({ kind: 'opinion-withdrawn', actor: thea.id });
    expect((await holder.agent.get(`/api/lots/${code}/opinions`).expect(200)).body.opinions).toEqual([]);
    // Once withdrawn, it is not standing: the same request is refused.
    await thea.agent
      .post(`/api/lots/${code}/opinions/${opinion.body.seq}/withdrawal`)
      .set(W)
      .send({})
      .expect(404);
    // Another assessor with no access still gets the bare 404.
    await ravi.agent
      .post(`/api/lots/${code}/opinions/${opinion.body.seq}/withdrawal`)
      .set(W)
      .send({})
      .expect(404);
  });

  it('closes the request on the roll and in the queue when the lot changes hands', async () => {
    const code = await newLot();
    const made = await ask(code, { assessor: thea.id }).expect(201);
    const offer = await holder.agent
      .post('/api/transfers/offers')
      .set(W)
      .send({ lot: code, recipient: other.id })
      .expect(201);
    await other.agent.post(`/api/transfers/offers/${offer.body.offer.id}/accept`).set(W).send({}).expect(200);
    const sent = await holder.agent.get('/api/opinion-requests').query({ box: 'sent' }).expect(200);
    expect(sent.body.items.find((x: { id: string }) => x.id === made.body.id)).toMatchObject({
      status: 'cancelled',
    });
    await thea.agent.get(`/api/lots/${code}`).expect(404);
  });

  it('asks any verified assessor, mailing nobody: each may read until one answers, unlisted', async () => {
    const code = await newLot();
    const fake = t.app.get(FakeSmtpService);
    const before = [fake.to(thea.email).length, fake.to(ravi.email).length];
    await ask(code).expect(201);
    expect([fake.to(thea.email).length, fake.to(ravi.email).length]).toEqual(before);
    expect((await verified(code)).state.openRequests).toEqual([expect.objectContaining({ assessor: null })]);
    await thea.agent.get(`/api/lots/${code}`).expect(200);
    await ravi.agent.get(`/api/lots/${code}`).expect(200);
    await pending.agent.get(`/api/lots/${code}`).expect(404);
    const answered = await ravi.agent.post(`/api/lots/${code}/opinions`).set(W).send(OPINION);
    expect(answered.body).toMatchObject({ seq: 2 });
    expect((await verified(code)).state.openRequests).toEqual([]);
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
    const r = await verified(code);
    expect(r.verified.at(-1)!.header).toMatchObject({
      kind: 'opinion-request-closed',
      actor: holder.id,
      facts: { request: r.verified.at(-2)!.header.seq },
    });
    expect(r.state.openRequests).toEqual([]);
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
