import { resolve } from 'node:path';
import { defineConfig } from 'vitest/config';

// Browser journeys: a real server (built) on a fresh database, driven through Debian's Chromium.
export default defineConfig({
  test: {
    root: resolve(__dirname),
    include: ['e2e/**/*.e2e.ts'],
    environment: 'node',
    globalSetup: ['./e2e/support/global-setup.ts'],
    testTimeout: 120_000,
    hookTimeout: 120_000,
    fileParallelism: false,
  },
});
