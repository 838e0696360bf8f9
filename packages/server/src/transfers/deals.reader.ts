import { Injectable } from '@nestjs/common';
import { DataSource } from 'typeorm';

/** One sale by a dealer: to a private buyer (`sold`) or to a dealer (an offer the dealer made, accepted). */
export interface DealRow {
  lot_id: string;
  /** seq of the `sold` entry, or of the accepted `transfer-offered` entry. */
  seq: number;
  /** The day it happened (UTC), YYYY-MM-DD. */
  day: string;
  to: 'buyer' | 'dealer';
}

/** What a dealer sold and bought, read from the transfers module's own tables for other modules. */
@Injectable()
export class DealsReader {
  constructor(private readonly dataSource: DataSource) {}

  /** Every sale by `seller`: to private buyers, and accepted offers to dealers. */
  salesBy(seller: string): Promise<DealRow[]> {
    return this.dataSource.query(
      `SELECT "lot_id", "seq", to_char("sold_on", 'YYYY-MM-DD') AS "day", 'buyer' AS "to"
         FROM "sales" WHERE "seller" = $1
       UNION ALL
       SELECT "lot_id", "offer_seq", to_char("answered_at" AT TIME ZONE 'UTC', 'YYYY-MM-DD'), 'dealer'
         FROM "transfer_offers" WHERE "offerer" = $1 AND "status" = 'accepted'`,
      [seller],
    );
  }

  /** Per lot id, the seqs of the offers `accountId` accepted (their transfer price is what it paid). */
  async boughtAt(accountId: string): Promise<Map<string, number[]>> {
    const rows: Array<{ lot_id: string; offer_seq: number }> = await this.dataSource.query(
      `SELECT "lot_id", "offer_seq" FROM "transfer_offers" WHERE "recipient" = $1 AND "status" = 'accepted'`,
      [accountId],
    );
    const out = new Map<string, number[]>();
    for (const r of rows) out.set(r.lot_id, [...(out.get(r.lot_id) ?? []), r.offer_seq]);
    return out;
  }
}
