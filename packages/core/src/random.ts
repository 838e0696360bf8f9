import { sha256 } from '@noble/hashes/sha2.js';
import { utf8ToBytes } from '@noble/hashes/utils.js';

/** A source of random bytes: returns `n` fresh bytes each call. */
export type RandomSource = (n: number) => Uint8Array;

/**
 * Cryptographically secure bytes from `globalThis.crypto.getRandomValues` (browsers, Node 20).
 * Precondition: 0 ≤ n ≤ 65536.
 */
export const secureRandom: RandomSource = (n) => {
  const out = new Uint8Array(n);
  const c = (globalThis as unknown as { crypto?: { getRandomValues(a: Uint8Array): Uint8Array } }).crypto;
  if (!c) throw new Error('no Web Crypto getRandomValues in this environment');
  c.getRandomValues(out);
  return out;
};

/**
 * A deterministic byte stream (SHA-256 in counter mode over `seed`) for tests and the demo
 * scenario. Never use it for real entries: anyone who knows the seed can predict every nonce
 * and salt.
 */
export function seededRandom(seed: string): RandomSource {
  const seedBytes = utf8ToBytes(seed);
  let counter = 0;
  let pool = new Uint8Array(0);
  return (n) => {
    const out = new Uint8Array(n);
    let filled = 0;
    while (filled < n) {
      if (pool.length === 0) {
        const block = new Uint8Array(seedBytes.length + 4);
        block.set(seedBytes);
        new DataView(block.buffer).setUint32(seedBytes.length, counter++);
        pool = sha256(block);
      }
      const take = Math.min(pool.length, n - filled);
      out.set(pool.subarray(0, take), filled);
      pool = pool.subarray(take);
      filled += take;
    }
    return out;
  };
}
