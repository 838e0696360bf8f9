// Size of the public lot page: builds the web package (unless --no-build) and prints the gzip
// bytes of every JS and CSS file that public.html loads up front (its module script, the chunks
// it preloads and its style sheets, and public.html itself, which carries the first script), and the brotli copy the build wrote beside each. Budget:
// 120 KB (122,880 bytes) gzip for JS + CSS. Then (unless --no-browser) it starts the built app
// with the demo scenario and loads a demo lot's public page cold in Chromium, printing every
// byte transferred (headers and bodies as sent, after compression), photos apart: target
// ≤ 130 KB. Run with tsx (npm run bench:public:size), which also loads the TypeScript helpers.
import { spawnSync } from 'node:child_process';
import { existsSync, readFileSync, statSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { gzipSync } from 'node:zlib';

const REPO = resolve(dirname(fileURLToPath(import.meta.url)), '..', '..', '..');
const WEB = join(REPO, 'packages/web');
const DIST = join(WEB, 'dist');
export const BUDGET_BYTES = 120 * 1024;

/** Files (relative to dist) that an HTML entry loads before it renders. */
export function entryAssets(html) {
  const out = new Set();
  for (const m of html.matchAll(/<(script|link)\b[^>]*>/g)) {
    const tag = m[0];
    const ref = /(?:src|href)="([^"]+)"/.exec(tag)?.[1];
    if (!ref || /^https?:/.test(ref)) continue;
    const isScript = m[1] === 'script' && /type="module"/.test(tag);
    const isStyle = /rel="stylesheet"/.test(tag);
    const isPreload = /rel="modulepreload"/.test(tag);
    if (isScript || isStyle || isPreload) out.add(ref.replace(/^\//, ''));
  }
  return [...out];
}

/** gzip -9 sizes of the public entry's JS and CSS (the page itself too when a script is written into it). */
export function measurePublicEntry() {
  const html = readFileSync(join(DIST, 'public.html'), 'utf8');
  const inline = /<script\b(?![^>]*\bsrc=)[^>]*>[^<]/.test(html) ? ['public.html'] : [];
  const files = [...inline, ...entryAssets(html)].map((f) => {
    const bytes = readFileSync(join(DIST, f));
    const br = existsSync(join(DIST, `${f}.br`)) ? statSync(join(DIST, `${f}.br`)).size : null;
    return { file: f, raw: bytes.length, gzip: gzipSync(bytes, { level: 9 }).length, br };
  });
  const total = files.reduce((n, f) => n + f.gzip, 0);
  return { files, total };
}

/** A cold load of a demo lot's public page in Chromium, 390 px, throttled: bytes transferred. */
async function transferred() {
  const { chromium } = await import('playwright-core');
  const { startBenchApp } = await import('../lib/bench-app.ts');
  const { loadOnce, phoneContext } = await import('../page/measure.ts');
  const app = await startBenchApp('bench-size');
  const browser = await chromium.launch({ executablePath: '/usr/bin/chromium', headless: true });
  try {
    const lot = app.demo.publicLots[0];
    const ctx = await phoneContext(browser);
    const r = await loadOnce(ctx, `${app.origin}/l/${lot.code}`);
    await ctx.close();
    console.log(`cold load of /l/${lot.code} (${lot.why}):`);
    for (const q of r.requests)
      console.log(
        `  ${String(q.bytes).padStart(8)} B  ${q.encoding || '-'}  ${q.url.replace(app.origin, '')}`,
      );
    const ok = r.bytes <= 130 * 1024;
    console.log(
      `public page transferred cold: ${r.bytes} B (${(r.bytes / 1024).toFixed(1)} KB) photos apart ` +
        `(target ≤ 130 KB) ${ok ? 'met' : 'NOT met'}; photos ${r.photoBytes} B`,
    );
    if (!ok) process.exitCode = 1;
  } finally {
    await browser.close();
    await app.stop();
  }
}

async function main() {
  if (!process.argv.includes('--no-build')) {
    const r = spawnSync('npm', ['run', 'build'], { cwd: WEB, stdio: 'inherit' });
    if (r.status !== 0) process.exit(r.status ?? 1);
  }
  const { files, total } = measurePublicEntry();
  for (const f of files) console.log(`${f.file}\t${f.raw} B raw\t${f.gzip} B gzip\t${f.br ?? '-'} B brotli`);
  const pct = ((total / BUDGET_BYTES) * 100).toFixed(1);
  console.log(
    `public page JS+CSS: ${total} B gzip (${(total / 1024).toFixed(1)} KB; budget 120 KB, ${pct}%)`,
  );
  if (total > BUDGET_BYTES) process.exitCode = 1;
  if (!process.argv.includes('--no-browser')) await transferred();
}

if (process.argv[1] && resolve(process.argv[1]) === fileURLToPath(import.meta.url))
  main().catch((err) => {
    console.error(err);
    process.exit(1);
  });
