import sharp from 'sharp';
import request from 'supertest';
import { DataSource } from 'typeorm';
import { BLOB_LOCK } from '../src/storage/blob-locks';
import { createAccount, type TestAccount } from './support/accounts';
import { imageOf, jpegWithGps } from './support/exhibit-fixtures';
import { binary, leftovers, rollOf, sha256, storedBlobs, upload } from './support/exhibit-http';
import { registerLot } from './support/lot-fixtures';
import { createTestApp, superuserClient, type TestApp } from './support/test-app';

// A caption that the test trigger below refuses when the upload's transaction commits.
const FAIL_AT_COMMIT = 'refused when the transaction commits';

let t: TestApp;
let registrar: TestAccount;

beforeAll(async () => {
  t = await createTestApp();
  registrar = await createAccount(t, { role: 'registrar' });
}, 60_000);
afterAll(() => t?.close());

async function newLot(dealer: TestAccount): Promise<string> {
  return (await registerLot(dealer)).code;
}

/** A small PNG; each width gives other bytes, so tests never share blobs by accident. */
const png = (width: number) => imageOf('png', width, 80);

function blobsOf(exhibit: { original: { sha256: string }; derivatives: Array<{ sha256: string }> }) {
  return [exhibit.original.sha256, ...exhibit.derivatives.map((d) => d.sha256)];
}

function storedNames(): string[] {
  return storedBlobs(t)
    .map((p) => p.split('/').pop()!)
    .sort();
}

describe('bytes the registrar removed', () => {
  it('are refused with 409 when sent again, with no entry and no blob written', async () => {
    const dealer = await createAccount(t, { role: 'dealer' });
    const code = await newLot(dealer);
    // A photo with EXIF and GPS: the stored original is a re-encoding without them.
    const photo = await jpegWithGps(241, 160);
    const added = await upload(dealer.agent, code, photo, { kind: 'hole' }).expect(201);
    const { seq } = added.body.exhibit as { seq: number };
    const stored = await dealer.agent
      .get(`/api/lots/${code}/exhibits/${seq}/original`)
      .buffer(true)
      .parse(binary);
    expect(stored.status).toBe(200);
    const storedOriginal = stored.body as Buffer;
    expect(sha256(storedOriginal)).not.toBe(sha256(photo));

    await registrar.agent
      .post('/api/registry/redactions')
      .set('X-Beadroll-Request', '1')
      .send({ lot: code, seq, reason: 'unlawful-content' })
      .expect(200);

    const entries = (await rollOf(dealer.agent, code)).length;
    const blobs = storedNames();
    for (const bytes of [photo, storedOriginal]) {
      const res = await upload(dealer.agent, code, bytes, { kind: 'hole' });
      expect(res.status).toBe(409);
      expect(res.body.error).toMatchObject({
        code: 'blocked_content',
        message: expect.stringMatching(/removed by the registrar/),
      });
    }
    // Another dealer, on another lot, is refused the same bytes too.
    const other = await createAccount(t, { role: 'dealer' });
    const res = await upload(other.agent, await newLot(other), photo, { kind: 'hole' });
    expect(res.status).toBe(409);

    expect((await rollOf(dealer.agent, code)).length).toBe(entries);
    expect(storedNames()).toEqual(blobs);
    expect(leftovers(t)).toEqual([]);
  });
});

describe('a sealed exhibit the registrar removes', () => {
  it('loses its stored files too, though its public body names none, and its bytes are blocked', async () => {
    const dealer = await createAccount(t, { role: 'dealer' });
    const code = await newLot(dealer);
    const receipt = await png(233);
    const added = await upload(
      dealer.agent,
      code,
      receipt,
      { kind: 'receipt' },
      'receipt.png',
      'image/png',
    ).expect(201);
    const exhibit = added.body.exhibit as {
      seq: number;
      sealed: boolean;
      original: { sha256: string };
      derivatives: Array<{ sha256: string }>;
    };
    expect(exhibit.sealed).toBe(true);
    const files = blobsOf(exhibit);
    for (const f of files) expect(storedNames()).toContain(f);

    const res = await registrar.agent
      .post('/api/registry/redactions')
      .set('X-Beadroll-Request', '1')
      .send({ lot: code, seq: exhibit.seq, reason: 'personal-data' })
      .expect(200);
    // The registrar's answer names no sealed digest.
    expect(res.body.blockedDigests).toEqual([]);
    for (const f of files) expect(storedNames()).not.toContain(f);
    const again = await upload(dealer.agent, code, receipt, { kind: 'receipt' }, 'receipt.png', 'image/png');
    expect(again.status).toBe(409);
    expect(again.body.error.code).toBe('blocked_content');
  });
});

