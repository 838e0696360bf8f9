import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Inventory search that folds accents: a text search configuration `beadroll_text` (English
 * stemming after the `unaccent` dictionary, a trusted extension), the attribution on record kept
 * beside each lot for sorting and filtering, and each reader's own storage place in a table of
 * its own, so one dealer's private words never match another dealer's search.
 */
export class InventorySearch1796490300000 implements MigrationInterface {
  name = 'InventorySearch1796490300000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`CREATE EXTENSION IF NOT EXISTS "unaccent"`);
    await q.query(`CREATE TEXT SEARCH CONFIGURATION "beadroll_text" (COPY = english)`);
    await q.query(
      `ALTER TEXT SEARCH CONFIGURATION "beadroll_text"
         ALTER MAPPING FOR "hword", "hword_part", "word" WITH "unaccent", "english_stem"`,
    );

    await q.query(`DROP INDEX "ix_lot_views_search"`);
    await q.query(`ALTER TABLE "lot_views" DROP COLUMN "search"`);
    await q.query(`ALTER TABLE "lot_views" ADD COLUMN "technique" varchar(32)`);
    await q.query(`ALTER TABLE "lot_views" ADD COLUMN "period_from" integer`);
    await q.query(`ALTER TABLE "lot_views" ADD COLUMN "period_to" integer`);
    // Rows written before this migration gain the attribution's raw names; the next entry on
    // the lot rewrites its words in full.
    await q.query(`
      UPDATE "lot_views" v SET
        "technique" = l."state" #>> '{attribution,body,technique}',
        "period_from" = (l."state" #>> '{attribution,body,period,from}')::int,
        "period_to" = (l."state" #>> '{attribution,body,period,to}')::int,
        "search_text" = concat_ws(' ', v."search_text",
          replace(l."state" #>> '{attribution,body,origin}', '-', ' '),
          replace(l."state" #>> '{attribution,body,technique}', '-', ' '),
          l."state" #>> '{attribution,body,period,from}',
          l."state" #>> '{attribution,body,period,to}',
          l."state" #>> '{attribution,body,decoration}')
      FROM "lots" l WHERE l."id" = v."lot_id"`);
    await q.query(
      `ALTER TABLE "lot_views" ADD COLUMN "search" tsvector
         GENERATED ALWAYS AS (to_tsvector('beadroll_text'::regconfig, "search_text")) STORED`,
    );
    await q.query(`CREATE INDEX "ix_lot_views_search" ON "lot_views" USING GIN ("search")`);
    await q.query(`CREATE INDEX "ix_lot_views_code_prefix" ON "lot_views" ("code" varchar_pattern_ops)`);
    await q.query(`CREATE INDEX "ix_lot_views_holder_updated" ON "lot_views" ("holder", "updated_at")`);

    await q.query(`
      CREATE TABLE "lot_private_search" (
        "lot_id" uuid NOT NULL,
        "account_id" varchar(64) NOT NULL,
        "search_text" text NOT NULL,
        "search" tsvector GENERATED ALWAYS AS (to_tsvector('beadroll_text'::regconfig, "search_text")) STORED,
        CONSTRAINT "pk_lot_private_search" PRIMARY KEY ("lot_id", "account_id"),
        CONSTRAINT "fk_lot_private_search_lot" FOREIGN KEY ("lot_id") REFERENCES "lots"("id") ON DELETE CASCADE
      )`);
    await q.query(`CREATE INDEX "ix_lot_private_search_search" ON "lot_private_search" USING GIN ("search")`);
    await q.query(`CREATE INDEX "ix_lot_private_search_account" ON "lot_private_search" ("account_id")`);
    await q.query(`
      INSERT INTO "lot_private_search" ("lot_id", "account_id", "search_text")
      SELECT DISTINCT ON (e."lot_id", a.id) e."lot_id", a.id, s."value"::jsonb #>> '{}'
        FROM "sealed_fields" s JOIN "entries" e ON e."id" = s."entry_id"
        CROSS JOIN LATERAL unnest(s."visible_to") AS a(id)
       WHERE s."name" = 'storage-location'
       ORDER BY e."lot_id", a.id, e."seq" DESC`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE "lot_private_search"`);
    await q.query(`DROP INDEX "ix_lot_views_holder_updated"`);
    await q.query(`DROP INDEX "ix_lot_views_code_prefix"`);
    await q.query(`DROP INDEX "ix_lot_views_search"`);
    await q.query(`ALTER TABLE "lot_views" DROP COLUMN "search"`);
    await q.query(`ALTER TABLE "lot_views" DROP COLUMN "period_to"`);
    await q.query(`ALTER TABLE "lot_views" DROP COLUMN "period_from"`);
    await q.query(`ALTER TABLE "lot_views" DROP COLUMN "technique"`);
    await q.query(
      `ALTER TABLE "lot_views" ADD COLUMN "search" tsvector
         GENERATED ALWAYS AS (to_tsvector('english', "search_text")) STORED`,
    );
    await q.query(`CREATE INDEX "ix_lot_views_search" ON "lot_views" USING GIN ("search")`);
    await q.query(`DROP TEXT SEARCH CONFIGURATION "beadroll_text"`);
    await q.query(`DROP EXTENSION IF EXISTS "unaccent"`);
  }
}
