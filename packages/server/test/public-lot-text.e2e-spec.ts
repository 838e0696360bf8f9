import request from 'supertest';
import { DataSource } from 'typeorm';
import { runSeed } from '../src/demo/seed';
import { PublicLotsService } from '../src/lots/public-lots.service';
import { useTestApp } from './support/test-app';

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

  it('answers a plain anonymous GET ahead of the router exactly as the controller does', async () => {
    // A cookie header sends the request through the controller; a plain GET takes the fast path.
    const server = t.app.getHttpServer();
    const comparable = (r: request.Response) => {
      const headers: Record<string, string> = { ...(r.headers as Record<string, string>) };
      expect(headers['x-request-id']).toMatch(/^[0-9a-f-]{36}$/);
      delete headers['x-request-id'];
      delete headers['date'];
      return { status: r.status, headers, text: r.text };
    };
    for (const { code } of lots.filter((l) => l.listed).slice(0, 5)) {
      const fast = await request(server).get(`/api/public/lots/${code}`).expect(200);
      const routed = await request(server)
        .get(`/api/public/lots/${code}`)
        .set('Cookie', 'unrelated=1')
        .expect(200);
      expect(comparable(fast)).toEqual(comparable(routed));
      expect(Object.keys(fast.headers)).toEqual(Object.keys(routed.headers));
    }
  });
});
