// Benchmark: time to the verified tick on the public lot page, in Debian's Chromium at 390 px
// over a throttled connection (1.6 Mbit/s down, 750 kbit/s up, 150 ms latency, set through the
// DevTools protocol), cold (empty cache) and warm (the same browser profile, second visit),
// against a static HTML copy of the same rendered page (no script; the same style sheets, fonts
// and photos, through the same server) measured in the same run, interleaved.
// Targets: ≤ 3 s cold, ≤ 1 s warm, and ≤ 1.3× the static copy. Also prints the bytes a cold load
// transfers, photos apart (target ≤ 130 KB).
// Usage: npm run build && npm run bench:page [-- --runs N] [--shot FILE.png]
import { brotliCompressSync } from 'node:zlib';
import { createHash } from 'node:crypto';
import { createServer, request, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { chromium } from 'playwright-core';
import { startBenchApp, type BenchApp } from '../lib/bench-app.ts';
import { loadOnce, median, phoneContext, type LoadResult } from './measure.ts';

const argRuns = process.argv.indexOf('--runs');
const RUNS = argRuns > 0 ? Number(process.argv[argRuns + 1]) : 5;
const argShot = process.argv.indexOf('--shot');
const SHOT = argShot > 0 ? process.argv[argShot + 1] : undefined;
const KB = (b: number) => `${(b / 1024).toFixed(1)} KB`;
const s = (ms: number) => `${(ms / 1000).toFixed(2)} s`;

/**
 * A server for the static copy: answers `/static` with the copy (brotli when asked, ETag,
 * revalidated like the app's HTML) and passes every other request to the app as it is.
 */
function staticCopyServer(app: BenchApp, html: string): Promise<{ url: string; server: Server }> {
  const body = Buffer.from(html);
  const br = brotliCompressSync(body);
  const etag = `"${createHash('sha256').update(body).digest('hex').slice(0, 16)}"`;
  const target = new URL(app.origin);
  const server = createServer((req, res) => {
    if (req.url === '/static') {
      res.setHeader('Cache-Control', 'no-cache');
      res.setHeader('ETag', etag);
      res.setHeader('Vary', 'Accept-Encoding');
      if (req.headers['if-none-match'] === etag) return void res.writeHead(304).end();
      res.setHeader('Content-Type', 'text/html; charset=utf-8');
      if (/\bbr\b/.test(String(req.headers['accept-encoding'] ?? ''))) {
        res.setHeader('Content-Encoding', 'br');
        return void res.end(br);
      }
      return void res.end(body);
    }
    const upstream = request(
      { host: target.hostname, port: target.port, path: req.url, method: req.method, headers: req.headers },
      (up) => {
        res.writeHead(up.statusCode ?? 502, up.headers);
        up.pipe(res);
      },
    );
    upstream.on('error', () => res.writeHead(502).end());
    req.pipe(upstream);
  });
  return new Promise((resolve) =>
    server.listen(0, '127.0.0.1', () =>
      resolve({ url: `http://127.0.0.1:${(server.address() as AddressInfo).port}/static`, server }),
    ),
  );
}

/** The rendered page with its scripts taken out: what the buyer sees, with nothing left to run. */
function staticCopy(rendered: string): string {
  return rendered
    .replace(/<script\b[^>]*>[\s\S]*?<\/script>/g, '')
    .replace(/<link\b[^>]*rel="modulepreload"[^>]*>/g, '');
}

function summary(name: string, xs: LoadResult[]): string {
  return `${name.padEnd(14)} tick median ${s(median(xs.map((x) => x.tickMs)))}  (runs: ${xs
    .map((x) => (x.tickMs / 1000).toFixed(2))
    .join(', ')})  transferred median ${KB(median(xs.map((x) => x.bytes)))}`;
}

async function main(): Promise<void> {
  const app = await startBenchApp('bench-page');
  const browser = await chromium.launch({ executablePath: '/usr/bin/chromium', headless: true });
  try {
    const lot = app.demo.publicLots[0];
    if (!lot) throw new Error('the demo scenario lists no public lot');
    const url = `${app.origin}/l/${lot.code}`;
    console.log(`public page ${url} (${lot.why}); ${RUNS} runs each, interleaved`);

    // The static copy is taken from an unthrottled load of the real page.
    const first = await phoneContext(browser);
    const page = await first.newPage();
    await page.goto(url);
    await page.waitForSelector('.pl-status-line.pl-ok');
    await page.waitForLoadState('networkidle');
    const copy = staticCopy(await page.content());
    if (SHOT) await page.screenshot({ path: SHOT, fullPage: true });
    await first.close();
    const stat = await staticCopyServer(app, copy);

    const cold = { page: [] as LoadResult[], static: [] as LoadResult[] };
    for (let i = 0; i < RUNS; i++) {
      for (const [name, u] of [
        ['page', url],
        ['static', stat.url],
      ] as const) {
        const ctx = await phoneContext(browser);
        cold[name].push(await loadOnce(ctx, u));
        await ctx.close();
      }
    }
    const warm = { page: [] as LoadResult[], static: [] as LoadResult[] };
    const ctxs = { page: await phoneContext(browser), static: await phoneContext(browser) };
    await loadOnce(ctxs.page, url);
    await loadOnce(ctxs.static, stat.url);
    for (let i = 0; i < RUNS; i++) {
      warm.page.push(await loadOnce(ctxs.page, url));
      warm.static.push(await loadOnce(ctxs.static, stat.url));
    }
    await ctxs.page.close();
    await ctxs.static.close();
    stat.server.close();

    const ratio = (a: LoadResult[], b: LoadResult[]) =>
      median(a.map((x) => x.tickMs)) / median(b.map((x) => x.tickMs));
    const coldMs = median(cold.page.map((x) => x.tickMs));
    const warmMs = median(warm.page.map((x) => x.tickMs));
    const coldRatio = ratio(cold.page, cold.static);
    const warmRatio = ratio(warm.page, warm.static);
    const coldBytes = median(cold.page.map((x) => x.bytes));
    const ok = (b: boolean) => (b ? 'met' : 'NOT met');
    console.log('');
    console.log('cold (empty cache)');
    console.log(`  ${summary('page', cold.page)}`);
    console.log(`  ${summary('static copy', cold.static)}`);
    console.log('warm (second visit, same profile)');
    console.log(`  ${summary('page', warm.page)}`);
    console.log(`  ${summary('static copy', warm.static)}`);
    console.log('');
    console.log('what a cold load of the page transferred (photos apart):');
    for (const r of cold.page[0]!.requests.filter((r) => !/\/exhibits\//.test(r.url)))
      console.log(
        `  ${String(r.bytes).padStart(8)} B  ${r.encoding || '-'}  ${r.url.replace(app.origin, '')}`,
      );
    console.log('');
    console.log(`cold tick  ${s(coldMs)} (target ≤ 3 s) ${ok(coldMs <= 3000)}`);
    console.log(`warm tick  ${s(warmMs)} (target ≤ 1 s) ${ok(warmMs <= 1000)}`);
    console.log(`cold page / static copy  ${coldRatio.toFixed(2)}× (target ≤ 1.3×) ${ok(coldRatio <= 1.3)}`);
    console.log(`warm page / static copy  ${warmRatio.toFixed(2)}× (target ≤ 1.3×) ${ok(warmRatio <= 1.3)}`);
    console.log(
      `cold transfer, photos apart  ${KB(coldBytes)} (target ≤ 130 KB) ${ok(coldBytes <= 130 * 1024)}`,
    );
  } finally {
    await browser.close();
    await app.stop();
  }
}

main().catch((err: unknown) => {
  console.error(err);
  process.exit(1);
});