describe('the file as the dealer sent it', () => {
  it('is recorded by the SHA-256 of every byte received, for a photo that arrives in many chunks', async () => {
    const dealer = await createAccount(t, { role: 'dealer' });
    const code = await newLot(dealer);
    // A noisy 1200 × 900 photo (noise keeps it large): several hundred kB, far more than one
    // network read, so the digest taken while the upload is written covers many chunks.
    const photo = await sharp({
      create: {
        width: 1200,
        height: 900,
        channels: 3,
        background: { r: 90, g: 60, b: 30 },
        noise: { type: 'gaussian', mean: 120, sigma: 30 },
      },
    })
      .jpeg({ quality: 90 })
      .toBuffer();
    expect(photo.length).toBeGreaterThan(300_000);
    const added = await upload(dealer.agent, code, photo, { kind: 'hole' }).expect(201);
    const rows: Array<{ sent_sha256: string }> = await t.app
      .get(DataSource)
      .query('SELECT "sent_sha256" FROM "exhibits" WHERE "lot_code" = $1 AND "seq" = $2', [
        code,
        added.body.exhibit.seq,
      ]);
    // Reference: node:crypto's SHA-256 of the bytes the test sent.
    expect(rows).toEqual([{ sent_sha256: sha256(photo) }]);
  });

  it('is blocked by a redaction on its own, apart from the digests of the stored files', async () => {
    const dealer = await createAccount(t, { role: 'dealer' });
    const code = await newLot(dealer);
    const photo = await jpegWithGps(243, 160);
    const sent = sha256(photo);
    const added = await upload(dealer.agent, code, photo, { kind: 'hole' }).expect(201);
    const exhibit = added.body.exhibit as Parameters<typeof blobsOf>[0] & { seq: number };
    const stored = blobsOf(exhibit);
    expect(stored).not.toContain(sent);
    // Kept on the server only: the bytes as sent may still hold the GPS position.
    const rows: Array<{ sent_sha256: string }> = await t.app
      .get(DataSource)
      .query('SELECT "sent_sha256" FROM "exhibits" WHERE "lot_code" = $1 AND "seq" = $2', [
        code,
        exhibit.seq,
      ]);
    expect(rows).toEqual([{ sent_sha256: sent }]);
    const seen = [
      added.body,
      (await dealer.agent.get(`/api/lots/${code}/exhibits`).expect(200)).body,
      (await dealer.agent.get(`/api/lots/${code}/roll`).expect(200)).body,
      (await request(t.app.getHttpServer()).get(`/api/public/lots/${code}`).expect(200)).body,
      (await request(t.app.getHttpServer()).get(`/api/public/lots/${code}/bundle`).expect(200)).text,
    ];
    for (const body of seen) expect(JSON.stringify(body)).not.toContain(sent);
    // The dealer's own download of what Beadroll holds about them names it; no one else's does.
    const own = await dealer.agent.get('/api/account/personal-data').expect(200);
    expect(own.body.exhibitsAsSent).toEqual([{ lot: code, seq: exhibit.seq, sha256: sent }]);
    const someoneElse = await createAccount(t, { role: 'dealer' });
    const theirs = await someoneElse.agent.get('/api/account/personal-data').expect(200);
    expect(JSON.stringify(theirs.body)).not.toContain(sent);

    const redacted = await registrar.agent
      .post('/api/registry/redactions')
      .set('X-Beadroll-Request', '1')
      .send({ lot: code, seq: exhibit.seq, reason: 'personal-data' })
      .expect(200);
    expect([...redacted.body.blockedDigests].sort()).toEqual([...stored].sort());
    expect(JSON.stringify(redacted.body)).not.toContain(sent);
    const record = await registrar.agent.get('/api/registry/actions/export?format=json').expect(200);
    expect(JSON.stringify(record.body)).not.toContain(sent);
    const blockedRows: Array<{ digest: string; lot: string; seq: number }> = await t.app
      .get(DataSource)
      .query('SELECT "digest", "lot", "seq" FROM "blocked_digests" WHERE "digest" = $1', [sent]);
    expect(blockedRows).toEqual([{ digest: sent, lot: code, seq: exhibit.seq }]);

    // As if normalising had changed since: the stored files' digests would no longer match
    // what the same photo now becomes. The list is append-only, so the superuser lifts the
    // stored digests with triggers off for one transaction.
    const su = await superuserClient(t.db.name);
    try {
      await su.query('BEGIN');
      await su.query(`SET LOCAL session_replication_role = 'replica'`);
      await su.query('DELETE FROM "blocked_digests" WHERE "digest" = ANY($1)', [stored]);
      await su.query('COMMIT');
    } finally {
      await su.end();
    }
    const left: unknown[] = await t.app
      .get(DataSource)
      .query('SELECT 1 FROM "blocked_digests" WHERE "digest" = ANY($1)', [stored]);
    expect(left).toEqual([]);
    const entries = (await rollOf(dealer.agent, code)).length;
    const blobs = storedNames();
    const again = await upload(dealer.agent, code, photo, { kind: 'hole' });
    expect(again.status).toBe(409);
    expect(again.body.error).toMatchObject({ code: 'blocked_content' });
    expect((await rollOf(dealer.agent, code)).length).toBe(entries);
    expect(storedNames()).toEqual(blobs);
    expect(leftovers(t)).toEqual([]);
  });
});

