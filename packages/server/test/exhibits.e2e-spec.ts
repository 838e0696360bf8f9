import type { ExhibitRef } from '@beadroll/core';
import exifr from 'exifr';
import request from 'supertest';
import { createAccount, type TestAccount } from './support/accounts';
import {
  heicHeader,
  HTML_PAGE,
  hugePng,
  imageOf,
  jpegWithGps,
  minimalPdf,
  SVG_DRAWING,
  TEST_GPS,
  zipOf,
} from './support/exhibit-fixtures';
import { binary, leftovers, rollOf, sha256, storedBlobs, upload } from './support/exhibit-http';
import { LedgerService } from '../src/ledger/ledger.service';
import { description } from './support/lot-fixtures';
import { createTestApp, type TestApp } from './support/test-app';

let t: TestApp;
let holder: TestAccount;
let other: TestAccount;
let listed: string;
let unlisted: string;

async function register(who: TestAccount, isListed: boolean): Promise<string> {
  const res = await who.agent
    .post('/api/lots')
    .set('X-Beadroll-Request', '1')
    .send({ description: description({ listed: isListed }) })
    .expect(201);
  return (res.body as { code: string }).code;
}

/** What a stranger with no account downloads. */
function publicGet(path: string) {
  return request(t.app.getHttpServer()).get(path).buffer(true).parse(binary);
}

const VARIANTS = ['original', 'web', 'thumb'] as const;
const roleOf = { web: 'web', thumb: 'thumbnail' } as const;

function fileOf(ref: ExhibitRef, v: (typeof VARIANTS)[number]) {
  return v === 'original' ? ref.original : ref.derivatives.find((d) => d.role === roleOf[v])!;
}

beforeAll(async () => {
  t = await createTestApp();
  holder = await createAccount(t, { role: 'dealer' });
  other = await createAccount(t, { role: 'dealer' });
  listed = await register(holder, true);
  unlisted = await register(holder, false);
}, 60_000);
afterAll(() => t?.close());

