import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * One's own inventory in either default order read from an index: the inventory page's (last
 * entry first) and the list's (newest registered first), each then by code. The first page of
 * a dealer holding a hundred thousand lots reads twenty rows instead of sorting them all.
 */
export class HolderInventoryOrder1796491200000 implements MigrationInterface {
  name = 'HolderInventoryOrder1796491200000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(
      `CREATE INDEX "ix_lot_views_holder_updated_code"
         ON "lot_views" ("holder", "updated_at" DESC NULLS LAST, "code")`,
    );
    await q.query(
      `CREATE INDEX "ix_lot_views_holder_registered"
         ON "lot_views" ("holder", "registered_at" DESC NULLS LAST, "code")`,
    );
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP INDEX "ix_lot_views_holder_registered"`);
    await q.query(`DROP INDEX "ix_lot_views_holder_updated_code"`);
  }
}
