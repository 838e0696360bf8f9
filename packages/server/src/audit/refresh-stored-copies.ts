import type { ObservedBody, Observations } from '@beadroll/core';
import type { EntityManager } from 'typeorm';
import { refreshCachedStates } from '../ledger/roll-replay';
import { LotViewProjector } from '../lots/lot-view.projector';

/**
 * Rewrites every lot's cached copies that a replay of its roll determines (the head and state
 * the ledger caches, the derived columns of the lot view through its projector) from the roll
 * through today's core, for rolls that verify; broken rolls are left for the audit to report.
 * Used once after the reducer's state gained fields, so caches written by an older reducer do
 * not read as tampered. Returns how many lots were rewritten.
 */
export function refreshStoredCopies(manager: EntityManager): Promise<number> {
  return refreshCachedStates(manager, (lot) => {
    let observations: Observations | null = null;
    return {
      entry(_row, e) {
        if (e.header.kind === 'observed' && e.body) observations = (e.body as ObservedBody).observations;
      },
      done: (state) => LotViewProjector.refresh(manager, lot.id, state, observations),
    };
  });
}