describe('uploading a photo', () => {
  let ref: ExhibitRef;
  let seq: number;

  it('adds one exhibit-added entry holding the hashes, sizes, types, pixel sizes, caption and kind', async () => {
    const photo = await jpegWithGps(1200, 900);
    // The test photo really carries a GPS position before upload (read back with exifr).
    expect((await exifr.gps(photo))?.latitude).toBeCloseTo(TEST_GPS.latitude, 3);
    const res = await upload(
      holder.agent,
      listed,
      photo,
      { kind: 'close-up', caption: 'Rose on the third bead' },
      '../../etc/passwd.jpg',
    ).expect(201);
    expect(res.body.notes).toEqual([]);

    const entries = await rollOf(holder.agent, listed);
    const last = entries[entries.length - 1];
    expect(last.kind).toBe('exhibit-added');
    seq = last.seq;
    ref = (JSON.parse(last.body) as { exhibit: ExhibitRef }).exhibit;
    expect(ref).toMatchObject({
      kind: 'close-up',
      caption: 'Rose on the third bead',
      original: { mediaType: 'image/jpeg', width: 1200, height: 900 },
    });
    expect(ref.derivatives).toEqual([
      expect.objectContaining({ role: 'web', mediaType: 'image/jpeg', width: 1200, height: 900 }),
      expect.objectContaining({ role: 'thumbnail', mediaType: 'image/jpeg', width: 400, height: 300 }),
    ]);
    expect(res.body.exhibit).toMatchObject({ seq, kind: 'close-up', sealed: false, original: ref.original });
    // The client's file name is kept nowhere: not in the roll, not on disk.
    expect(last.body).not.toMatch(/passwd/);
    expect(storedBlobs(t).some((p) => p.includes('passwd'))).toBe(false);
    expect(leftovers(t)).toEqual([]);

    const verification = await holder.agent.get(`/api/lots/${listed}/verification`).expect(200);
    expect(verification.body).toMatchObject({ ok: true });
  });

  it.each(VARIANTS)('serves the %s with no EXIF or GPS, and its SHA-256 matches the roll', async (v) => {
    const res = await publicGet(`/api/public/lots/${listed}/exhibits/${seq}/${v}`).expect(200);
    const bytes = res.body as Buffer;
    const file = fileOf(ref, v);
    expect(bytes.length).toBe(file.size);
    expect(sha256(bytes)).toBe(file.sha256);
    // exifr (a general-purpose metadata reader) finds no block at all, and no GPS.
    expect(await exifr.parse(bytes, true)).toBeUndefined();
    expect(await exifr.gps(bytes)).toBeUndefined();
  });

  it('serves with headers that pin the type, forbid sniffing and scripts, and cache by hash', async () => {
    const path = `/api/public/lots/${listed}/exhibits/${seq}/web`;
    const res = await publicGet(path).expect(200);
    const web = fileOf(ref, 'web');
    expect(res.headers['content-type']).toBe('image/jpeg');
    expect(res.headers['x-content-type-options']).toBe('nosniff');
    expect(res.headers['content-security-policy']).toBe("default-src 'none'; sandbox");
    expect(res.headers['cache-control']).toBe('public, max-age=31536000, immutable');
    expect(res.headers['etag']).toBe(`"${web.sha256}"`);
    expect(res.headers['content-disposition']).toBe(`inline; filename="${listed}-${seq}-web.jpg"`);
    // RFC 9110 §13.1.2: a matching If-None-Match gets 304 with no body.
    await request(t.app.getHttpServer()).get(path).set('If-None-Match', `"${web.sha256}"`).expect(304);

    const own = await holder.agent
      .get(`/api/lots/${listed}/exhibits/${seq}/original`)
      .buffer(true)
      .parse(binary);
    expect(own.status).toBe(200);
    expect(own.headers['cache-control']).toBe('private, max-age=31536000, immutable');
    expect(sha256(own.body as Buffer)).toBe(ref.original.sha256);
  });

  it('lists the exhibit with its URLs', async () => {
    const res = await other.agent.get(`/api/lots/${listed}/exhibits`).expect(200);
    expect(res.body.exhibits).toEqual([
      expect.objectContaining({
        seq,
        kind: 'close-up',
        sealed: false,
        urls: {
          original: `/api/lots/${listed}/exhibits/${seq}/original`,
          web: `/api/lots/${listed}/exhibits/${seq}/web`,
          thumb: `/api/lots/${listed}/exhibits/${seq}/thumb`,
        },
      }),
    ]);
  });

  it('stores a file uploaded twice once, with an entry each time', async () => {
    const photo = await jpegWithGps(640, 480);
    await upload(holder.agent, unlisted, photo).expect(201);
    const blobs = storedBlobs(t).length;
    const before = (await rollOf(holder.agent, unlisted)).length;
    const again = await upload(holder.agent, unlisted, photo).expect(201);
    expect(storedBlobs(t).length).toBe(blobs);
    const entries = await rollOf(holder.agent, unlisted);
    expect(entries.length).toBe(before + 1);
    const [a, b] = entries.slice(-2).map((e) => (JSON.parse(e.body) as { exhibit: ExhibitRef }).exhibit);
    expect(a.original.sha256).toBe(b.original.sha256);
    expect(again.body.exhibit.original.sha256).toBe(a.original.sha256);
  });

  it('keeps PNG, WebP and AVIF as their own type and serves a PDF as a download', async () => {
    for (const format of ['png', 'webp', 'avif'] as const) {
      const res = await upload(holder.agent, listed, await imageOf(format), { kind: 'hole' }).expect(201);
      expect(res.body.exhibit.original.mediaType).toBe(`image/${format}`);
    }
    const pdf = await upload(
      holder.agent,
      listed,
      minimalPdf(),
      { kind: 'reference-page', caption: 'Plate 12 of a pattern book' },
      'page.pdf',
      'application/pdf',
    ).expect(201);
    expect(pdf.body.notes).toEqual([expect.stringMatching(/stored exactly as sent/)]);
    const pseq = pdf.body.exhibit.seq as number;
    const res = await publicGet(`/api/public/lots/${listed}/exhibits/${pseq}/original`).expect(200);
    expect(res.headers['content-type']).toBe('application/pdf');
    expect(res.headers['content-disposition']).toBe(`attachment; filename="${listed}-${pseq}-original.pdf"`);
    expect(res.headers['content-security-policy']).toBe("default-src 'none'; sandbox");
    expect(sha256(res.body as Buffer)).toBe(pdf.body.exhibit.original.sha256);
    await publicGet(`/api/public/lots/${listed}/exhibits/${pseq}/web`).expect(404);
  });
});

