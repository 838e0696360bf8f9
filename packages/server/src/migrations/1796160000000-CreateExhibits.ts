import type { MigrationInterface, QueryRunner } from 'typeorm';

export class CreateExhibits1796160000000 implements MigrationInterface {
  name = 'CreateExhibits1796160000000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE "exhibits" (
        "id" uuid NOT NULL DEFAULT gen_random_uuid(),
        "lot_id" uuid NOT NULL,
        "lot_code" varchar(9) NOT NULL,
        "seq" integer NOT NULL,
        "added_by" varchar(64) NOT NULL,
        "sealed" boolean NOT NULL,
        "original_sha256" char(64) NOT NULL,
        "ref" jsonb NOT NULL,
        "bytes" bigint NOT NULL,
        "created_at" timestamptz NOT NULL DEFAULT now(),
        CONSTRAINT "pk_exhibits" PRIMARY KEY ("id"),
        CONSTRAINT "fk_exhibits_lot" FOREIGN KEY ("lot_id") REFERENCES "lots" ("id") ON DELETE RESTRICT,
        CONSTRAINT "ck_exhibits_seq" CHECK ("seq" > 0),
        CONSTRAINT "ck_exhibits_bytes" CHECK ("bytes" >= 0),
        CONSTRAINT "ck_exhibits_sha256" CHECK ("original_sha256" ~ '^[0-9a-f]{64}$')
      )`);
    await q.query(`CREATE UNIQUE INDEX "ux_exhibits_lot_seq" ON "exhibits" ("lot_id", "seq")`);
    await q.query(`CREATE INDEX "ix_exhibits_added_by" ON "exhibits" ("added_by")`);
    await q.query(`CREATE INDEX "ix_exhibits_original" ON "exhibits" ("original_sha256")`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE "exhibits"`);
  }
}
