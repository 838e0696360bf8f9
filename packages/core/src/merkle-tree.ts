import { MerkleError } from './errors.js';
import { EMPTY_TREE_HASH, merkleNodeHash } from './merkle.js';

function largestPowerOfTwoBelow(n: number): number {
  let k = 1;
  while (k * 2 < n) k *= 2;
  return k;
}

/** log2 of n when n is a power of two, else -1; integer arithmetic only. */
function exactLog2(n: number): number {
  let x = n;
  let l = 0;
  while (x > 1) {
    if (x % 2 !== 0) return -1;
    x /= 2;
    l++;
  }
  return x === 1 ? l : -1;
}

/**
 * An append-only RFC 6962 / RFC 9162 Merkle tree that keeps the hash of every complete
 * subtree, so a root, an inclusion proof or a consistency proof for any size up to the current
 * one costs O(log² n) node hashes instead of O(n). Its answers are exactly those of
 * `merkleRoot`, `inclusionProof` and `consistencyProof` over the first `size` leaves.
 */
export class MerkleTree {
  /** levels[k][i] = hash of leaves [i·2^k, (i+1)·2^k); only complete subtrees. */
  private readonly levels: Uint8Array[][] = [[]];

  /** Builds a tree from leaf hashes (each 32 bytes). */
  constructor(leafHashes: Iterable<Uint8Array> = []) {
    for (const h of leafHashes) this.append(h);
  }

  /** Number of leaves. */
  get size(): number {
    return this.levels[0]!.length;
  }

  /** Appends one leaf hash (32 bytes, already hashed as a leaf: `merkleLeafHash(data)`). */
  append(leafHash: Uint8Array): void {
    if (!(leafHash instanceof Uint8Array) || leafHash.length !== 32)
      throw new MerkleError('bad-hash', 'a leaf hash is 32 bytes');
    this.levels[0]!.push(leafHash);
    let k = 0;
    while (this.levels[k]!.length % 2 === 0) {
      const level = this.levels[k]!;
      const node = merkleNodeHash(level[level.length - 2]!, level[level.length - 1]!);
      if (!this.levels[k + 1]) this.levels.push([]);
      this.levels[k + 1]!.push(node);
      k++;
    }
  }

  /** The leaf hash at `index`. Precondition: 0 ≤ index < size. */
  leaf(index: number): Uint8Array {
    this.checkIndex(index, this.size);
    return this.levels[0]![index]!;
  }

  private mth(lo: number, hi: number): Uint8Array {
    const n = hi - lo;
    if (n === 0) return EMPTY_TREE_HASH;
    const l = exactLog2(n);
    if (l >= 0 && lo % n === 0) return this.levels[l]![lo / n]!;
    const k = largestPowerOfTwoBelow(n);
    return merkleNodeHash(this.mth(lo, lo + k), this.mth(lo + k, hi));
  }

  private checkSize(size: number): void {
    if (!Number.isSafeInteger(size) || size < 0 || size > this.size)
      throw new MerkleError('bad-size', `size ${size} is not within 0..${this.size}`);
  }

  private checkIndex(index: number, size: number): void {
    if (!Number.isSafeInteger(index) || index < 0 || index >= size)
      throw new MerkleError('bad-index', `leaf ${index} is not in a tree of ${size}`);
  }

  /** Root of the tree of the first `size` leaves (default: all). Throws `bad-size` beyond the tree. */
  root(size: number = this.size): Uint8Array {
    this.checkSize(size);
    return this.mth(0, size);
  }

  /**
   * Inclusion proof (RFC 6962 PATH, leaf side first) of leaf `index` in the tree of the first
   * `size` leaves. Throws `bad-size` or `bad-index` when out of range.
   */
  inclusionProof(index: number, size: number = this.size): Uint8Array[] {
    this.checkSize(size);
    this.checkIndex(index, size);
    const out: Uint8Array[] = [];
    let lo = 0;
    let hi = size;
    let m = index;
    const stack: Uint8Array[] = [];
    while (hi - lo > 1) {
      const k = largestPowerOfTwoBelow(hi - lo);
      if (m < k) {
        stack.push(this.mth(lo + k, hi));
        hi = lo + k;
      } else {
        stack.push(this.mth(lo, lo + k));
        lo = lo + k;
        m -= k;
      }
    }
    for (let i = stack.length - 1; i >= 0; i--) out.push(stack[i]!);
    return out;
  }

  /**
   * Consistency proof (RFC 6962 PROOF) from the tree of the first `from` leaves to the tree of
   * the first `to` leaves. Empty when from is 0 or equals to. Throws `bad-size` unless
   * 0 ≤ from ≤ to ≤ size.
   */
  consistencyProof(from: number, to: number = this.size): Uint8Array[] {
    this.checkSize(to);
    if (!Number.isSafeInteger(from) || from < 0 || from > to)
      throw new MerkleError('bad-size', `size ${from} is not within 0..${to}`);
    if (from === 0 || from === to) return [];
    const siblings: Uint8Array[] = [];
    let base: Uint8Array | undefined;
    let lo = 0;
    let hi = to;
    let m = from;
    let whole = true;
    for (;;) {
      const n = hi - lo;
      if (m === n) {
        if (!whole) base = this.mth(lo, hi);
        break;
      }
      const k = largestPowerOfTwoBelow(n);
      if (m <= k) {
        siblings.push(this.mth(lo + k, hi));
        hi = lo + k;
      } else {
        siblings.push(this.mth(lo, lo + k));
        lo = lo + k;
        m -= k;
        whole = false;
      }
    }
    // The RFC's recursion emits the innermost node first; this loop met them outermost first.
    const out: Uint8Array[] = base ? [base] : [];
    for (let i = siblings.length - 1; i >= 0; i--) out.push(siblings[i]!);
    return out;
  }
}
