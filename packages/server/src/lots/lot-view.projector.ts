import { Injectable, type OnModuleInit } from '@nestjs/common';
import type { ObservedBody, Observations, RedactedBody, RollState } from '@beadroll/core';
import type { EntityManager } from 'typeorm';
import { LedgerService } from '../ledger/ledger.service';
import type { AppendedEntry, RollProjector } from '../ledger/ledger.types';
import { RollReaderService } from '../ledger/roll-reader.service';
import { attributionRecordOf, type AttributionRecord } from './attribution-record';
import { attributionWords, decorationWords } from './search-words';

/** Entry kinds after which a lot's descendants may inherit a different attribution on record. */
const INHERITED_KINDS = new Set(['opinion', 'opinion-withdrawn', 'redacted', 'described']);

/** Entry kinds that may seal a storage place (a registration or a new description). */
const STORAGE_KINDS = new Set(['registered', 'described']);

/** Keeps `lot_views` in step with each roll, inside the append transaction. */
@Injectable()
export class LotViewProjector implements RollProjector, OnModuleInit {
  constructor(
    private readonly ledger: LedgerService,
    private readonly reader: RollReaderService,
  ) {}

  onModuleInit(): void {
    this.ledger.addProjector(this);
  }

  async project(m: EntityManager, lotId: string, entry: AppendedEntry): Promise<void> {
    const s = entry.state;
    let observations: Observations | null;
    if (entry.kind === 'observed') {
      observations = (JSON.parse(entry.body) as ObservedBody).observations;
    } else if (entry.kind === 'redacted' || entry.seq === 0) {
      const target = entry.kind === 'redacted' ? (JSON.parse(entry.body) as RedactedBody).target : -1;
      const body = await this.reader.latestBody(lotId, 'observed', target, m);
      observations = body ? (JSON.parse(body) as ObservedBody).observations : null;
    } else {
      const rows: Array<{ observations: Observations | null }> = await m.query(
        'SELECT "observations" FROM "lot_views" WHERE "lot_id" = $1',
        [lotId],
      );
      observations = rows[0]?.observations ?? null;
    }
    const v = lotViewValues(s, observations, await attributionRecordOf(this.reader, s, m));
    await m.query(
      `INSERT INTO "lot_views" ("lot_id", "code", "title", "form", "status", "holder", "listed", "origin",
         "count_value", "count_estimated", "dissent_count", "offer_recipient", "observations", "head_seq",
         "search_text", "registered_at", "updated_at", "technique", "period_from", "period_to", "origin_source")
       VALUES ($1, $2, $3, $4, $5, $6, $7, $8, $9, $10, $11, $12, $13, $14, $15, $16, $16, $17, $18, $19, $20)
       ON CONFLICT ("lot_id") DO UPDATE SET "title" = $3, "form" = $4, "status" = $5, "holder" = $6,
         "listed" = $7, "origin" = $8, "count_value" = $9, "count_estimated" = $10, "dissent_count" = $11,
         "offer_recipient" = $12, "observations" = $13, "head_seq" = $14, "search_text" = $15,
         "updated_at" = $16, "technique" = $17, "period_from" = $18, "period_to" = $19, "origin_source" = $20`,
      [
        lotId,
        v.code,
        v.title,
        v.form,
        v.status,
        v.holder,
        v.listed,
        v.origin,
        v.count_value,
        v.count_estimated,
        v.dissent_count,
        v.offer_recipient,
        v.observations ? JSON.stringify(v.observations) : null,
        v.head_seq,
        v.search_text,
        entry.time,
        v.technique,
        v.period_from,
        v.period_to,
        v.origin_source,
      ],
    );
    if (STORAGE_KINDS.has(entry.kind)) await this.projectStorage(m, lotId, entry.actor);
    if (INHERITED_KINDS.has(entry.kind) && s.children.length > 0) await this.refreshDescendants(m, s);
  }

  /**
   * A descendant without its holder's attribution may show one inherited from this lot: after
   * an entry that changes what this lot passes down, its descendants' attribution on record is
   * derived again (their views keep their own last-entry time).
   */
  private async refreshDescendants(m: EntityManager, s: RollState): Promise<void> {
    const seen = new Set<string>([s.lot]);
    let next = s.children.map((c) => c.lot);
    while (next.length > 0) {
      const found: string[] = [];
      for (const code of next) {
        if (seen.has(code)) continue;
        seen.add(code);
        const row = await this.reader.cachedState(code, m);
        if (!row) continue;
        found.push(...row.state.children.map((c) => c.lot));
        if (row.state.attribution) continue;
        const views: Array<{ observations: Observations | null }> = await m.query(
          'SELECT "observations" FROM "lot_views" WHERE "lot_id" = $1',
          [row.id],
        );
        if (!views[0]) continue;
        const record = await attributionRecordOf(this.reader, row.state, m);
        await LotViewProjector.refresh(m, row.id, lotViewValues(row.state, views[0].observations, record));
      }
      next = found;
    }
  }