describe('who may add and read', () => {
  it('another verified dealer may add evidence to a listed lot, not to an unlisted one', async () => {
    await upload(other.agent, listed, await imageOf('png'), { kind: 'other' }).expect(201);
    const res = await upload(other.agent, unlisted, await imageOf('png'), { kind: 'other' }).expect(404);
    expect(res.body.error.code).toBe('not_found');
  });

  it('an assessor may add evidence to a listed lot (for an opinion of their own)', async () => {
    const assessor = await createAccount(t, { role: 'assessor' });
    await upload(assessor.agent, listed, await imageOf('webp'), { kind: 'close-up' }).expect(201);
  });

  it('an account waiting for verification may not add', async () => {
    const pending = await createAccount(t, { role: 'dealer', status: 'pending' });
    await upload(pending.agent, listed, await imageOf('png')).expect(403);
  });

  it('needs the CSRF header', async () => {
    const res = await holder.agent
      .post(`/api/lots/${listed}/exhibits`)
      .field('kind', 'other')
      .attach('file', await imageOf('png'), 'a.png')
      .expect(403);
    expect(res.body.error.code).toBe('csrf');
  });

  it('serves an unlisted lot’s exhibits to its holder only, and never publicly', async () => {
    const entries = await rollOf(holder.agent, unlisted);
    const seq = entries.find((e) => e.kind === 'exhibit-added')!.seq;
    await holder.agent.get(`/api/lots/${unlisted}/exhibits/${seq}/thumb`).expect(200);
    await other.agent.get(`/api/lots/${unlisted}/exhibits/${seq}/thumb`).expect(404);
    await other.agent.get(`/api/lots/${unlisted}/exhibits`).expect(404);
    await publicGet(`/api/public/lots/${unlisted}/exhibits/${seq}/thumb`).expect(404);
  });

  it('gives the same bare 404 for everything that is not a public exhibit of a listed lot', async () => {
    const entries = await rollOf(holder.agent, listed);
    const exhibitSeq = entries.find((e) => e.kind === 'exhibit-added')!.seq;
    const unlistedSeq = (await rollOf(holder.agent, unlisted)).find((e) => e.kind === 'exhibit-added')!.seq;
    const paths = [
      `/api/public/lots/${unlisted}/exhibits/${unlistedSeq}/web`, // unlisted lot
      `/api/public/lots/${listed}/exhibits/0/web`, // the registered entry
      `/api/public/lots/${listed}/exhibits/999/web`, // no such entry
      `/api/public/lots/${listed}/exhibits/${exhibitSeq}/full`, // no such variant
      `/api/public/lots/${listed}/exhibits/01/web`, // not a canonical seq
      `/api/public/lots/ZZZZ-ZZZZ/exhibits/1/web`, // no such lot
      `/api/public/lots/not-a-code/exhibits/1/web`, // malformed code
    ];
    for (const p of paths) {
      const res = await request(t.app.getHttpServer()).get(p).expect(404);
      expect(res.body).toEqual({
        error: { code: 'not_found', message: 'Not found.', requestId: expect.any(String) },
      });
    }
  });
});

