// Size of the public lot page: builds the web package (unless --no-build) and prints the gzip
// bytes of every JS and CSS file that public.html loads up front (its module script, the chunks
// it preloads and its style sheets). Budget: 120 KB (122,880 bytes) gzip for JS + CSS.
import { spawnSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
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

/** gzip -9 sizes of the public entry's JS and CSS. */
export function measurePublicEntry() {
  const html = readFileSync(join(DIST, 'public.html'), 'utf8');
  const files = entryAssets(html).map((f) => {
    const bytes = readFileSync(join(DIST, f));
    return { file: f, raw: bytes.length, gzip: gzipSync(bytes, { level: 9 }).length };
  });
  const total = files.reduce((n, f) => n + f.gzip, 0);
  return { files, total };
}

function main() {
  if (!process.argv.includes('--no-build')) {
    const r = spawnSync('npx', ['vite', 'build', '--logLevel', 'warn'], { cwd: WEB, stdio: 'inherit' });
    if (r.status !== 0) process.exit(r.status ?? 1);
  }
  const { files, total } = measurePublicEntry();
  for (const f of files) console.log(`${f.file}\t${f.raw} B raw\t${f.gzip} B gzip`);
  const pct = ((total / BUDGET_BYTES) * 100).toFixed(1);
  console.log(
    `public page JS+CSS: ${total} B gzip (${(total / 1024).toFixed(1)} KB; budget 120 KB, ${pct}%)`,
  );
  if (total > BUDGET_BYTES) process.exitCode = 1;
}

if (process.argv[1] && resolve(process.argv[1]) === fileURLToPath(import.meta.url)) main();
