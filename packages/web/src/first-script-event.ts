/**
 * The event the public page's first script (src/public-tick.ts) fires on `window` once it has
 * left `window.beadrollPage`; the page's module script (src/public-main.tsx) waits for it.
 */
export const FIRST_SCRIPT_RAN = 'beadroll-first-check';
