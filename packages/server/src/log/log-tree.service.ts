import { createHash } from 'node:crypto';
import { Injectable } from '@nestjs/common';
import { entryLeafHash, MerkleTree } from '@beadroll/core';
import { LogLeavesService } from '../ledger/log-leaves.service';

/** Leaves read from the database at a time. */
const PAGE = 10_000;
/** Leaves hashed into the tree between two turns of the event loop (about 20 ms of hashing). */
const CHUNK = 1000;
/** How many leaves read in earlier passes each signing pass compares with the database again. */
export const RECHECK_LEAVES = 20_000;

/**
 * Appends leaves to a tree and their entry hashes to its list, a chunk at a time with a turn of
 * the event loop between chunks (the tree hashes in JavaScript: a page of leaves would hold up
 * every request for a fraction of a second). Stops, answering false, once `kept()` is false.
 */
async function appendLeaves(
  tree: MerkleTree,
  hashes: string[],
  page: readonly string[],
  kept: () => boolean = () => true,
): Promise<boolean> {
  for (let i = 0; i < page.length; i += CHUNK) {
    if (i > 0) await new Promise((resolve) => setImmediate(resolve));
    if (!kept()) return false;
    for (const h of page.slice(i, i + CHUNK)) {
      tree.append(entryLeafHash(h));
      hashes.push(h);
    }
  }
  return true;
}

/** No entry has a log index below the log's size: an entry was removed. */
export class LogGapError extends Error {
  constructor(readonly index: number) {
    super(`the log has no leaf ${index}`);
  }
}

/**
 * This instance's copy of the ledger-wide Merkle tree, read from the entries by log index and
 * extended as the log grows, a page at a time. Before each signature the signer reads the
 * leaves it has not read yet and compares the next {@link RECHECK_LEAVES} of those it read
 * before with the database (one digest computed there), going round the whole log pass by
 * pass; any difference or missing leaf makes it read every leaf again, so a changed or removed
 * entry is refused rather than signed (see {@link forSigning}).
 */
@Injectable()
export class LogTreeService {
  private tree = new MerkleTree();
  private hashes: string[] = [];
  private loading?: Promise<void>;
  /** Where the next signing pass's comparison of leaves read before starts. */
  private recheckFrom = 0;
  /** How many leaves read before one signing pass compares (a test may make it smaller). */
  recheckLeaves = RECHECK_LEAVES;

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

  /**
   * The tree holding at least `size` leaves, for a signature: the leaves not read yet are read
   * and appended, and the next {@link RECHECK_LEAVES} leaves read in earlier passes (all of
   * them while the log is smaller) are compared with the database. When they differ or one is
   * missing, every leaf up to `size` is read again ({@link rebuild}): the signer then finds the
   * tree inconsistent with its last checkpoint, or a leaf missing ({@link LogGapError}), and
   * refuses. The comparison moves on only after a pass that found nothing; while a refusal
   * stands the signer asks for every leaf (`readAll`), so it signs again as soon as the log is
   * whole again. Precondition: `size` ≤ the committed log size.
   */
  async forSigning(size: number, readAll = false): Promise<MerkleTree> {
    if (readAll) return this.rebuild(size);
    const readBefore = Math.min(this.tree.size, size);
    await this.atLeast(size);
    if (readBefore === 0) return this.tree;
    const from = this.recheckFrom < readBefore ? this.recheckFrom : 0;
    const to = Math.min(readBefore, from + this.recheckLeaves);
    const held = createHash('sha256');
    for (let i = from; i < to; i++) held.update(this.hashes[i]!);
    const stored = await this.log.digest(from, to);
    if (stored.count !== to - from || stored.sha256 !== held.digest('hex')) return this.rebuild(size);
    this.recheckFrom = to >= readBefore ? 0 : to;
    return this.tree;
  }

  /** Reads every leaf up to `size` again from the database and replaces the cached tree. */
  async rebuild(size: number): Promise<MerkleTree> {
    const tree = new MerkleTree();
    const hashes: string[] = [];
    for (let start = 0; start < size; start += PAGE)
      await appendLeaves(tree, hashes, await this.read(start, Math.min(size, start + PAGE)));
    this.tree = tree;
    this.hashes = hashes;
    this.recheckFrom = 0;
    return tree;
  }

  private async extend(size: number): Promise<void> {
    const tree = this.tree;
    const hashes = this.hashes;
    for (let start = tree.size; start < size; start += PAGE) {
      const page = await this.read(start, Math.min(size, start + PAGE));
      // A rebuild that ran meanwhile replaced the tree: this one is no longer kept.
      if (!(await appendLeaves(tree, hashes, page, () => this.tree === tree))) return;
    }
  }

  /** The entry hashes of leaves [from, to), at most one page. */
  private async read(from: number, to: number): Promise<string[]> {
    const rows = await this.log.leaves(from, to);
    rows.forEach((r, i) => {
      if (r.logIndex !== from + i) throw new LogGapError(from + i);
    });
    if (rows.length !== to - from) throw new LogGapError(from + rows.length);
    return rows.map((r) => r.hash);
  }
}
