import { readFileSync } from 'node:fs';
import { generateLotCode, seededRandom, type LotDescription, type Observations } from '@beadroll/core';
import type { DataSource } from 'typeorm';
import type { LedgerService } from '../ledger/ledger.service';
import type { SealedDetailsDto } from '../lots/dto/sealed-details.dto';
import { sealedValuesOf } from '../lots/lots.service';

/** One invented lot of the demo scenario (seed-demo/lots.json). */
export interface DemoLot {
  /** Index into the demo dealers, in the order the scenario lists them. */
  dealer: number;
  description: LotDescription;
  observations?: Observations;
  sealed?: SealedDetailsDto;
}

/** A demo lot as loaded: its code and whether it is listed. */
export interface LoadedDemoLot {
  code: string;
  dealer: number;
  title: string;
  listed: boolean;
}

/** Seed of the demo lot codes: the same codes on every machine and every run. */
export const DEMO_LOT_SEED = 'beadroll demo scenario: lots';

/** Reads the scenario's lots. */
export function readDemoLots(file: string): DemoLot[] {
  return JSON.parse(readFileSync(file, 'utf8')) as DemoLot[];
}

/**
 * Registers the demo lots for the demo dealers (account ids in scenario order) through the
 * ledger's one append path. Codes come from a fixed seed, so a lot already on the ledger is
 * recognised and skipped: loading twice changes nothing.
 */
export async function loadDemoLots(
  ledger: LedgerService,
  dataSource: DataSource,
  lots: DemoLot[],
  dealerIds: string[],
): Promise<LoadedDemoLot[]> {
  const random = seededRandom(DEMO_LOT_SEED);
  const out: LoadedDemoLot[] = [];
  for (const lot of lots) {
    const code = generateLotCode(random);
    const actor = dealerIds[lot.dealer];
    if (!actor)
      throw new Error(
        `demo lot "${lot.description.title}" names dealer ${lot.dealer}, which is not in the scenario`,
      );
    out.push({ code, dealer: lot.dealer, title: lot.description.title, listed: lot.description.listed });
    const exists: unknown[] = await dataSource.query('SELECT 1 FROM "lots" WHERE "code" = $1', [code]);
    if (exists.length > 0) continue;
    await ledger.withLots([], async (tx) => {
      await tx.register({ code, actor, description: lot.description, sealed: sealedValuesOf(lot.sealed) });
      if (lot.observations)
        await tx.append(code, { kind: 'observed', actor, body: { observations: lot.observations } });
    });
  }
  return out;
}
