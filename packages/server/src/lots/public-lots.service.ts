import { Injectable } from '@nestjs/common';
import {
  BUNDLE_VERSION,
  SYSTEM_ACTOR,
  type Bundle,
  type BundleCheckpoint,
  type EntryHeader,
  type TransferOfferedBody,
} from '@beadroll/core';
import type { EntityManager } from 'typeorm';
import { StandbyService, type ReadSource } from '../standby/standby.service';
import { DealerCardsService, type DealerCard } from '../accounts/dealer-cards.service';
import { AppError } from '../common/app-error';
import { BundleService } from '../ledger/bundle.service';
import { RollReaderService } from '../ledger/roll-reader.service';
import { CheckpointsService } from '../log/checkpoints.service';
import { LogService } from '../log/log.service';
import type { PublicBundle, PublicLotResponse } from './dto/public-lot.dto';
import {
  cardAccounts,
  publicLotText,
  readPublicLot,
  readPublicLotKey,
  weakEtag,
  type NamedStatementPool,
} from './public-lot-text';
import { PublicLotCache, type PublicLotAnswer } from './public-lot-cache';

export type { PublicLotAnswer } from './public-lot-cache';

export { READ_FROM_HEADER } from '../standby/read-from';

/** The pg pool under a TypeORM manager (the primary's or the standby's), for a named statement. */
function poolOf(manager: EntityManager): NamedStatementPool {
  return (manager.connection.driver as unknown as { master: NamedStatementPool }).master;
}

const answerOf = (text: string): PublicLotAnswer => ({ text, etag: weakEtag(text), copies: {} });

const sameList = (a: readonly string[], b: readonly string[]) =>
  a === b || (a.length === b.length && a.every((x, i) => x === b[i]));

/** The one answer to any code that is not a listed lot: no hint of why. */
function notFound(): AppError {
  return new AppError('not_found', 'Not found.');
}

/**
 * Copies a bundle member by member into the public shape, so nothing but the ledger format's
 * own fields can ever leave (the stored rows hold no sealed values, and this keeps it so).
 */
export function toPublicBundle(b: Bundle): PublicBundle {
  return {
    format: 'beadroll-bundle',
    version: BUNDLE_VERSION,
    rolls: b.rolls.map((r) => ({
      lot: r.lot,
      scope: r.scope,
      entries: r.entries.map((e) => ({ hash: e.hash, header: e.header, body: e.body, logIndex: e.logIndex })),
    })),
    checkpoints: (b.checkpoints as BundleCheckpoint[]).map((c) => ({
      note: c.note,
      inclusions: c.inclusions.map((i) => ({
        lot: i.lot,
        seq: i.seq,
        logIndex: i.logIndex,
        proof: [...i.proof],
      })),
    })),
  };
}

/**
 * Public data of listed lots, for buyers without an account. Any code that is not a listed lot
 * — unknown, unlisted, malformed, with a wrong check symbol — gets the same bare 404.
 */
@Injectable()
export class PublicLotsService {
  private readonly cache = new PublicLotCache();

  constructor(
    private readonly bundles: BundleService,
    private readonly cards: DealerCardsService,
    private readonly standby: StandbyService,
    private readonly log: LogService,
    private readonly checkpoints: CheckpointsService,
  ) {}

  /**
   * The serialised {@link PublicLotResponse} of a listed lot. A lot without parents — nearly
   * every lot — takes one statement and is written by PostgreSQL; a split child or combined piece
   * takes the bundle walk over its ancestors.
   */
  async lotText(text: string): Promise<string> {
    return (await this.lotRead(text)).answer.text;
  }

