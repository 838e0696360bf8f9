import { generateLotCode, seededRandom, type OpinionBody } from '@beadroll/core';
import { DEMO_LOT_SEED } from '../demo/demo-lots';
import { readSeedFile, type SeedStep } from '../demo/seed';
import { LedgerService } from '../ledger/ledger.service';
import { RollReaderService } from '../ledger/roll-reader.service';

/** One opinion of the demo scenario (seed-demo/opinions.json), on a demo lot named by its title. */
interface DemoOpinion {
  lot: string;
  author: string;
  opinion: Omit<OpinionBody, 'nonce'>;
  /** When set, the lot goes into the start banner's public pages with this reason. */
  why?: string;
}

/**
 * Seed step: opinions on the demo lots, among them a dissent by the demo assessor on a listed
 * lot. The lots' codes come from the demo lots' fixed seed; a lot that already has opinions, or
 * is not loaded, is left as it is, so a second run changes nothing.
 */
export const seedOpinions: SeedStep = async (app, ctx) => {
  const ledger = app.get(LedgerService);
  const reader = app.get(RollReaderService);
  const random = seededRandom(DEMO_LOT_SEED);
  const codes = new Map<string, string>();
  for (const lot of readSeedFile<Array<{ description: { title: string } }>>('lots.json'))
    codes.set(lot.description.title, generateLotCode(random));
  const byLot = new Map<string, DemoOpinion[]>();
  for (const o of readSeedFile<DemoOpinion[]>('opinions.json'))
    byLot.set(o.lot, [...(byLot.get(o.lot) ?? []), o]);
  for (const [title, opinions] of byLot) {
    const code = codes.get(title);
    if (!code) throw new Error(`demo opinion names the lot "${title}", which is not in the scenario`);
    if (!(await reader.findLot(code))) continue;
    if (!(await reader.hasEntryOfKind(code, 'opinion'))) {
      await ledger.withLots([code], async (tx) => {
        for (const o of opinions) {
          const actor = ctx.accounts[o.author];
          if (!actor) throw new Error(`demo opinion names ${o.author}, who is not in the scenario`);
          await tx.append(code, { kind: 'opinion', actor, body: o.opinion });
        }
      });
    }
    const why = opinions.find((o) => o.why)?.why;
    if (why) ctx.report.publicLots.push({ code, why });
  }
};
