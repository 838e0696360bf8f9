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
      const lots: Array<{ id: string; code: string; head_seq: number; head_hash: string }> =
        await this.dataSource.query(
          `SELECT "id", "code", "head_seq", "head_hash" FROM "lots" WHERE "code" > $1 ORDER BY "code" LIMIT $2`,
          [after, LOT_BATCH],
        );
      if (lots.length === 0) break;
      for (const lot of lots) {
        after = lot.code;
        const problem = await this.checkLot(lot, (n) => (entriesChecked += n));
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

  private async checkLot(
    lot: { id: string; code: string; head_seq: number; head_hash: string },
    counted: (n: number) => void,
  ): Promise<{ seq: number; reason: string; message: string } | null> {
    const v = createRollVerifier(lot.code);
    let from = 0;
    let first: EntryHeader | null = null;
    for (;;) {
      const page = await this.reader.entries(lot.id, { fromSeq: from, limit: ENTRY_BATCH });
      counted(page.length);
      for (const e of page) {
        const f = v.push(e);
        if (f) return { seq: f.seq, reason: f.reason, message: f.message };
        if (e.seq === 0) first = v.last!.header;
      }
      if (page.length < ENTRY_BATCH) break;
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