  /**
   * {@link lotText}, and where it was read: the hot standby while it is close enough behind,
   * else the primary (see `StandbyService`). A lot without parents takes one statement; a split
   * child or combined piece walks its ancestors on the same connection. A signed-in reader
   * (`signedIn`) always reads the primary, so a dealer sees what they have just written.
   * A lot without parents is answered again with the answer composed last time while a read of
   * what it depends on (head, stored text of the roll, card columns, checkpoint member) finds
   * them unchanged.
   */
  async lotRead(text: string, signedIn = false): Promise<{ answer: PublicLotAnswer; from: ReadSource }> {
    const code = RollReaderService.canonicalCode(text);
    if (!code) throw notFound();
    const { manager, from } = await this.standby.reader(signedIn);
    const pool = poolOf(manager);
    const cached = this.cache.get(code);
    const digestOf = cached?.named ?? [];
    const key = await readPublicLotKey(pool, code, digestOf);
    if (!key) {
      this.cache.delete(code);
      throw notFound();
    }
    const latest = await this.checkpoints.latest();
    if (
      cached &&
      key.head === cached.head &&
      key.roll === cached.roll &&
      key.accounts === cached.accounts &&
      sameList(cached.digestOf, cached.named)
    ) {
      const p = cached.proved;
      if (p.latest === latest && p.seq === key.head_seq && p.logIndex === key.head_log_index)
        return { answer: cached.answer, from };
      if ((await this.checkpointText(code, key)) === cached.checkpoints) {
        cached.proved = { latest, seq: key.head_seq, logIndex: key.head_log_index };
        return { answer: cached.answer, from };
      }
    }
    const row = await readPublicLot(pool, code);
    if (!row) {
      this.cache.delete(code);
      throw notFound();
    }
    if (row.has_parents) return { answer: answerOf(JSON.stringify(await this.lotFrom(code, manager))), from };
    const checkpoints = await this.checkpointText(code, row);
    const answer = answerOf(publicLotText(code, row, checkpoints));
    const named = cardAccounts(row.entries);
    const proved = { latest, seq: row.head_seq, logIndex: row.head_log_index };
    this.cache.set(code, {
      head: key.head,
      roll: key.roll,
      accounts: key.accounts,
      digestOf,
      named,
      checkpoints,
      proved,
      answer,
    });
    return { answer, from };
  }

  /**
   * The checkpoint member of a lot without parents: the proof is of the head as this read saw
   * it (the standby may be a moment behind).
   */
  private async checkpointText(
    code: string,
    head: { head_seq: number; head_log_index: string | null },
  ): Promise<string> {
    const checkpoint = await this.log.rollCheckpoint(code, {
      seq: head.head_seq,
      logIndex: head.head_log_index === null ? null : Number(head.head_log_index),
    });
    return checkpoint ? JSON.stringify([checkpoint]) : '[]';
  }

  /** The public data of a listed lot, built from its bundle (ancestors included). */
  async lot(text: string): Promise<PublicLotResponse> {
    const code = RollReaderService.canonicalCode(text);
    if (!code) throw notFound();
    const { manager } = await this.standby.reader();
    await this.listedCode(code, manager);
    return this.lotFrom(code, manager);
  }

  /** The public data of the listed lot `code`, every row read through `manager`. */
  private async lotFrom(code: string, manager: EntityManager): Promise<PublicLotResponse> {
    const bundle = await this.bundleFrom(code, manager);
    const ids = new Set<string>();
    for (const r of bundle.rolls)
      for (const e of r.entries) {
        const h = JSON.parse(e.header) as EntryHeader;
        if (h.actor !== SYSTEM_ACTOR) ids.add(h.actor);
        if (h.kind === 'transfer-offered' && e.body !== null)
          ids.add((JSON.parse(e.body) as TransferOfferedBody).recipient);
      }
    const found = await this.cards.cardsFor([...ids], manager);
    const cards: Record<string, DealerCard> = {};
    for (const [id, card] of found) cards[id] = card;
    return { code, bundle, cards };
  }

  /**
   * The export bundle of a listed lot and where it was read (the standby while close enough
   * behind, else the primary; always the primary for a signed-in reader).
   */
  async bundleRead(
    text: string,
    signedIn = false,
  ): Promise<{ code: string; bundle: PublicBundle; from: ReadSource }> {
    const { manager, from } = await this.standby.reader(signedIn);
    const code = await this.listedCode(text, manager);
    return { code, bundle: await this.bundleFrom(code, manager), from };
  }

  /** The bundle of a listed lot: unlisted ancestors only in link scope. */
  private async bundleFrom(code: string, manager: EntityManager): Promise<PublicBundle> {
    const b = await this.bundles.bundleFor(code, (_lot, state) => state.listed, manager);
    if (!b) throw notFound();
    return toPublicBundle(b);
  }

  /** The canonical code of a listed lot, or the bare 404. */
  async listedCode(text: string, manager?: EntityManager): Promise<string> {
    const code = RollReaderService.canonicalCode(text);
    if (!code) throw notFound();
    const m = manager ?? (await this.standby.reader()).manager;
    const rows: unknown[] = await m.query('SELECT 1 FROM "lot_views" WHERE "code" = $1 AND "listed"', [code]);
    if (rows.length === 0) throw notFound();
    return code;
  }
}
