import {
  createRollVerifier,
  type RollState,
  type RollVerification,
  type StoredEntry,
  type VerifiedEntry,
} from '@beadroll/core';
import type { EntityManager } from 'typeorm';

/** One stored entry row with every column the ledger keeps beside the canonical strings. */
export interface StoredEntryRow extends StoredEntry {
  id: string;
  seq: number;
  kind: string;
  actor: string;
  time: string;
  redactsSeq: number | null;
}

/**
 * A lot's stored entry rows in seq order, from `fromSeq`, at most `limit`, only of `kinds` when
 * given. A redacted entry's body is null.
 */
export async function readEntryRows(
  manager: EntityManager,
  lotId: string,
  opts: { fromSeq?: number; limit?: number; kinds?: string[] } = {},
): Promise<Array<StoredEntryRow & { logIndex: number | null }>> {
  const rows: EntryRowColumns[] = await manager.query(
    `SELECT e."id", e."seq", e."kind", e."actor", e."time", e."hash", e."header", b."body",
            e."redacts_seq", e."log_index"
       FROM "entries" e LEFT JOIN "entry_bodies" b ON b."entry_id" = e."id"
      WHERE e."lot_id" = $1 AND e."seq" >= $2 AND ($4::text[] IS NULL OR e."kind" = ANY($4))
      ORDER BY e."seq" LIMIT $3`,
    [lotId, opts.fromSeq ?? 0, opts.limit ?? 1_000_000, opts.kinds ?? null],
  );
  return rows.map(storedEntryRowOf);
}

/** An entry row with its body as the database answers it (column names as stored). */
export interface EntryRowColumns {
  id: string;
  seq: number;
  kind: string;
  actor: string;
  time: string;
  hash: string;
  header: string;
  body: string | null;
  redacts_seq: number | null;
  log_index: string | null;
}

/** A row as read from the database, as the replay and its visitors take it. */
export function storedEntryRowOf(r: EntryRowColumns): StoredEntryRow & { logIndex: number | null } {
  return {
    id: r.id,
    seq: r.seq,
    kind: r.kind,
    actor: r.actor,
    time: r.time,
    hash: r.hash,
    header: r.header,
    body: r.body,
    redactsSeq: r.redacts_seq,
    logIndex: r.log_index === null ? null : Number(r.log_index),
  };
}

/** How many entries are read from the database at once while a roll is replayed. */
export const REPLAY_PAGE = 500;

/**
 * Replays a stored roll through core's incremental verifier, a page of entries at a time (memory
 * stays flat however long the roll is), and returns core's verdict: the derived state and head,
 * or the first failure. `visit` sees each row once core has accepted it, with its decoded entry.
 * Run it inside the transaction that holds the lot's row lock when the result decides a write.
 */
export async function replayStoredRoll(
  manager: EntityManager,
  lot: { id: string; code: string },
  visit?: (row: StoredEntryRow, entry: VerifiedEntry) => void,
): Promise<{ result: RollVerification; entries: number }> {
  const v = createRollVerifier(lot.code);
  let from = 0;
  let entries = 0;
  for (;;) {
    const rows = await readEntryRows(manager, lot.id, { fromSeq: from, limit: REPLAY_PAGE });
    entries += rows.length;
    for (const row of rows) {
      const failure = v.push(row);
      if (failure) return { result: failure, entries };
      visit?.(row, v.last!);
    }
    if (rows.length < REPLAY_PAGE) break;
    from = rows[rows.length - 1]!.seq + 1;
  }
  return { result: v.finish(), entries };
}

/** What a caller of {@link refreshCachedStates} does with each lot whose roll verifies. */
export interface RefreshVisitor {
  /** Sees each entry once core has accepted it. */
  entry?(row: StoredEntryRow, entry: VerifiedEntry): void;
  /** Runs after the lot's cached state was rewritten, with that state. */
  done(state: RollState): Promise<void>;
}

/**
 * Rewrites every lot's cached head and state in `lots` from a replay of its roll through
 * today's core, for rolls that verify (broken rolls are left for the audit to report), and
 * lets `forLot` refresh what other modules derive from the same replay. Returns how many lots
 * were rewritten.
 */
export async function refreshCachedStates(
  manager: EntityManager,
  forLot: (lot: { id: string; code: string }) => RefreshVisitor,
): Promise<number> {
  let after = '';
  let refreshed = 0;
  for (;;) {
    const lots: Array<{ id: string; code: string }> = await manager.query(
      'SELECT "id", "code" FROM "lots" WHERE "code" > $1 ORDER BY "code" LIMIT 200',
      [after],
    );
    if (lots.length === 0) return refreshed;
    for (const lot of lots) {
      after = lot.code;
      const visitor = forLot(lot);
      const { result } = await replayStoredRoll(manager, lot, (row, e) => visitor.entry?.(row, e));
      if (!result.ok) continue;
      const state = JSON.parse(JSON.stringify(result.state)) as RollState;
      await manager.query(
        'UPDATE "lots" SET "head_seq" = $2, "head_hash" = $3, "head_time" = $4, "state" = $5 WHERE "id" = $1',
        [lot.id, state.head.seq, state.head.hash, state.head.time, JSON.stringify(state)],
      );
      await visitor.done(state);
      refreshed++;
    }
  }
}

/** One place where a stored JSON value differs from the expected one. */
export interface JsonDifference {
  path: string;
  stored: unknown;
  expected: unknown;
}

/**
 * Where two JSON values differ, by path (`holder`, `openOffer.recipient`, `opinions[2]`), at
 * most `limit` places. Key order does not count (PostgreSQL's jsonb keeps its own).
 */
export function jsonDifferences(stored: unknown, expected: unknown, limit = 10): JsonDifference[] {
  const out: JsonDifference[] = [];
  const walk = (a: unknown, b: unknown, at: string): void => {
    if (out.length >= limit || a === b) return;
    if (Array.isArray(a) && Array.isArray(b) && a.length === b.length) {
      a.forEach((x, i) => walk(x, b[i], `${at}[${i}]`));
      return;
    }
    if (a && b && typeof a === 'object' && typeof b === 'object' && !Array.isArray(a) && !Array.isArray(b)) {
      const ao = a as Record<string, unknown>;
      const bo = b as Record<string, unknown>;
      const keys = [...new Set([...Object.keys(ao), ...Object.keys(bo)])].sort();
      for (const k of keys) walk(ao[k], bo[k], at ? `${at}.${k}` : k);
      return;
    }
    out.push({ path: at || '(whole value)', stored: a, expected: b });
  };
  walk(stored, expected, '');
  return out;
}
