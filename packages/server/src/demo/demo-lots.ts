import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { generateLotCode, seededRandom, type LotDescription, type Observations } from '@beadroll/core';
import { LedgerService } from '../ledger/ledger.service';
import { RollReaderService } from '../ledger/roll-reader.service';
import type { SealedDetailsDto } from '../lots/dto/sealed-details.dto';
import { sealedValuesOf } from '../lots/lots.service';
import type { SeedStep } from './seed';

/** One invented lot of the demo scenario (seed-demo/lots.json). */
export interface DemoLot {
  /** Handle of the demo dealer who registers and holds the lot (seed-demo/accounts.json). */
  holder: string;
  description: LotDescription;
  observations?: Observations;
  sealed?: SealedDetailsDto;
}

/** A demo lot as loaded: its code and whether it is listed. */
export interface LoadedDemoLot {
  code: string;
  holder: string;
  title: string;
  listed: boolean;
}

/** The scenario's lots (seed-demo/lots.json; the same folder as the loader's SEED_DIR). */
export const DEMO_LOTS_FILE = resolve(__dirname, '..', '..', '..', '..', 'seed-demo', 'lots.json');

/** Seed of the demo lot codes: the same codes on every machine and every run. */
export const DEMO_LOT_SEED = 'beadroll demo scenario: lots';

/** Reads the scenario's lots. */
export function readDemoLots(file: string): DemoLot[] {
  return JSON.parse(readFileSync(file, 'utf8')) as DemoLot[];
}

/**
 * Registers the demo lots for the demo dealers (account ids by handle) through the
 * ledger's one append path. Codes come from a fixed seed, so a lot already on the ledger is
 * recognised and skipped: loading twice changes nothing.
 */
export async function loadDemoLots(
  ledger: LedgerService,
  reader: RollReaderService,
  lots: DemoLot[],
  accounts: Record<string, string>,
): Promise<LoadedDemoLot[]> {
  const random = seededRandom(DEMO_LOT_SEED);
  const out: LoadedDemoLot[] = [];
  for (const lot of lots) {
    const code = generateLotCode(random);
    const actor = accounts[lot.holder];
    if (!actor)
      throw new Error(`demo lot "${lot.description.title}" names ${lot.holder}, who is not in the scenario`);
    out.push({ code, holder: lot.holder, title: lot.description.title, listed: lot.description.listed });
    if (await reader.findLot(code)) continue;
    await ledger.withLots([], async (tx) => {
      await tx.register({ code, actor, description: lot.description, sealed: sealedValuesOf(lot.sealed) });
      if (lot.observations)
        await tx.append(code, { kind: 'observed', actor, body: { observations: lot.observations } });
    });
  }
  return out;
}

/** Seed step: the demo lots, then three listed lots for the start banner's public pages. */
export const seedLots: SeedStep = async (app, ctx) => {
  const loaded = await loadDemoLots(
    app.get(LedgerService),
    app.get(RollReaderService),
    readDemoLots(DEMO_LOTS_FILE),
    ctx.accounts,
  );
  for (const lot of loaded.filter((l) => l.listed).slice(0, 3))
    ctx.report.publicLots.push({ code: lot.code, why: `a listed lot: ${lot.title}` });
};
