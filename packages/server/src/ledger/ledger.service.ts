import { Inject, Injectable, Logger } from '@nestjs/common';
import {
  bodyDigest,
  buildEntry,
  canonicalise,
  decodeHeader,
  entryHash,
  isHeaderProblem,
  checkTransition,
  verifyRoll,
  generateLotCode,
  isCanonicalLotCode,
  reduceEntry,
  ValidationError,
  type BuiltEntry,
  type CombinedBody,
  type EntryKind,
  type RedactionReason,
  type RollState,
  type SealedFieldName,
  type SplitBody,
} from '@beadroll/core';
import { DataSource, type EntityManager } from 'typeorm';
import { AppError } from '../common/app-error';
import { LedgerClock } from './ledger.clock';
import { LEDGER_RANDOM, type LedgerRandom } from './ledger.tokens';
import type { AppendDraft, AppendedEntry, RegisterDraft, RollProjector } from './ledger.types';
import { replayStoredRoll, jsonDifferences } from './roll-replay';
import { issuesToFields } from './roll-rule.error';
import { LogSequencer } from './log-sequencer';

const log = new Logger('ledger');

interface LockedLot {
  id: string;
  code: string;
  state: RollState;
}

/** Options of one append or registration. */
export interface AppendOptions {
  /** Renames core's field paths (`body.description`) to the request's field names in 400 answers. */
  fields?: Record<string, string>;
}

function refusal(e: unknown, fields: Record<string, string> = {}): never {
  if (e instanceof ValidationError) throw AppError.validation(issuesToFields(e.issues, fields));
  throw e;
}

function transitionError(code: 'bad-actor' | 'bad-transition', message: string): AppError {
  return code === 'bad-actor' ? new AppError('forbidden', message) : new AppError('roll_rule', message);
}

/**
 * One transaction over one or more rolls, holding the row lock of every lot it touches. Every
 * write to any roll goes through {@link RollTransaction.append} or {@link RollTransaction.register}:
 * core checks the transition, core builds the entry, the entry is inserted and the head moves.
 */
export class RollTransaction {
  private readonly locked = new Map<string, LockedLot>();
  /** Ids of the entries this transaction inserted, in the order written. */
  readonly written: string[] = [];

  constructor(
    readonly manager: EntityManager,
    private readonly random: LedgerRandom,
    private readonly projectors: RollProjector[],
    /**
     * One time for the whole transaction, so parent links never point into the future. It moves
     * forward only when a locked lot's head is later (a transaction that committed while this
     * one waited for its lock), and then stays there for every later entry of this transaction.
     */
    private time: string,
  ) {}

  /**
   * Locks an existing lot (`SELECT … FOR UPDATE`); callers lock several in {@link LedgerService.withLots}
   * order. The state every rule of this transaction checks against is derived here, under the
   * lock, by replaying the stored roll through core's verifier: the cached state and head in
   * `lots` are never trusted for a decision. A roll that does not verify takes no entry; a
   * cached copy the roll contradicts is logged, and the append rewrites it from the roll.
   */
  async lock(code: string): Promise<LockedLot> {
    const have = this.locked.get(code);
    if (have) return have;
    const rows: Array<{
      id: string;
      code: string;
      state: RollState;
      head_seq: number;
      head_hash: string;
      head_time: string;
    }> = await this.manager.query(
      'SELECT "id", "code", "state", "head_seq", "head_hash", "head_time" FROM "lots" WHERE "code" = $1 FOR UPDATE',
      [code],
    );
    const row = rows[0];
    if (!row) throw new AppError('not_found', 'Not found.');
    const { result } = await replayStoredRoll(this.manager, row);
    if (!result.ok) {
      log.error(
        `lot ${code}: the stored roll does not verify at seq ${result.seq} (${result.reason}: ${result.message}); nothing is appended to it`,
      );
      throw new AppError(
        'internal',
        `The stored history of lot ${code} does not check out, so nothing can be added to it until the registrar has looked into it.`,
      );
    }
    const derived = JSON.parse(JSON.stringify(result.state)) as RollState;
    const cached = {
      state: row.state,
      head: { seq: row.head_seq, hash: row.head_hash, time: row.head_time },
    };
    const stale = jsonDifferences(cached, {
      state: derived,
      head: { seq: derived.head.seq, hash: derived.head.hash, time: derived.head.time },
    });
    if (stale.length > 0)
      log.error(
        `lot ${code}: cached copies differ from the roll (${stale.map((d) => d.path).join(', ')}); the roll decides`,
      );
    const lot = { id: row.id, code: row.code, state: derived };
    this.locked.set(code, lot);
    return lot;
  }

