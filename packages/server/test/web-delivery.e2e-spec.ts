import { mkdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { brotliCompressSync, gzipSync } from 'node:zlib';
import request from 'supertest';
import { createTestApp, type TestApp } from './support/test-app';

// How the built web app reaches a browser: precompressed copies chosen by Accept-Encoding and
// named in Content-Encoding (RFC 9110 §8.4, §12.5.3) with `Vary: Accept-Encoding` (§12.5.5),
// hashed assets cached as immutable (RFC 8246), dynamic JSON compressed on the fly, and the
// public page's lot data named in a preload link (RFC 8288 Link header; rel=preload from the
// W3C Preload specification).
describe('web delivery', () => {
  let t: TestApp;
  const script = `export const words = ${JSON.stringify('glass bead '.repeat(400))};\n`;

  beforeAll(async () => {
    const dir = join(process.env.TMPDIR ?? '/tmp', `beadroll-web-${process.pid}`);
    mkdirSync(join(dir, 'assets'), { recursive: true });
    writeFileSync(join(dir, 'index.html'), '<!doctype html><title>app</title>');
    writeFileSync(
      join(dir, 'public.html'),
      '<!doctype html><title>public</title><link rel="manifest" href="/lot.webmanifest">',
    );
    writeFileSync(join(dir, 'assets', 'public-AbC123.js'), script);
    writeFileSync(join(dir, 'assets', 'public-AbC123.js.br'), brotliCompressSync(script));
    writeFileSync(join(dir, 'assets', 'public-AbC123.js.gz'), gzipSync(script));
    writeFileSync(join(dir, 'lot-sw.js'), 'self.addEventListener("fetch", () => {});\n');
    writeFileSync(join(dir, 'app-sw.js'), 'self.addEventListener("fetch", () => {});\n');
    writeFileSync(join(dir, 'lot.webmanifest'), '{"name":"Lot history"}');
    t = await createTestApp({ WEB_DIST: dir });
  });
  afterAll(async () => {
    await t.close();
  });

  const get = (path: string, encoding?: string) => {
    const r = request(t.app.getHttpServer()).get(path).buffer(true);
    if (encoding !== undefined) r.set('Accept-Encoding', encoding);
    return r.parse((res, done) => {
      const chunks: Buffer[] = [];
      res.on('data', (c: Buffer) => chunks.push(c));
      res.on('end', () => done(null, Buffer.concat(chunks)));
    });
  };

  it('sends the brotli copy of a hashed asset to a browser that accepts it, cached as immutable', async () => {
    const res = await get('/assets/public-AbC123.js', 'gzip, deflate, br');
    expect(res.status).toBe(200);
    expect(res.headers['content-encoding']).toBe('br');
    expect(res.headers['vary']).toMatch(/Accept-Encoding/i);
    expect(res.headers['content-type']).toMatch(/javascript/);
    expect(res.headers['cache-control']).toMatch(/immutable/);
    expect(res.headers['cache-control']).toMatch(/max-age=31536000/);
    // The bytes sent are the brotli copy (supertest decodes them again for the body).
    expect(Number(res.headers['content-length'])).toBe(brotliCompressSync(script).length);
    expect((res.body as Buffer).toString()).toBe(script);
  });

  it('sends the gzip copy when brotli is not accepted, and the file itself when nothing is', async () => {
    const gz = await get('/assets/public-AbC123.js', 'gzip');
    expect(gz.headers['content-encoding']).toBe('gzip');
    expect(gz.headers['vary']).toMatch(/Accept-Encoding/i);
    const plain = await get('/assets/public-AbC123.js', 'identity');
    expect(plain.headers['content-encoding']).toBeUndefined();
    expect((plain.body as Buffer).toString()).toBe(script);
  });

  it('compresses a large JSON answer for a client that asks, and not for one that does not', async () => {
    const gz = await get('/api/docs-json', 'gzip');
    expect(gz.status).toBe(200);
    expect(gz.headers['content-encoding']).toBe('gzip');
    expect(gz.headers['vary']).toMatch(/Accept-Encoding/i);
    const plain = await get('/api/docs-json', 'identity');
    expect(plain.headers['content-encoding']).toBeUndefined();
    expect(JSON.parse((plain.body as Buffer).toString())).toHaveProperty('openapi');
  });

  it('names the lot data in a preload link on a public page, by its canonical code', async () => {
    const link = '</api/public/lots/7K2QM9XAT>; rel=preload; as=fetch; crossorigin=anonymous';
    const tag = await get('/L/7K2QM9XAT/ABCDEFGHJK');
    expect(tag.status).toBe(200);
    expect(tag.headers['link']).toBe(link);
    expect((await get('/l/7k2q-m9xa-t')).headers['link']).toBe(link);
    // Not a lot code (wrong check symbol, a malformed escape): the page still opens, with no preload.
    expect((await get('/l/7K2QM9XAA')).headers['link']).toBeUndefined();
    expect((await get('/l/%E0%A4%A')).headers['link']).toBeUndefined();
    expect((await get('/lots')).headers['link']).toBeUndefined();
  });

  // A service worker's script keeps its address across releases, so it must be checked with the
  // server every time (no-cache, RFC 9111 §5.2.2.4), never kept as immutable; the W3C Service
  // Workers spec's update check looks at the script only when the HTTP cache lets it through.
  // The web app manifest is served as application/manifest+json (W3C Web Application Manifest §1.1).
  it('sends the service workers and the web app manifest to be checked again every time', async () => {
    for (const path of ['/lot-sw.js', '/app-sw.js']) {
      const sw = await get(path, 'gzip, deflate, br');
      expect(sw.status).toBe(200);
      expect(sw.headers['content-type']).toMatch(/javascript/);
      expect(sw.headers['cache-control']).toBe('no-cache');
    }
    const manifest = await get('/lot.webmanifest');
    expect(manifest.status).toBe(200);
    expect(manifest.headers['content-type']).toMatch(/^application\/manifest\+json/);
    expect(manifest.headers['cache-control']).toBe('no-cache');
  });

  // W3C Web Application Manifest: a manifest names its start_url and scope; browsers install
  // only one that names its start address. A lot page's manifest starts at that lot.
  it('links a lot page to a manifest that starts at that lot, under the address family it was opened with', async () => {
    const page = await get('/L/7K2QM9XAT/ABCDEFGHJK');
    expect(page.text ?? (page.body as Buffer).toString()).toContain(
      '<link rel="manifest" href="/lot.webmanifest?lot=7K2QM9XAT&amp;tag=1">',
    );
    const typed = (await get('/l/7k2q-m9xa-t')).body as Buffer;
    expect(typed.toString()).toContain('<link rel="manifest" href="/lot.webmanifest?lot=7K2QM9XAT">');
    const fromTag = await get('/lot.webmanifest?lot=7K2QM9XAT&tag=1');
    expect(fromTag.headers['content-type']).toMatch(/^application\/manifest\+json/);
    expect(fromTag.headers['cache-control']).toBe('no-cache');
    expect(JSON.parse((fromTag.body as Buffer).toString())).toEqual({
      name: 'Lot history',
      id: '/L/7K2QM9XAT',
      start_url: '/L/7K2QM9XAT',
      scope: '/L/',
    });
    const typedManifest = JSON.parse(
      ((await get('/lot.webmanifest?lot=7k2q-m9xa-t')).body as Buffer).toString(),
    );
    expect(typedManifest).toMatchObject({ start_url: '/l/7K2QM9XAT', scope: '/l/' });
    // Not a lot code: the manifest as built, naming no lot.
    const other = JSON.parse(((await get('/lot.webmanifest?lot=7K2QM9XAA')).body as Buffer).toString());
    expect(other).toEqual({ name: 'Lot history' });
  });
});
