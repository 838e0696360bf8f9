import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * One's own inventory in its default order (newest registered first, then by code) read from an
 * index: the first page of a dealer holding a hundred thousand lots reads twenty rows instead of
 * sorting them all.
 */
export class HolderInventoryOrder1796491200000 implements MigrationInterface {
  name = 'HolderInventoryOrder1796491200000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(
      `CREATE INDEX "ix_lot_views_holder_registered"
         ON "lot_views" ("holder", "registered_at" DESC NULLS LAST, "code")`,
    );
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP INDEX "ix_lot_views_holder_registered"`);
  }
}
