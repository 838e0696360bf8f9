// Builds the standalone verifier from the sources of this package and of @beadroll/core:
//   dist/beadroll-verify.mjs  the command line, one file with core inside (no dependencies)
//   dist/verify.html          the offline page, one file with its script and styles inline
// Usage: node build.mjs            build
//        node build.mjs --if-stale build only when a source is newer than the output
import {
  existsSync,
  mkdirSync,
  readdirSync,
  readFileSync,
  realpathSync,
  renameSync,
  statSync,
  writeFileSync,
} from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { createHash } from 'node:crypto';
import { build } from 'esbuild';

const HERE = dirname(fileURLToPath(import.meta.url));
const DIST = join(HERE, 'dist');
export const CLI_FILE = join(DIST, 'beadroll-verify.mjs');
export const PAGE_FILE = join(DIST, 'verify.html');

/** The package directory of @beadroll/core, found the way Node would find it from here. */
function corePackageDir() {
  for (let dir = HERE; ; dir = dirname(dir)) {
    const candidate = join(dir, 'node_modules', '@beadroll', 'core');
    if (existsSync(join(candidate, 'package.json'))) return realpathSync(candidate);
    if (dirname(dir) === dir) throw new Error('@beadroll/core is not installed (run npm ci)');
  }
}

/** Core is bundled from its TypeScript sources, so no build of core is needed first. */
function coreSources() {
  return join(corePackageDir(), 'src');
}

function newest(dir) {
  let t = 0;
  for (const e of readdirSync(dir, { withFileTypes: true })) {
    const p = join(dir, e.name);
    t = Math.max(t, e.isDirectory() ? newest(p) : statSync(p).mtimeMs);
  }
  return t;
}

/** True when an output is missing or older than a source it is built from. */
export function isStale() {
  if (!existsSync(CLI_FILE) || !existsSync(PAGE_FILE)) return true;
  const built = Math.min(statSync(CLI_FILE).mtimeMs, statSync(PAGE_FILE).mtimeMs);
  const sources = Math.max(
    newest(join(HERE, 'src')),
    newest(coreSources()),
    statSync(fileURLToPath(import.meta.url)).mtimeMs,
  );
  return sources > built;
}

const common = {
  bundle: true,
  alias: { '@beadroll/core': join(coreSources(), 'index.ts') },
  legalComments: 'none',
  logLevel: 'warning',
  target: 'es2022',
};

const inlineHash = (text) => `'sha256-${createHash('sha256').update(text, 'utf8').digest('base64')}'`;

/**
 * The page's content security policy: its one inline script and one inline style, by hash, and
 * nothing else: no connection, no other script, no form submission.
 */
export function pagePolicy(html) {
  const script = /<script>([\s\S]*?)<\/script>/.exec(html)[1];
  const style = /<style>([\s\S]*?)<\/style>/.exec(html)[1];
  return [
    "default-src 'none'",
    `script-src ${inlineHash(script)}`,
    `style-src ${inlineHash(style)}`,
    'img-src data:',
    "connect-src 'none'",
    "form-action 'none'",
    "base-uri 'none'",
  ].join('; ');
}

/** Writes a whole file at once (a reader never sees half of it, even with two builds running). */
function writeWhole(file, text, mode = 0o644) {
  const tmp = `${file}.${process.pid}.tmp`;
  writeFileSync(tmp, text, { mode });
  renameSync(tmp, file);
}

/** Builds both outputs. */
export async function buildVerifier() {
  mkdirSync(DIST, { recursive: true });
  const cli = await build({
    ...common,
    entryPoints: [join(HERE, 'src', 'bin.ts')],
    platform: 'node',
    format: 'esm',
    banner: { js: '#!/usr/bin/env node' },
    write: false,
  });
  const page = await build({
    ...common,
    entryPoints: [join(HERE, 'src', 'page.ts')],
    platform: 'browser',
    format: 'iife',
    minify: true,
    write: false,
  });
  const script = page.outputFiles[0].text.replace(/<\/script/gi, '<\\/script');
  const css = readFileSync(join(HERE, 'src', 'page.css'), 'utf8');
  let html = readFileSync(join(HERE, 'src', 'page.html'), 'utf8')
    .replace('/*STYLE*/', () => css.trim())
    .replace('/*SCRIPT*/', () => script.trim());
  html = html.replace('/*CSP*/', () => pagePolicy(html));
  writeWhole(CLI_FILE, cli.outputFiles[0].text, 0o755);
  writeWhole(PAGE_FILE, html);
}

if (process.argv[1] && realpathSync(process.argv[1]) === fileURLToPath(import.meta.url)) {
  if (!process.argv.includes('--if-stale') || isStale()) await buildVerifier();
}
