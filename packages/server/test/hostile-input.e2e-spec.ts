import request from 'supertest';
import { createAccount, useAccount } from './support/accounts';
import { imageOf } from './support/exhibit-fixtures';
import { upload } from './support/exhibit-http';
import { description, handOver, registerLot } from './support/lot-fixtures';
import { useTestApp } from './support/test-app';

const W = { 'X-Beadroll-Request': '1' };
const NUL = String.fromCharCode(0);
// A high surrogate with no low surrogate after it: not a Unicode scalar value, so not text
// (Unicode 15 §3.9 D76, D91; RFC 8785 §3.2.2.2 refuses it in canonical JSON).
const LONE = 'a\uD83Dz@example.invalid';

/** A JSON body nested `depth` lists deep, as raw text (JSON.stringify of it would recurse). */
function deepJson(depth: number): string {
  return `{"email":${'['.repeat(depth)}${']'.repeat(depth)},"password":"x"}`;
}

describe('hostile input answers 400, never 500', () => {
  let listedCode: string;

  const t = useTestApp();
  const holder = useAccount(t, { role: 'dealer' });
  const other = useAccount(t, { role: 'dealer' });
  const registrar = useAccount(t, { role: 'registrar' });
  beforeAll(async () => {
    listedCode = (
      await holder.agent.post('/api/lots').set(W).send({ description: description() }).expect(201)
    ).body.code as string;
  });

  const anon = () => request(t.app.getHttpServer());

  it('refuses JSON nested 20,000 deep on every kind of route, before validation', async () => {
    for (const [agent, path] of [
      [anon(), '/api/auth/sign-in'],
      [anon(), '/api/attribution-aid'],
      [holder.agent, '/api/lots'],
    ] as const) {
      const res = await agent
        .post(path)
        .set(W)
        .set('Content-Type', 'application/json')
        .send(deepJson(20_000));
      expect({ path, status: res.status }).toEqual({ path, status: 400 });
      expect(res.body.error.fields[0]).toMatchObject({ field: expect.stringMatching(/^email/) });
      expect(res.body.error.fields[0].reason).toMatch(/nested too deeply/);
    }
  });

  it('answers a body over the size limit with 413 and broken JSON with 400', async () => {
    const big = await anon()
      .post('/api/auth/sign-in')
      .set(W)
      .set('Content-Type', 'application/json')
      .send(JSON.stringify({ email: 'x'.repeat(300 * 1024) }));
    expect(big.status).toBe(413);
    expect(big.body.error.code).toBe('payload_too_large');
    const broken = await anon()
      .post('/api/auth/sign-in')
      .set(W)
      .set('Content-Type', 'application/json')
      .send('{"email":');
    expect(broken.status).toBe(400);
    expect(broken.body.error.fields).toEqual([{ field: 'body', reason: 'is not valid JSON' }]);
  });

  it('refuses a lone surrogate in an e-mail on sign-up, sign-in, forgot-password and public reports', async () => {
    const cases: Array<[string, object]> = [
      ['/api/auth/sign-up', { role: 'dealer', email: LONE, password: 'long enough password', handle: 'x-y' }],
      ['/api/auth/sign-in', { email: LONE, password: 'whatever it is' }],
      ['/api/auth/forgot-password', { email: LONE }],
      [
        `/api/public/lots/${listedCode}/reports`,
        { category: 'other', text: 'Looks wrong to me.', email: LONE },
      ],
    ];
    for (const [path, body] of cases) {
      const res = await anon().post(path).set(W).send(body);
      expect({ path, status: res.status }).toEqual({ path, status: 400 });
      expect(res.body.error.fields).toEqual([
        { field: 'email', reason: expect.stringMatching(/broken character/) },
      ]);
    }
  });

  it('refuses a NUL where free text is stored outside the roll, naming the field', async () => {
    const removal = await holder.agent
      .post(`/api/lots/${listedCode}/redaction-requests`)
      .set(W)
      .send({ seq: 0, note: `please remove${NUL}` });
    expect(removal.status).toBe(400);
    expect(removal.body.error.fields[0].field).toBe('note');
    const close = await registrar.agent
      .post('/api/registry/reports/00000000-0000-4000-8000-000000000000/close')
      .set(W)
      .send({ resolution: `done${NUL}` });
    expect(close.status).toBe(400);
    expect(close.body.error.fields[0].field).toBe('resolution');
    const reject = await registrar.agent
      .post(`/api/registry/accounts/${other.id}/reject`)
      .set(W)
      .send({ reason: `no${NUL}` });
    expect(reject.status).toBe(400);
    expect(reject.body.error.fields[0].field).toBe('reason');
    // In a nested field and in a query, too.
    const nested = await holder.agent
      .post('/api/lots')
      .set(W)
      .send({ description: description({ title: `Roses${NUL}` }) });
    expect(nested.status).toBe(400);
    expect(nested.body.error.fields[0].field).toBe('description.title');
    const query = await holder.agent.get('/api/lots').query({ q: `rose${NUL}` });
    expect(query.status).toBe(400);
    expect(query.body.error.fields[0].field).toBe('q');
  });

  it('refuses a NUL in an upload’s form field', async () => {
    const res = await upload(
      holder.agent,
      listedCode,
      await imageOf('png'),
      { kind: 'close-up', caption: `tray${NUL}` },
      'a.png',
      'image/png',
    );
    expect(res.status).toBe(400);
    expect(res.body.error.fields[0].field).toBe('caption');
  });
});

