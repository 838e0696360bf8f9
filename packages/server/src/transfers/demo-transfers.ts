import { join } from 'node:path';
import { generateLotCode, seededRandom, SYSTEM_ACTOR, type LotDescription, type Money } from '@beadroll/core';
import { DataSource } from 'typeorm';
import { readSeedFile, type SeedStep } from '../demo/seed';
import { LedgerService } from '../ledger/ledger.service';
import { RollReaderService } from '../ledger/roll-reader.service';
import type { SealedDetailsDto } from '../lots/dto/sealed-details.dto';
import { sealedValuesOf } from '../lots/lots.service';
import { TransfersService } from './transfers.service';
import { LotViewsService } from '../lots/lot-views.service';

type Then = 'accept' | 'decline' | 'withdraw' | 'lapse' | 'open';

/** One invented lot of seed-demo/transfers.json and what happens to it. */
export interface DemoTransferLot {
  holder: string;
  description: LotDescription;
  sealed?: SealedDetailsDto;
  story: Array<
    | { offer: string; note?: string; price?: Money; then: Then; answerNote?: string }
    | { sale: { date: string; price: Money; buyerNote?: string } }
  >;
  /** Set on the lot the start banner shows as one that changed hands. */
  publicWhy?: string;
}

/** Seed of these lots' codes, so a second load finds them. */
export const DEMO_TRANSFERS_SEED = 'beadroll demo scenario: transfers and sales';

export const DEMO_TRANSFERS_FILE = 'transfers.json';

/**
 * Seed step: invented lots that change hands between the demo dealers (accepted, declined,
 * withdrawn, lapsed and still open offers, with sealed prices) and a few sales at fairs. Every
 * entry goes through the ledger's append path; a lot already on the ledger is skipped whole.
 * The lapse is written straight away as the system account, as the lapse job would after
 * the configured days.
 */
export const seedTransfers: SeedStep = async (app, ctx) => {
  const ledger = app.get(LedgerService);
  const transfers = app.get(TransfersService);
  const db = app.get(DataSource);
  const reader = app.get(RollReaderService);
  const random = seededRandom(DEMO_TRANSFERS_SEED);
  const id = (handle: string) => {
    const found = ctx.accounts[handle];
    if (!found)
      throw new Error(
        `${join('seed-demo', DEMO_TRANSFERS_FILE)} names ${handle}, who is not in the scenario`,
      );
    return found;
  };
  // The first listed demo lot without opinions changes hands from its holder to the next dealer,
  // so one printed page shows a transfer (and the holder's attribution elsewhere stays theirs).
  let banner: { code: string; why: string } | undefined;
  for (const candidate of ctx.report.publicLots) {
    if (!(await reader.hasEntryOfKind(candidate.code, 'opinion'))) {
      banner = candidate;
      break;
    }
  }
  if (banner) {
    const row = await app.get(LotViewsService).find({ code: banner.code });
    const dealers = Object.keys(ctx.accounts).filter((h) => ctx.accounts[h] !== row?.holder);
    const to = ['teodor-brasko', 'odile-varnas'].find((h) => dealers.includes(h));
    const done: unknown[] = await db.query(
      `SELECT 1 FROM "transfer_offers" WHERE "code" = $1 AND "status" = 'accepted'`,
      [banner.code],
    );
    if (row && to && (done.length > 0 || row.status === 'held')) {
      if (done.length === 0) {
        await ledger.withLots([banner.code], async (tx) => {
          const o = await transfers.writeOffer(
            tx,
            row.holder,
            banner.code,
            id(to),
            'as agreed at the spring fair',
            {
              amount: 14500,
              currency: 'EUR',
            },
          );
          await tx.append(banner.code, {
            kind: 'transfer-accepted',
            actor: id(to),
            body: { offerSeq: o.offerSeq, note: 'collected in person' },
          });
        });
      }
      ctx.report.publicLots.push({
        code: banner.code,
        why: `changed hands: ${banner.why.replace(/^a listed lot: /, '')}`,
      });
    }
  }
  for (const lot of readSeedFile<DemoTransferLot[]>(DEMO_TRANSFERS_FILE)) {
    const code = generateLotCode(random);
    // Shown by the start banner only when no other step printed a lot (see below).
    if (lot.publicWhy && ctx.report.publicLots.length === 0)
      ctx.report.publicLots.push({ code, why: lot.publicWhy });
    if (await reader.findLot(code)) continue;
    let holder = id(lot.holder);
    await ledger.withLots([], async (tx) => {
      await tx.register({
        code,
        actor: holder,
        description: lot.description,
        sealed: sealedValuesOf(lot.sealed),
      });
    });
    for (const step of lot.story) {
      await ledger.withLots([code], async (tx) => {
        if ('sale' in step) {
          const s = step.sale;
          await tx.append(code, {
            kind: 'sold',
            actor: holder,
            body: { date: s.date },
            sealed: { 'sale-price': s.price, ...(s.buyerNote ? { 'buyer-note': s.buyerNote } : {}) },
          });
          return;
        }
        const to = id(step.offer);
        const offer = await transfers.writeOffer(tx, holder, code, to, step.note, step.price);
        const note = step.answerNote ? { note: step.answerNote } : {};
        const body = { offerSeq: offer.offerSeq, ...note };
        if (step.then === 'accept') {
          await tx.append(code, { kind: 'transfer-accepted', actor: to, body });
          holder = to;
        } else if (step.then === 'decline')
          await tx.append(code, { kind: 'transfer-declined', actor: to, body });
        else if (step.then === 'withdraw')
          await tx.append(code, { kind: 'transfer-withdrawn', actor: holder, body });
        else if (step.then === 'lapse')
          await tx.append(code, {
            kind: 'transfer-lapsed',
            actor: SYSTEM_ACTOR,
            body: { offerSeq: offer.offerSeq },
          });
      });
    }
  }
};
