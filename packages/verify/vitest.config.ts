import { defineConfig } from 'vitest/config';

// `VERIFY_SKIP_BROWSER=1` leaves out the page's browser test (the quick suite has no browser).
export default defineConfig({
  test: {
    include: ['test/**/*.test.ts'],
    exclude: process.env.VERIFY_SKIP_BROWSER ? ['test/**/*.browser.test.ts'] : [],
    environment: 'node',
    testTimeout: 120_000,
    hookTimeout: 180_000,
  },
});
