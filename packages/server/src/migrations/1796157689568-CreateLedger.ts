import type { MigrationInterface, QueryRunner } from 'typeorm';

const KINDS = [
  'registered',
  'described',
  'observed',
  'exhibit-added',
  'opinion',
  'opinion-withdrawn',
  'transfer-offered',
  'transfer-accepted',
  'transfer-declined',
  'transfer-withdrawn',
  'transfer-lapsed',
  'split',
  'combined',
  'sold',
  'retired',
  'redacted',
  'note',
];

/**
 * Lots, their append-only roll entries, entry bodies kept apart (for redaction), sealed fields,
 * and the derived lot view for listing. Triggers make the database itself refuse any change to
 * an entry (except filling in the reserved log index once), to a sealed field, and to a body
 * except its deletion after a `redacted` entry names it.
 */
export class CreateLedger1796157689568 implements MigrationInterface {
  name = 'CreateLedger1796157689568';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE "lots" (
        "id" uuid NOT NULL DEFAULT gen_random_uuid(),
        "code" varchar(9) NOT NULL,
        "head_seq" integer NOT NULL,
        "head_hash" char(64) NOT NULL,
        "head_time" varchar(24) NOT NULL,
        "state" jsonb NOT NULL,
        "created_at" timestamptz NOT NULL DEFAULT now(),
        CONSTRAINT "pk_lots" PRIMARY KEY ("id"),
        CONSTRAINT "uq_lots_code" UNIQUE ("code"),
        CONSTRAINT "ck_lots_code" CHECK ("code" ~ '^[0-9A-HJKMNP-TV-Z]{9}$'),
        CONSTRAINT "ck_lots_head_seq" CHECK ("head_seq" >= 0)
      )`);
    await q.query(`
      CREATE TABLE "entries" (
        "id" bigint GENERATED ALWAYS AS IDENTITY,
        "lot_id" uuid NOT NULL,
        "seq" integer NOT NULL,
        "kind" varchar(32) NOT NULL,
        "actor" varchar(64) NOT NULL,
        "time" varchar(24) NOT NULL,
        "hash" char(64) NOT NULL,
        "header" text NOT NULL,
        "log_index" bigint,
        "redacts_seq" integer,
        "recorded_at" timestamptz NOT NULL DEFAULT now(),
        CONSTRAINT "pk_entries" PRIMARY KEY ("id"),
        CONSTRAINT "uq_entries_lot_seq" UNIQUE ("lot_id", "seq"),
        CONSTRAINT "uq_entries_hash" UNIQUE ("hash"),
        CONSTRAINT "uq_entries_log_index" UNIQUE ("log_index"),
        CONSTRAINT "ck_entries_seq" CHECK ("seq" >= 0),
        CONSTRAINT "ck_entries_hash" CHECK ("hash" ~ '^[0-9a-f]{64}$'),
        CONSTRAINT "ck_entries_log_index" CHECK ("log_index" IS NULL OR "log_index" >= 0),
        CONSTRAINT "ck_entries_kind" CHECK ("kind" IN (${KINDS.map((k) => `'${k}'`).join(', ')})),
        CONSTRAINT "ck_entries_redacts_seq" CHECK (("kind" = 'redacted') = ("redacts_seq" IS NOT NULL)),
        CONSTRAINT "fk_entries_lot" FOREIGN KEY ("lot_id") REFERENCES "lots"("id") ON DELETE RESTRICT
      )`);
    await q.query(`CREATE INDEX "ix_entries_actor" ON "entries" ("actor")`);
    await q.query(`
      CREATE TABLE "entry_bodies" (
        "entry_id" bigint NOT NULL,
        "body" text NOT NULL,
        CONSTRAINT "pk_entry_bodies" PRIMARY KEY ("entry_id"),
        CONSTRAINT "fk_entry_bodies_entry" FOREIGN KEY ("entry_id") REFERENCES "entries"("id") ON DELETE RESTRICT
      )`);
    await q.query(`
      CREATE TABLE "sealed_fields" (
        "id" bigint GENERATED ALWAYS AS IDENTITY,
        "entry_id" bigint NOT NULL,
        "name" varchar(40) NOT NULL,
        "salt" char(32) NOT NULL,
        "value" text NOT NULL,
        "commitment" char(64) NOT NULL,
        "visible_to" varchar(64)[] NOT NULL,
        CONSTRAINT "pk_sealed_fields" PRIMARY KEY ("id"),
        CONSTRAINT "uq_sealed_fields_entry_name" UNIQUE ("entry_id", "name"),
        CONSTRAINT "ck_sealed_fields_salt" CHECK ("salt" ~ '^[0-9a-f]{32}$'),
        CONSTRAINT "ck_sealed_fields_commitment" CHECK ("commitment" ~ '^[0-9a-f]{64}$'),
        CONSTRAINT "fk_sealed_fields_entry" FOREIGN KEY ("entry_id") REFERENCES "entries"("id") ON DELETE RESTRICT
      )`);
    await q.query(`
      CREATE TABLE "lot_views" (
        "lot_id" uuid NOT NULL,
        "code" varchar(9) NOT NULL,
        "title" varchar(200) NOT NULL,
        "form" varchar(16),
        "status" varchar(16) NOT NULL,
        "holder" varchar(64) NOT NULL,
        "listed" boolean NOT NULL,
        "origin" varchar(32),
        "count_value" integer NOT NULL,
        "count_estimated" boolean NOT NULL,
        "dissent_count" integer NOT NULL,
        "offer_recipient" varchar(64),
        "observations" jsonb,
        "head_seq" integer NOT NULL,
        "search_text" text NOT NULL,
        "search" tsvector GENERATED ALWAYS AS (to_tsvector('english', "search_text")) STORED,
        "registered_at" timestamptz NOT NULL,
        "updated_at" timestamptz NOT NULL,
        CONSTRAINT "pk_lot_views" PRIMARY KEY ("lot_id"),
        CONSTRAINT "fk_lot_views_lot" FOREIGN KEY ("lot_id") REFERENCES "lots"("id") ON DELETE RESTRICT
      )`);
    await q.query(`CREATE UNIQUE INDEX "ix_lot_views_code" ON "lot_views" ("code")`);
    await q.query(`CREATE INDEX "ix_lot_views_holder" ON "lot_views" ("holder")`);
    await q.query(`CREATE INDEX "ix_lot_views_status" ON "lot_views" ("status")`);
    await q.query(`CREATE INDEX "ix_lot_views_listed_registered" ON "lot_views" ("listed", "registered_at")`);
    await q.query(`CREATE INDEX "ix_lot_views_search" ON "lot_views" USING GIN ("search")`);

    await q.query(`
      CREATE FUNCTION "beadroll_refuse_change"() RETURNS trigger LANGUAGE plpgsql AS $$
      BEGIN
        RAISE EXCEPTION '% on % is refused: roll records are append-only', TG_OP, TG_TABLE_NAME
          USING ERRCODE = 'insufficient_privilege';
      END $$`);
    await q.query(`
      CREATE FUNCTION "beadroll_entries_guard"() RETURNS trigger LANGUAGE plpgsql AS $$
      BEGIN
        IF TG_OP = 'UPDATE' AND OLD."log_index" IS NULL AND NEW."log_index" IS NOT NULL
           AND (NEW."id", NEW."lot_id", NEW."seq", NEW."kind", NEW."actor", NEW."time", NEW."hash",
                NEW."header", NEW."redacts_seq", NEW."recorded_at")
               IS NOT DISTINCT FROM
               (OLD."id", OLD."lot_id", OLD."seq", OLD."kind", OLD."actor", OLD."time", OLD."hash",
                OLD."header", OLD."redacts_seq", OLD."recorded_at") THEN
          RETURN NEW;
        END IF;
        RAISE EXCEPTION '% on entries is refused: roll entries are append-only', TG_OP
          USING ERRCODE = 'insufficient_privilege';
      END $$`);
    await q.query(`
      CREATE FUNCTION "beadroll_entry_bodies_guard"() RETURNS trigger LANGUAGE plpgsql AS $$
      BEGIN
        IF TG_OP = 'DELETE' AND current_setting('beadroll.redaction', true) = 'on' AND EXISTS (
             SELECT 1 FROM "entries" t
             JOIN "entries" r ON r."lot_id" = t."lot_id" AND r."kind" = 'redacted' AND r."redacts_seq" = t."seq"
             WHERE t."id" = OLD."entry_id") THEN
          RETURN OLD;
        END IF;
        RAISE EXCEPTION '% on entry_bodies is refused: a body is removed only by a recorded redaction', TG_OP
          USING ERRCODE = 'insufficient_privilege';
      END $$`);
    await q.query(`
      CREATE TRIGGER "tr_entries_append_only" BEFORE UPDATE OR DELETE ON "entries"
      FOR EACH ROW EXECUTE FUNCTION "beadroll_entries_guard"()`);
    await q.query(`
      CREATE TRIGGER "tr_entry_bodies_guard" BEFORE UPDATE OR DELETE ON "entry_bodies"
      FOR EACH ROW EXECUTE FUNCTION "beadroll_entry_bodies_guard"()`);
    await q.query(`
      CREATE TRIGGER "tr_sealed_fields_append_only" BEFORE UPDATE OR DELETE ON "sealed_fields"
      FOR EACH ROW EXECUTE FUNCTION "beadroll_refuse_change"()`);
    await q.query(`
      CREATE TRIGGER "tr_lots_no_delete" BEFORE DELETE ON "lots"
      FOR EACH ROW EXECUTE FUNCTION "beadroll_refuse_change"()`);
    for (const table of ['lots', 'entries', 'entry_bodies', 'sealed_fields']) {
      await q.query(`
        CREATE TRIGGER "tr_${table}_no_truncate" BEFORE TRUNCATE ON "${table}"
        FOR EACH STATEMENT EXECUTE FUNCTION "beadroll_refuse_change"()`);
    }
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE "lot_views"`);
    await q.query(`DROP TABLE "sealed_fields"`);
    await q.query(`DROP TABLE "entry_bodies"`);
    await q.query(`DROP TABLE "entries"`);
    await q.query(`DROP TABLE "lots"`);
    await q.query(`DROP FUNCTION "beadroll_entry_bodies_guard"()`);
    await q.query(`DROP FUNCTION "beadroll_entries_guard"()`);
    await q.query(`DROP FUNCTION "beadroll_refuse_change"()`);
  }
}
