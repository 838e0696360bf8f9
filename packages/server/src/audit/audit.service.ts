import { Injectable } from '@nestjs/common';
import {
  decodeHeader,
  entryHash,
  isHeaderProblem,
  sealedFieldCommitment,
  sealedRoot,
  type CombinedBody,
  type ExhibitAddedBody,
  type ExhibitRef,
  type RollState,
  type SoldBody,
  type SplitBody,
  type TransferAnswerBody,
  type TransferOfferedBody,
} from '@beadroll/core';
import { DataSource, type EntityManager } from 'typeorm';
import { jsonDifferences, replayStoredRoll } from '../ledger/roll-replay';
import { DERIVED_COLUMNS, lotViewValues } from '../lots/lot-view.projector';
import { sameJson } from './same-json';
import {
  shown,
  startReplay,
  replayLots,
  ENTRIES_BY_LOT_RANGE,
  type EntryRowOf,
  type KeptEntry,
  type LotReplay,
  type StoredCopyDifference,
} from './lot-replay';
import { OFFER_ENDINGS } from '../transfers/transfer.projector';
import { attributionRecordOf } from '../lots/attribution-record';
import { RollReaderService } from '../ledger/roll-reader.service';

/**
 * The audit's reason for a lot whose roll verifies but whose stored copies (the columns kept
 * beside each entry's header, the cached state and head, the lot view, sealed commitments) say
 * something else.
 */
export const STORED_COPY = 'stored-copy';

export type { StoredCopyDifference } from './lot-replay';

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

/** Lots checked per batch, and most entries a batch reads at once. */
const LOT_BATCH = 500;
/** A lot's row as the checks compare it, and how many entries its roll holds. */
const LOT_COLUMNS = `"id", "code", "head_seq", "head_hash", "head_time", "state", "head_seq" + 1 AS "entries"`;
const BATCH_ENTRIES = 20_000;
/** Batches read (or being read) ahead of the one being checked. */
const READ_AHEAD = 2;

/** The pg client or pool under a manager, for a statement whose rows come as arrays. */
interface ArrayQueryable {
  query(q: { text: string; values: unknown[]; rowMode: 'array' }): Promise<{ rows: unknown[][] }>;
}

/** The lot view's columns the audit compares: every derived one and the two timestamps. */
const VIEW_COLUMNS = ['lot_id', ...DERIVED_COLUMNS, 'registered_at', 'updated_at']
  .map((c) => `"${c}"`)
  .join(', ');

interface SealedRow {
  lot_id: string;
  seq: number;
  name: string;
  salt: string;
  value: string;
  commitment: string;
  visible_to: string[];
}

interface ExhibitRow {
  lot_id: string;
  seq: number;
  lot_code: string;
  added_by: string;
  sealed: boolean;
  original_sha256: string;
  ref: ExhibitRef;
}

interface OfferRow {
  lot_id: string;
  code: string;
  offer_seq: number;
  offerer: string;
  recipient: string | null;
  status: string;
  offered_at: Date;
  answer_seq: number | null;
  answered_at: Date | null;
}

interface SaleRow {
  lot_id: string;
  code: string;
  seq: number;
  seller: string;
  sold_on: string;
  recorded_at: Date;
}

/** A batch of lots and the rows of theirs the audit compares, by lot id. */
interface LotBatch {
  lots: LotRow[];
  /** Where the next batch reads on from (the last lot id read); null when every lot was read. */
  after: string | null;
  /** Lots read but left for the next batch. */
  rest: Array<LotRow & { entries: number }>;
  /**
   * Each lot's roll replayed from the rows read with
   * the batch; a lot missing here is replayed from the database a page at a time.
   */
  replays: Promise<Map<string, LotReplay>>;
  views: Map<string, Record<string, unknown>>;
  sealed: Map<string, SealedRow[]>;
  exhibits: Map<string, ExhibitRow[]>;
  offers: Map<string, OfferRow[]>;
  sales: Map<string, SaleRow[]>;
}

/**
 * The registrar's full-ledger audit: every roll is streamed from the database through core's
 * incremental verifier, lots in batches read with one statement per table, a roll longer than a
 * batch a page at a time (memory stays flat however long a roll is), every parent link a
 * child names is checked against the parent's stored entry, and every copy the database keeps
 * beside the canonical strings is compared with what the roll says: the `seq`, `kind`, `actor`,
 * `time` and `redacts_seq` columns of each entry with its header, the lot's cached head and
 * state with a replay through core's reducer, its `lot_views` row with the same projection the
 * append path writes, and sealed commitments with their values and the header's root.
 */
