import { Injectable } from '@nestjs/common';
import { DataSource, type EntityManager } from 'typeorm';

/**
 * The ledger-wide log as the ledger numbers it: its size (how many entries the sequencer has
 * given a log index) and the entries by log index. The log module builds its Merkle tree,
 * checkpoints and proofs from these reads.
 */
@Injectable()
export class LogLeavesService {
  constructor(private readonly dataSource: DataSource) {}

  /** How many entries have a log index (indices 0 to size − 1), read in the caller's transaction when given. */
  async size(manager: EntityManager = this.dataSource.manager): Promise<number> {
    const [{ size }] = (await manager.query('SELECT "size" FROM "log_head" WHERE "id" = 1')) as Array<{
      size: string;
    }>;
    return Number(size);
  }

  /** The entries with log indices in [start, end), by index: each one's index and hash (hex). */
  async leaves(start: number, end: number): Promise<Array<{ logIndex: number; hash: string }>> {
    const rows: Array<{ hash: string; log_index: string }> = await this.dataSource.query(
      `SELECT "hash", "log_index" FROM "entries" WHERE "log_index" >= $1 AND "log_index" < $2
        ORDER BY "log_index"`,
      [start, end],
    );
    return rows.map((r) => ({ logIndex: Number(r.log_index), hash: r.hash }));
  }

  /**
   * How many entries have log indices in [start, end), and the SHA-256 (hex) of their entry
   * hashes (hex) written one after the other by index, computed in the database: a range of
   * leaves compared with a copy without reading them.
   */
  async digest(start: number, end: number): Promise<{ count: number; sha256: string }> {
    const [row] = (await this.dataSource.query(
      `SELECT count(*)::int AS "count",
              encode(sha256(convert_to(coalesce(string_agg("hash", '' ORDER BY "log_index"), ''), 'UTF8')), 'hex') AS "sha256"
         FROM "entries" WHERE "log_index" >= $1 AND "log_index" < $2`,
      [start, end],
    )) as Array<{ count: number; sha256: string }>;
    return row!;
  }

  /**
   * The newest entry of a lot (by canonical code) at or below seq `maxSeq` whose log index is
   * below `size`, or null.
   */
  async latestCovered(
    code: string,
    size: number,
    maxSeq: number,
  ): Promise<{ seq: number; logIndex: number } | null> {
    const rows: Array<{ seq: number; log_index: string }> = await this.dataSource.query(
      `SELECT e."seq", e."log_index" FROM "entries" e JOIN "lots" l ON l."id" = e."lot_id"
        WHERE l."code" = $1 AND e."log_index" < $2 AND e."seq" <= $3 ORDER BY e."seq" DESC LIMIT 1`,
      [code, size, maxSeq],
    );
    const r = rows[0];
    return r ? { seq: r.seq, logIndex: Number(r.log_index) } : null;
  }
}
