import type { ObservedBody, Observations, RollState } from '@beadroll/core';
import type { EntityManager } from 'typeorm';
import { replayStoredRoll } from '../ledger/roll-replay';
import { lotViewValues } from '../lots/lot-view.projector';

/**
 * Rewrites every lot's cached copies that a replay of its roll determines (the head and state
 * in `lots`, the derived columns of `lot_views`) from the roll through today's core, for rolls
 * that verify; broken rolls are left for the audit to report. Used once after the reducer's
 * state gained fields, so caches written by an older reducer do not read as tampered. Returns
 * how many lots were rewritten.
 */
export async function refreshStoredCopies(manager: EntityManager): Promise<number> {
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
      let observations: Observations | null = null;
      const { result } = await replayStoredRoll(manager, lot, (_row, e) => {
        if (e.header.kind === 'observed' && e.body) observations = (e.body as ObservedBody).observations;
      });
      if (!result.ok) continue;
      const state = JSON.parse(JSON.stringify(result.state)) as RollState;
      await manager.query(
        'UPDATE "lots" SET "head_seq" = $2, "head_hash" = $3, "head_time" = $4, "state" = $5 WHERE "id" = $1',
        [lot.id, state.head.seq, state.head.hash, state.head.time, JSON.stringify(state)],
      );
      const v = lotViewValues(state, observations);
      await manager.query(
        `UPDATE "lot_views" SET "title" = $2, "form" = $3, "status" = $4, "holder" = $5, "listed" = $6,
           "origin" = $7, "count_value" = $8, "count_estimated" = $9, "dissent_count" = $10,
           "offer_recipient" = $11, "observations" = $12, "head_seq" = $13, "search_text" = $14
         WHERE "lot_id" = $1`,
        [
          lot.id,
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
        ],
      );
      refreshed++;
    }
  }
}
