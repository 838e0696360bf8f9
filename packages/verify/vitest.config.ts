import { fileURLToPath } from 'node:url';
import { defineConfig } from 'vitest/config';

// `VERIFY_SKIP_BROWSER=1` leaves out the page's browser test (the quick suite has no browser).
export default defineConfig({
  resolve: {
    // The tests read core from its sources, as the build bundles it.
    alias: { '@beadroll/core': fileURLToPath(new URL('../core/src/index.ts', import.meta.url)) },
  },
  test: {
    include: ['test/**/*.test.ts'],
    exclude: process.env.VERIFY_SKIP_BROWSER ? ['test/**/*.browser.test.ts'] : [],
    environment: 'node',
    testTimeout: 120_000,
    hookTimeout: 180_000,
  },
});
