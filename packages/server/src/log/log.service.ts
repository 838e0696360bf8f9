import { Injectable } from '@nestjs/common';
import { base64Encode, type BundleCheckpoint, type LogInclusion } from '@beadroll/core';
import { AppError } from '../common/app-error';
import { LogLeavesService } from '../ledger/log-leaves.service';
import { CheckpointsService, type LatestCheckpoint } from './checkpoints.service';
import { LogTreeService } from './log-tree.service';

/** Most leaves one request may ask for. */
export const MAX_LEAVES = 1000;

/** A roll as far as its checkpoint proof needs: lot, and its entries' seq and log index. */
export interface RollLogEntries {
  lot: string;
  entries: ReadonlyArray<{ seq: number; logIndex: number | null }>;
}

function tooLarge(field: string, size: number): AppError {
  return AppError.validation([
    { field, reason: `is beyond the log's latest checkpoint, which holds ${size} entries` },
  ]);
}

/**
 * Proofs of the ledger-wide log (RFC 9162 §2.1.3–2.1.4) against its signed checkpoints: every
 * size asked for must be covered by the latest checkpoint, so a proof always refers to a tree
 * the log has signed.
 */
@Injectable()
export class LogService {
  constructor(
    private readonly numbered: LogLeavesService,
    private readonly checkpoints: CheckpointsService,
    private readonly tree: LogTreeService,
  ) {}

  private async signedSize(): Promise<number> {
    const latest = await this.checkpoints.latest();
    return latest?.size ?? 0;
  }

  async inclusion(index: number, size: number): Promise<{ index: number; size: number; proof: string[] }> {
    const signed = await this.signedSize();
    if (size > signed) throw tooLarge('size', signed);
    if (index >= size)
      throw AppError.validation([{ field: 'index', reason: `must be smaller than size (${size})` }]);
    const tree = await this.tree.atLeast(size);
    return { index, size, proof: tree.inclusionProof(index, size).map(base64Encode) };
  }

  async consistency(from: number, to: number): Promise<{ from: number; to: number; proof: string[] }> {
    const signed = await this.signedSize();
    if (to > signed) throw tooLarge('to', signed);
    if (from > to)
      throw AppError.validation([{ field: 'from', reason: `must not be larger than to (${to})` }]);
    const tree = await this.tree.atLeast(to);
    return { from, to, proof: tree.consistencyProof(from, to).map(base64Encode) };
  }

  async leaves(start: number, end: number): Promise<{ start: number; end: number; leaves: string[] }> {
    if (start >= end)
      throw AppError.validation([{ field: 'start', reason: `must be smaller than end (${end})` }]);
    if (end - start > MAX_LEAVES)
      throw AppError.validation([
        { field: 'end', reason: `asks for more than ${MAX_LEAVES} leaves at once` },
      ]);
    const signed = await this.signedSize();
    if (end > signed) throw tooLarge('end', signed);
    await this.tree.atLeast(end);
    return { start, end, leaves: this.tree.hashesIn(start, end) };
  }

  /**
   * The bundle's checkpoint member (format §14.5): the latest checkpoint and, for each roll,
   * an inclusion proof of its latest entry that checkpoint covers. Null before the first
   * checkpoint. Rolls none of whose entries are covered yet get no inclusion. `signed`: the
   * checkpoint to prove against, when the caller has already read it.
   */
  async bundleCheckpoint(
    rolls: readonly RollLogEntries[],
    signed?: LatestCheckpoint | null,
  ): Promise<BundleCheckpoint | null> {
    const latest = signed === undefined ? await this.checkpoints.latest() : signed;
    if (!latest) return null;
    const tree = await this.tree.atLeast(latest.size);
    const inclusions: LogInclusion[] = [];
    for (const r of rolls) {
      let best: { seq: number; logIndex: number } | undefined;
      for (const e of r.entries)
        if (e.logIndex !== null && e.logIndex < latest.size && (!best || e.seq > best.seq))
          best = { seq: e.seq, logIndex: e.logIndex };
      if (best)
        inclusions.push({
          lot: r.lot,
          ...best,
          proof: tree.inclusionProof(best.logIndex, latest.size).map(base64Encode),
        });
    }
    return { note: latest.note, inclusions };
  }

  /**
   * The checkpoint member of a bundle holding one roll whose head is `head` (seq and log
   * index); when the head is newer than the checkpoint, the roll's latest covered entry up to
   * the head is read.
   */
  async rollCheckpoint(
    lot: string,
    head: { seq: number; logIndex: number | null },
  ): Promise<BundleCheckpoint | null> {
    const latest = await this.checkpoints.latest();
    if (!latest) return null;
    // The same checkpoint throughout: a newer one read halfway would leave the head unproved.
    if (head.logIndex !== null && head.logIndex < latest.size)
      return this.bundleCheckpoint([{ lot, entries: [head] }], latest);
    const covered = await this.numbered.latestCovered(lot, latest.size, head.seq);
    return this.bundleCheckpoint([{ lot, entries: covered ? [covered] : [] }], latest);
  }
}
