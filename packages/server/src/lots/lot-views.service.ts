import { Injectable } from '@nestjs/common';
import { InjectRepository } from '@nestjs/typeorm';
import { In, type EntityManager, type Repository } from 'typeorm';
import { LotViewEntity } from './entities/lot-view.entity';

/** The columns of a lot's derived view other modules read (never its search text). */
export type LotView = Omit<LotViewEntity, 'lot' | 'searchText'>;

/**
 * The one reader of `lot_views` for other modules: the derived, never authoritative, view of
 * each lot (title, status, holder, listing, head), kept by the lots module's projector. Other
 * modules ask here instead of naming the table.
 */
@Injectable()
export class LotViewsService {
  constructor(@InjectRepository(LotViewEntity) private readonly views: Repository<LotViewEntity>) {}

  private repo(m?: EntityManager): Repository<LotViewEntity> {
    return m ? m.getRepository(LotViewEntity) : this.views;
  }

  /** The view of one lot by its canonical code or id, or null when there is none. */
  find(by: { code: string } | { lotId: string }, m?: EntityManager): Promise<LotView | null> {
    return this.repo(m).findOne({ where: by });
  }

  /** The views of many lots at once, by canonical codes or ids (in no particular order). */
  async findMany(by: { codes: readonly string[] } | { lotIds: readonly string[] }): Promise<LotView[]> {
    const where = 'codes' in by ? { code: In([...by.codes]) } : { lotId: In([...by.lotIds]) };
    const ids = 'codes' in by ? by.codes : by.lotIds;
    return ids.length ? this.views.find({ where }) : [];
  }

  /** The lots an account holds, by code; only those of the given statuses when named. */
  heldBy(accountId: string, statuses?: readonly string[]): Promise<LotView[]> {
    return this.views.find({
      where: { holder: accountId, ...(statuses ? { status: In([...statuses]) } : {}) },
      order: { code: 'ASC' },
    });
  }

  /** The first lot (by code) with exactly this title, for seeding demo data. */
  firstTitled(title: string): Promise<LotView | null> {
    return this.views.findOne({ where: { title }, order: { code: 'ASC' } });
  }

  /** Deletes an account's private search words of every lot, in the caller's transaction (the account is closing). */
  async forgetPrivateSearchOf(accountId: string, m: EntityManager): Promise<void> {
    await m.query(`DELETE FROM "lot_private_search" WHERE "account_id" = $1`, [accountId]);
  }

  /**
   * A SQL condition, for another module's own query: true when the lot `lotIdSql` is held by
   * `accountSql` (both SQL expressions of that query). The table stays named here only.
   */
  static heldBySql(lotIdSql: string, accountSql: string): string {
    return `EXISTS (SELECT 1 FROM "lot_views" lv WHERE lv."lot_id" = ${lotIdSql} AND lv."holder" = ${accountSql})`;
  }
}
