import type { MigrationInterface, QueryRunner } from 'typeorm';
import { refreshStoredCopies } from '../audit/refresh-stored-copies';
import { DERIVED_COLUMNS } from '../lots/lot-view.projector';

/**
 * The lot view lists, filters, sorts and searches by core's attribution on record, inherited
 * from an earlier holder or an ancestor when the holder has none: a column says whose it is,
 * and every view is derived again so its search words include the inherited attribution.
 */
export class InheritedAttributionInSearch1796490800000 implements MigrationInterface {
  name = 'InheritedAttributionInSearch1796490800000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE "lot_views" ADD COLUMN "origin_source" varchar(16)`);
    await refreshStoredCopies(q.manager, DERIVED_COLUMNS);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE "lot_views" DROP COLUMN "origin_source"`);
  }
}
