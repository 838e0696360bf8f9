import { resolve } from 'node:path';
import react from '@vitejs/plugin-react';
import { compression } from 'vite-plugin-compression2';
import { defineConfig } from 'vitest/config';
import { firstScript } from './build/first-script';
import { PUBLIC_ASSETS_DIR, pwaPlugins } from './build/pwa';

/**
 * The build runs three times (`npm run build`): the dealer app (index.html) with React, then, with
 * `BEADROLL_ENTRY=public`, the public lot page (public.html) into the same folder with Preact's
 * React-compatible layer in place of React: the page a buyer opens on a phone at a fair loads
 * about a third of the script. Last, with `--ssr`, the same page's renderer for the server
 * (`dist-ssr/public-ssr.js`, everything bundled, so Preact stands in for React there too).
 * Development and tests use React for both pages.
 */
const publicBuild = process.env.BEADROLL_ENTRY === 'public';

const apiPort = process.env.PORT ?? '3000';

export default defineConfig(({ isSsrBuild }) => ({
  plugins: [
    react(),
    // A brotli and a gzip copy beside each compressible file, made once at build time at the
    // highest levels; the server sends the copy the browser accepts.
    ...(isSsrBuild
      ? []
      : [
          compression({
            algorithms: ['brotliCompress', 'gzip'],
            include: /\.(js|css|html|svg|json|txt|webmanifest)$/,
            threshold: 512,
          }),
          // The web app manifest and the service worker of each page (see build/pwa.ts).
          ...pwaPlugins(publicBuild ? 'public' : 'app'),
          // The public page's first script, written into its HTML (see build/first-script.ts).
          ...(publicBuild ? [firstScript(PUBLIC_ASSETS_DIR)] : []),
        ]),
  ],
  resolve: publicBuild
    ? {
        alias: [
          { find: /^react-dom\/client$/, replacement: 'preact/compat/client' },
          { find: /^react-dom$/, replacement: 'preact/compat' },
          { find: /^react\/jsx-runtime$/, replacement: 'preact/compat/jsx-runtime' },
          { find: /^react\/jsx-dev-runtime$/, replacement: 'preact/compat/jsx-dev-runtime' },
          { find: /^react$/, replacement: 'preact/compat' },
        ],
      }
    : undefined,
  ssr: { noExternal: true },
  build: {
    emptyOutDir: !publicBuild || isSsrBuild,
    // The public page's files in a folder of their own: its service worker precaches exactly those.
    ...(publicBuild ? { assetsDir: PUBLIC_ASSETS_DIR, modulePreload: { polyfill: false } } : {}),
    rollupOptions: isSsrBuild
      ? undefined
      : {
          input: publicBuild
            ? ({ public: resolve(__dirname, 'public.html') } as Record<string, string>)
            : { app: resolve(__dirname, 'index.html') },
        },
  },
  server: {
    host: '127.0.0.1',
    proxy: {
      '/api': `http://127.0.0.1:${apiPort}`,
      '/dev': `http://127.0.0.1:${apiPort}`,
      '/verify': `http://127.0.0.1:${apiPort}`,
    },
  },
  test: {
    environment: 'jsdom',
    setupFiles: ['./src/test-setup.ts'],
    include: ['src/**/*.test.{ts,tsx}'],
    // Form tests type into many fields; a busy 2-core machine needs more than the 5 s default.
    testTimeout: 30_000,
  },
}));
