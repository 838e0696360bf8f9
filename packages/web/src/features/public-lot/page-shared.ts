// What the public page's first script shares with the rest of the page. In the built page the
// first script is written into the HTML itself (build/first-script.ts): it checks the lot and
// leaves these functions on `window.beadrollPage`, and the rest of the page takes core's verifier
// and these words from there instead of downloading them a second time. A public-page module
// that needs another value from `@beadroll/core` adds it here (the build stops with "not
// exported" until it is).
export * from './check-lot';
export * from './embedded';
export * from './history-words';
export * from './route';
export * from './words';
export {
  formatLotCode,
  parseLotCode,
  recordCautions,
  sha256HexOfBytes,
  SYSTEM_ACTOR,
  tagReference,
  uvCaution,
} from '@beadroll/core';
