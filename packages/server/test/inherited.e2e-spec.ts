import {
  attributionOnRecord,
  inheritedRecord,
  parseBundle,
  verifyBundle,
  verifyRoll,
  type EntryHeader,
  type ExhibitRef,
} from '@beadroll/core';
import request from 'supertest';
import { createAccount, type TestAccount } from './support/accounts';
import { imageOf } from './support/exhibit-fixtures';
import { binary, sha256, upload } from './support/exhibit-http';
import { description } from './support/lot-fixtures';
import { createTestApp, type TestApp } from './support/test-app';

const CSRF = ['X-Beadroll-Request', '1'] as const;

let t: TestApp;
let holder: TestAccount;
let assessor: TestAccount;

const opinion = (origin: string, from: number, to: number, exhibits: string[] = []) => ({
  origin,
  period: { from, to, approximate: true },
  technique: 'wound-lampwork',
  qualifier: 'attributed-to',
  confidence: 'medium',
  rationale: 'Seen under a loupe.',
  exhibits,
});

beforeAll(async () => {
  t = await createTestApp();
  holder = await createAccount(t, { role: 'dealer' });
  assessor = await createAccount(t, { role: 'assessor' });
}, 60_000);
afterAll(() => t?.close());

/** The attribution on record of a listed lot, as a buyer's browser derives it from the public data. */
async function recordOf(code: string) {
  const bundle = parseBundle(
    (await request(t.app.getHttpServer()).get(`/api/public/lots/${code}`)).body.bundle,
  );
  const own = verifyRoll(bundle.rolls[0]!.entries, { lot: code });
  if (!own.ok) throw new Error(`the roll of ${code} does not verify`);
  return attributionOnRecord(own.verified, own.state, inheritedRecord(bundle, code));
}

