import {
  attributionOnRecord,
  inheritedRecord,
  verifyRoll,
  type Origin,
  type Period,
  type RecordSource,
  type RollState,
  type Technique,
} from '@beadroll/core';
import type { EntityManager } from 'typeorm';
import { bundleRolls } from '../ledger/bundle.service';
import type { RollReaderService } from '../ledger/roll-reader.service';

/** The attribution on record a lot is listed, searched, sorted and exported by, as core derives it. */
export interface AttributionRecord {
  source: RecordSource;
  origin: Origin;
  period: Period;
  technique: Technique;
  decoration: string | null;
  /** Standing opinions that disagree with it. */
  dissents: number;
}

/**
 * The attribution on record of a lot with state `state`, by core's rule ({@link attributionOnRecord}):
 * the holder's newest standing opinion; else an earlier holder's; else an ancestor's holder's,
 * inherited through the public bundle (listed ancestors in full, unlisted ones in inherited
 * scope). The holder's case needs only the state; the others read the lot's roll and its
 * ancestors through `manager`. null when there is none.
 */
export async function attributionRecordOf(
  reader: RollReaderService,
  state: RollState,
  manager?: EntityManager,
): Promise<AttributionRecord | null> {
  const own = state.attribution?.body;
  if (own)
    return {
      source: 'holder',
      origin: own.origin,
      period: own.period,
      technique: own.technique,
      decoration: own.decoration ?? null,
      dissents: state.dissents.length,
    };
  if (state.opinions.length === 0 && state.parents.length === 0) return null;
  const rolls = await bundleRolls(reader, state.lot, (_lot, s) => s.listed, manager);
  if (!rolls) return null;
  const verified = verifyRoll(rolls[0]!.entries, { lot: state.lot });
  if (!verified.ok) return null;
  const r = attributionOnRecord(verified.verified, verified.state, inheritedRecord({ rolls }, state.lot));
  if (!r.record || !r.source) return null;
  const b = r.record.body;
  return {
    source: r.source,
    origin: b.origin,
    period: b.period,
    technique: b.technique,
    decoration: b.decoration ?? null,
    dissents: r.dissent.length,
  };
}
