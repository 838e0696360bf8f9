import { Injectable, type OnModuleInit } from '@nestjs/common';
import type { ObservedBody, Observations, RedactedBody, RollState } from '@beadroll/core';
import type { EntityManager } from 'typeorm';
import { LedgerService } from '../ledger/ledger.service';
import type { AppendedEntry, RollProjector } from '../ledger/ledger.types';

/** Keeps `lot_views` in step with each roll, inside the append transaction. */
@Injectable()
export class LotViewProjector implements RollProjector, OnModuleInit {
  constructor(private readonly ledger: LedgerService) {}

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
      const rows: Array<{ body: string }> = await m.query(
        `SELECT b."body" FROM "entries" e JOIN "entry_bodies" b ON b."entry_id" = e."id"
         WHERE e."lot_id" = $1 AND e."kind" = 'observed' AND e."seq" <> $2 ORDER BY e."seq" DESC LIMIT 1`,
        [lotId, target],
      );
      observations = rows[0] ? (JSON.parse(rows[0].body) as ObservedBody).observations : null;
    } else {
      const rows: Array<{ observations: Observations | null }> = await m.query(
        'SELECT "observations" FROM "lot_views" WHERE "lot_id" = $1',
        [lotId],
      );
      observations = rows[0]?.observations ?? null;
    }
    const v = lotViewValues(s, observations);
    await m.query(
      `INSERT INTO "lot_views" ("lot_id", "code", "title", "form", "status", "holder", "listed", "origin",
         "count_value", "count_estimated", "dissent_count", "offer_recipient", "observations", "head_seq",
         "search_text", "registered_at", "updated_at")
       VALUES ($1, $2, $3, $4, $5, $6, $7, $8, $9, $10, $11, $12, $13, $14, $15, $16, $16)
       ON CONFLICT ("lot_id") DO UPDATE SET "title" = $3, "form" = $4, "status" = $5, "holder" = $6,
         "listed" = $7, "origin" = $8, "count_value" = $9, "count_estimated" = $10, "dissent_count" = $11,
         "offer_recipient" = $12, "observations" = $13, "head_seq" = $14, "search_text" = $15,
         "updated_at" = $16`,
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
      ],
    );
  }
}

/** The columns of `lot_views` derived from a lot's state (all but the two timestamps), by column name. */
export interface LotViewValues {
  code: string;
  title: string;
  form: string | null;
  status: string;
  holder: string;
  listed: boolean;
  origin: string | null;
  count_value: number;
  count_estimated: boolean;
  dissent_count: number;
  offer_recipient: string | null;
  observations: Observations | null;
  head_seq: number;
  search_text: string;
}

/**
 * What `lot_views` holds for a lot with state `s` whose newest observations (with a body) are
 * `observations`. The one definition, shared by the projector and the audit that checks it.
 */
export function lotViewValues(s: RollState, observations: Observations | null): LotViewValues {
  const d = s.description;
  return {
    code: s.lot,
    title: d?.title ?? '',
    form: d?.form ?? null,
    status: s.status,
    holder: s.holder,
    listed: s.listed,
    origin: s.attribution?.body?.origin ?? null,
    count_value: s.remaining.value,
    count_estimated: s.remaining.estimated,
    dissent_count: s.dissents.length,
    offer_recipient: s.openOffer?.recipient ?? null,
    observations,
    head_seq: s.head.seq,
    search_text: d
      ? [d.title, d.summary, d.colours.join(' '), d.decorationNote, d.condition].filter(Boolean).join(' ')
      : '',
  };
}
