import type { RandomSource } from '@beadroll/core';

/** Injection token of the random source for nonces, salts and lot codes (core's secureRandom). */
export const LEDGER_RANDOM = Symbol('LEDGER_RANDOM');
export type LedgerRandom = RandomSource;