  /**
   * A state stored before the rules tracked sale times and correctable entries lacks those
   * fields: it is derived again from the lot's verified entries (once; the next write stores it).
   */
  private async current(lotId: string, state: RollState): Promise<RollState> {
    if (Array.isArray(state.descriptionSeqs) && state.soldTime !== undefined) return state;
    const rows: Array<{ hash: string; header: string; body: string | null }> = await this.manager.query(
      `SELECT e."hash", e."header", b."body" FROM "entries" e
       LEFT JOIN "entry_bodies" b ON b."entry_id" = e."id" WHERE e."lot_id" = $1 ORDER BY e."seq"`,
      [lotId],
    );
    const v = verifyRoll(rows);
    if (!v.ok) throw new AppError('internal', `the roll of lot ${state.lot} does not verify`);
    return v.state;
  }

  /** The derived state of a locked lot (after any entries this transaction appended). */
  state(code: string): RollState {
    const lot = this.locked.get(code);
    if (!lot) throw new Error(`lot ${code} is not locked in this transaction`);
    return lot.state;
  }

  /** Draws a fresh lot code that no lot has yet. */
  async newCode(): Promise<string> {
    for (;;) {
      const code = generateLotCode(this.random);
      const rows: unknown[] = await this.manager.query('SELECT 1 FROM "lots" WHERE "code" = $1', [code]);
      if (rows.length === 0) return code;
    }
  }

  /** Appends one entry to a lot this transaction has locked (or locks it now). */
  async append<K extends EntryKind>(
    code: string,
    draft: AppendDraft<K>,
    options: AppendOptions = {},
  ): Promise<AppendedEntry> {
    const lot = await this.lock(code);
    const state = lot.state;
    if (this.time < state.head.time) this.time = state.head.time;
    const time = this.time;
    let built: BuiltEntry;
    try {
      built = buildEntry(
        state.head,
        { kind: draft.kind, actor: draft.actor, time, body: draft.body, sealed: draft.sealed },
        { random: this.random },
      );
    } catch (e) {
      refusal(e, options.fields);
    }
    const t = checkTransition(state, { kind: draft.kind, actor: draft.actor, body: built.body, time });
    if (!t.ok) throw transitionError(t.code, t.message);
    const next = reduceEntry(state, { header: built.header, hash: built.stored.hash, body: built.body });
    const entry = await this.insert(lot.id, built, next, draft.sealedAlsoVisibleTo);
    await this.manager.query(
      'UPDATE "lots" SET "head_seq" = $2, "head_hash" = $3, "head_time" = $4, "state" = $5 WHERE "id" = $1',
      [lot.id, built.header.seq, built.stored.hash, built.header.time, JSON.stringify(next)],
    );
    lot.state = next;
    await this.project(lot.id, entry);
    return entry;
  }

