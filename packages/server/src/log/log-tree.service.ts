import { Injectable } from '@nestjs/common';
import { entryLeafHash, MerkleTree } from '@beadroll/core';
import { LogLeavesService } from '../ledger/log-leaves.service';

const PAGE = 10_000;

/** No entry has a log index below the log's size: an entry was removed. */
export class LogGapError extends Error {
  constructor(readonly index: number) {
    super(`the log has no leaf ${index}`);
  }
}

/**
 * This instance's copy of the ledger-wide Merkle tree, read from the entries by log index and
 * extended as the log grows. The signer rebuilds it from the database before every signature,
 * so what is signed is always what the database holds.
 */
@Injectable()
export class LogTreeService {
  private tree = new MerkleTree();
  private hashes: string[] = [];
  private loading?: Promise<void>;

  constructor(private readonly log: LogLeavesService) {}

  /** The tree, holding at least `size` leaves. Precondition: `size` ≤ the committed log size. */
  async atLeast(size: number): Promise<MerkleTree> {
    while (this.tree.size < size) {
      this.loading ??= this.extend(size).finally(() => {
        this.loading = undefined;
      });
      await this.loading;
    }
    return this.tree;
  }

  /** Entry hashes (hex) of leaves [start, end). Precondition: end ≤ the tree's size. */
  hashesIn(start: number, end: number): string[] {
    return this.hashes.slice(start, end);
  }

  /** Reads every leaf up to `size` again from the database and replaces the cached tree. */
  async rebuild(size: number): Promise<MerkleTree> {
    const hashes = await this.read(0, size);
    const tree = new MerkleTree(hashes.map(entryLeafHash));
    this.tree = tree;
    this.hashes = hashes;
    return tree;
  }

  private async extend(size: number): Promise<void> {
    const from = this.tree.size;
    const hashes = await this.read(from, size);
    if (this.tree.size !== from) return; // a rebuild ran meanwhile
    for (const h of hashes) {
      this.tree.append(entryLeafHash(h));
      this.hashes.push(h);
    }
  }

  private async read(from: number, to: number): Promise<string[]> {
    const out: string[] = [];
    for (let start = from; start < to; start += PAGE) {
      const end = Math.min(to, start + PAGE);
      const rows = await this.log.leaves(start, end);
      rows.forEach((r, i) => {
        if (r.logIndex !== start + i) throw new LogGapError(start + i);
        out.push(r.hash);
      });
      if (rows.length !== end - start) throw new LogGapError(start + rows.length);
    }
    return out;
  }
}