@Injectable()
export class AuditService {
  /** Reads rolls for deriving each lot's attribution on record, as the projector does. */
  private readonly reader: RollReaderService;

  constructor(private readonly dataSource: DataSource) {
    this.reader = new RollReaderService(dataSource);
  }

  async *run(progressEvery = 50): AsyncGenerator<AuditEvent> {
    const [{ n }] = (await this.dataSource.query('SELECT count(*)::int AS "n" FROM "lots"')) as Array<{
      n: number;
    }>;
    yield { type: 'start', lots: n, startedAt: new Date().toISOString() };
    let lotsChecked = 0;
    let entriesChecked = 0;
    let broken = 0;
    // The next batches are read, one after another, while this one is checked.
    const readAfter = (previous: Promise<LotBatch>) => {
      const read = previous.then((b) => (b.lots.length === 0 ? b : this.readBatch(b.after, b.rest)));
      read.catch(() => undefined); // awaited in its turn; a failure is thrown there
      return read;
    };
    let last = this.readBatch('', []);
    const ahead = [last];
    while (ahead.length < READ_AHEAD) ahead.push((last = readAfter(last)));
    for (;;) {
      const batch = await ahead.shift()!;
      if (batch.lots.length === 0) break;
      ahead.push((last = readAfter(last)));
      const replays = await batch.replays;
      for (const lot of batch.lots) {
        const first = await this.checkLot(
          lot,
          replays.get(lot.id),
          (n) => (entriesChecked += n),
          batch,
          this.dataSource.manager,
        );
        const problem = first && (await this.recheck(lot.id));
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
   * The next lots in id order (those left over from the last batch, then those after `after`:
   * the last lot id read, '' before the first batch, null once every lot has been read),
   * up to LOT_BATCH lots or BATCH_ENTRIES entries, with every row the checks compare, read in one
   * statement per table by a range of lot ids (an index range, in the order the checks take
   * them). A roll longer than BATCH_ENTRIES comes alone and is replayed a page at a time, so
   * memory stays flat.
   */
  private async readBatch(
    after: string | null,
    rest: Array<LotRow & { entries: number }>,
  ): Promise<LotBatch> {
    let lots = rest;
    let last = after;
    if (lots.length < LOT_BATCH && last !== null) {
      const more: Array<LotRow & { entries: number }> = await this.dataSource.query(
        `SELECT ${LOT_COLUMNS} FROM "lots" WHERE $1::uuid IS NULL OR "id" > $1::uuid ORDER BY "id" LIMIT $2`,
        [last === '' ? null : last, LOT_BATCH],
      );
      last = more.length < LOT_BATCH ? null : more[more.length - 1]!.id;
      lots = [...lots, ...more];
    }
    let total = 0;
    let count = 0;
    while (count < lots.length && (count === 0 || total + lots[count]!.entries <= BATCH_ENTRIES))
      total += lots[count++]!.entries;
    return this.readRows(lots.slice(0, count), total, last, lots.slice(count), this.dataSource.manager);
  }

  /** Every row the checks compare of these consecutive lots (in id order), read through `m`. */
  private async readRows(
    chosen: LotRow[],
    total: number,
    after: string | null,
    rest: Array<LotRow & { entries: number }>,
    m: EntityManager,
  ): Promise<LotBatch> {
    const batch: LotBatch = {
      lots: chosen,
      after,
      rest,
      replays: Promise.resolve(new Map()),
      views: new Map(),
      sealed: new Map(),
      exhibits: new Map(),
      offers: new Map(),
      sales: new Map(),
    };
    if (chosen.length === 0) return batch;
    // The chosen lots are consecutive in id order: every row of theirs lies in this id range.
    const range = [chosen[0]!.id, chosen[chosen.length - 1]!.id];
    const byLot = <T extends { lot_id: string }>(rows: T[], into: Map<string, T[]>) => {
      let lot = '';
      let list: T[] = [];
      for (const r of rows) {
        if (r.lot_id !== lot) {
          lot = r.lot_id;
          list = into.get(lot) ?? [];
          into.set(lot, list);
        }
        list.push(r);
      }
    };
    if (total <= BATCH_ENTRIES) {
      const replays = this.arrays(m, ENTRIES_BY_LOT_RANGE, range).then((rows) =>
        replayLots(chosen, rows as EntryRowOf[]),
      );
      batch.replays = replays.then((r) => new Map(chosen.map((l, i) => [l.id, r[i]!])));
      batch.replays.catch(() => undefined); // awaited in its turn; a failure is thrown there
    }
    const [views, sealed, exhibits, offers, sales] = await Promise.all([
      m.query(`SELECT ${VIEW_COLUMNS} FROM "lot_views" WHERE "lot_id" BETWEEN $1 AND $2`, range) as Promise<
        Array<Record<string, unknown> & { lot_id: string }>
      >,
      m.query(
        `SELECT e."lot_id", e."seq", s."name", s."salt", s."value", s."commitment", s."visible_to" FROM "sealed_fields" s
           JOIN "entries" e ON e."id" = s."entry_id" WHERE e."lot_id" BETWEEN $1 AND $2 ORDER BY e."lot_id", e."seq", s."name"`,
        range,
      ) as Promise<SealedRow[]>,
      m.query(
        `SELECT "lot_id", "seq", "lot_code", "added_by", "sealed", "original_sha256", "ref" FROM "exhibits"
          WHERE "lot_id" BETWEEN $1 AND $2 ORDER BY "lot_id", "seq"`,
        range,
      ) as Promise<ExhibitRow[]>,
      m.query(
        `SELECT "lot_id", "code", "offer_seq", "offerer", "recipient", "status", "offered_at", "answer_seq", "answered_at"
           FROM "transfer_offers" WHERE "lot_id" BETWEEN $1 AND $2 ORDER BY "lot_id", "offer_seq"`,
        range,
      ) as Promise<OfferRow[]>,
      m.query(
        `SELECT "lot_id", "code", "seq", "seller", "sold_on"::text AS "sold_on", "recorded_at" FROM "sales"
          WHERE "lot_id" BETWEEN $1 AND $2 ORDER BY "lot_id", "seq"`,
        range,
      ) as Promise<SaleRow[]>,
    ]);
    for (const v of views) batch.views.set(v.lot_id, v);
    byLot(sealed, batch.sealed);
    byLot(exhibits, batch.exhibits);
    byLot(offers, batch.offers);
    byLot(sales, batch.sales);
    return batch;
  }

  /**
   * Runs a statement through the pg client under `m` (a transaction's) or else the pool, its
   * rows as arrays of column values: no object per row for the driver to build or to collect.
   */
  private async arrays(m: EntityManager, text: string, values: unknown[]): Promise<unknown[][]> {
    const client = (
      m.queryRunner
        ? await m.queryRunner.connect()
        : (this.dataSource.driver as unknown as { master: ArrayQueryable }).master
    ) as ArrayQueryable;
    return (await client.query({ text, values, rowMode: 'array' })).rows;
  }

  /**
   * Reads one lot again, every table in one REPEATABLE READ snapshot, and checks it again: a
   * batch reads its tables in separate statements, so an entry appended between two of them
   * would otherwise look like a stored copy that disagrees with the roll.
   */
  private recheck(id: string): Promise<LotProblem | null> {
    return this.dataSource.transaction('REPEATABLE READ', async (m) => {
      const [lot] = (await m.query(`SELECT ${LOT_COLUMNS} FROM "lots" WHERE "id" = $1`, [id])) as Array<
        LotRow & { entries: number }
      >;
      if (!lot) return null;
      const batch = await this.readRows([lot], lot.entries, null, [], m);
      return this.checkLot(lot, (await batch.replays).get(lot.id), () => undefined, batch, m);
    });
  }

  private async checkLot(
    lot: LotRow,
    replayed: LotReplay | undefined,
    counted: (n: number) => void,
    batch: LotBatch,
    m: EntityManager,
  ): Promise<LotProblem | null> {
    let replay = replayed;
    if (!replay) {
      // A roll longer than a batch: replayed here, a page at a time.
      const start = startReplay();
      const { result, entries } = await replayStoredRoll(m, lot, (row, e) =>
        start.visit({ ...row, redacts_seq: row.redactsSeq }, e),
      );
      replay = Object.assign(start.replay, { result, entries });
    }
    const { result, observations, sealedRoots, sealedActors, offerRecipients, kept } = replay;
    const diffs: StoredCopyDifference[] = [...replay.differences];
    const differs = (table: string, column: string, seq: number | null, stored: unknown, roll: unknown) =>
      diffs.push({ table, column, seq, stored: shown(stored), roll: shown(roll) });
    counted(replay.entries);
    if (!result.ok) return { seq: result.seq, reason: result.reason, message: result.message };
    const head = result.head;

    if (lot.head_seq !== head.seq) differs('lots', 'head_seq', null, lot.head_seq, head.seq);
    if (lot.head_hash !== head.hash) differs('lots', 'head_hash', null, lot.head_hash, head.hash);
    if (lot.head_time !== head.time) differs('lots', 'head_time', null, lot.head_time, head.time);
    // The state as JSON keeps it; a stored state found equal already is that (read afresh per batch).
    let state: RollState;
    if (sameJson(lot.state, result.state)) state = lot.state;
    else {
      state = JSON.parse(JSON.stringify(result.state)) as RollState;
      for (const d of jsonDifferences(lot.state, state))
        differs('lots', `state.${d.path}`, null, d.stored, d.expected);
    }

    const view = batch.views.get(lot.id);
    if (!view) differs('lot_views', '(row)', null, 'missing', 'one row');
    else {
      const want = lotViewValues(state, observations, await attributionRecordOf(this.reader, state));
      for (const [column, value] of Object.entries(want)) {
        if (sameJson(view[column], value)) continue;
        for (const d of jsonDifferences(view[column], value)) {
          const at = d.path === '(whole value)' ? column : `${column}.${d.path}`;
          differs('lot_views', at, null, d.stored, d.expected);
        }
      }
      const times: Array<[string, string]> = [
        ['registered_at', replay.registeredAt ?? ''],
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
    const sealed = batch.sealed.get(lot.id) ?? [];
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
      // Readable by the dealer who recorded it, and a transfer price by that offer's recipient too.
      const actor = sealedActors.get(f.seq);
      const recipient = f.name === 'transfer-price' ? offerRecipients.get(f.seq) : undefined;
      const readers = [actor, ...(recipient ? [recipient] : [])].filter((x): x is string => !!x).sort();
      if (JSON.stringify([...f.visible_to].sort()) !== JSON.stringify(readers))
        differs('sealed_fields', `${f.name} (readers)`, f.seq, f.visible_to.join(', '), readers.join(', '));
    }
    // The values of a closed account's own entries are deleted on purpose; every other entry
    // whose header commits sealed fields keeps them. Which actors are closed is asked only when
    // an entry's fields are missing or differ.
    let closed: Set<string> | null = null;
    const isClosed = async (actor: string) => {
      closed ??= new Set(
        (
          (await m.query(
            `SELECT "id"::text AS "id" FROM "accounts" WHERE "status" = 'closed' AND "id"::text = ANY($1)`,
            [[...new Set(sealedActors.values())]],
          )) as Array<{ id: string }>
        ).map((r) => r.id),
      );
      return closed.has(actor);
    };
    for (const [seq, root] of sealedRoots) {
      const commitments = bySeq.get(seq);
      if (!commitments) {
        if (!(await isClosed(sealedActors.get(seq)!)))
          differs('sealed_fields', '(missing)', seq, 'none', 'its fields');
        continue;
      }
      const got = sealedRoot(commitments);
      if (got !== root && !(await isClosed(sealedActors.get(seq)!)))
        differs('sealed_fields', 'commitment', seq, got, root);
    }
    for (const seq of bySeq.keys())
      if (!sealedRoots.has(seq)) differs('sealed_fields', 'commitment', seq, 'fields', 'no sealed root');

    await this.checkFeatureRows(lot, kept, sealed, differs, batch);

    for (const p of replay.parents) {
      const rows: Array<{ hash: string; header: string; body: string | null }> = await m.query(
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

  /**
   * The rows other features write in the append transaction, each a copy of one entry: the
   * exhibit rows files are served by, the transfer offers and the sales lists.
   */
  private async checkFeatureRows(
    lot: LotRow,
    kept: Map<number, KeptEntry>,
    sealed: Array<{ seq: number; name: string; value: string }>,
    differs: (table: string, column: string, seq: number | null, stored: unknown, roll: unknown) => void,
    batch: LotBatch,
  ): Promise<void> {
    const same = (a: unknown, b: unknown) => jsonDifferences(a, b, 1).length === 0;
    const sameTime = (stored: unknown, time: string) =>
      stored instanceof Date && stored.getTime() === new Date(time).getTime();
    // The kept entry a row of `table` stands for; none (and a difference) when the roll has no `kind` there.
    const entryFor = (table: string, seq: number, kind: string, row: string): KeptEntry | undefined => {
      const e = kept.get(seq);
      if (e?.kind !== kind) differs(table, '(row)', seq, row, e ? `a ${e.kind} entry` : 'no such entry');
      return e?.kind === kind ? e : undefined;
    };
    const exhibits = batch.exhibits.get(lot.id) ?? [];
    for (const x of exhibits) {
      const e = entryFor('exhibits', x.seq, 'exhibit-added', 'an exhibit');
      if (!e) continue;
      if (x.lot_code !== lot.code) differs('exhibits', 'lot_code', x.seq, x.lot_code, lot.code);
      if (x.added_by !== e.actor) differs('exhibits', 'added_by', x.seq, x.added_by, e.actor);
      if (x.original_sha256 !== x.ref?.original?.sha256)
        differs('exhibits', 'original_sha256', x.seq, x.original_sha256, x.ref?.original?.sha256);
      const body = e.body as ExhibitAddedBody | null;
      if (!body) {
        differs('exhibits', '(row)', x.seq, 'an exhibit', 'a removed exhibit');
        continue;
      }
      const isSealed = !('exhibit' in body);
      if (x.sealed !== isSealed) differs('exhibits', 'sealed', x.seq, x.sealed, isSealed);
      const committed =
        'exhibit' in body
          ? body.exhibit
          : (() => {
              const f = sealed.find((s) => s.seq === x.seq && s.name === 'sealed-exhibit');
              return f ? (JSON.parse(f.value) as unknown) : undefined;
            })();
      if (committed !== undefined && !same(x.ref, committed))
        differs('exhibits', 'ref', x.seq, x.ref, committed);
    }

    const offers = batch.offers.get(lot.id) ?? [];
    const offerSeqs = [...kept].filter(([, e]) => e.kind === 'transfer-offered').map(([seq]) => seq);
    for (const seq of offerSeqs)
      if (!offers.some((o) => o.offer_seq === seq))
        differs('transfer_offers', '(row)', seq, 'missing', 'an offer');
    for (const o of offers) {
      const e = entryFor('transfer_offers', o.offer_seq, 'transfer-offered', 'an offer');
      if (!e) continue;
      if (o.code !== lot.code) differs('transfer_offers', 'code', o.offer_seq, o.code, lot.code);
      if (o.offerer !== e.actor) differs('transfer_offers', 'offerer', o.offer_seq, o.offerer, e.actor);
      const recipient = (e.body as TransferOfferedBody | null)?.recipient;
      if (recipient !== undefined && o.recipient !== recipient)
        differs('transfer_offers', 'recipient', o.offer_seq, o.recipient, recipient);
      if (!sameTime(o.offered_at, e.time))
        differs('transfer_offers', 'offered_at', o.offer_seq, o.offered_at, e.time);
      const answer = [...kept].find(
        ([, a]) =>
          OFFER_ENDINGS[a.kind] !== undefined &&
          (a.body as TransferAnswerBody | null)?.offerSeq === o.offer_seq,
      );
      // An answer whose body was removed no longer says which offer it answered.
      const unknown = [...kept].some(([, a]) => OFFER_ENDINGS[a.kind] !== undefined && a.body === null);
      if (!answer && unknown) continue;
      const status = answer ? OFFER_ENDINGS[answer[1].kind]! : 'open';
      if (o.status !== status) differs('transfer_offers', 'status', o.offer_seq, o.status, status);
      if (o.answer_seq !== (answer?.[0] ?? null))
        differs('transfer_offers', 'answer_seq', o.offer_seq, o.answer_seq, answer?.[0] ?? null);
      if (answer ? !sameTime(o.answered_at, answer[1].time) : o.answered_at !== null)
        differs('transfer_offers', 'answered_at', o.offer_seq, o.answered_at, answer?.[1].time ?? null);
    }

    const sales = batch.sales.get(lot.id) ?? [];
    for (const x of sales) {
      const e = entryFor('sales', x.seq, 'sold', 'a sale');
      if (!e) continue;
      if (x.code !== lot.code) differs('sales', 'code', x.seq, x.code, lot.code);
      if (x.seller !== e.actor) differs('sales', 'seller', x.seq, x.seller, e.actor);
      const date = (e.body as SoldBody | null)?.date;
      if (date !== undefined && x.sold_on !== date) differs('sales', 'sold_on', x.seq, x.sold_on, date);
      if (!sameTime(x.recorded_at, e.time)) differs('sales', 'recorded_at', x.seq, x.recorded_at, e.time);
    }
  }
}
