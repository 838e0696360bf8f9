import type { Encoding } from './public-lot-fast-path';

/** A composed public answer: its text, its ETag and the compressed copies made of it so far. */
export interface PublicLotAnswer {
  text: string;
  etag: string;
  copies: Partial<Record<Encoding, Buffer>>;
}

/** A composed public answer of a lot without parents, and what it was composed from. */
export interface CachedPublicLot {
  /** The roll's head hash read (before the answer) by PUBLIC_LOT_KEY_SQL. */
  head: string;
  /** The digest of the roll's stored text read with it (PublicLotKeyRow.roll). */
  roll: string;
  /** The accounts digest read with it, over `digestOf`. */
  accounts: string | null;
  /** The accounts that digest covers. */
  digestOf: readonly string[];
  /** The accounts the answer's cards can name (its actors and offer recipients). */
  named: readonly string[];
  /** The answer's checkpoint member text. */
  checkpoints: string;
  /**
   * What that member was last found to be made from: the latest checkpoint (the very object
   * CheckpointsService keeps, replaced when it reads again) and the head it proves.
   */
  proved: { latest: object | null; seq: number; logIndex: string | null };
  answer: PublicLotAnswer;
}

/** At most this many answers are kept, and at most this many characters in all. */
const MAX_LOTS = 2000;
const MAX_CHARS = 32 * 1024 * 1024;

/**
 * Composed public answers by lot code, oldest out first. An answer is only ever served again
 * after a fresh read of what it depends on has found the same head, the same card columns and the
 * same checkpoint member and the same stored text of the roll (PublicLotsService.lotRead), so an append, an account change or a new
 * checkpoint on any instance is seen by the next read, and a read from a standby that is behind
 * never gets an answer it cannot vouch for.
 */
export class PublicLotCache {
  private readonly lots = new Map<string, CachedPublicLot>();
  private chars = 0;

  get(code: string): CachedPublicLot | undefined {
    return this.lots.get(code);
  }

  set(code: string, value: CachedPublicLot): void {
    this.delete(code);
    this.lots.set(code, value);
    this.chars += value.answer.text.length;
    for (const [oldest, v] of this.lots) {
      if (this.lots.size <= MAX_LOTS && this.chars <= MAX_CHARS) break;
      this.lots.delete(oldest);
      this.chars -= v.answer.text.length;
    }
  }

  delete(code: string): void {
    const old = this.lots.get(code);
    if (!old) return;
    this.lots.delete(code);
    this.chars -= old.answer.text.length;
  }
}