describe('sealed exhibits', () => {
  it('a receipt is always sealed: the body says only that a sealed exhibit was added', async () => {
    // Not the reference page above: these bytes are on no public entry.
    const receipt = Buffer.from(minimalPdf().toString('latin1').replace('(Receipt)', '(Receiqt)'), 'latin1');
    const res = await upload(
      holder.agent,
      listed,
      receipt,
      { kind: 'receipt', caption: 'Bought at the spring fair' },
      'receipt.pdf',
      'application/pdf',
    ).expect(201);
    const { seq, original } = res.body.exhibit as { seq: number; original: { sha256: string } };
    expect(res.body.exhibit.sealed).toBe(true);

    // A stranger's view of the roll: the public bundle.
    const bundle = await request(t.app.getHttpServer()).get(`/api/public/lots/${listed}`).expect(200);
    const text = JSON.stringify(bundle.body);
    expect(text).not.toContain(original.sha256);
    expect(text).not.toContain('spring fair');

    const mine = (await rollOf(holder.agent, listed)).find((e) => e.seq === seq)!;
    expect(JSON.parse(mine.body)).toEqual({ nonce: expect.any(String), sealedOnly: true });
    expect(mine.sealed).toEqual([
      expect.objectContaining({
        name: 'sealed-exhibit',
        value: expect.objectContaining({ kind: 'receipt', caption: 'Bought at the spring fair', original }),
      }),
    ]);
    const theirs = (await rollOf(other.agent, listed)).find((e) => e.seq === seq)!;
    expect(theirs.sealed).toBeUndefined();

    await holder.agent.get(`/api/lots/${listed}/exhibits/${seq}/original`).expect(200);
    await other.agent.get(`/api/lots/${listed}/exhibits/${seq}/original`).expect(404);
    await publicGet(`/api/public/lots/${listed}/exhibits/${seq}/original`).expect(404);
    const list = await other.agent.get(`/api/lots/${listed}/exhibits`).expect(200);
    expect((list.body.exhibits as Array<{ seq: number }>).map((x) => x.seq)).not.toContain(seq);
    const own = await holder.agent.get(`/api/lots/${listed}/exhibits`).expect(200);
    expect((own.body.exhibits as Array<{ seq: number }>).map((x) => x.seq)).toContain(seq);
  });

  it('a photo marked private is sealed too, even when the same bytes are public elsewhere', async () => {
    const photo = await jpegWithGps(500, 400);
    const pub = await upload(other.agent, listed, photo, { kind: 'whole-lot' }).expect(201);
    const priv = await upload(holder.agent, listed, photo, { kind: 'whole-lot', sealed: 'true' }).expect(201);
    expect(priv.body.exhibit.original.sha256).toBe(pub.body.exhibit.original.sha256);
    const seq = priv.body.exhibit.seq as number;
    // Served per (lot, entry): the public copy of the same bytes does not open the sealed entry.
    await publicGet(`/api/public/lots/${listed}/exhibits/${seq}/web`).expect(404);
    await other.agent.get(`/api/lots/${listed}/exhibits/${seq}/web`).expect(404);
    await publicGet(`/api/public/lots/${listed}/exhibits/${pub.body.exhibit.seq}/web`).expect(200);
  });
});

