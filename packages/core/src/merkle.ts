import { sha256 } from '@noble/hashes/sha2.js';
import { MerkleError } from './errors.js';

/** Hash of the empty tree: SHA-256 of no bytes (RFC 6962 §2.1, RFC 9162 §2.1.1). */
export const EMPTY_TREE_HASH: Uint8Array = sha256(new Uint8Array(0));

/** RFC 6962 leaf hash: SHA-256(0x00 || data). */
export function merkleLeafHash(data: Uint8Array): Uint8Array {
  const buf = new Uint8Array(data.length + 1);
  buf.set(data, 1);
  return sha256(buf);
}

/** RFC 6962 interior node hash: SHA-256(0x01 || left || right). Precondition: both 32 bytes. */
export function merkleNodeHash(left: Uint8Array, right: Uint8Array): Uint8Array {
  const buf = new Uint8Array(1 + left.length + right.length);
  buf[0] = 1;
  buf.set(left, 1);
  buf.set(right, 1 + left.length);
  return sha256(buf);
}

/** The largest power of two smaller than n (n ≥ 2); exact for every safe integer. */
function split(n: number): number {
  let k = 1;
  while (k * 2 < n) k *= 2;
  return k;
}

/** True when n (a positive safe integer) is a power of two; integer arithmetic only. */
function isPowerOfTwo(n: number): boolean {
  let x = n;
  while (x > 1 && x % 2 === 0) x /= 2;
  return x === 1;
}

function mth(leaves: readonly Uint8Array[], lo: number, hi: number): Uint8Array {
  const n = hi - lo;
  if (n === 0) return EMPTY_TREE_HASH;
  if (n === 1) return leaves[lo]!;
  const k = split(n);
  return merkleNodeHash(mth(leaves, lo, lo + k), mth(leaves, lo + k, hi));
}

/**
 * Merkle tree hash (RFC 6962 MTH) of a list of leaf hashes, any size (0 gives
 * {@link EMPTY_TREE_HASH}). Precondition: each element is a 32-byte leaf hash.
 */
export function merkleRoot(leafHashes: readonly Uint8Array[]): Uint8Array {
  return mth(leafHashes, 0, leafHashes.length);
}

function path(leaves: readonly Uint8Array[], m: number, lo: number, hi: number, out: Uint8Array[]): void {
  const n = hi - lo;
  if (n <= 1) return;
  const k = split(n);
  if (m < k) {
    path(leaves, m, lo, lo + k, out);
    out.push(mth(leaves, lo + k, hi));
  } else {
    path(leaves, m - k, lo + k, hi, out);
    out.push(mth(leaves, lo, lo + k));
  }
}

/**
 * Inclusion proof (RFC 6962 PATH) of leaf `index` in the tree of `leafHashes`, leaf side first.
 * Throws {@link MerkleError} `bad-index` unless 0 ≤ index < size.
 */
export function inclusionProof(leafHashes: readonly Uint8Array[], index: number): Uint8Array[] {
  if (!Number.isSafeInteger(index) || index < 0 || index >= leafHashes.length) {
    throw new MerkleError('bad-index', `leaf ${index} is not in a tree of ${leafHashes.length}`);
  }
  const out: Uint8Array[] = [];
  path(leafHashes, index, 0, leafHashes.length, out);
  return out;
}

function subproof(
  leaves: readonly Uint8Array[],
  m: number,
  lo: number,
  hi: number,
  b: boolean,
  out: Uint8Array[],
): void {
  const n = hi - lo;
  if (m === n) {
    if (!b) out.push(mth(leaves, lo, hi));
    return;
  }
  const k = split(n);
  if (m <= k) {
    subproof(leaves, m, lo, lo + k, b, out);
    out.push(mth(leaves, lo + k, hi));
  } else {
    subproof(leaves, m - k, lo + k, hi, false, out);
    out.push(mth(leaves, lo, lo + k));
  }
}