  /** Opens a new roll with its `registered` entry; the new lot stays locked in this transaction. */
  async register(draft: RegisterDraft, options: AppendOptions = {}): Promise<AppendedEntry> {
    const code = draft.code ?? (await this.newCode());
    if (!isCanonicalLotCode(code)) throw new AppError('bad_request', 'not a canonical lot code');
    let built: BuiltEntry;
    try {
      built = buildEntry(
        null,
        {
          lot: code,
          kind: 'registered',
          actor: draft.actor,
          time: this.time,
          body: { description: draft.description },
          parents: draft.parents,
          sealed: draft.sealed,
        },
        { random: this.random },
      );
    } catch (e) {
      refusal(e, options.fields);
    }
    const t = checkTransition(null, { kind: 'registered', actor: draft.actor, body: built.body });
    if (!t.ok) throw transitionError(t.code, t.message);
    for (const p of draft.parents ?? []) await this.checkParent(p, code);
    const state = reduceEntry(null, { header: built.header, hash: built.stored.hash, body: built.body });
    const rows: Array<{ id: string }> = await this.manager.query(
      `INSERT INTO "lots" ("code", "head_seq", "head_hash", "head_time", "state")
       VALUES ($1, 0, $2, $3, $4) ON CONFLICT ON CONSTRAINT "uq_lots_code" DO NOTHING RETURNING "id"`,
      [code, built.stored.hash, built.header.time, JSON.stringify(state)],
    );
    if (rows.length === 0) throw new AppError('conflict', `lot ${code} already exists`);
    const lot = { id: rows[0]!.id, code, state };
    this.locked.set(code, lot);
    const entry = await this.insert(lot.id, built, state, draft.sealedAlsoVisibleTo);
    await this.project(lot.id, entry);
    return entry;
  }

  /**
   * Appends a `redacted` entry and deletes the target's body: the only path that removes
   * anything, and the database admits the deletion only once the `redacted` entry is on the
   * roll. Callers admit only the registrar.
   */
  async redact(code: string, actor: string, target: number, reason: RedactionReason): Promise<AppendedEntry> {
    const entry = await this.append(code, { kind: 'redacted', actor, body: { target, reason } });
    await this.manager.query(`SELECT set_config('beadroll.redaction', 'on', true)`);
    await this.manager.query(
      `DELETE FROM "entry_bodies" WHERE "entry_id" =
         (SELECT e."id" FROM "entries" e WHERE e."lot_id" = $1 AND e."seq" = $2)`,
      [this.locked.get(code)!.id, target],
    );
    await this.manager.query(`SELECT set_config('beadroll.redaction', 'off', true)`);
    return entry;
  }

  /**
   * A parent named by a new child must be a `split`/`combined` entry naming the child. Read from
   * the entry's canonical header and body (their hash and digest checked), never from the
   * `kind` column beside them.
   */
  private async checkParent(p: { lot: string; seq: number; hash: string }, child: string): Promise<void> {
    const rows: Array<{ hash: string; header: string; body: string | null }> = await this.manager.query(
      `SELECT e."hash", e."header", b."body" FROM "entries" e JOIN "lots" l ON l."id" = e."lot_id"
       LEFT JOIN "entry_bodies" b ON b."entry_id" = e."id" WHERE l."code" = $1 AND e."seq" = $2`,
      [p.lot, p.seq],
    );
    const row = rows[0];
    const bad = (why: string) => new AppError('roll_rule', `parent ${p.lot} seq ${p.seq} ${why}`);
    if (!row || row.hash !== p.hash || entryHash(row.header) !== p.hash)
      throw bad('is not on the ledger with that hash');
    const header = decodeHeader(row.header);
    if (
      isHeaderProblem(header) ||
      (header.kind !== 'split' && header.kind !== 'combined') ||
      !row.body ||
      bodyDigest(row.body) !== header.body
    )
      throw bad('is not a split or combined entry');
    const body = JSON.parse(row.body) as SplitBody | CombinedBody;
    const names = 'children' in body ? body.children.map((c) => c.lot) : [body.child];
    if (!names.includes(child)) throw bad(`does not name ${child}`);
  }

