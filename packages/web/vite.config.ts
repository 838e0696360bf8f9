import { resolve } from 'node:path';
import react from '@vitejs/plugin-react';
import { defineConfig } from 'vitest/config';

const apiPort = process.env.PORT ?? '3000';

export default defineConfig({
  plugins: [react()],
  build: {
    rollupOptions: {
      input: { app: resolve(__dirname, 'index.html'), public: resolve(__dirname, 'public.html') },
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
});