/**
 * Consistency proof (RFC 6962 PROOF) from the tree of the first `size1` leaves to the tree of
 * all `leafHashes`. Empty when size1 is 0 or equals the size. Throws {@link MerkleError}
 * `bad-size` unless 0 ≤ size1 ≤ size.
 */
export function consistencyProof(leafHashes: readonly Uint8Array[], size1: number): Uint8Array[] {
  const n = leafHashes.length;
  if (!Number.isSafeInteger(size1) || size1 < 0 || size1 > n)
    throw new MerkleError('bad-size', `size ${size1} is not within 0..${n}`);
  const out: Uint8Array[] = [];
  if (size1 === 0 || size1 === n) return out;
  subproof(leafHashes, size1, 0, n, true, out);
  return out;
}

function equal(a: Uint8Array, b: Uint8Array): boolean {
  if (a.length !== b.length) return false;
  let d = 0;
  for (let i = 0; i < a.length; i++) d |= a[i]! ^ b[i]!;
  return d === 0;
}

const odd = (x: number): boolean => x % 2 === 1;
const half = (x: number): number => Math.floor(x / 2);

function wellFormed(hashes: readonly Uint8Array[]): boolean {
  return hashes.every((h) => h instanceof Uint8Array && h.length === 32);
}

/**
 * Verifies an inclusion proof (RFC 9162 §2.1.3.2): `leafHash` is leaf `index` of the tree of
 * `size` leaves whose root is `root`. Returns false for any mismatch or out-of-range input;
 * never throws.
 */
export function verifyInclusion(
  leafHash: Uint8Array,
  index: number,
  size: number,
  proof: readonly Uint8Array[],
  root: Uint8Array,
): boolean {
  if (!Number.isSafeInteger(index) || !Number.isSafeInteger(size) || index < 0 || index >= size) return false;
  if (!wellFormed([leafHash, root, ...proof])) return false;
  let fn = index;
  let sn = size - 1;
  let r = leafHash;
  for (const p of proof) {
    if (sn === 0) return false;
    if (odd(fn) || fn === sn) {
      r = merkleNodeHash(p, r);
      if (!odd(fn)) {
        while (!odd(fn) && fn !== 0) {
          fn = half(fn);
          sn = half(sn);
        }
      }
    } else {
      r = merkleNodeHash(r, p);
    }
    fn = half(fn);
    sn = half(sn);
  }
  return sn === 0 && equal(r, root);
}

/**
 * Verifies a consistency proof (RFC 9162 §2.1.4.2) between the tree of `size1` leaves with
 * root `root1` and the tree of `size2` leaves with root `root2`. Returns false for any mismatch
 * or out-of-range input; never throws.
 */
export function verifyConsistency(
  size1: number,
  size2: number,
  proof: readonly Uint8Array[],
  root1: Uint8Array,
  root2: Uint8Array,
): boolean {
  if (!Number.isSafeInteger(size1) || !Number.isSafeInteger(size2) || size1 < 0 || size2 < size1)
    return false;
  if (!wellFormed([root1, root2, ...proof])) return false;
  if (size1 === size2) return proof.length === 0 && equal(root1, root2);
  if (size1 === 0) return proof.length === 0;
  if (proof.length === 0) return false;
  const path = [...proof];
  // size1 a power of two: the first subtree root is root1 itself.
  if (isPowerOfTwo(size1)) path.unshift(root1);
  let fn = size1 - 1;
  let sn = size2 - 1;
  while (odd(fn)) {
    fn = half(fn);
    sn = half(sn);
  }
  let fr = path[0]!;
  let sr = path[0]!;
  for (const c of path.slice(1)) {
    if (sn === 0) return false;
    if (odd(fn) || fn === sn) {
      fr = merkleNodeHash(c, fr);
      sr = merkleNodeHash(c, sr);
      if (!odd(fn)) {
        while (!odd(fn) && fn !== 0) {
          fn = half(fn);
          sn = half(sn);
        }
      }
    } else {
      sr = merkleNodeHash(sr, c);
    }
    fn = half(fn);
    sn = half(sn);
  }
  return sn === 0 && equal(fr, root1) && equal(sr, root2);
}
