import { Injectable } from '@nestjs/common';
import {
  decodeHeader,
  entryHash,
  isHeaderProblem,
  sealedFieldCommitment,
  sealedRoot,
  type CombinedBody,
  type EntryHeader,
  type ObservedBody,
  type Observations,
  type RedactedBody,
  type RollState,
  type SplitBody,
} from '@beadroll/core';
import { DataSource } from 'typeorm';
import { jsonDifferences, replayStoredRoll } from '../ledger/roll-replay';
import { lotViewValues } from '../lots/lot-view.projector';

/**
 * The audit's reason for a lot whose roll verifies but whose stored copies (the columns kept
 * beside each entry's header, the cached state and head, the lot view, sealed commitments) say
 * something else.
 */
export const STORED_COPY = 'stored-copy';

/** One stored value that differs from what the roll says. */
export interface StoredCopyDifference {
  table: string;
  column: string;
  /** The entry, for a column of one entry; null for a value of the lot. */
  seq: number | null;
  stored: string;
  roll: string;
}

interface LotRow {
  id: string;
  code: string;
  head_seq: number;
  head_hash: string;
  head_time: string;
  state: RollState;
}

interface LotProblem {
  seq: number;
  reason: string;
  message: string;
  differences?: StoredCopyDifference[];
}

/** One event of a full-ledger audit, streamed as it runs. */
export type AuditEvent =
  | { type: 'start'; lots: number; startedAt: string }
  | { type: 'progress'; lotsChecked: number; lots: number; entriesChecked: number }
  | {
      type: 'broken';
      lot: string;
      seq: number;
      reason: string;
      message: string;
      /** For `stored-copy`: each stored value that differs from the roll. */
      differences?: StoredCopyDifference[];
    }
  | {
      type: 'done';
      lotsChecked: number;
      entriesChecked: number;
      broken: number;
      ok: boolean;
      finishedAt: string;
    };

const LOT_BATCH = 200;

