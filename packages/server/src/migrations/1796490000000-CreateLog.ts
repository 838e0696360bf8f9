import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * The ledger-wide log: one row holding its size (the sequencer every append takes last, so log
 * indices are dense and in commit order), the checkpoints the service signed, the witness keys
 * the registrar registered and the cosignatures they sent. Entries written before this
 * migration get their log indices in the order they were recorded.
 */
export class CreateLog1796490000000 implements MigrationInterface {
  name = 'CreateLog1796490000000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE "log_head" (
        "id" smallint NOT NULL DEFAULT 1,
        "size" bigint NOT NULL DEFAULT 0,
        CONSTRAINT "pk_log_head" PRIMARY KEY ("id"),
        CONSTRAINT "ck_log_head_one_row" CHECK ("id" = 1),
        CONSTRAINT "ck_log_head_size" CHECK ("size" >= 0)
      )`);
    await q.query(`
      UPDATE "entries" e SET "log_index" = n."ix"
        FROM (SELECT "id", row_number() OVER (ORDER BY "recorded_at", "id") - 1 AS "ix"
                FROM "entries" WHERE "log_index" IS NULL) n
       WHERE e."id" = n."id"`);
    await q.query(`INSERT INTO "log_head" ("id", "size") SELECT 1, count(*) FROM "entries"`);
    await q.query(`
      CREATE TABLE "log_checkpoints" (
        "size" bigint NOT NULL,
        "root" char(64) NOT NULL,
        "note" text NOT NULL,
        "signed_at" timestamptz NOT NULL DEFAULT now(),
        CONSTRAINT "pk_log_checkpoints" PRIMARY KEY ("size"),
        CONSTRAINT "ck_log_checkpoints_size" CHECK ("size" >= 0),
        CONSTRAINT "ck_log_checkpoints_root" CHECK ("root" ~ '^[0-9a-f]{64}$')
      )`);
    await q.query(`
      CREATE TABLE "log_witnesses" (
        "id" uuid NOT NULL DEFAULT gen_random_uuid(),
        "name" varchar(200) NOT NULL,
        "key" varchar(300) NOT NULL,
        "registered_at" timestamptz NOT NULL DEFAULT now(),
        "registered_by" varchar(64) NOT NULL,
        "last_cosigned_at" timestamptz,
        "last_cosigned_size" bigint,
        CONSTRAINT "pk_log_witnesses" PRIMARY KEY ("id"),
        CONSTRAINT "uq_log_witnesses_name" UNIQUE ("name"),
        CONSTRAINT "uq_log_witnesses_key" UNIQUE ("key")
      )`);
    await q.query(`
      CREATE TABLE "log_cosignatures" (
        "checkpoint_size" bigint NOT NULL,
        "witness_id" uuid NOT NULL,
        "line" text NOT NULL,
        "cosigned_time" bigint NOT NULL,
        "received_at" timestamptz NOT NULL DEFAULT now(),
        CONSTRAINT "pk_log_cosignatures" PRIMARY KEY ("checkpoint_size", "witness_id"),
        CONSTRAINT "fk_log_cosignatures_checkpoint" FOREIGN KEY ("checkpoint_size")
          REFERENCES "log_checkpoints" ("size") ON DELETE CASCADE,
        CONSTRAINT "fk_log_cosignatures_witness" FOREIGN KEY ("witness_id")
          REFERENCES "log_witnesses" ("id") ON DELETE CASCADE
      )`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE "log_cosignatures"`);
    await q.query(`DROP TABLE "log_witnesses"`);
    await q.query(`DROP TABLE "log_checkpoints"`);
    await q.query(`DROP TABLE "log_head"`);
  }
}
