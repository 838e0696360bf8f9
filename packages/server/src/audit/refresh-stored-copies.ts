import type { ObservedBody, Observations } from '@beadroll/core';
import type { EntityManager } from 'typeorm';
import { refreshCachedStates } from '../ledger/roll-replay';
import { attributionRecordOf } from '../lots/attribution-record';
import {
  DERIVED_COLUMNS,
  LotViewProjector,
  lotViewValues,
  type LotViewValues,
} from '../lots/lot-view.projector';
import { RollReaderService } from '../ledger/roll-reader.service';

/** The columns of the lot view when stored copies were first refreshed (before the search columns). */
const FIRST_COLUMNS = DERIVED_COLUMNS.filter(
  (c) => !['code', 'origin_source', 'technique', 'period_from', 'period_to'].includes(c),
);

/**
 * Rewrites every lot's cached copies that a replay of its roll determines (the head and state
 * the ledger caches, the derived columns of the lot view through its projector) from the roll
 * through today's core, for rolls that verify; broken rolls are left for the audit to report.
 * Used once after the reducer's state gained fields, so caches written by an older reducer do
 * not read as tampered. `columns` are the lot view's columns the calling migration's schema
 * has. Returns how many lots were rewritten.
 */
export function refreshStoredCopies(
  manager: EntityManager,
  columns: readonly (keyof LotViewValues)[] = FIRST_COLUMNS,
): Promise<number> {
  const reader = new RollReaderService(manager.connection);
  return refreshCachedStates(manager, (lot) => {
    let observations: Observations | null = null;
    return {
      entry(_row, e) {
        if (e.header.kind === 'observed' && e.body) observations = (e.body as ObservedBody).observations;
      },
      done: async (state) => {
        const record = await attributionRecordOf(reader, state, manager);
        await LotViewProjector.refresh(manager, lot.id, lotViewValues(state, observations, record), columns);
      },
    };
  });
}
