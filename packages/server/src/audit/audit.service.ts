import { Injectable } from '@nestjs/common';
import {
  createRollVerifier,
  sealedFieldCommitment,
  sealedRoot,
  type CombinedBody,
  type EntryHeader,
  type RedactedBody,
  type SplitBody,
  type StoredEntry,
  type TransferOfferedBody,
} from '@beadroll/core';
import { DataSource } from 'typeorm';

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

interface LotRow {
  id: string;
  code: string;
  head_seq: number;
  head_hash: string;
  head_time: string;
  state: unknown;
}
const ENTRY_BATCH = 500;

/** One stored entry with every column the audit compares, and its sealed fields. */
interface AuditRow extends StoredEntry {
  seq: number;
  kind: string;
  actor: string;
  time: string;
  redacts_seq: number | null;
  sealed: Array<{
    name: string;
    salt: string;
    value: string;
    commitment: string;
    visible_to: string[];
  }> | null;
  actor_closed: boolean;
}

type Problem = { seq: number; reason: string; message: string };

/** JSON with its object keys sorted, so a jsonb round trip compares equal to the original. */
function stable(value: unknown): string {
  return JSON.stringify(value, (_k, v: unknown) =>
    v && typeof v === 'object' && !Array.isArray(v)
      ? Object.fromEntries(Object.entries(v as Record<string, unknown>).sort(([a], [b]) => (a < b ? -1 : 1)))
      : v,
  );
}

/**
 * What the stored columns of a verified entry must say: the copies of header fields the
 * database keeps beside the header (seq, kind, actor, time, the redaction's target), and the
 * sealed fields, each reproducing its commitment, together reproducing the header's sealed root
 * (unless some were deleted with their closed account), and readable only by the actor and,
 * for a transfer price, the offer's recipient.
 */
function columnProblem(row: AuditRow, h: EntryHeader, body: unknown): Problem | null {
  const bad = (what: string): Problem => ({
    seq: h.seq,
    reason: 'bad-column',
    message: `the stored ${what} does not match the entry`,
  });
  if (row.seq !== h.seq) return bad('seq');
  if (row.kind !== h.kind) return bad('kind');
  if (row.actor !== h.actor) return bad('actor');
  if (row.time !== h.time) return bad('time');
  const target = h.kind === 'redacted' && body ? (body as RedactedBody).target : null;
  if (h.kind === 'redacted' ? body !== null && row.redacts_seq !== target : row.redacts_seq !== null)
    return bad('redaction target');
  const fields = row.sealed ?? [];
  if (fields.length === 0) return h.sealed === undefined || row.actor_closed ? null : bad('sealed fields');
  if (h.sealed === undefined) return bad('sealed fields');
  const commitments: Record<string, string> = {};
  for (const f of fields) {
    let value: unknown;
    try {
      value = JSON.parse(f.value);
    } catch {
      return bad(`sealed field ${f.name}`);
    }
    if (sealedFieldCommitment(f.name, f.salt, value) !== f.commitment) return bad(`sealed field ${f.name}`);
    commitments[f.name] = f.commitment;
    const recipient =
      h.kind === 'transfer-offered' && f.name === 'transfer-price' && body
        ? (body as TransferOfferedBody).recipient
        : undefined;
    const others = f.visible_to.filter((v) => v !== h.actor);
    if (!f.visible_to.includes(h.actor) || others.some((v) => v !== recipient) || others.length > 1)
      return bad(`readers of sealed field ${f.name}`);
  }
  if (!row.actor_closed && sealedRoot(commitments) !== h.sealed) return bad('sealed fields');
  return null;
}

/**
 * The registrar's full-ledger audit: every roll is streamed from the database in pages through
 * core's incremental verifier (memory stays flat however long a roll is), the columns stored
 * beside each entry are compared with it, its sealed fields with their commitments, the stored
 * head and derived state with the verified roll's, and every parent link a child names is
 * checked against the parent's stored entry.
 */
@Injectable()
export class AuditService {
  constructor(private readonly dataSource: DataSource) {}

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
        `SELECT "id", "code", "head_seq", "head_hash", "head_time", "state" FROM "lots" WHERE "code" > $1 ORDER BY "code" LIMIT $2`,
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

  /** Entries of a lot from `fromSeq` with every column the audit compares. */
  private page(lotId: string, fromSeq: number): Promise<AuditRow[]> {
    return this.dataSource.query(
      `SELECT e."seq", e."kind", e."actor", e."time", e."hash", e."header", b."body", e."redacts_seq",
              (SELECT json_agg(json_build_object('name', s."name", 'salt', s."salt", 'value', s."value",
                                                 'commitment', s."commitment", 'visible_to', s."visible_to"))
                 FROM "sealed_fields" s WHERE s."entry_id" = e."id") AS "sealed",
              EXISTS (SELECT 1 FROM "accounts" a WHERE a."id"::text = e."actor" AND a."status" = 'closed') AS "actor_closed"
         FROM "entries" e LEFT JOIN "entry_bodies" b ON b."entry_id" = e."id"
        WHERE e."lot_id" = $1 AND e."seq" >= $2 ORDER BY e."seq" LIMIT $3`,
      [lotId, fromSeq, ENTRY_BATCH],
    );
  }

  private async checkLot(lot: LotRow, counted: (n: number) => void): Promise<Problem | null> {
    const v = createRollVerifier(lot.code);
    let from = 0;
    let first: EntryHeader | null = null;
    for (;;) {
      const page = await this.page(lot.id, from);
      counted(page.length);
      for (const e of page) {
        const f = v.push(e);
        if (f) return { seq: f.seq, reason: f.reason, message: f.message };
        const column = columnProblem(e, v.last!.header, v.last!.body);
        if (column) return column;
        if (e.seq === 0) first = v.last!.header;
      }
      if (page.length < ENTRY_BATCH) break;
      from = page[page.length - 1]!.seq + 1;
    }
    const r = v.finish();
    if (!r.ok) return { seq: r.seq, reason: r.reason, message: r.message };
    if (r.head.seq !== lot.head_seq || r.head.hash !== lot.head_hash || r.head.time !== lot.head_time) {
      return {
        seq: r.head.seq,
        reason: 'bad-seq',
        message: `the stored head (seq ${lot.head_seq}) is not the last entry on the roll (seq ${r.head.seq})`,
      };
    }
    if (stable(lot.state) !== stable(JSON.parse(JSON.stringify(r.state))))
      return {
        seq: r.head.seq,
        reason: 'bad-state',
        message: 'the stored state of the lot is not what its roll gives',
      };
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
