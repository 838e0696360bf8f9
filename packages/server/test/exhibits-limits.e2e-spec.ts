import { request as httpRequest } from 'node:http';
import type { AddressInfo } from 'node:net';
import request from 'supertest';
import { DataSource } from 'typeorm';
import { createAccount, type TestAccount } from './support/accounts';
import { imageOf, jpegWithGps } from './support/exhibit-fixtures';
import { leftovers, rollOf, storedBlobs, upload } from './support/exhibit-http';
import { registerLot } from './support/lot-fixtures';
import { createTestApp, type TestApp } from './support/test-app';

// Small limits so that a test file can go over them: 64 KiB per file, 2000 bytes per account.
const MAX_BYTES = 64 * 1024;
const QUOTA = 2000;

let t: TestApp;
let dealer: TestAccount;
let code: string;

beforeAll(async () => {
  t = await createTestApp({ EXHIBIT_MAX_BYTES: String(MAX_BYTES), EXHIBIT_QUOTA_BYTES: String(QUOTA) });
  dealer = await createAccount(t, { role: 'dealer' });
  code = (await registerLot(dealer)).code;
}, 60_000);
afterAll(() => t?.close());

async function until(check: () => boolean, ms = 5000): Promise<void> {
  const end = Date.now() + ms;
  while (!check() && Date.now() < end) await new Promise((r) => setTimeout(r, 50));
}

it('refuses a file over the size limit with 413, naming the limit, and keeps nothing', async () => {
  // A photo padded past the limit.
  const big = Buffer.concat([await jpegWithGps(), Buffer.alloc(MAX_BYTES + 1, 0x41)]);
  const entries = (await rollOf(dealer.agent, code)).length;
  const res = await upload(dealer.agent, code, big).expect(413);
  expect(res.body.error).toMatchObject({
    code: 'payload_too_large',
    fields: [{ field: 'file', reason: `is over the limit of ${MAX_BYTES} bytes` }],
  });
  expect((await rollOf(dealer.agent, code)).length).toBe(entries);
  expect(storedBlobs(t)).toEqual([]);
  await until(() => leftovers(t).length === 0);
  expect(leftovers(t)).toEqual([]);
});

it('removes the temporary file when the client goes away mid-upload, and adds no entry', async () => {
  const server = t.app.getHttpServer();
  if (!server.listening) await new Promise<void>((r) => server.listen(0, '127.0.0.1', r));
  const { port } = server.address() as AddressInfo;
  const signIn = await request(server)
    .post('/api/auth/sign-in')
    .set('X-Beadroll-Request', '1')
    .send({ email: dealer.email, password: dealer.password })
    .expect(200);
  const cookie = (signIn.headers['set-cookie'] as unknown as string[]).map((c) => c.split(';')[0]).join('; ');
  const entries = (await rollOf(dealer.agent, code)).length;

  const boundary = 'exhibit-abort-boundary';
  const head = Buffer.from(
    `--${boundary}\r\nContent-Disposition: form-data; name="kind"\r\n\r\nclose-up\r\n` +
      `--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="a.jpg"\r\nContent-Type: image/jpeg\r\n\r\n`,
  );
  const req = httpRequest({
    host: '127.0.0.1',
    port,
    method: 'POST',
    path: `/api/lots/${code}/exhibits`,
    headers: {
      cookie,
      'x-beadroll-request': '1',
      'content-type': `multipart/form-data; boundary=${boundary}`,
      'content-length': String(head.length + 60_000),
    },
  });
  req.on('error', () => undefined);
  req.write(head);
  req.write(Buffer.alloc(30_000, 0x42));
  // Multer has started the temporary file by now; then the connection drops.
  await until(() => leftovers(t).length > 0, 3000);
  req.destroy();
  await until(() => leftovers(t).length === 0);
  expect(leftovers(t)).toEqual([]);
  expect((await rollOf(dealer.agent, code)).length).toBe(entries);
});

