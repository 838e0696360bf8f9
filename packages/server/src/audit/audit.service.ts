import { Injectable } from '@nestjs/common';
import { createRollVerifier, type CombinedBody, type EntryHeader, type SplitBody } from '@beadroll/core';
import { DataSource } from 'typeorm';
import { RollReaderService } from '../ledger/roll-reader.service';

/** One event of a full-ledger audit, streamed as it runs. */
export type AuditEvent =
  | { type: 'start'; lots: number; startedAt: string }
  | { type: 'progress'; lotsChecked: number; lots: number; entriesChecked: number }
  | { type: 'broken'; lot: string; seq: number; reason: string; message: string }
  | {
      type: 'done';
      lotsChecked: number;
      entriesChecked: number;
      broken: number;
      ok: boolean;
      finishedAt: string;
    };

const LOT_BATCH = 200;
const ENTRY_BATCH = 500;
/** Rolls this short are read together, a batch of lots in one statement. */
const SHORT_ROLL = 50;

type LotRow = { id: string; code: string; head_seq: number; head_hash: string };
type AuditEntry = { seq: number; hash: string; header: string; body: string | null };

/**
 * The registrar's full-ledger audit: every roll is streamed from the database in pages through
 * core's incremental verifier (memory stays flat however long a roll is), its stored head is
 * compared with the last verified entry, and every parent link a child names is checked
 * against the parent's stored entry.
 */
@Injectable()
export class AuditService {
  constructor(
    private readonly dataSource: DataSource,
    private readonly reader: RollReaderService,
  ) {}

  async *run(progressEvery = 50): AsyncGenerator<AuditEvent> {
    const [{ n }] = (await this.dataSource.query('SELECT count(*)::int AS "n" FROM "lots"')) as Array<{
      n: number;
    }>;
    yield { type: 'start', lots: n, startedAt: new Date().toISOString() };
    let lotsChecked = 0;
    let entriesChecked = 0;
    let broken = 0;
    let after = '';
    for (;;) {
      const lots: LotRow[] = await this.dataSource.query(
        `SELECT "id", "code", "head_seq", "head_hash" FROM "lots" WHERE "code" > $1 ORDER BY "code" LIMIT $2`,
        [after, LOT_BATCH],
      );
      if (lots.length === 0) break;
      const short = await this.shortRolls(lots);
      for (const lot of lots) {
        after = lot.code;
        const problem = await this.checkLot(lot, (n) => (entriesChecked += n), short.get(lot.id));
        short.delete(lot.id);
        if (problem) {
          broken++;
          yield { type: 'broken', lot: lot.code, ...problem };
        }
        lotsChecked++;
        if (lotsChecked % progressEvery === 0)
          yield { type: 'progress', lotsChecked, lots: n, entriesChecked };
      }
    }
    yield { type: 'progress', lotsChecked, lots: n, entriesChecked };
    yield {
      type: 'done',
      lotsChecked,
      entriesChecked,
      broken,
      ok: broken === 0,
      finishedAt: new Date().toISOString(),
    };
  }

  /**
   * The entries of the batch's short rolls (by their stored head), read in one statement
   * instead of one per lot: at most LOT_BATCH × SHORT_ROLL entries in memory at once. Longer
   * rolls are read a page at a time by {@link checkLot}.
   */
  private async shortRolls(lots: LotRow[]): Promise<Map<string, AuditEntry[]>> {
    const ids = lots.filter((l) => l.head_seq < SHORT_ROLL).map((l) => l.id);
    const out = new Map<string, AuditEntry[]>();
    if (ids.length === 0) return out;
    const rows: Array<AuditEntry & { lot_id: string }> = await this.dataSource.query(
      `SELECT e."lot_id", e."seq", e."hash", e."header", b."body"
       FROM "entries" e LEFT JOIN "entry_bodies" b ON b."entry_id" = e."id"
       WHERE e."lot_id" = ANY($1::uuid[]) AND e."seq" < $2 ORDER BY e."lot_id", e."seq"`,
      [ids, SHORT_ROLL],
    );
    for (const r of rows) {
      let list = out.get(r.lot_id);
      if (!list) out.set(r.lot_id, (list = []));
      list.push({ seq: r.seq, hash: r.hash, header: r.header, body: r.body });
    }
    // A roll that grew past its stored head while the audit ran is read again page by page.
    for (const l of lots) if (out.get(l.id)?.length === SHORT_ROLL) out.delete(l.id);
    return out;
  }

  private async checkLot(
    lot: LotRow,
    counted: (n: number) => void,
    prefetched?: AuditEntry[],
  ): Promise<{ seq: number; reason: string; message: string } | null> {
    const v = createRollVerifier(lot.code);
    let from = 0;
    let first: EntryHeader | null = null;
    for (;;) {
      const page: AuditEntry[] =
        prefetched ?? (await this.reader.entries(lot.id, { fromSeq: from, limit: ENTRY_BATCH }));
      counted(page.length);
      for (const e of page) {
        const f = v.push(e);
        if (f) return { seq: f.seq, reason: f.reason, message: f.message };
        if (e.seq === 0) first = v.last!.header;
      }
      if (prefetched || page.length < ENTRY_BATCH) break;
      from = page[page.length - 1]!.seq + 1;
    }
    const r = v.finish();
    if (!r.ok) return { seq: r.seq, reason: r.reason, message: r.message };
    if (r.head.seq !== lot.head_seq || r.head.hash !== lot.head_hash) {
      return {
        seq: r.head.seq,
        reason: 'bad-seq',
        message: `the stored head (seq ${lot.head_seq}) is not the last entry on the roll (seq ${r.head.seq})`,
      };
    }
    for (const p of first?.parents ?? []) {
      const rows: Array<{ hash: string; kind: string; body: string | null }> = await this.dataSource.query(
        `SELECT e."hash", e."kind", b."body" FROM "entries" e JOIN "lots" l ON l."id" = e."lot_id"
         LEFT JOIN "entry_bodies" b ON b."entry_id" = e."id" WHERE l."code" = $1 AND e."seq" = $2`,
        [p.lot, p.seq],
      );
      const row = rows[0];
      let named = false;
      if (row?.body && (row.kind === 'split' || row.kind === 'combined')) {
        const b = JSON.parse(row.body) as SplitBody | CombinedBody;
        named = 'children' in b ? b.children.some((c) => c.lot === lot.code) : b.child === lot.code;
      }
      if (!row || row.hash !== p.hash || !named) {
        return { seq: 0, reason: 'bad-parent', message: `parent entry ${p.lot} seq ${p.seq} does not match` };
      }
    }
    return null;
  }
}
