import { tagPayload, tagReference } from '@beadroll/core';
import request from 'supertest';
import { planTags, type TagLayoutRequest } from '../src/tags/tag-layout';
import { createAccount, type TestAccount } from './support/accounts';
import { description } from './support/lot-fixtures';
import { decodeCells, mediaBoxes, rasterise } from './support/tag-raster';
import { createTestApp, type TestApp } from './support/test-app';

const CSRF = { 'X-Beadroll-Request': '1' };
// ISO/IEC 18004 alphanumeric capacity at level L, version 2: 47 characters (Panasonic LP-RV
// manual p. 162; alibabacloud "QR code encoding principle (2)").
const V2_L_CAPACITY = 47;

function binary(res: request.Response, cb: (err: Error | null, body: Buffer) => void) {
  const chunks: Buffer[] = [];
  res.on('data', (c: Buffer) => chunks.push(c));
  res.on('end', () => cb(null, Buffer.concat(chunks)));
}

describe('tags API', () => {
  let t: TestApp;
  let holder: TestAccount;
  let other: TestAccount;
  let listedLot: string;
  let unlistedLot: string;
  const host = '127.0.0.1:3000';

  const register = async (listed: boolean, title: string) => {
    const res = await holder.agent
      .post('/api/lots')
      .set(CSRF)
      .send({ description: description({ listed, title }) })
      .expect(201);
    return (res.body as { code: string }).code;
  };
  const head = async (code: string) => {
    const res = await holder.agent.get(`/api/lots/${code}`).expect(200);
    return res.body as { headSeq: number; headHash: string; listed: boolean };
  };
  const print = (who: TestAccount, body: object) =>
    who.agent.post('/api/tags/pdf').set(CSRF).send(body).buffer(true).parse(binary);

  beforeAll(async () => {
    t = await createTestApp({ PUBLIC_BASE_URL: `http://${host}` });
    holder = await createAccount(t, { role: 'dealer' });
    other = await createAccount(t, { role: 'dealer' });
    listedLot = await register(true, 'Wound beads with pink roses');
    unlistedLot = await register(false, 'Pressed glass buttons, mixed');
  });
  afterAll(async () => {
    await t?.close();
  });

  it('says which designs fit the public host', async () => {
    const res = await holder.agent.get('/api/tags/layouts').expect(200);
    expect(res.body).toMatchObject({
      host: '127.0.0.1:3000',
      version: 2,
      designs: [
        { design: 'string', fits: true },
        { design: 'barbell', fits: true },
      ],
    });
  });

  it('prints the held lots at their heads on an A4 sheet; every symbol reads as its payload; the rolls are unchanged', async () => {
    const before = await Promise.all([head(listedLot), head(unlistedLot)]);
    const layout: TagLayoutRequest = {
      design: 'string',
      sheet: {
        paper: 'a4',
        columns: 3,
        rows: 2,
        marginTopMm: 15,
        marginRightMm: 15,
        marginBottomMm: 15,
        marginLeftMm: 15,
        gapXMm: 4,
        gapYMm: 4,
      },
    };
    const res = await print(holder, { lots: [listedLot, unlistedLot], ...layout }).expect(200);
    expect(res.headers['content-type']).toMatch(/^application\/pdf/);
    expect(res.headers['content-disposition']).toMatch(
      /attachment; filename="tags-\d{4}-\d{2}-\d{2}-2\.pdf"/,
    );
    const pdf = res.body as Buffer;
    // ISO 216 A4 = 210 × 297 mm = 595.28 × 841.89 pt.
    const [box] = mediaBoxes(pdf);
    expect(Math.abs(box![2]! - 595.28)).toBeLessThanOrEqual(0.01);
    expect(Math.abs(box![3]! - 841.89)).toBeLessThanOrEqual(0.01);
    const read = decodeCells(rasterise(pdf), planTags(host, layout, 2));
    [listedLot, unlistedLot].forEach((code, i) => {
      // The test site is served over plain HTTP, so its tags say HTTP.
      const payload = tagPayload(host, code, tagReference(before[i]!.headHash), 'http');
      expect(payload).toMatch(/^HTTP:\/\//);
      expect(payload.length).toBeLessThanOrEqual(V2_L_CAPACITY);
      expect(read[i]?.data).toBe(payload);
      expect(read[i]?.version).toBe(2);
    });
    // Printing writes nothing.
    expect(await Promise.all([head(listedLot), head(unlistedLot)])).toEqual(before);
  });

  it('tells the scanner whether the dealer holds a lot, the same way for a stranger’s lot and none', async () => {
    const mine = await holder.agent.get(`/api/tags/lots/${listedLot.toLowerCase()}`).expect(200);
    const h = await head(listedLot);
    expect(mine.body).toMatchObject({
      code: listedLot,
      held: true,
      seq: h.headSeq,
      ref: tagReference(h.headHash),
    });
    const theirs = await other.agent.get(`/api/tags/lots/${listedLot}`).expect(200);
    expect(theirs.body).toEqual({ code: listedLot, held: false });
    const none = await other.agent.get('/api/tags/lots/7K2Q-M9XA-T').expect(200);
    expect(none.body).toEqual({ code: '7K2QM9XAT', held: false });
    const bad = await holder.agent.get('/api/tags/lots/7K2Q-M9XA-V').expect(400);
    expect(bad.body.error.fields[0].field).toBe('code');
  });

  it('refuses lots the dealer does not hold, naming them, and writes nothing', async () => {
    const res = await print(other, { lots: [listedLot], design: 'barbell' }).expect(400);
    const body = JSON.parse((res.body as Buffer).toString('utf8'));
    expect(body.error.code).toBe('validation');
    expect(body.error.fields).toEqual([{ field: 'lots', reason: expect.stringContaining('you hold') }]);
    const unknown = await print(holder, { lots: [listedLot, '7K2Q-M9XA-T'], design: 'string' }).expect(400);
    expect(JSON.parse((unknown.body as Buffer).toString('utf8')).error.fields[0].reason).toContain(
      '7K2Q-M9XA-T',
    );
    const malformed = await print(holder, { lots: ['nope'], design: 'string' }).expect(400);
    expect(JSON.parse((malformed.body as Buffer).toString('utf8')).error.fields[0].field).toBe('lots.0');
  });

  it('refuses a grid that does not fit the page and unknown fields, with the field', async () => {
    const res = await print(holder, {
      lots: [listedLot],
      design: 'string',
      sheet: {
        paper: 'letter',
        columns: 9,
        marginTopMm: 10,
        marginRightMm: 10,
        marginBottomMm: 10,
        marginLeftMm: 10,
        gapXMm: 3,
        gapYMm: 3,
      },
    }).expect(400);
    expect(
      JSON.parse((res.body as Buffer).toString('utf8')).error.fields.map((f: { field: string }) => f.field),
    ).toEqual(['sheet.columns']);
    const extra = await print(holder, { lots: [listedLot], design: 'string', colour: 'red' }).expect(400);
    expect(JSON.parse((extra.body as Buffer).toString('utf8')).error.code).toBe('validation');
  });

  it('lists an unlisted lot only when the holder confirms, with a described entry; later tags name the new head', async () => {
    const before = await head(unlistedLot);
    expect(before.listed).toBe(false);
    await other.agent
      .post('/api/tags/list')
      .set(CSRF)
      .send({ lots: [unlistedLot] })
      .expect(400);
    const res = await holder.agent
      .post('/api/tags/list')
      .set(CSRF)
      .send({ lots: [listedLot, unlistedLot] })
      .expect(200);
    expect(res.body).toEqual({ listed: [unlistedLot] });
    const after = await head(unlistedLot);
    expect(after.listed).toBe(true);
    expect(after.headSeq).toBe(before.headSeq + 1);
    const roll = await holder.agent.get(`/api/lots/${unlistedLot}/roll`).expect(200);
    expect((roll.body.entries as { kind: string }[]).at(-1)!.kind).toBe('described');
    const tag = await holder.agent.get(`/api/tags/lots/${unlistedLot}`).expect(200);
    expect(tag.body).toMatchObject({ seq: after.headSeq, ref: tagReference(after.headHash), listed: true });
  });
});

describe('tags API with a public host too long for any tag', () => {
  let t: TestApp;
  let holder: TestAccount;
  beforeAll(async () => {
    // 130 characters: the payload needs a version 6 symbol, under 0.4 mm a module on every design.
    t = await createTestApp({ PUBLIC_BASE_URL: `http://${'a'.repeat(60)}.${'b'.repeat(60)}.example` });
    holder = await createAccount(t, { role: 'dealer' });
  });
  afterAll(async () => {
    await t?.close();
  });

  it('warns in the layouts and refuses to print, naming the host', async () => {
    const layouts = await holder.agent.get('/api/tags/layouts').expect(200);
    expect(layouts.body.designs.map((d: { fits: boolean }) => d.fits)).toEqual([false, false]);
    const lot = await holder.agent
      .post('/api/lots')
      .set(CSRF)
      .send({ description: description() })
      .expect(201);
    const res = await holder.agent
      .post('/api/tags/pdf')
      .set(CSRF)
      .send({ lots: [lot.body.code], design: 'string' })
      .expect(400);
    expect(res.body.error.fields[0].field).toBe('host');
  });
});