describe('what an unlisted parent passes on', () => {
  let parent: string;
  let kid: string;
  let cited: { seq: number; ref: ExhibitRef };
  let uncitedSeq: number;

  beforeAll(async () => {
    const res = await holder.agent
      .post('/api/lots')
      .set(...CSRF)
      .send({
        description: description({
          title: 'Parent kept private later',
          count: { value: 20, estimated: false },
        }),
      })
      .expect(201);
    parent = res.body.code as string;
    await holder.agent
      .post(`/api/lots/${parent}/observations`)
      .set(...CSRF)
      .send({ observations: { note: 'bought with the brass box' } })
      .expect(201);
    const up = await upload(assessor.agent, parent, await imageOf('png'), { kind: 'hole' }).expect(201);
    cited = { seq: up.body.exhibit.seq as number, ref: up.body.exhibit as ExhibitRef };
    const other = await upload(holder.agent, parent, await imageOf('png', 90, 60), {
      kind: 'whole-lot',
    }).expect(201);
    uncitedSeq = other.body.exhibit.seq as number;
    await holder.agent
      .post(`/api/lots/${parent}/opinions`)
      .set(...CSRF)
      .send(opinion('venice-murano', 1860, 1900))
      .expect(201);
    await assessor.agent
      .post(`/api/lots/${parent}/opinions`)
      .set(...CSRF)
      .send(opinion('bohemia-czech', 1920, 1938, [cited.ref.original.sha256]))
      .expect(201);
    await holder.agent
      .put(`/api/lots/${parent}/listing`)
      .set(...CSRF)
      .send({ listed: false })
      .expect(200);
    const split = await holder.agent
      .post(`/api/lots/${parent}/splits`)
      .set(...CSRF)
      .send({
        children: [1, 2].map((n) => ({
          description: description({ title: `Listed child ${n}`, count: { value: 10, estimated: false } }),
        })),
      });
    expect(split.status).toBe(201);
    kid = split.body.children[0].code as string;
  }, 60_000);

  it('the child’s public data carries the parent’s opinions and the cited exhibit, nothing else of it', async () => {
    const res = await request(t.app.getHttpServer()).get(`/api/public/lots/${kid}`).expect(200);
    const bundle = parseBundle(res.body.bundle);
    expect(verifyBundle(bundle).failures).toEqual([]);
    const roll = bundle.rolls.find((r) => r.lot === parent)!;
    expect(roll.scope).toBe('inherited');
    expect(roll.entries.map((e) => (JSON.parse(e.header) as EntryHeader).kind)).toEqual([
      'registered',
      'exhibit-added',
      'opinion',
      'opinion',
      'split',
    ]);
    expect(res.text).not.toContain('Parent kept private later');
    expect(res.text).not.toContain('brass box');
    const inherited = inheritedRecord(bundle, kid);
    const own = verifyRoll(bundle.rolls[0]!.entries, { lot: kid });
    if (!own.ok) throw new Error('the child roll does not verify');
    const record = attributionOnRecord(own.verified, own.state, inherited);
    expect(record.source).toBe('ancestor');
    expect(record.dissent.map((d) => d.author)).toEqual([assessor.id]);
    // The assessor's card says what they are.
    expect(res.body.cards[assessor.id].role).toBe('assessor');
  });

  it('serves the cited exhibit through the child, and the same bare 404 for anything else', async () => {
    const server = t.app.getHttpServer();
    const got = await request(server)
      .get(`/api/public/lots/${kid}/inherited/${parent}/exhibits/${cited.seq}/original`)
      .buffer(true)
      .parse(binary)
      .expect(200);
    expect(sha256(got.body as Buffer)).toBe(cited.ref.original.sha256);
    for (const path of [
      `/api/public/lots/${kid}/inherited/${parent}/exhibits/${uncitedSeq}/original`,
      `/api/public/lots/${parent}/exhibits/${cited.seq}/original`,
      `/api/public/lots/${parent}/inherited/${kid}/exhibits/1/original`,
      `/api/public/lots/${kid}/inherited/${parent}/exhibits/999/original`,
    ])
      expect((await request(server).get(path)).status).toBe(404);
  });

  it('the inventory lists, filters and finds the child by the attribution it inherits', async () => {
    const codes = (body: { items: Array<{ code: string }> }) => body.items.map((i) => i.code);
    const found = await holder.agent.get('/api/lots').query({ mine: true, q: 'Venetian 19th' }).expect(200);
    expect(codes(found.body)).toContain(kid);
    const row = found.body.items.find((i: { code: string }) => i.code === kid);
    // The same record a buyer's browser derives from the public data.
    const rec = (await recordOf(kid)).record!;
    expect(row).toMatchObject({
      origin: rec.body.origin,
      originSource: 'ancestor',
      technique: rec.body.technique,
      period: { from: rec.body.period.from, to: rec.body.period.to },
    });
    const byOrigin = await holder.agent
      .get('/api/lots')
      .query({ mine: true, origin: 'venice-murano' })
      .expect(200);
    expect(codes(byOrigin.body)).toContain(kid);
    const other = await holder.agent.get('/api/lots').query({ mine: true, origin: 'india' }).expect(200);
    expect(codes(other.body)).not.toContain(kid);
  });

  it('the child’s holder adopts the inherited attribution; an adopts naming no standing opinion is a 400 naming it', async () => {
    const rec = (await recordOf(kid)).record!;
    const bad = await holder.agent
      .post(`/api/lots/${kid}/opinions`)
      .set(...CSRF)
      .send({
        ...opinion('venice-murano', 1860, 1900),
        adopts: { lot: parent, seq: rec.seq, hash: '0'.repeat(64) },
      })
      .expect(400);
    expect(bad.body.error.fields.map((f: { field: string }) => f.field)).toEqual(['adopts']);
    const ok = await holder.agent
      .post(`/api/lots/${kid}/opinions`)
      .set(...CSRF)
      .send({
        ...opinion('venice-murano', 1860, 1900),
        adopts: { lot: rec.lot, seq: rec.seq, hash: rec.hash },
      })
      .expect(201);
    expect(ok.body.seq).toBe(1);
    const after = parseBundle(
      (await request(t.app.getHttpServer()).get(`/api/public/lots/${kid}`)).body.bundle,
    );
    const own = verifyRoll(after.rolls[0]!.entries, { lot: kid });
    if (!own.ok) throw new Error('the child roll does not verify');
    const r = attributionOnRecord(own.verified, own.state, inheritedRecord(after, kid));
    expect(r.source).toBe('holder');
    expect(r.adopted?.hash).toBe(rec.hash);
    expect(r.dissent.map((d) => d.author)).toEqual([assessor.id]);
  });
});
