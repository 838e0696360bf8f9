import '@testing-library/jest-dom/vitest';
import { cleanup, configure } from '@testing-library/react';
import { afterEach, vi } from 'vitest';

// A find or waitFor waits for as long as the test itself may run (testTimeout, 30 s, in
// vite.config.ts), not Testing Library's 1 s: on a busy machine the first render of a page and its
// lazily loaded parts can take seconds. It gives up a little before the test's limit, so a failure
// still shows the page as it was.
configure({ asyncUtilTimeout: 25_000 });

afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

// jsdom has no ResizeObserver; Fluent's message bar and dialogs only need it to exist.
globalThis.ResizeObserver ??= class {
  observe() {}
  unobserve() {}
  disconnect() {}
} as unknown as typeof ResizeObserver;
