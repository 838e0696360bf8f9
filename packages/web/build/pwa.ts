import type { Plugin } from 'vite';
import { VitePWA } from 'vite-plugin-pwa';
import { beadrollBrand } from '../src/app/brand';
import { iconSvg } from './icons';

/** Where the public page's own files go, so its service worker precaches those and nothing else. */
export const PUBLIC_ASSETS_DIR = 'assets/lot';

const ICONS = [
  { src: '/icons/beadroll.svg', sizes: 'any', type: 'image/svg+xml', purpose: 'any' },
  { src: '/icons/beadroll-maskable.svg', sizes: 'any', type: 'image/svg+xml', purpose: 'maskable' },
];

/** Writes the two icons (drawn in icons.ts) into the build, and names the icon and the theme colour in the page. */
function emitIcons(): Plugin {
  return {
    name: 'beadroll-icons',
    apply: 'build',
    transformIndexHtml: () => [
      { tag: 'meta', attrs: { name: 'theme-color', content: beadrollBrand[80] }, injectTo: 'head' },
      {
        tag: 'link',
        attrs: { rel: 'icon', href: '/icons/beadroll.svg', type: 'image/svg+xml' },
        injectTo: 'head',
      },
    ],
    generateBundle() {
      this.emitFile({ type: 'asset', fileName: 'icons/beadroll.svg', source: iconSvg(false) });
      this.emitFile({ type: 'asset', fileName: 'icons/beadroll-maskable.svg', source: iconSvg(true) });
    },
  };
}

/**
 * The installable web app: a web app manifest and a Workbox service worker (sw/*.ts, built by
 * vite-plugin-pwa's injectManifest, which writes the list of files to precache into it).
 *
 * - The dealer app (`app-sw.js`, scope `/`) precaches the whole dealer app, so the scanner and
 *   its quick sale open with no signal.
 * - The public lot page (`lot-sw.js`, registered for `/l/` or `/L/`) precaches only the public
 *   page's files (a buyer's phone never loads the dealer app) and keeps the last copy of each
 *   lot's data it opened.
 *
 * `BEADROLL_SW=off` builds both workers as ones that remove themselves and their caches.
 */
export function pwaPlugins(entry: 'app' | 'public'): Plugin[] {
  const off = process.env.BEADROLL_SW === 'off';
  const common = {
    strategies: 'injectManifest' as const,
    srcDir: 'sw',
    injectRegister: false as const,
    selfDestroying: off,
    includeManifestIcons: false,
  };
  const colours = { theme_color: beadrollBrand[80], background_color: '#ffffff' };
  const pwa =
    entry === 'app'
      ? VitePWA({
          ...common,
          filename: 'app-sw.ts',
          manifestFilename: 'app.webmanifest',
          scope: '/',
          manifest: {
            name: 'Beadroll for dealers',
            short_name: 'Beadroll',
            description: 'Your lots, your stand’s scanner and quick sales, also with no signal.',
            id: '/',
            start_url: '/scan',
            scope: '/',
            display: 'standalone',
            icons: ICONS,
            ...colours,
          },
          injectManifest: {
            globPatterns: ['index.html', 'assets/**/*.{js,css,woff2}', 'icons/*.svg', 'app.webmanifest'],
            globIgnores: [`${PUBLIC_ASSETS_DIR}/**`],
            maximumFileSizeToCacheInBytes: 4 * 1024 * 1024,
          },
        })
      : VitePWA({
          ...common,
          filename: 'lot-sw.ts',
          manifestFilename: 'lot.webmanifest',
          scope: '/l/',
          manifest: {
            name: 'Beadroll lot history',
            short_name: 'Lot history',
            description: 'The history of a lot of glass beads, checked in your browser.',
            // No start address or scope: both follow the lot page it is installed from.
            id: undefined,
            start_url: undefined,
            scope: undefined,
            display: 'standalone',
            icons: ICONS,
            ...colours,
          },
          injectManifest: {
            // Latin letters only: the other font subsets load only if a page needs them.
            globPatterns: [
              'public.html',
              `${PUBLIC_ASSETS_DIR}/*.{js,css}`,
              `${PUBLIC_ASSETS_DIR}/*-latin-{400,700}-normal-*.woff2`,
              'icons/*.svg',
            ],
          },
        });
  // vite-plugin-pwa is typed against the workspace root's Vite, a minor release apart from this
  // package's own; the plugin's hooks are the same.
  return [emitIcons(), ...(pwa as unknown as Plugin[])];
}