describe('an upload whose transaction fails after its files were stored', () => {
  const db = () => t.app.get(DataSource);
  beforeAll(async () => {
    // A deferred constraint trigger runs at COMMIT, after the files went into the store.
    await db().query(`
      CREATE FUNCTION test_refuse_exhibit() RETURNS trigger LANGUAGE plpgsql AS $$
      BEGIN
        IF NEW."ref" ->> 'caption' = '${FAIL_AT_COMMIT}' THEN
          RAISE EXCEPTION 'exhibit refused at commit (test)';
        END IF;
        RETURN NEW;
      END $$`);
    await db().query(`
      CREATE CONSTRAINT TRIGGER test_refuse_exhibit AFTER INSERT ON "exhibits"
      DEFERRABLE INITIALLY DEFERRED FOR EACH ROW EXECUTE FUNCTION test_refuse_exhibit()`);
  });
  afterAll(async () => {
    await db().query('DROP TRIGGER test_refuse_exhibit ON "exhibits"');
    await db().query('DROP FUNCTION test_refuse_exhibit()');
  });

  it('leaves no blob behind that it wrote', async () => {
    const dealer = await createAccount(t, { role: 'dealer' });
    const code = await newLot(dealer);
    const entries = (await rollOf(dealer.agent, code)).length;
    const before = storedNames();
    const res = await upload(dealer.agent, code, await png(124), { kind: 'hole', caption: FAIL_AT_COMMIT });
    expect(res.status).toBe(500);
    expect((await rollOf(dealer.agent, code)).length).toBe(entries);
    expect(storedNames()).toEqual(before);
    expect(leftovers(t)).toEqual([]);
  });

  it('keeps blobs that another exhibit names (files are shared by their bytes)', async () => {
    const dealer = await createAccount(t, { role: 'dealer' });
    const [kept, failing] = [await newLot(dealer), await newLot(dealer)];
    const photo = await png(125);
    const ok = await upload(dealer.agent, kept, photo, { kind: 'hole' }, 'a.png', 'image/png').expect(201);
    const names = blobsOf(ok.body.exhibit);
    const res = await upload(dealer.agent, failing, photo, { kind: 'hole', caption: FAIL_AT_COMMIT });
    expect(res.status).toBe(500);
    for (const d of names) expect(storedNames()).toContain(d);
    const got = await dealer.agent
      .get(`/api/lots/${kept}/exhibits/${ok.body.exhibit.seq}/original`)
      .buffer(true)
      .parse(binary)
      .expect(200);
    expect(sha256(got.body as Buffer)).toBe(names[0]);
  });

  it('keeps the files of a simultaneous upload of the same bytes that succeeds', async () => {
    // Two dealers, so that neither the lots' locks nor an account's upload lock line them up;
    // whichever way the two interleave, the exhibit that was added keeps its files.
    for (const width of [126, 127, 128]) {
      const [keeps, fails] = [
        await createAccount(t, { role: 'dealer' }),
        await createAccount(t, { role: 'dealer' }),
      ];
      const [good, bad] = [await newLot(keeps), await newLot(fails)];
      const photo = await png(width);
      const [ok, refused] = await Promise.all([
        upload(keeps.agent, good, photo, { kind: 'hole' }, 'a.png', 'image/png'),
        upload(fails.agent, bad, photo, { kind: 'hole', caption: FAIL_AT_COMMIT }, 'b.png', 'image/png'),
      ]);
      expect([ok.status, refused.status]).toEqual([201, 500]);
      const names = storedNames();
      for (const n of blobsOf(ok.body.exhibit)) expect(names).toContain(n);
      const got = await keeps.agent
        .get(`/api/lots/${good}/exhibits/${ok.body.exhibit.seq}/original`)
        .buffer(true)
        .parse(binary)
        .expect(200);
      expect(sha256(got.body as Buffer)).toBe(ok.body.exhibit.original.sha256);
    }
    expect(leftovers(t)).toEqual([]);
  });
});

