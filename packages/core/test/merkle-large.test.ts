import { describe, expect, it } from 'vitest';
import { createHash } from 'node:crypto';
import { verifyConsistency, verifyInclusion } from '../src/index.js';

// A reference implementation written from RFC 9162 §2.1.1 (MTH), §2.1.3.1 (PATH) and §2.1.4.1
// (SUBPROOF) in BigInt arithmetic, hashing with node:crypto. A tree of 2^52 leaves cannot be
// built, so every complete subtree (a power-of-two range the recursion meets) that holds no
// point of interest (the old tree size, the proved leaf) stands for itself with an opaque
// hash: the recursion then touches O(log n) nodes, and the proofs and roots it yields are
// those of a real tree whose untouched complete subtrees have those hashes.
const sha = (...parts: Buffer[]): Buffer => createHash('sha256').update(Buffer.concat(parts)).digest();
const opaque = (lo: bigint, size: bigint): Buffer => sha(Buffer.from(`subtree ${lo} ${size}`));
const node = (l: Buffer, r: Buffer): Buffer => sha(Buffer.from([1]), l, r);
const isPow2 = (n: bigint): boolean => n > 0n && (n & (n - 1n)) === 0n;
const splitPoint = (n: bigint): bigint => {
  let k = 1n;
  while (k * 2n < n) k *= 2n;
  return k;
};

let cuts: bigint[] = [];

function mth(lo: bigint, hi: bigint): Buffer {
  const n = hi - lo;
  if (n === 1n || (isPow2(n) && !cuts.some((c) => lo < c && c < hi))) return opaque(lo, n);
  const k = splitPoint(n);
  return node(mth(lo, lo + k), mth(lo + k, hi));
}

function pathOf(m: bigint, lo: bigint, hi: bigint): Buffer[] {
  const n = hi - lo;
  if (n <= 1n) return [];
  const k = splitPoint(n);
  return m < k
    ? [...pathOf(m, lo, lo + k), mth(lo + k, hi)]
    : [...pathOf(m - k, lo + k, hi), mth(lo, lo + k)];
}

function subproof(m: bigint, lo: bigint, hi: bigint, b: boolean): Buffer[] {
  const n = hi - lo;
  if (m === n) return b ? [] : [mth(lo, hi)];
  const k = splitPoint(n);
  return m <= k
    ? [...subproof(m, lo, lo + k, b), mth(lo + k, hi)]
    : [...subproof(m - k, lo + k, hi, false), mth(lo, lo + k)];
}

const u8 = (b: Buffer): Uint8Array => new Uint8Array(b);
const flip = (proof: Uint8Array[], i: number): Uint8Array[] =>
  proof.map((p, j) => (j === i ? Uint8Array.from(p, (x, k) => (k === 0 ? x ^ 1 : x)) : p));

const P = (e: number): bigint => 2n ** BigInt(e);
const consistencyCases: Array<[bigint, bigint]> = [
  [P(50) - 1n, P(52) + 1n],
  [P(31), P(52) + 1n],
  [P(32) + 1n, P(33)],
  [P(30) + 1n, P(31) + 3n],
  [1n, P(53) - 1n],
  [P(52), P(53) - 1n],
  [P(52) + 1n, P(52) + 2n],
  [P(50) - 1n, P(50)],
];

describe('Merkle proofs at sizes past 32-bit and float-log arithmetic', () => {
  for (const [m, n] of consistencyCases) {
    it(`consistency ${m} → ${n} verifies, and fails after a changed node or size`, () => {
      cuts = [m];
      const proof = subproof(m, 0n, n, true).map(u8);
      const r1 = u8(mth(0n, m));
      const r2 = u8(mth(0n, n));
      expect(verifyConsistency(Number(m), Number(n), proof, r1, r2)).toBe(true);
      for (let i = 0; i < proof.length; i++)
        expect(verifyConsistency(Number(m), Number(n), flip(proof, i), r1, r2)).toBe(false);
      expect(verifyConsistency(Number(m) + 1, Number(n), proof, r1, r2)).toBe(false);
      expect(verifyConsistency(Number(m), Number(n), proof, r2, r1)).toBe(false);
    });
  }
  const inclusionCases: Array<[bigint, bigint]> = [
    [P(52), P(52) + 1n],
    [P(50) - 2n, P(50) - 1n],
    [P(31) + 7n, P(53) - 1n],
    [0n, P(52) + 1n],
  ];
  for (const [i, n] of inclusionCases) {
    it(`inclusion of leaf ${i} in ${n} verifies, and fails after a changed node or index`, () => {
      cuts = [i, i + 1n];
      const leaf = u8(opaque(i, 1n));
      const proof = pathOf(i, 0n, n).map(u8);
      const root = u8(mth(0n, n));
      expect(verifyInclusion(leaf, Number(i), Number(n), proof, root)).toBe(true);
      expect(verifyInclusion(leaf, Number(i), Number(n), flip(proof, 0), root)).toBe(false);
      expect(verifyInclusion(leaf, Number(i) ^ 1, Number(n), proof, root)).toBe(false);
    });
  }
});