it('stops an account at its storage quota, with a 413 naming the allowance', async () => {
  // A 120 × 80 PNG keeps well under 2000 bytes with its two JPEG derivatives (about 1100).
  const png = await imageOf('png');
  const first = await upload(dealer.agent, code, png, { kind: 'hole' }).expect(201);
  const used =
    (first.body.exhibit.original.size as number) +
    (first.body.exhibit.derivatives as Array<{ size: number }>).reduce((n, d) => n + d.size, 0);
  expect(used).toBeLessThanOrEqual(QUOTA);
  expect(used * 2).toBeGreaterThan(QUOTA);
  const entries = (await rollOf(dealer.agent, code)).length;
  const res = await upload(dealer.agent, code, png, { kind: 'hole' }).expect(413);
  expect(res.body.error).toMatchObject({
    code: 'payload_too_large',
    fields: [{ field: 'file', reason: expect.stringMatching(`the allowance is ${QUOTA} bytes`) }],
  });
  expect((await rollOf(dealer.agent, code)).length).toBe(entries);
  expect(leftovers(t)).toEqual([]);

  // The quota is per account: another dealer still has all of theirs.
  const second = await createAccount(t, { role: 'dealer' });
  await upload(second.agent, (await registerLot(second)).code, png, { kind: 'hole' }).expect(201);
});

it('lets exactly one of two simultaneous uploads through when together they go over the quota', async () => {
  const owner = await createAccount(t, { role: 'dealer' });
  // Two lots, so that the lots' own row locks do not line the two uploads up.
  const lots: string[] = [];
  for (let i = 0; i < 2; i++) {
    lots.push((await registerLot(owner)).code);
  }
  // Two different images (other bytes, so no shared blobs), about 1100 bytes each with derivatives.
  const images = [await imageOf('png', 118, 80), await imageOf('png', 119, 80)];
  const storedBefore = storedBlobs(t).length;
  // Each exhibit row takes half a second to insert, which holds the time between an upload's
  // quota check and its commit wide open: a check outside the commit's lock lets both through.
  const db = t.app.get(DataSource);
  await db.query(`CREATE FUNCTION test_slow_exhibit() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN PERFORM pg_sleep(0.5); RETURN NEW; END $$`);
  await db.query(`CREATE TRIGGER test_slow_exhibit BEFORE INSERT ON "exhibits"
    FOR EACH ROW EXECUTE FUNCTION test_slow_exhibit()`);
  let results: Awaited<ReturnType<typeof upload>>[];
  try {
    results = await Promise.all(
      lots.map((lot, i) => upload(owner.agent, lot, images[i]!, { kind: 'hole' }, `${i}.png`, 'image/png')),
    );
  } finally {
    await db.query('DROP TRIGGER test_slow_exhibit ON "exhibits"');
    await db.query('DROP FUNCTION test_slow_exhibit()');
  }
  expect(results.map((r) => r.status).sort()).toEqual([201, 413]);
  expect(results.find((r) => r.status === 413)!.body.error).toMatchObject({
    code: 'payload_too_large',
    fields: [{ field: 'file', reason: expect.stringMatching(`the allowance is ${QUOTA} bytes`) }],
  });
  const rows: Array<{ n: string; used: string }> = await db.query(
    'SELECT COUNT(*) AS "n", SUM("bytes") AS "used" FROM "exhibits" WHERE "added_by" = $1',
    [owner.id],
  );
  expect(Number(rows[0]!.n)).toBe(1);
  expect(Number(rows[0]!.used)).toBeLessThanOrEqual(QUOTA);
  // The refused upload left no entry on its lot and no file in the store: only the accepted
  // exhibit's original and two derivatives were added.
  const refusedLot = lots[results.findIndex((r) => r.status === 413)]!;
  expect((await rollOf(owner.agent, refusedLot)).length).toBe(1);
  const accepted = results.find((r) => r.status === 201)!.body.exhibit as {
    original: { sha256: string };
    derivatives: Array<{ sha256: string }>;
  };
  const names = storedBlobs(t).map((p) => p.split('/').pop());
  for (const d of [accepted.original, ...accepted.derivatives]) expect(names).toContain(d.sha256);
  expect(names.length).toBe(storedBefore + 3);
  expect(leftovers(t)).toEqual([]);
});
