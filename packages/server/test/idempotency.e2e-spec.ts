import { randomUUID } from 'node:crypto';
import request from 'supertest';
import { DataSource } from 'typeorm';
import { IdempotencySweeper } from '../src/idempotency/idempotency.module';
import { useAccount } from './support/accounts';
import { imageOf } from './support/exhibit-fixtures';
import { upload } from './support/exhibit-http';
import { description } from './support/lot-fixtures';
import { useTestApp } from './support/test-app';

const W = { 'X-Beadroll-Request': '1' };

describe('idempotent writes', () => {
  let db: DataSource;

  const t = useTestApp();
  const a = useAccount(t, { role: 'dealer' });
  const b = useAccount(t, { role: 'dealer' });
  beforeAll(async () => {
    db = t.app.get(DataSource);
  });

  async function count(sql: string, params: unknown[] = []): Promise<number> {
    const [{ n }] = (await db.query(`SELECT count(*)::int AS n FROM (${sql}) q`, params)) as Array<{
      n: number;
    }>;
    return n;
  }
  const lots = () => count('SELECT 1 FROM "lots"');
  const entriesOf = (code: string) =>
    count('SELECT 1 FROM "entries" e JOIN "lots" l ON l."id" = e."lot_id" WHERE l."code" = $1', [code]);

  it('answers a repeated registration from the stored answer and registers one lot', async () => {
    const key = randomUUID();
    const before = await lots();
    const body = { description: description({ title: 'Twelve striped chevrons' }) };
    const first = await a.agent.post('/api/lots').set(W).set('Idempotency-Key', key).send(body);
    expect(first.status).toBe(201);
    expect(first.headers['idempotent-replayed']).toBeUndefined();
    const again = await a.agent.post('/api/lots').set(W).set('Idempotency-Key', key).send(body);
    expect(again.status).toBe(201);
    expect(again.headers['idempotent-replayed']).toBe('true');
    expect(again.body).toEqual(first.body);
    expect(await lots()).toBe(before + 1);
    // The key, the request's digest and the answer are stored with the write.
    const [row] = (await db.query('SELECT * FROM "idempotency_keys" WHERE "account" = $1 AND "key" = $2', [
      a.id,
      key,
    ])) as Array<{ status: number; body: string; request_digest: string }>;
    expect(row.status).toBe(201);
    expect(JSON.parse(row.body)).toEqual(first.body);
    expect(row.request_digest).toMatch(/^[0-9a-f]{64}$/);
  });

  it('refuses the same key with a different request (422) and writes nothing', async () => {
    const key = randomUUID();
    await a.agent
      .post('/api/lots')
      .set(W)
      .set('Idempotency-Key', key)
      .send({ description: description() })
      .expect(201);
    const before = await lots();
    const other = await a.agent
      .post('/api/lots')
      .set(W)
      .set('Idempotency-Key', key)
      .send({ description: description({ title: 'Another lot' }) });
    expect(other.status).toBe(422);
    expect(other.body.error.code).toBe('idempotency_key_reused');
    expect(await lots()).toBe(before);
  });

  it('keeps keys per account: another dealer may use the same key', async () => {
    const key = randomUUID();
    const body = { description: description() };
    const mine = await a.agent.post('/api/lots').set(W).set('Idempotency-Key', key).send(body).expect(201);
    const theirs = await b.agent.post('/api/lots').set(W).set('Idempotency-Key', key).send(body).expect(201);
    expect(theirs.headers['idempotent-replayed']).toBeUndefined();
    expect(theirs.body.code).not.toBe(mine.body.code);
  });

  it('writes one entry when the same request races itself with one key', async () => {
    const code = (await a.agent.post('/api/lots').set(W).send({ description: description() }).expect(201))
      .body.code as string;
    const before = await entriesOf(code);
    const key = randomUUID();
    const send = () =>
      a.agent
        .post(`/api/lots/${code}/observations`)
        .set(W)
        .set('Idempotency-Key', key)
        .send({ observations: { windingMarks: 'seen', foil: 'none' } });
    const answers = await Promise.all([send(), send(), send(), send()]);
    expect(answers.map((r) => r.status)).toEqual([201, 201, 201, 201]);
    expect(await entriesOf(code)).toBe(before + 1);
    expect(answers.filter((r) => r.headers['idempotent-replayed'] === 'true')).toHaveLength(3);
  });

  it('stores nothing for a refused request: its repeat is decided afresh', async () => {
    const key = randomUUID();
    const bad = await a.agent.post('/api/lots').set(W).set('Idempotency-Key', key).send({ description: {} });
    expect(bad.status).toBe(400);
    expect(await count('SELECT 1 FROM "idempotency_keys" WHERE "key" = $1', [key])).toBe(0);
    const good = await a.agent
      .post('/api/lots')
      .set(W)
      .set('Idempotency-Key', key)
      .send({ description: description() });
    expect(good.status).toBe(201);
  });

  it('refuses a malformed key, naming the header, and writes nothing', async () => {
    const code = (await a.agent.post('/api/lots').set(W).send({ description: description() }).expect(201))
      .body.code as string;
    const before = await entriesOf(code);
    const key = 'x'.repeat(256);
    const res = await a.agent
      .post(`/api/lots/${code}/observations`)
      .set(W)
      .set('Idempotency-Key', key)
      .send({});
    expect(res.status).toBe(400);
    expect(res.body.error.fields[0].field).toBe('Idempotency-Key');
    expect(await entriesOf(code)).toBe(before);
  });

  it('forgets keys after 24 hours', async () => {
    const key = randomUUID();
    const body = { description: description() };
    const first = await a.agent.post('/api/lots').set(W).set('Idempotency-Key', key).send(body).expect(201);
    await db.query(
      `UPDATE "idempotency_keys" SET "created_at" = now() - interval '25 hours' WHERE "account" = $1 AND "key" = $2`,
      [a.id, key],
    );
    const later = await a.agent.post('/api/lots').set(W).set('Idempotency-Key', key).send(body).expect(201);
    expect(later.headers['idempotent-replayed']).toBeUndefined();
    expect(later.body.code).not.toBe(first.body.code);
    await db.query(`UPDATE "idempotency_keys" SET "created_at" = now() - interval '25 hours'`);
    expect(await t.app.get(IdempotencySweeper).sweep()).toBeGreaterThan(0);
    expect(await count('SELECT 1 FROM "idempotency_keys"')).toBe(0);
  });

  it('covers transfers: an accept sent twice accepts once', async () => {
    const code = (await a.agent.post('/api/lots').set(W).send({ description: description() }).expect(201))
      .body.code as string;
    const offer = await a.agent
      .post('/api/transfers/offers')
      .set(W)
      .set('Idempotency-Key', randomUUID())
      .send({ lot: code, recipient: b.id })
      .expect(201);
    const key = randomUUID();
    const accept = () =>
      b.agent
        .post(`/api/transfers/offers/${offer.body.offer.id}/accept`)
        .set(W)
        .set('Idempotency-Key', key)
        .send({});
    const one = await accept();
    const two = await accept();
    expect(one.status).toBe(200);
    expect(two.status).toBe(200);
    expect(two.body).toEqual(one.body);
    const kinds = (await db.query(
      `SELECT e."kind" FROM "entries" e JOIN "lots" l ON l."id" = e."lot_id" WHERE l."code" = $1 ORDER BY e."seq"`,
      [code],
    )) as Array<{ kind: string }>;
    expect(kinds.map((k) => k.kind)).toEqual(['registered', 'transfer-offered', 'transfer-accepted']);
  });

  it('covers uploads: the digest includes the file, so the same key with another file is refused', async () => {
    const code = (await a.agent.post('/api/lots').set(W).send({ description: description() }).expect(201))
      .body.code as string;
    const key = randomUUID();
    const png = await imageOf('png');
    const first = await upload(a.agent, code, png, { kind: 'close-up' }, 'a.png', 'image/png').set(
      'Idempotency-Key',
      key,
    );
    expect(first.status).toBe(201);
    const again = await upload(a.agent, code, png, { kind: 'close-up' }, 'a.png', 'image/png').set(
      'Idempotency-Key',
      key,
    );
    expect(again.status).toBe(201);
    expect(again.headers['idempotent-replayed']).toBe('true');
    expect(again.body).toEqual(first.body);
    const other = await upload(
      a.agent,
      code,
      await imageOf('png', 64, 64),
      { kind: 'close-up' },
      'a.png',
      'image/png',
    ).set('Idempotency-Key', key);
    expect(other.status).toBe(422);
    expect(await entriesOf(code)).toBe(2);
  });

  it('accepts a key on sign-up without a sign-in, and on sign-in without replaying cookies', async () => {
    const key = randomUUID();
    const body = {
      role: 'dealer',
      handle: `dealer-${randomUUID().slice(0, 8)}`,
      email: `${randomUUID().slice(0, 8)}@example.invalid`,
      password: 'a long enough password',
      displayName: 'Ivo Brannock',
      business: 'Brannock Beads',
      town: 'Lattimo Hythe',
      country: 'Cullet Shires',
      address: '4 Quay Lane, Lattimo Hythe',
      tradeReferences: 'Stand 9 at the Lattimo Hythe bead fair since 2020.',
    };
    const one = await request(t.app.getHttpServer())
      .post('/api/auth/sign-up')
      .set(W)
      .set('Idempotency-Key', key)
      .send(body);
    expect(one.status).toBeLessThan(300);
    const two = await request(t.app.getHttpServer())
      .post('/api/auth/sign-up')
      .set(W)
      .set('Idempotency-Key', key)
      .send(body);
    expect(two.status).toBe(one.status);
    expect(two.headers['idempotent-replayed']).toBe('true');
    const signIn = () =>
      request(t.app.getHttpServer())
        .post('/api/auth/sign-in')
        .set(W)
        .set('Idempotency-Key', key)
        .send({ email: a.email, password: a.password });
    expect((await signIn()).headers['set-cookie']).toBeDefined();
    expect((await signIn()).headers['set-cookie']).toBeDefined();
  });
});
