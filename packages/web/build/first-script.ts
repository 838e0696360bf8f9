import { createHash } from 'node:crypto';
import { dirname, resolve } from 'node:path';
import { build, type Plugin, type Rollup } from 'vite';

const SRC = resolve(__dirname, '../src');
/** The first script's entry: it checks the lot and leaves `window.beadrollPage`. */
const ENTRY = resolve(SRC, 'public-tick.ts');
/** The web modules the first script contains, which the rest of the page takes from it. */
const SHARED_MODULES = [
  'features/public-lot/page-shared.ts',
  'features/public-lot/first-check.ts',
  'features/public-lot/check-lot.ts',
  'features/public-lot/embedded.ts',
  'features/public-lot/history-words.ts',
  'features/public-lot/route.ts',
  'features/public-lot/words.ts',
].map((f) => resolve(SRC, f));
/** Modules that keep their own copy of what they take from core (loaded late: the log check). */
const OWN_CORE = resolve(SRC, 'features/transparency');
const SHARED = '\0beadroll-page-shared';

/** Writes a script's text so that nothing in it can end its element or open a comment (HTML §4.12.1.3). */
const inHtml = (code: string) => code.replace(/<\/(script)/gi, '<\\/$1').replace(/<!--/g, '<\\!--');

/**
 * The public page's first script (src/public-tick.ts: core's verifier and the status line),
 * written into `public.html` itself as an inline module, so a lot is checked as soon as its HTML
 * has arrived, without waiting for another request or for the style sheet. The server allows it
 * by its hash in the Content-Security-Policy (`publicPageScriptHashes`).
 *
 * So the rest of the page does not download the same modules again, every import of
 * `@beadroll/core` and of the first script's own modules in the public build (the log check
 * apart) is answered by a module that reads them from `window.beadrollPage.shared`, which the
 * first script leaves there (`src/features/public-lot/page-shared.ts` lists what it shares).
 * The same script is also written as a file under `assetsDir`: `public-main.tsx` runs it when the
 * page's inline copy did not run. The inline copy carries `data-first-check` and fires
 * `FIRST_SCRIPT_RAN` (src/first-script-event.ts), for which `public-main.tsx` waits while the
 * copy is in the page: an async module may run after the page's deferred module script.
 */
export function firstScript(assetsDir: string): Plugin {
  let code = '';
  let names: string[] = [];
  let fileName = '';
  return {
    name: 'beadroll-first-script',
    apply: 'build',
    // Ahead of Vite's own resolver, which would find `@beadroll/core` itself.
    enforce: 'pre',
    async config() {
      const out = (await build({
        configFile: false,
        root: dirname(SRC),
        logLevel: 'warn',
        publicDir: false,
        define: { 'process.env.NODE_ENV': '"production"' },
        build: {
          write: false,
          minify: true,
          target: 'es2022',
          modulePreload: false,
          rollupOptions: { input: ENTRY, preserveEntrySignatures: 'strict' },
        },
      })) as Rollup.RollupOutput | Rollup.RollupOutput[];
      const chunks = (Array.isArray(out) ? out : [out]).flatMap((o) =>
        o.output.filter((c): c is Rollup.OutputChunk => c.type === 'chunk'),
      );
      if (chunks.length !== 1) throw new Error('the first script must build into one chunk');
      code = chunks[0]!.code.trim();
      names = chunks[0]!.exports;
      // Its exports (the shared modules', re-exported so their names are known here) are reached
      // through `window.beadrollPage`, never imported: the export statement is left out.
      code = code.replace(/\bexport\s*\{[^}]*\};?$/, '').trim();
      const hash = createHash('sha256').update(code).digest('hex').slice(0, 8);
      fileName = `${assetsDir}/first-check-${hash}.js`;
      return { define: { 'import.meta.env.BEADROLL_FIRST_SCRIPT': JSON.stringify(`/${fileName}`) } };
    },
    async resolveId(source, importer, options) {
      if (!importer || importer.startsWith(OWN_CORE) || importer === SHARED) return null;
      if (source === '@beadroll/core') return SHARED;
      if (!source.startsWith('.')) return null;
      const resolved = await this.resolve(source, importer, { ...options, skipSelf: true });
      return resolved && SHARED_MODULES.includes(resolved.id) ? SHARED : null;
    },
    load(id) {
      if (id !== SHARED) return null;
      return `const shared = window.beadrollPage.shared;\nexport const { ${names.join(', ')} } = shared;\n`;
    },
    transformIndexHtml: {
      order: 'post',
      handler: () => [
        {
          tag: 'script',
          attrs: { type: 'module', async: true, 'data-first-check': true },
          children: inHtml(code),
          injectTo: 'body',
        },
      ],
    },
    generateBundle() {
      this.emitFile({ type: 'asset', fileName, source: code });
    },
  };
}
