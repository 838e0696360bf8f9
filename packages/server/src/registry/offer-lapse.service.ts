import { Injectable, Logger } from '@nestjs/common';
import { SYSTEM_ACTOR } from '@beadroll/core';
import { DataSource } from 'typeorm';
import { LedgerService } from '../ledger/ledger.service';

/**
 * Lapses every open offer an account made or was made, at once, when the account is suspended
 * or closed. The `transfer-lapsed` entries are written by the system actor through the ledger's
 * one append path.
 */
@Injectable()
export class OfferLapseService {
  private readonly log = new Logger(OfferLapseService.name);

  constructor(
    private readonly dataSource: DataSource,
    private readonly ledger: LedgerService,
  ) {}

  /** Returns the codes of the lots whose offers lapsed. */
  async lapseOffersOf(accountId: string): Promise<string[]> {
    const rows: Array<{ code: string }> = await this.dataSource.query(
      `SELECT "code" FROM "lot_views" WHERE "status" = 'offered' AND ("holder" = $1 OR "offer_recipient" = $1)
       ORDER BY "code"`,
      [accountId],
    );
    const lapsed: string[] = [];
    for (const { code } of rows) {
      const done = await this.ledger.withLots([code], async (tx) => {
        const offer = tx.state(code).openOffer;
        // Re-read under the lot's lock: the offer may have been answered in the meantime.
        if (!offer || (offer.offerer !== accountId && offer.recipient !== accountId)) return false;
        await tx.append(code, {
          kind: 'transfer-lapsed',
          actor: SYSTEM_ACTOR,
          body: { offerSeq: offer.seq },
        });
        return true;
      });
      if (done) lapsed.push(code);
    }
    if (lapsed.length) this.log.log(`lapsed ${lapsed.length} open offer(s) of account ${accountId}`);
    return lapsed;
  }
}