describe('bad input: a clear 4xx, nothing stored, no entry', () => {
  const cases: Array<[string, () => Promise<Buffer | string>, number, RegExp]> = [
    ['a .jpg that is really an HTML page', async () => HTML_PAGE, 400, /HTML page/],
    ['a .jpg that is really a ZIP archive', async () => zipOf('notes.txt', 'hello'), 400, /application\/zip/],
    ['an SVG drawing', async () => SVG_DRAWING, 400, /SVG/],
    [
      'a truncated JPEG',
      async () => {
        const j = await jpegWithGps(640, 480);
        return j.subarray(0, Math.floor(j.length * 0.6));
      },
      400,
      /ends inside|cut short/,
    ],
    ['a 20,000 × 20,000 pixel PNG', async () => hugePng(20_000), 400, /20000 × 20000 pixels/],
    [
      'a polyglot (a JPEG with a ZIP appended)',
      async () => Buffer.concat([await jpegWithGps(), zipOf('x.html', HTML_PAGE)]),
      400,
      /after the end/,
    ],
    ['an empty file', async () => Buffer.alloc(0), 400, /empty/],
    ['a HEIC photo', async () => heicHeader(), 400, /HEIC .*send a JPEG/],
  ];

  it.each(cases)('%s', async (_name, make, status, reason) => {
    const blobs = storedBlobs(t).length;
    const entries = (await rollOf(holder.agent, listed)).length;
    const res = await upload(holder.agent, listed, await make()).expect(status);
    expect(res.body.error.fields).toEqual([{ field: 'file', reason: expect.stringMatching(reason) }]);
    expect(storedBlobs(t).length).toBe(blobs);
    expect((await rollOf(holder.agent, listed)).length).toBe(entries);
    expect(leftovers(t)).toEqual([]);
  });

  it.each([
    ['an unknown kind', { kind: 'selfie' }, 'kind'],
    ['no kind', {}, 'kind'],
    ['an unknown field', { kind: 'hole', price: '12' }, 'price'],
    ['a caption over 1000 characters', { kind: 'hole', caption: 'x'.repeat(1001) }, 'caption'],
    ['sealed that is not true or false', { kind: 'hole', sealed: 'yes' }, 'sealed'],
  ])('a form with %s', async (_name, fields, field) => {
    const entries = (await rollOf(holder.agent, listed)).length;
    const res = await upload(holder.agent, listed, await imageOf('png'), fields).expect(400);
    expect((res.body.error.fields as Array<{ field: string }>).map((f) => f.field)).toContain(field);
    expect((await rollOf(holder.agent, listed)).length).toBe(entries);
    expect(leftovers(t)).toEqual([]);
  });

  it('no file, or two files', async () => {
    const none = await holder.agent
      .post(`/api/lots/${listed}/exhibits`)
      .set('X-Beadroll-Request', '1')
      .field('kind', 'hole')
      .expect(400);
    expect(none.body.error.fields).toEqual([{ field: 'file', reason: expect.stringMatching(/missing/) }]);
    const two = await holder.agent
      .post(`/api/lots/${listed}/exhibits`)
      .set('X-Beadroll-Request', '1')
      .field('kind', 'hole')
      .attach('file', await imageOf('png'), 'a.png')
      .attach('file', await imageOf('png'), 'b.png')
      .expect(400);
    expect(two.body.error.fields).toEqual([{ field: 'file', reason: expect.stringMatching(/exactly one/) }]);
    expect(leftovers(t)).toEqual([]);
  });

  it('a body that is not multipart', async () => {
    const res = await holder.agent
      .post(`/api/lots/${listed}/exhibits`)
      .set('X-Beadroll-Request', '1')
      .send({ kind: 'hole' })
      .expect(400);
    expect(res.body.error.code).toBe('validation');
  });
});

describe('redaction', () => {
  it('a redacted exhibit-added entry is no longer served, to anyone', async () => {
    const res = await upload(holder.agent, listed, await jpegWithGps(300, 300), { kind: 'other' }).expect(
      201,
    );
    const seq = res.body.exhibit.seq as number;
    await publicGet(`/api/public/lots/${listed}/exhibits/${seq}/web`).expect(200);
    await t.app
      .get(LedgerService)
      .withLots([listed], (tx) => tx.redact(listed, holder.id, seq, 'personal-data'));
    await publicGet(`/api/public/lots/${listed}/exhibits/${seq}/web`).expect(404);
    await holder.agent.get(`/api/lots/${listed}/exhibits/${seq}/web`).expect(404);
    const list = await holder.agent.get(`/api/lots/${listed}/exhibits`).expect(200);
    expect((list.body.exhibits as Array<{ seq: number }>).map((x) => x.seq)).not.toContain(seq);
  });
});