describe('authorisation follows the roll', () => {
  const t = useTestApp();
  const a = useAccount(t, { role: 'dealer' });
  const b = useAccount(t, { role: 'dealer' });

  it('refuses a listing change by a dealer who does not hold the lot, even when nothing would change', async () => {
    const { code } = await registerLot(a, { listed: true });
    for (const listed of [true, false]) {
      const res = await b.agent.put(`/api/lots/${code}/listing`).set(W).send({ listed });
      expect({ listed, status: res.status }).toEqual({ listed, status: 403 });
    }
    expect((await a.agent.put(`/api/lots/${code}/listing`).set(W).send({ listed: true })).status).toBe(200);
  });

  it('lets a former holder read the ancestry, opinions and exhibits of an unlisted lot up to the handover', async () => {
    const { code } = await registerLot(a, { listed: false });
    await upload(a.agent, code, await imageOf('png'), { kind: 'close-up' }, 'a.png', 'image/png').expect(201);
    await handOver(a, code, b);
    // After the handover the new holder adds an exhibit the former holder must not see.
    await upload(
      b.agent,
      code,
      await imageOf('png', 90, 60),
      { kind: 'close-up' },
      'b.png',
      'image/png',
    ).expect(201);

    expect((await a.agent.get(`/api/lots/${code}`)).status).toBe(200);
    const ancestry = await a.agent.get(`/api/lots/${code}/ancestry`);
    expect(ancestry.status).toBe(200);
    expect(ancestry.body.nodes[0]).toMatchObject({ code, readable: true });
    expect((await a.agent.get(`/api/lots/${code}/opinions`)).status).toBe(200);
    const exhibits = await a.agent.get(`/api/lots/${code}/exhibits`);
    expect(exhibits.status).toBe(200);
    expect(exhibits.body.exhibits).toHaveLength(1);
    const [mine] = exhibits.body.exhibits as Array<{ seq: number }>;
    expect((await a.agent.get(`/api/lots/${code}/exhibits/${mine!.seq}/thumb`)).status).toBe(200);
    const later = (await b.agent.get(`/api/lots/${code}/exhibits`).expect(200)).body.exhibits as Array<{
      seq: number;
    }>;
    const theirs = later.find((e) => e.seq !== mine!.seq)!;
    expect((await a.agent.get(`/api/lots/${code}/exhibits/${theirs.seq}/thumb`)).status).toBe(404);

    // Someone who never held it still gets the same 404 everywhere.
    const c = await createAccount(t, { role: 'dealer' });
    for (const path of ['', '/ancestry', '/opinions', '/exhibits'])
      expect((await c.agent.get(`/api/lots/${code}${path}`)).status).toBe(404);
  });
});
