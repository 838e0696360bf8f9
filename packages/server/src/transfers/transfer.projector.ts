import { Injectable } from '@nestjs/common';
import type { SoldBody, TransferAnswerBody, TransferOfferedBody } from '@beadroll/core';
import type { EntityManager } from 'typeorm';
import { AppendProjector } from '../ledger/append-projector';
import type { AppendedEntry } from '../ledger/ledger.types';
import type { OfferStatus } from './entities/transfer-offer.entity';

/** The status an offer's row takes after each answering kind (the audit checks rows against it). */
export const OFFER_ENDINGS: Partial<Record<string, OfferStatus>> = {
  'transfer-accepted': 'accepted',
  'transfer-declined': 'declined',
  'transfer-withdrawn': 'withdrawn',
  'transfer-lapsed': 'lapsed',
};

/** Keeps `transfer_offers` and `sales` in step with each roll, inside the append transaction. */
@Injectable()
export class TransferProjector extends AppendProjector {
  async project(m: EntityManager, lotId: string, entry: AppendedEntry): Promise<void> {
    const title = entry.state.description?.title ?? '';
    if (entry.kind === 'transfer-offered') {
      const b = JSON.parse(entry.body) as TransferOfferedBody;
      await m.query(
        `INSERT INTO "transfer_offers" ("lot_id", "code", "title", "offer_seq", "offerer", "recipient",
           "status", "note", "offered_at") VALUES ($1, $2, $3, $4, $5, $6, 'open', $7, $8)`,
        [lotId, entry.lot, title, entry.seq, entry.actor, b.recipient, b.note ?? null, entry.time],
      );
      return;
    }
    const ending = OFFER_ENDINGS[entry.kind];
    if (ending) {
      const b = JSON.parse(entry.body) as TransferAnswerBody & { note?: string };
      await m.query(
        `UPDATE "transfer_offers" SET "status" = $3, "answer_seq" = $4, "answer_note" = $5, "answered_at" = $6
         WHERE "lot_id" = $1 AND "offer_seq" = $2`,
        [lotId, b.offerSeq, ending, entry.seq, b.note ?? null, entry.time],
      );
      return;
    }
    if (entry.kind === 'sold') {
      const b = JSON.parse(entry.body) as SoldBody;
      await m.query(
        `INSERT INTO "sales" ("lot_id", "code", "title", "seq", "seller", "sold_on", "recorded_at")
         VALUES ($1, $2, $3, $4, $5, $6, $7)`,
        [lotId, entry.lot, title, entry.seq, entry.actor, b.date, entry.time],
      );
    }
    // A voided sale leaves the seller's list of sales; the roll keeps both entries.
    if (entry.kind === 'sale-voided') await m.query('DELETE FROM "sales" WHERE "lot_id" = $1', [lotId]);
  }
}
