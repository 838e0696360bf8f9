import request from 'supertest';
import { DataSource } from 'typeorm';
import { runSeed } from '../src/demo/seed';
import { PublicLotsService } from '../src/lots/public-lots.service';
import type { PublicLotResponse } from '../src/lots/dto/public-lot.dto';
import { chosenEncoding } from '../src/lots/public-lot-fast-path';
import { CheckpointsService } from '../src/log/checkpoints.service';
import { createAccount } from './support/accounts';
import { description } from './support/lot-fixtures';
import { superuserClient, useTestApp } from './support/test-app';

/**
 * The public lot answer written by PostgreSQL in one statement must be the very JSON text that
 * serialising the bundle-built response gives, for every lot of the demo scenario.
 */
describe('public lot data as one statement', () => {
  let service: PublicLotsService;
  let lots: Array<{ code: string; listed: boolean }>;

  const t = useTestApp();
  beforeAll(async () => {
    await runSeed(t.app);
    service = t.app.get(PublicLotsService);
    lots = await t.app.get(DataSource).query('SELECT "code", "listed" FROM "lot_views" ORDER BY "code"');
  });

  it('escapes strings exactly as JSON.stringify does', async () => {
    // RFC 8259 §7 leaves some escapes optional; ECMA-262 (QuoteJSONString) fixes JSON.stringify's
    // choice: \b \f \n \r \t \" \\ as short escapes, other controls as lower-case \u00xx, and
    // everything else (non-ASCII, U+2028, "/") as is. PostgreSQL's to_json(text) must agree.
    const samples = [
      'plain',
      'quote " and backslash \\ and slash /',
      'tab\tnewline\ncarriage\rbackspace\bformfeed\f',
      '\u0001\u001f\u007f',
      'é ü ß — “quoted” ✓ 🜂',
      'line\u2028separator\u2029paragraph',
    ];
    for (const s of samples) {
      const [row] = (await t.app.get(DataSource).query('SELECT to_json($1::text)::text AS "j"', [s])) as [
        { j: string },
      ];
      expect(row.j).toBe(JSON.stringify(s));
    }
  });

  it('gives the same text as the bundle-built answer for every listed lot', async () => {
    const listed = lots.filter((l) => l.listed);
    expect(listed.length).toBeGreaterThan(20);
    for (const { code } of listed) {
      const text = await service.lotText(code);
      const built = await service.lot(code);
      const parsed = JSON.parse(text) as typeof built;
      // Member order included: the bundle part must match byte for byte.
      expect(JSON.stringify(parsed.bundle)).toBe(JSON.stringify(built.bundle));
      expect(parsed.code).toBe(built.code);
      expect(parsed.cards).toEqual(built.cards);
      expect(Object.keys(parsed)).toEqual(['code', 'bundle', 'cards']);
    }
  });

  it('serves that text as JSON, and the same bare 404 for an unlisted or unknown code', async () => {
    const code = lots.find((l) => l.listed)!.code;
    const res = await request(t.app.getHttpServer()).get(`/api/public/lots/${code}`).expect(200);
    expect(res.headers['content-type']).toBe('application/json; charset=utf-8');
    expect(res.text).toBe(await service.lotText(code));
    // RFC 9110 §13.1.2: the validator the answer carried makes a conditional GET a 304.
    const etag = res.headers['etag'] as string;
    expect(etag).toBeTruthy();
    await request(t.app.getHttpServer())
      .get(`/api/public/lots/${code}`)
      .set('If-None-Match', etag)
      .expect(304);

    const unlisted = lots.find((l) => !l.listed)!.code;
    const a = await request(t.app.getHttpServer()).get(`/api/public/lots/${unlisted}`).expect(404);
    const b = await request(t.app.getHttpServer()).get('/api/public/lots/ZZZZZZZZZ').expect(404);
    const bare = (r: typeof a) => ({ ...r.body, error: { ...r.body.error, requestId: undefined } });
    expect(bare(a)).toEqual(bare(b));
    expect(bare(a)).toEqual({ error: { code: 'not_found', message: 'Not found.' } });
  });

  it('answers a plain anonymous GET ahead of express exactly as the controller does', async () => {
    // A cookie header sends the request through express and the controller; a plain GET takes
    // the fast path. The fast path sends a compressed copy made once with its length, where the
    // compression middleware streams it in chunks: the framing headers differ, nothing else.
    const server = t.app.getHttpServer();
    const framing = ['content-length', 'transfer-encoding'];
    const comparable = (r: request.Response) => {
      const headers: Record<string, string> = { ...(r.headers as Record<string, string>) };
      expect(headers['x-request-id']).toMatch(/^[0-9a-f-]{36}$/);
      for (const h of ['x-request-id', 'date', ...framing]) delete headers[h];
      return { status: r.status, headers, text: r.text };
    };
    for (const encoding of ['identity', 'gzip', 'br']) {
      for (const { code } of lots.filter((l) => l.listed).slice(0, 5)) {
        const fast = await request(server)
          .get(`/api/public/lots/${code}`)
          .set('Accept-Encoding', encoding)
          .expect(200);
        const routed = await request(server)
          .get(`/api/public/lots/${code}`)
          .set('Accept-Encoding', encoding)
          .set('Cookie', 'unrelated=1')
          .expect(200);
        expect(comparable(fast)).toEqual(comparable(routed));
        const order = (r: request.Response) => Object.keys(r.headers).filter((h) => !framing.includes(h));
        expect(order(fast)).toEqual(order(routed));
        expect(fast.headers['content-encoding']).toBe(encoding === 'identity' ? undefined : encoding);
        expect(Number(fast.headers['content-length'])).toBeGreaterThan(0);
      }
    }
  });

  it('chooses the encoding a request accepts, brotli first', () => {
    // RFC 9110 §12.5.3: a q-value of 0 refuses an encoding; "*" stands for any other.
    expect(chosenEncoding(undefined)).toBe('identity');
    expect(chosenEncoding('gzip, deflate, br, zstd')).toBe('br');
    expect(chosenEncoding('gzip, deflate')).toBe('gzip');
    expect(chosenEncoding('br;q=0, gzip;q=0.5')).toBe('gzip');
    expect(chosenEncoding('*')).toBe('br');
    expect(chosenEncoding('*;q=0, identity')).toBe('identity');
    expect(chosenEncoding('deflate')).toBe('identity');
  });

  it('follows an append, a changed stored body, a change to a dealer named on the roll and a new checkpoint at once', async () => {
    const server = t.app.getHttpServer();
    const data = t.app.get(DataSource);
    const dealer = await createAccount(t, { role: 'dealer' });
    const res = await dealer.agent
      .post('/api/lots')
      .set('X-Beadroll-Request', '1')
      .send({ description: description({ title: 'Amber drawn beads', listed: true }) })
      .expect(201);
    const code = (res.body as { code: string }).code;
    const read = async () => {
      const r = await request(server).get(`/api/public/lots/${code}`).expect(200);
      return JSON.parse(r.text) as PublicLotResponse;
    };
    // Read more than once, so the answer is composed, kept and served again.
    for (let i = 0; i < 3; i++) expect((await read()).bundle.rolls[0]!.entries).toHaveLength(1);
    expect((await read()).cards[dealer.id]?.displayName).toMatch(/^Test dealer/);

    await dealer.agent
      .post(`/api/lots/${code}/observations`)
      .set('X-Beadroll-Request', '1')
      .send({ observations: { hole: 'clean' } })
      .expect(201);
    expect((await read()).bundle.rolls[0]!.entries).toHaveLength(2);
    expect(await read()).toEqual(JSON.parse(await service.lotText(code)));

    // Another instance (or the registrar) changes the account: the card follows.
    await data.query(`UPDATE "accounts" SET "display_name" = 'Renamed dealer' WHERE "id" = $1`, [dealer.id]);
    expect((await read()).cards[dealer.id]?.displayName).toBe('Renamed dealer');
    await data.query(`UPDATE "accounts" SET "status" = 'suspended' WHERE "id" = $1`, [dealer.id]);
    expect((await read()).cards[dealer.id]?.status).toBe('suspended');

    // A checkpoint covering the head brings its inclusion proof.
    await t.app.get(CheckpointsService).signIfDue(true);
    t.app.get(CheckpointsService).invalidate();
    const proved = await read();
    expect(proved.bundle.checkpoints[0]?.inclusions.map((i) => i.seq)).toEqual([1]);

    // A stored body changed behind the ledger's back (triggers lifted by a superuser): the next
    // answer carries the changed text, so the buyer's browser shows where the history breaks.
    const su = await superuserClient(t.db.name);
    try {
      await su.query('BEGIN');
      await su.query(`SET LOCAL session_replication_role = 'replica'`);
      await su.query(
        `UPDATE "entry_bodies" b SET "body" = replace(b."body", 'clean', 'worn')
           FROM "entries" e JOIN "lots" l ON l."id" = e."lot_id"
          WHERE b."entry_id" = e."id" AND l."code" = $1 AND e."seq" = 1`,
        [code],
      );
      await su.query('COMMIT');
    } finally {
      await su.end();
    }
    expect((await read()).bundle.rolls[0]!.entries[1]!.body).toContain('worn');

    // No longer listed (as another instance would leave it): the bare 404 at once.
    await data.query(`UPDATE "lot_views" SET "listed" = false WHERE "code" = $1`, [code]);
    await request(server).get(`/api/public/lots/${code}`).expect(404);
  });
});
