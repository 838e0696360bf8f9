import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { hexToBytes } from '@noble/hashes/utils.js';
import {
  consistencyProof,
  inclusionProof,
  merkleLeafHash,
  merkleRoot,
  MerkleTree,
  verifyConsistency,
  verifyInclusion,
} from '../src/index.js';
import v from './fixtures/merkle.json' with { type: 'json' };

const leafOf = (i: number): Uint8Array => merkleLeafHash(new Uint8Array([i & 255, (i >> 8) & 255, 7]));
const hex = (a: Uint8Array[]): string[] => a.map((x) => Buffer.from(x).toString('hex'));

// Source: the standard 8-leaf test tree (transparency-dev/merkle testonly/constants.go), RFC 6962 §2.1.
describe('MerkleTree against the RFC 6962 test tree', () => {
  const leaves = v.leafInputs.hex.map((h) => merkleLeafHash(hexToBytes(h)));
  const tree = new MerkleTree(leaves);
  for (const r of v.roots)
    it(r.desc, () => expect(Buffer.from(tree.root(r.input.size)).toString('hex')).toBe(r.expected));
  for (const c of v.inclusion)
    it(c.desc, () => expect(hex(tree.inclusionProof(c.input.index, c.input.size))).toEqual(c.expected.proof));
});

// Property tests: the tree with stored subtrees answers exactly as the RFC's recursive
// definitions; every honest proof verifies (RFC 9162 §2.1.3.2, §2.1.4.2); every tampered one fails.
describe('random trees', () => {
  const sized = fc.integer({ min: 1, max: 300 }).chain((n) =>
    fc.record({
      n: fc.constant(n),
      a: fc.integer({ min: 0, max: n - 1 }),
      b: fc.integer({ min: 1, max: n }),
    }),
  );

  it('roots and inclusion proofs match the recursive definition and verify; tampered ones fail', () => {
    fc.assert(
      fc.property(sized, fc.integer({ min: 0, max: 31 }), ({ n, a, b }, byte) => {
        const leaves = Array.from({ length: n }, (_, i) => leafOf(i));
        const tree = new MerkleTree(leaves);
        const size = Math.max(b, a + 1);
        const root = tree.root(size);
        expect(root).toEqual(merkleRoot(leaves.slice(0, size)));
        const proof = tree.inclusionProof(a, size);
        expect(proof).toEqual(inclusionProof(leaves.slice(0, size), a));
        expect(verifyInclusion(leaves[a]!, a, size, proof, root)).toBe(true);
        if (proof.length > 0) {
          const bad = proof.map((p) => p.slice());
          bad[byte % bad.length]![byte] ^= 1;
          expect(verifyInclusion(leaves[a]!, a, size, bad, root)).toBe(false);
          expect(verifyInclusion(leaves[a]!, a, size, proof.slice(0, -1), root)).toBe(false);
        }
        expect(verifyInclusion(leafOf(n + 1), a, size, proof, root)).toBe(false);
        if (size > 1) expect(verifyInclusion(leaves[a]!, (a + 1) % size, size, proof, root)).toBe(false);
      }),
      { numRuns: 150 },
    );
  });

  it('consistency proofs match the recursive definition and verify; tampered ones fail', () => {
    fc.assert(
      fc.property(sized, fc.integer({ min: 0, max: 31 }), ({ n, a, b }, byte) => {
        const leaves = Array.from({ length: n }, (_, i) => leafOf(i));
        const tree = new MerkleTree(leaves);
        const [m, k] = a <= b ? [a, b] : [b, a];
        const proof = tree.consistencyProof(m, k);
        expect(proof).toEqual(consistencyProof(leaves.slice(0, k), m));
        const r1 = tree.root(m);
        const r2 = tree.root(k);
        expect(verifyConsistency(m, k, proof, r1, r2)).toBe(true);
        if (proof.length > 0) {
          const bad = proof.map((p) => p.slice());
          bad[byte % bad.length]![byte] ^= 1;
          expect(verifyConsistency(m, k, bad, r1, r2)).toBe(false);
        }
        if (m > 0 && m < k) {
          // A history rewritten below m: the old root no longer has a consistency proof.
          const forged = leaves.slice(0, k);
          forged[byte % m] = leafOf(9999);
          const other = new MerkleTree(forged);
          expect(verifyConsistency(m, k, other.consistencyProof(m, k), r1, other.root(k))).toBe(false);
        }
      }),
      { numRuns: 150 },
    );
  });

  it('refuses sizes and indices outside the tree', () => {
    const tree = new MerkleTree([leafOf(1), leafOf(2)]);
    expect(() => tree.root(3)).toThrow();
    expect(() => tree.inclusionProof(2, 2)).toThrow();
    expect(() => tree.consistencyProof(2, 1)).toThrow();
    expect(() => tree.append(new Uint8Array(31))).toThrow();
  });
});