/**
 * The registrar's full-ledger audit: every roll is streamed from the database in pages through
 * core's incremental verifier (memory stays flat however long a roll is), every parent link a
 * child names is checked against the parent's stored entry, and every copy the database keeps
 * beside the canonical strings is compared with what the roll says: the `seq`, `kind`, `actor`,
 * `time` and `redacts_seq` columns of each entry with its header, the lot's cached head and
 * state with a replay through core's reducer, its `lot_views` row with the same projection the
 * append path writes, and sealed commitments with their values and the header's root.
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
        `SELECT "id", "code", "head_seq", "head_hash", "head_time", "state" FROM "lots"
          WHERE "code" > $1 ORDER BY "code" LIMIT $2`,
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

  private async checkLot(lot: LotRow, counted: (n: number) => void): Promise<LotProblem | null> {
    const diffs: StoredCopyDifference[] = [];
    const differs = (table: string, column: string, seq: number | null, stored: unknown, roll: unknown) =>
      diffs.push({ table, column, seq, stored: shown(stored), roll: shown(roll) });
    let first: EntryHeader | null = null;
    let observations: Observations | null = null;
    const sealedRoots = new Map<number, string>();
    const { result, entries } = await replayStoredRoll(this.dataSource.manager, lot, (row, e) => {
      const h = e.header;
      if (h.seq === 0) first = h;
      // Every column kept beside the canonical header must say what the header says.
      if (row.seq !== h.seq) differs('entries', 'seq', h.seq, row.seq, h.seq);
      if (row.kind !== h.kind) differs('entries', 'kind', h.seq, row.kind, h.kind);
      if (row.actor !== h.actor) differs('entries', 'actor', h.seq, row.actor, h.actor);
      if (row.time !== h.time) differs('entries', 'time', h.seq, row.time, h.time);
      const target = h.kind === 'redacted' && e.body ? (e.body as RedactedBody).target : null;
      if (row.redactsSeq !== target) differs('entries', 'redacts_seq', h.seq, row.redactsSeq, target);
      if (h.kind === 'observed' && e.body) observations = (e.body as ObservedBody).observations;
      if (h.sealed) sealedRoots.set(h.seq, h.sealed);
    });
    counted(entries);
    if (!result.ok) return { seq: result.seq, reason: result.reason, message: result.message };
    const state = JSON.parse(JSON.stringify(result.state)) as RollState;
    const head = result.head;

    if (lot.head_seq !== head.seq) differs('lots', 'head_seq', null, lot.head_seq, head.seq);
    if (lot.head_hash !== head.hash) differs('lots', 'head_hash', null, lot.head_hash, head.hash);
    if (lot.head_time !== head.time) differs('lots', 'head_time', null, lot.head_time, head.time);
    for (const d of jsonDifferences(lot.state, state))
      differs('lots', `state.${d.path}`, null, d.stored, d.expected);

    const views: Array<Record<string, unknown>> = await this.dataSource.query(
      'SELECT * FROM "lot_views" WHERE "lot_id" = $1',
      [lot.id],
    );
    const view = views[0];
    if (!view) differs('lot_views', '(row)', null, 'missing', 'one row');
    else {
      const want = lotViewValues(state, observations);
      for (const [column, value] of Object.entries(want)) {
        for (const d of jsonDifferences(view[column], value)) {
          const at = d.path === '(whole value)' ? column : `${column}.${d.path}`;
          differs('lot_views', at, null, d.stored, d.expected);
        }
      }
      const times: Array<[string, string]> = [
        ['registered_at', (first as EntryHeader | null)?.time ?? ''],
        ['updated_at', head.time],
      ];
      for (const [column, time] of times) {
        const stored = view[column] instanceof Date ? (view[column] as Date).getTime() : NaN;
        if (stored !== new Date(time).getTime())
          differs(
            'lot_views',
            column,
            null,
            view[column] instanceof Date ? (view[column] as Date).toISOString() : view[column],
            time,
          );
      }
    }

    // Sealed values: each commitment recomputed from its salt and value, the commitments of an
    // entry hashed to the root in its header. (A closed account's own values may be gone.)
    const sealed: Array<{ seq: number; name: string; salt: string; value: string; commitment: string }> =
      await this.dataSource.query(
        `SELECT e."seq", s."name", s."salt", s."value", s."commitment" FROM "sealed_fields" s
           JOIN "entries" e ON e."id" = s."entry_id" WHERE e."lot_id" = $1 ORDER BY e."seq", s."name"`,
        [lot.id],
      );
    const bySeq = new Map<number, Record<string, string>>();
    for (const f of sealed) {
      let value: unknown;
      try {
        value = JSON.parse(f.value);
      } catch {
        value = f.value;
      }
      const commitment = sealedFieldCommitment(f.name, f.salt, value);
      if (commitment !== f.commitment)
        differs('sealed_fields', `${f.name} (value or salt)`, f.seq, f.commitment, commitment);
      bySeq.set(f.seq, { ...(bySeq.get(f.seq) ?? {}), [f.name]: f.commitment });
    }
    for (const [seq, commitments] of bySeq) {
      const root = sealedRoots.get(seq) ?? null;
      const got = sealedRoot(commitments);
      if (got !== root) differs('sealed_fields', 'commitment', seq, got, root);
    }

    const parents = (first as EntryHeader | null)?.parents ?? [];
    for (const p of parents) {
      const rows: Array<{ hash: string; header: string; body: string | null }> = await this.dataSource.query(
        `SELECT e."hash", e."header", b."body" FROM "entries" e JOIN "lots" l ON l."id" = e."lot_id"
         LEFT JOIN "entry_bodies" b ON b."entry_id" = e."id" WHERE l."code" = $1 AND e."seq" = $2`,
        [p.lot, p.seq],
      );
      const row = rows[0];
      let named = false;
      const h = row ? decodeHeader(row.header) : null;
      if (row?.body && h && !isHeaderProblem(h) && (h.kind === 'split' || h.kind === 'combined')) {
        const b = JSON.parse(row.body) as SplitBody | CombinedBody;
        named = 'children' in b ? b.children.some((c) => c.lot === lot.code) : b.child === lot.code;
      }
      if (!row || row.hash !== p.hash || entryHash(row.header) !== p.hash || !named) {
        return { seq: 0, reason: 'bad-parent', message: `parent entry ${p.lot} seq ${p.seq} does not match` };
      }
    }

    if (diffs.length === 0) return null;
    const seqs = diffs.map((d) => d.seq).filter((x): x is number => x !== null);
    return {
      seq: seqs.length > 0 ? Math.min(...seqs) : head.seq,
      reason: STORED_COPY,
      message: `a stored copy differs from the roll: ${diffs
        .slice(0, 8)
        .map(
          (d) =>
            `${d.table}.${d.column}${d.seq === null ? '' : ` at seq ${d.seq}`} is ${d.stored}, the roll says ${d.roll}`,
        )
        .join('; ')}${diffs.length > 8 ? `; and ${diffs.length - 8} more` : ''}`,
      differences: diffs,
    };
  }
}

/** Shows a stored or derived value in a message, briefly. */
function shown(value: unknown): string {
  const text = value === undefined ? 'absent' : (JSON.stringify(value) ?? String(value));
  return text.length > 80 ? `${text.slice(0, 77)}…` : text;
}
