import {
  createRollVerifier,
  TRANSFER_KINDS,
  type EntryHeader,
  type ObservedBody,
  type Observations,
  type RedactedBody,
  type RollVerification,
  type StoredEntry,
  type TransferOfferedBody,
  type VerifiedEntry,
} from '@beadroll/core';

/** One stored value that differs from what the roll says. */
export interface StoredCopyDifference {
  table: string;
  column: string;
  /** The entry, for a column of one entry; null for a value of the lot. */
  seq: number | null;
  stored: string;
  roll: string;
}

/** Entries other features keep a row for, remembered while a roll is replayed (a few per lot). */
const KEPT_KINDS = new Set<string>(['exhibit-added', ...TRANSFER_KINDS, 'sold']);

export interface KeptEntry {
  kind: string;
  actor: string;
  time: string;
  body: unknown;
}

/** The columns of an entry row the audit compares with its header. */
export interface EntryColumns {
  seq: number;
  kind: string;
  actor: string;
  time: string;
  redacts_seq: number | null;
}

/**
 * An entry row as the audit reads it, as an array (no object per row): the columns kept beside
 * the canonical strings, then the strings.
 */
export type EntryRowOf = [
  lot_id: string,
  seq: number,
  kind: string,
  actor: string,
  time: string,
  redacts_seq: number | null,
  hash: string,
  header: string,
  body: string | null,
];

/**
 * The entry rows of the lots whose ids lie between $1 and $2, as EntryRowOf arrays, in the
 * order checked. The body by a subquery, one index probe per entry: a join plans a hash over
 * every body.
 */
export const ENTRIES_BY_LOT_RANGE = `SELECT e."lot_id", e."seq", e."kind", e."actor", e."time", e."redacts_seq",
    e."hash", e."header", (SELECT b."body" FROM "entry_bodies" b WHERE b."entry_id" = e."id")
  FROM "entries" e WHERE e."lot_id" BETWEEN $1 AND $2 ORDER BY e."lot_id", e."seq"`;

/**
 * What the audit keeps of a replayed roll for its other checks: the verification, the
 * differences between each entry's columns and its header, and the few header and body values
 * the checks of the lot's other rows need.
 */
export interface LotReplay {
  result: RollVerification;
  entries: number;
  differences: StoredCopyDifference[];
  /** Seq 0's time and the parents it names. */
  registeredAt: string | null;
  parents: NonNullable<EntryHeader['parents']>;
  /** The last `observed` entry's observations. */
  observations: Observations | null;
  /** Each entry that commits sealed fields: its sealed root and its actor. */
  sealedRoots: Map<number, string>;
  sealedActors: Map<number, string>;
  /** Each transfer offer's recipient, as its header or body names it. */
  offerRecipients: Map<number, string>;
  /** The entries other features keep a row for. */
  kept: Map<number, KeptEntry>;
}

/** Shows a stored or derived value in a message, briefly. */
export function shown(value: unknown): string {
  const text = value === undefined ? 'absent' : (JSON.stringify(value) ?? String(value));
  return text.length > 80 ? `${text.slice(0, 77)}…` : text;
}

/**
 * Starts a replay: `visit` takes each row core has accepted with its decoded entry and compares
 * the columns kept beside the canonical header with the header; `end` adds the verification.
 */
export function startReplay(): {
  replay: LotReplay;
  visit: (row: EntryColumns, e: VerifiedEntry) => void;
} {
  const replay: LotReplay = {
    result: null as unknown as RollVerification,
    entries: 0,
    differences: [],
    registeredAt: null,
    parents: [],
    observations: null,
    sealedRoots: new Map(),
    sealedActors: new Map(),
    offerRecipients: new Map(),
    kept: new Map(),
  };
  const differs = (column: string, seq: number, stored: unknown, roll: unknown) =>
    replay.differences.push({ table: 'entries', column, seq, stored: shown(stored), roll: shown(roll) });
  const visit = (row: EntryColumns, e: VerifiedEntry) => {
    const h = e.header;
    if (h.seq === 0) {
      replay.registeredAt = h.time;
      replay.parents = h.parents ?? [];
    }
    // Every column kept beside the canonical header must say what the header says.
    if (row.seq !== h.seq) differs('seq', h.seq, row.seq, h.seq);
    if (row.kind !== h.kind) differs('kind', h.seq, row.kind, h.kind);
    if (row.actor !== h.actor) differs('actor', h.seq, row.actor, h.actor);
    if (row.time !== h.time) differs('time', h.seq, row.time, h.time);
    const target = h.kind === 'redacted' && e.body ? (e.body as RedactedBody).target : null;
    if (row.redacts_seq !== target) differs('redacts_seq', h.seq, row.redacts_seq, target);
    if (h.kind === 'observed' && e.body) replay.observations = (e.body as ObservedBody).observations;
    if (h.sealed) {
      replay.sealedRoots.set(h.seq, h.sealed);
      replay.sealedActors.set(h.seq, h.actor);
    }
    if (h.kind === 'transfer-offered') {
      const r = h.facts?.recipient ?? (e.body as TransferOfferedBody | null)?.recipient;
      if (r) replay.offerRecipients.set(h.seq, r);
    }
    if (KEPT_KINDS.has(h.kind))
      replay.kept.set(h.seq, { kind: h.kind, actor: h.actor, time: h.time, body: e.body });
  };
  return { replay, visit };
}

/** Replays rows already read (a whole roll in seq order) through core's incremental verifier. */
export function replayRows(code: string, rows: readonly EntryRowOf[]): LotReplay {
  const { replay, visit } = startReplay();
  const v = createRollVerifier(code);
  // One object of each reused for every row: the verifier and `visit` keep none of them.
  const columns: EntryColumns = { seq: 0, kind: '', actor: '', time: '', redacts_seq: null };
  const stored: StoredEntry = { hash: '', header: '', body: null };
  replay.entries = rows.length;
  for (const row of rows) {
    // By index: destructuring an array goes through its iterator.
    columns.seq = row[1];
    columns.kind = row[2];
    columns.actor = row[3];
    columns.time = row[4];
    columns.redacts_seq = row[5];
    stored.hash = row[6];
    stored.header = row[7];
    stored.body = row[8];
    const failure = v.push(stored);
    if (failure) {
      replay.result = failure;
      return replay;
    }
    visit(columns, v.last!);
  }
  replay.result = v.finish();
  return replay;
}

/** Replays each lot's roll from rows of several lots in the order of ENTRIES_BY_LOT_RANGE. */
export function replayLots(
  lots: ReadonlyArray<{ id: string; code: string }>,
  rows: readonly EntryRowOf[],
): LotReplay[] {
  const byLot = new Map(lots.map((l) => [l.id, [] as EntryRowOf[]]));
  let lot = '';
  let list: EntryRowOf[] | undefined;
  for (const r of rows) {
    if (r[0] !== lot) list = byLot.get((lot = r[0]));
    list?.push(r);
  }
  return lots.map((l) => replayRows(l.code, byLot.get(l.id)!));
}