  private async insert(
    lotId: string,
    built: BuiltEntry,
    state: RollState,
    alsoVisibleTo: Partial<Record<SealedFieldName, string[]>> = {},
  ): Promise<AppendedEntry> {
    const h = built.header;
    const redacts = h.kind === 'redacted' ? (built.body as { target: number }).target : null;
    const rows: Array<{ id: string }> = await this.manager.query(
      `INSERT INTO "entries" ("lot_id", "seq", "kind", "actor", "time", "hash", "header", "redacts_seq")
       VALUES ($1, $2, $3, $4, $5, $6, $7, $8) RETURNING "id"`,
      [lotId, h.seq, h.kind, h.actor, h.time, built.stored.hash, built.stored.header, redacts],
    );
    const entryId = rows[0]!.id;
    this.written.push(entryId);
    await this.manager.query('INSERT INTO "entry_bodies" ("entry_id", "body") VALUES ($1, $2)', [
      entryId,
      built.stored.body,
    ]);
    for (const f of built.sealed?.fields ?? []) {
      const viewers = [...new Set([h.actor, ...(alsoVisibleTo[f.name] ?? [])])];
      await this.manager.query(
        `INSERT INTO "sealed_fields" ("entry_id", "name", "salt", "value", "commitment", "visible_to")
         VALUES ($1, $2, $3, $4, $5, $6)`,
        [entryId, f.name, f.salt, canonicalise(f.value), f.commitment, viewers],
      );
    }
    return {
      lot: h.lot,
      seq: h.seq,
      kind: h.kind,
      hash: built.stored.hash,
      time: h.time,
      actor: h.actor,
      header: built.stored.header,
      body: built.stored.body!,
      state,
    };
  }

  private async project(lotId: string, entry: AppendedEntry): Promise<void> {
    for (const p of this.projectors) await p.project(this.manager, lotId, entry);
  }
}

/**
 * The one append path of the ledger. Each call is one database transaction: the lots involved
 * are locked in a fixed order (their codes, sorted), core's rules decide, core builds each
 * entry, and the entries, bodies, sealed fields, heads and derived views are written together
 * or not at all. Appends to one lot serialise on its row lock; different lots do not block each
 * other. After each commit the log sequencer is asked to number the new entries (see
 * {@link LogSequencer}); the append does not wait for it.
 */
@Injectable()
export class LedgerService {
  private readonly projectors: RollProjector[] = [];

  constructor(
    private readonly dataSource: DataSource,
    private readonly clock: LedgerClock,
    @Inject(LEDGER_RANDOM) private readonly random: LedgerRandom,
    private readonly sequencer: LogSequencer,
  ) {}

  /** Adds a projector run inside every append transaction (the lot view, later others). */
  addProjector(p: RollProjector): void {
    this.projectors.push(p);
  }

  /**
   * Runs `fn` in one transaction after locking every lot in `codes` (canonical codes), in
   * sorted order so that two transactions over the same lots never deadlock. New lots made in
   * `fn` (split and combined children) need no lock. An unknown code is a 404.
   */
  async withLots<T>(codes: string[], fn: (tx: RollTransaction) => Promise<T>): Promise<T> {
    const result = await this.dataSource.transaction('READ COMMITTED', async (manager) => {
      const tx = new RollTransaction(manager, this.random, this.projectors, this.clock.now().toISOString());
      for (const code of [...new Set(codes)].sort()) await tx.lock(code);
      return fn(tx);
    });
    this.sequencer.kick();
    return result;
  }

  /** Appends one entry to one lot, in its own transaction. */
  append<K extends EntryKind>(
    code: string,
    draft: AppendDraft<K>,
    options?: AppendOptions,
  ): Promise<AppendedEntry> {
    return this.withLots([code], (tx) => tx.append(code, draft, options));
  }

  /**
   * Deletes the sealed values an account being closed recorded for itself alone, inside the
   * closing transaction `m`; their salted commitments stay in the headers, so every roll still
   * verifies. A value shared with the other party of a transfer is that party's record too: it
   * stays. The database refuses the delete unless this transaction names the closing account.
   */
  async forgetSealedValuesOf(accountId: string, m: EntityManager): Promise<void> {
    await m.query(`SELECT set_config('beadroll.closing_account', $1, true)`, [accountId]);
    await m.query(
      `DELETE FROM "sealed_fields" s USING "entries" e
        WHERE e."id" = s."entry_id" AND e."actor" = $1::text AND s."visible_to" = ARRAY[$1::varchar]`,
      [accountId],
    );
    await m.query(`SELECT set_config('beadroll.closing_account', '', true)`);
  }

  /** Registers one new lot, in its own transaction. */
  register(draft: RegisterDraft, options?: AppendOptions): Promise<AppendedEntry> {
    return this.withLots([], (tx) => tx.register(draft, options));
  }
}