describe('an upload of the same bytes while a redaction is under way', () => {
  const db = () => t.app.get(DataSource);
  // An advisory key only this test takes: a trigger makes the redaction wait on it just before
  // it records its decision, that is after it has blocked the bytes and locked the files' names.
  const PAUSE = [0x54455354, 1] as const;
  beforeAll(async () => {
    await db().query(`
      CREATE FUNCTION test_pause_record() RETURNS trigger LANGUAGE plpgsql AS $$
      BEGIN
        PERFORM pg_advisory_xact_lock(${PAUSE[0]}, ${PAUSE[1]});
        RETURN NEW;
      END $$`);
    await db().query(`
      CREATE TRIGGER test_pause_record BEFORE INSERT ON "registrar_actions"
      FOR EACH ROW EXECUTE FUNCTION test_pause_record()`);
  });
  afterAll(async () => {
    await db().query('DROP TRIGGER test_pause_record ON "registrar_actions"');
    await db().query('DROP FUNCTION test_pause_record()');
  });

  /** Waits until some session of this database waits for an advisory lock whose first key is `key`. */
  async function waitingOn(key: number): Promise<void> {
    for (let i = 0; i < 400; i++) {
      const rows: unknown[] = await db().query(
        `SELECT 1 FROM pg_locks l JOIN pg_database d ON d.oid = l.database
          WHERE l.locktype = 'advisory' AND NOT l.granted AND l.classid = $1::bigint::oid
            AND d.datname = current_database()`,
        [key],
      );
      if (rows.length) return;
      await new Promise((r) => setTimeout(r, 25));
    }
    throw new Error(`nothing waited for advisory lock ${key}`);
  }

  it('waits for the redaction to commit, is then refused, and stores nothing', async () => {
    const [holder, other] = [
      await createAccount(t, { role: 'dealer' }),
      await createAccount(t, { role: 'dealer' }),
    ];
    const [code, otherCode] = [await newLot(holder), await newLot(other)];
    const photo = await png(133);
    const added = await upload(holder.agent, code, photo, { kind: 'hole' }, 'a.png', 'image/png').expect(201);
    const names = blobsOf(added.body.exhibit);
    const entries = (await rollOf(other.agent, otherCode)).length;

    const pause = db().createQueryRunner();
    await pause.connect();
    let redaction: Promise<{ status: number }> | undefined;
    let again: Promise<{ status: number; body: { error?: { code: string } } }> | undefined;
    try {
      await pause.startTransaction();
      await pause.query('SELECT pg_advisory_xact_lock($1, $2)', [...PAUSE]);
      redaction = registrar.agent
        .post('/api/registry/redactions')
        .set('X-Beadroll-Request', '1')
        .send({ lot: code, seq: added.body.exhibit.seq, reason: 'unlawful-content' })
        .then((r) => r);
      await waitingOn(PAUSE[0]);
      // The redaction has blocked the bytes, not yet committed, and holds the names. The early
      // look at the blocked list cannot see the block yet; the upload gets as far as the lock.
      again = upload(other.agent, otherCode, photo, { kind: 'hole' }, 'b.png', 'image/png').then((r) => r);
      await waitingOn(BLOB_LOCK);
      for (const n of names) expect(storedNames()).toContain(n);
    } finally {
      await pause.commitTransaction();
      await pause.release();
    }
    expect((await redaction).status).toBe(200);
    const res = await again!;
    expect(res.status).toBe(409);
    expect(res.body.error).toMatchObject({ code: 'blocked_content' });
    expect((await rollOf(other.agent, otherCode)).length).toBe(entries);
    for (const n of names) expect(storedNames()).not.toContain(n);
    expect(leftovers(t)).toEqual([]);
  });
});