  /**
   * Rewrites `columns` (by default every derived column) of a lot's existing view from `v`; its
   * `updated_at` stays, as no entry was added. For refreshing stored copies after a derivation
   * changed (an older schema passes the columns it has).
   */
  static async refresh(
    m: EntityManager,
    lotId: string,
    v: LotViewValues,
    columns: readonly (keyof LotViewValues)[] = DERIVED_COLUMNS,
  ): Promise<void> {
    const set = columns.filter((c) => c !== 'code');
    const value = (c: keyof LotViewValues) =>
      c === 'observations' ? (v.observations ? JSON.stringify(v.observations) : null) : v[c];
    await m.query(
      `UPDATE "lot_views" SET ${set.map((c, i) => `"${c}" = $${i + 2}`).join(', ')} WHERE "lot_id" = $1`,
      [lotId, ...set.map(value)],
    );
  }

  /** The writer's newest sealed storage place, as words only their own searches match. */
  private async projectStorage(m: EntityManager, lotId: string, actor: string): Promise<void> {
    const place = (await this.reader.sealedFor(lotId, actor, m))
      .filter((f) => f.name === 'storage-location')
      .pop()?.value;
    if (typeof place === 'string' && place.trim()) {
      await m.query(
        `INSERT INTO "lot_private_search" ("lot_id", "account_id", "search_text") VALUES ($1, $2, $3)
         ON CONFLICT ("lot_id", "account_id") DO UPDATE SET "search_text" = $3`,
        [lotId, actor, place],
      );
    } else {
      await m.query('DELETE FROM "lot_private_search" WHERE "lot_id" = $1 AND "account_id" = $2', [
        lotId,
        actor,
      ]);
    }
  }
}

/** Every derived column of `lot_views` (all but the two timestamps). */
export const DERIVED_COLUMNS: readonly (keyof LotViewValues)[] = [
  'code',
  'title',
  'form',
  'status',
  'holder',
  'listed',
  'origin',
  'origin_source',
  'count_value',
  'count_estimated',
  'dissent_count',
  'offer_recipient',
  'observations',
  'head_seq',
  'search_text',
  'technique',
  'period_from',
  'period_to',
];

/** The columns of `lot_views` derived from a lot's state (all but the two timestamps), by column name. */
export interface LotViewValues {
  code: string;
  title: string;
  form: string | null;
  status: string;
  holder: string;
  listed: boolean;
  origin: string | null;
  /** Whose opinion `origin` comes from: the holder, an earlier holder, or an ancestor's. */
  origin_source: string | null;
  count_value: number;
  count_estimated: boolean;
  dissent_count: number;
  offer_recipient: string | null;
  observations: Observations | null;
  head_seq: number;
  search_text: string;
  technique: string | null;
  period_from: number | null;
  period_to: number | null;
}

/**
 * What `lot_views` holds for a lot with state `s` whose newest observations (with a body) are
 * `observations` and whose attribution on record is `attribution` ({@link attributionRecordOf}).
 * The one definition, shared by the projector and the audit that checks it.
 */
export function lotViewValues(
  s: RollState,
  observations: Observations | null,
  attribution: AttributionRecord | null,
): LotViewValues {
  const d = s.description;
  return {
    code: s.lot,
    title: d?.title ?? '',
    form: d?.form ?? null,
    status: s.status,
    holder: s.holder,
    listed: s.listed,
    origin: attribution?.origin ?? null,
    origin_source: attribution?.source ?? null,
    count_value: s.remaining.value,
    count_estimated: s.remaining.estimated,
    dissent_count: attribution?.dissents ?? s.dissents.length,
    offer_recipient: s.openOffer?.recipient ?? null,
    observations,
    head_seq: s.head.seq,
    search_text: [
      d?.title,
      d?.summary,
      d?.colours.join(' '),
      d ? decorationWords(d.decoration) : '',
      d?.decorationNote,
      d?.condition,
      attributionWords(attribution),
    ]
      .filter(Boolean)
      .join(' '),
    technique: attribution?.technique ?? null,
    period_from: attribution?.period.from ?? null,
    period_to: attribution?.period.to ?? null,
  };
}
