import { createHash } from 'node:crypto';
import { mkdirSync, writeFileSync } from 'node:fs';
import { get as httpGet, type IncomingHttpHeaders, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { join } from 'node:path';
import { brotliDecompressSync } from 'node:zlib';
import request from 'supertest';
import { RollReaderService } from '../src/ledger/roll-reader.service';
import { lotDataBlock } from '../src/lots/public-lot-page';
import { createAccount } from './support/accounts';
import { registerLot } from './support/lot-fixtures';
import { createTestApp, type TestApp } from './support/test-app';

// A listed lot's public page carries the lot's public data (the API's answer, the very text)
// in a JSON data block, so the page needs no second request; any other code gets the page as
// built, which tells no more than the API's one bare 404 does.
describe('the public lot page carries its lot’s data', () => {
  let t: TestApp;
  // The built page ends with its first script, written into the page (it reads the data block).
  const firstScript = '<script type="module" async>window.checked = "</ok>";</script>';
  const built =
    '<!doctype html><html><head><title>public</title><link rel="manifest" href="/lot.webmanifest"></head>' +
    `<body><div id="root"></div>${firstScript}</body></html>`;

  beforeAll(async () => {
    const dir = join(process.env.TMPDIR ?? '/tmp', `beadroll-page-${process.pid}`);
    mkdirSync(dir, { recursive: true });
    writeFileSync(join(dir, 'index.html'), '<!doctype html><title>app</title>');
    writeFileSync(join(dir, 'public.html'), built);
    t = await createTestApp({ WEB_DIST: dir });
  });
  afterAll(async () => {
    await t?.close();
  });

  const get = (path: string) =>
    request(t.app.getHttpServer())
      .get(path)
      .buffer(true)
      .parse((res, done) => {
        let text = '';
        res.setEncoding('utf8');
        res.on('data', (c: string) => (text += c));
        res.on('end', () => done(null, text));
      });
  // The bytes as they come over the wire, not decompressed by the client.
  const rawGet = async (path: string, headers: Record<string, string>) => {
    const server = t.app.getHttpServer() as Server;
    const own = !server.listening;
    if (own) await new Promise<void>((r) => server.listen(0, '127.0.0.1', r));
    try {
      const { port } = server.address() as AddressInfo;
      return await new Promise<{ status: number; headers: IncomingHttpHeaders; body: Buffer }>(
        (resolve, reject) =>
          httpGet({ host: '127.0.0.1', port, path, headers }, (res) => {
            const chunks: Buffer[] = [];
            res.on('data', (c: Buffer) => chunks.push(c));
            res.on('end', () =>
              resolve({ status: res.statusCode!, headers: res.headers, body: Buffer.concat(chunks) }),
            );
          }).on('error', reject),
      );
    } finally {
      if (own) await new Promise((r) => server.close(r));
    }
  };
  const dataBlock = (html: string) =>
    /<script type="application\/json" id="lot-data">([^<]*)<\/script>/.exec(html)?.[1] ?? null;

  describe('with lots registered by a dealer', () => {
    let listed: string;
    let unlisted: string;
    // The title holds what would end a script element or open a comment if written as it is.
    const title = 'Blue beads </script><!-- from the "harbour" stall';

    beforeAll(async () => {
      const holder = await createAccount(t, { role: 'dealer' });
      listed = (await registerLot(holder, { title })).code;
      unlisted = (await registerLot(holder, { title: 'Unlisted strand', listed: false })).code;
    });

    it('writes the API’s answer for a listed lot into its page, and names no data to preload', async () => {
      // The log signs a checkpoint a moment after each change, and the answer carries it: the
      // page's copy is the answer given just before or just after it.
      const before = (await get(`/api/public/lots/${listed}`).expect(200)).body as string;
      const page = await get(`/l/${listed}`).expect(200);
      const after = (await get(`/api/public/lots/${listed}`).expect(200)).body as string;
      expect(page.headers['content-type']).toMatch(/^text\/html/);
      expect(page.headers['cache-control']).toBe('no-cache');
      expect(page.headers['link']).toBeUndefined();
      const text = dataBlock(page.body as string);
      expect(text).not.toBeNull();
      // ECMA-404: "\u003c" in a JSON string is the character "<"; the block reads as the answer.
      expect([before, after]).toContain(text!.replace(/\\u003c/g, '<'));
      expect([JSON.parse(before), JSON.parse(after)]).toContainEqual(JSON.parse(text!));
      // Under a tag's address too, by the canonical code.
      const tag = await get(`/L/${listed.toLowerCase()}/ABCDEFGHJK`).expect(200);
      expect(JSON.parse(dataBlock(tag.body as string)!).code).toBe(listed);
    });

    it('keeps the data inside its element whatever the lot’s text holds (HTML §4.12.1.3)', async () => {
      const html = (await get(`/l/${listed}`).expect(200)).body as string;
      const block = html.slice(html.indexOf('<script type="application/json"'));
      // The block ends at its own end tag, right ahead of the first script that reads it.
      const end = block.indexOf('</script>') + '</script>'.length;
      expect(block.slice(end)).toBe(`${firstScript}</body></html>`);
      expect(block.slice(0, end)).not.toContain('<!--');
      expect(lotDataBlock('{"t":"</script>"}')).toBe(
        '<script type="application/json" id="lot-data">{"t":"\\u003c/script>"}</script>',
      );
    });

    it('serves an unlisted lot’s page exactly as an unknown code’s: the page as built', async () => {
      const unknown = RollReaderService.canonicalCode('7k2q-m9xa-t')!;
      const a = await get(`/l/${unlisted}`).expect(200);
      const b = await get(`/l/${unknown}`).expect(200);
      expect(dataBlock(a.body as string)).toBeNull();
      expect((a.body as string).replaceAll(unlisted, 'CODE')).toBe(
        (b.body as string).replaceAll(unknown, 'CODE'),
      );
      expect((a.headers['link'] as string).replace(unlisted, 'CODE')).toBe(
        (b.headers['link'] as string).replace(unknown, 'CODE'),
      );
      // The page then asks the API, which answers both with the same bare 404.
      const apiA = await get(`/api/public/lots/${unlisted}`).expect(404);
      const apiB = await get(`/api/public/lots/${unknown}`).expect(404);
      expect(JSON.parse(apiA.body as string).error.code).toBe(JSON.parse(apiB.body as string).error.code);
    });
  });

  it('allows the page’s first script, and no other inline script, by its hash', async () => {
    const csp = (await get('/l/7K2QM9XAT').expect(200)).headers['content-security-policy'] as string;
    const scriptSrc = /(?:^|;)\s*script-src ([^;]*)/.exec(csp)?.[1]?.split(' ') ?? [];
    // CSP Level 3 §2.3.1 (hash-source): base64 of the SHA-256 of the element's text, UTF-8.
    const text = 'window.checked = "</ok>";';
    const hash = `'sha256-${createHash('sha256').update(text, 'utf8').digest('base64')}'`;
    expect(scriptSrc).toEqual(["'self'", hash]);
  });

  it('sends the page brotli-compressed when asked, the same page under one ETag', async () => {
    const path = '/l/7K2QM9XAT';
    const plain = await get(path).set('Accept-Encoding', 'identity').expect(200);
    const raw = await rawGet(path, { 'Accept-Encoding': 'gzip, deflate, br' });
    expect(raw.status).toBe(200);
    expect(raw.headers['content-encoding']).toBe('br');
    expect(raw.headers['vary']).toMatch(/Accept-Encoding/i);
    expect(raw.headers['cache-control']).toBe('no-cache');
    expect(brotliDecompressSync(raw.body).toString('utf8')).toBe(plain.body);
    const etag = raw.headers['etag'] as string;
    // Asked for a second time, the page is compressed again at the highest quality, which then
    // replaces the first copy: the same page under the same ETag, no larger.
    await rawGet(path, { 'Accept-Encoding': 'br' });
    await new Promise((r) => setTimeout(r, 1500));
    const best = await rawGet(path, { 'Accept-Encoding': 'br' });
    expect(best.headers['etag']).toBe(etag);
    expect(brotliDecompressSync(best.body).toString('utf8')).toBe(plain.body);
    expect(best.body.length).toBeLessThanOrEqual(raw.body.length);
    await get(path).set('Accept-Encoding', 'br').set('If-None-Match', etag).expect(304);
  });
});
