import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { bytesToHex, hexToBytes, utf8ToBytes } from '@noble/hashes/utils.js';
import {
  consistencyProof,
  inclusionProof,
  merkleLeafHash,
  merkleNodeHash,
  merkleRoot,
  verifyConsistency,
  verifyInclusion,
  MerkleError,
} from '../src/index.js';
import v from './fixtures/merkle.json' with { type: 'json' };

const leaves = v.leafInputs.hex.map((h) => merkleLeafHash(hexToBytes(h)));
const hex = (a: Uint8Array[]): string[] => a.map(bytesToHex);

// Sources: RFC 6962 §2.1 (construction), RFC 9162 §2.1.3.2 and §2.1.4.2 (verification), and the
// standard 8-leaf test tree of transparency-dev/merkle (named per case in the fixture).
describe('RFC 6962 hashing', () => {
  it(v.hasher[0]!.desc, () => expect(bytesToHex(merkleRoot([]))).toBe(v.hasher[0]!.expected));
  it(v.hasher[1]!.desc, () =>
    expect(bytesToHex(merkleLeafHash(new Uint8Array(0)))).toBe(v.hasher[1]!.expected),
  );
  it(v.hasher[2]!.desc, () =>
    expect(bytesToHex(merkleLeafHash(utf8ToBytes('L123456')))).toBe(v.hasher[2]!.expected),
  );
  it(v.hasher[3]!.desc, () =>
    expect(bytesToHex(merkleNodeHash(utf8ToBytes('N123'), utf8ToBytes('N456')))).toBe(v.hasher[3]!.expected),
  );
  for (const r of v.roots)
    it(r.desc, () => expect(bytesToHex(merkleRoot(leaves.slice(0, r.input.size)))).toBe(r.expected));
});

describe('inclusion proofs', () => {
  for (const c of v.inclusion) {
    it(c.desc, () => {
      const tree = leaves.slice(0, c.input.size);
      const leaf = merkleLeafHash(hexToBytes(c.input.leafHex));
      expect(bytesToHex(leaf)).toBe(c.expected.leafHash);
      expect(hex(inclusionProof(tree, c.input.index))).toEqual(c.expected.proof);
      const proof = c.expected.proof.map(hexToBytes);
      const root = hexToBytes(c.expected.root);
      expect(verifyInclusion(leaf, c.input.index, c.input.size, proof, root)).toBe(true);
      // Negative cases by mutation of the good one.
      expect(verifyInclusion(leaf, c.input.index + 1, c.input.size, proof, root)).toBe(false);
      expect(verifyInclusion(leaf, c.input.index, c.input.size, proof, leaves[7]!)).toBe(false);
      expect(verifyInclusion(leaf, c.input.index, c.input.size, [...proof, root], root)).toBe(false);
      if (proof.length > 0)
        expect(verifyInclusion(leaf, c.input.index, c.input.size, proof.slice(1), root)).toBe(false);
      expect(verifyInclusion(leaves[7]!, c.input.index, c.input.size, proof, root)).toBe(false);
    });
  }
  for (const c of v.rfc6962Example.checks.filter((x) => x.input.type === 'inclusion')) {
    it(`RFC 6962 §2.1.3 example: ${c.desc}`, () =>
      expect(hex(inclusionProof(leaves.slice(0, 7), (c.input as { index: number }).index))).toEqual(
        c.expected,
      ));
  }
  it('throws a typed error for an index outside the tree', () => {
    expect(() => inclusionProof(leaves, 8)).toThrow(MerkleError);
  });
});

describe('consistency proofs', () => {
  for (const c of v.consistency) {
    it(c.desc, () => {
      const { size1, size2 } = c.input;
      expect(hex(consistencyProof(leaves.slice(0, size2), size1))).toEqual(c.expected.proof);
      const proof = c.expected.proof.map(hexToBytes);
      const r1 = hexToBytes(c.expected.root1);
      const r2 = hexToBytes(c.expected.root2);
      expect(verifyConsistency(size1, size2, proof, r1, r2)).toBe(true);
      expect(verifyConsistency(size1, size2, proof, r2, r1)).toBe(size1 === size2);
      if (proof.length > 0) {
        expect(verifyConsistency(size1, size2, proof.slice(0, -1), r1, r2)).toBe(false);
        expect(verifyConsistency(size1 + 1, size2, proof, r1, r2)).toBe(false);
      }
    });
  }
  for (const c of v.rfc6962Example.checks.filter((x) => x.input.type === 'consistency')) {
    it(`RFC 6962 §2.1.3 example: ${c.desc}`, () =>
      expect(hex(consistencyProof(leaves.slice(0, 7), (c.input as { size1: number }).size1))).toEqual(
        c.expected,
      ));
  }
});

describe('Merkle properties (random trees up to 1000 leaves)', () => {
  const flip = (a: Uint8Array, bit: number): Uint8Array => {
    const b = a.slice();
    b[bit >> 3]! ^= 1 << (bit & 7);
    return b;
  };
  const treeOf = (n: number): Uint8Array[] =>
    Array.from({ length: n }, (_, i) => merkleLeafHash(utf8ToBytes(`leaf ${i}`)));
  const big = treeOf(1000);

  it('inclusion: proof then verify holds, and fails after any bit flip', () => {
    fc.assert(
      fc.property(
        fc
          .integer({ min: 1, max: 1000 })
          .chain((n) => fc.tuple(fc.constant(n), fc.nat(n - 1), fc.nat(1 << 16))),
        ([n, i, r]) => {
          const tree = big.slice(0, n);
          const root = merkleRoot(tree);
          const proof = inclusionProof(tree, i);
          expect(verifyInclusion(tree[i]!, i, n, proof, root)).toBe(true);
          const items = [tree[i]!, ...proof, root];
          const which = r % items.length;
          const flipped = items.map((x, k) => (k === which ? flip(x, r % 256) : x));
          expect(verifyInclusion(flipped[0]!, i, n, flipped.slice(1, -1), flipped.at(-1)!)).toBe(false);
        },
      ),
      { numRuns: 150 },
    );
  });

  it('consistency: proof then verify holds, and fails after any bit flip', () => {
    fc.assert(
      fc.property(
        fc
          .integer({ min: 1, max: 1000 })
          .chain((n) => fc.tuple(fc.integer({ min: 1, max: n }), fc.constant(n), fc.nat(1 << 16))),
        ([m, n, r]) => {
          const tree = big.slice(0, n);
          const r1 = merkleRoot(tree.slice(0, m));
          const r2 = merkleRoot(tree);
          const proof = consistencyProof(tree, m);
          expect(verifyConsistency(m, n, proof, r1, r2)).toBe(true);
          if (m === n) return;
          const items = [r1, r2, ...proof];
          const which = r % items.length;
          const f = items.map((x, k) => (k === which ? flip(x, r % 256) : x));
          expect(verifyConsistency(m, n, f.slice(2), f[0]!, f[1]!)).toBe(false);
        },
      ),
      { numRuns: 150 },
    );
  });
});
