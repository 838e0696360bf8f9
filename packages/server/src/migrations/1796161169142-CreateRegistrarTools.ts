import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * The registrar's tools: the append-only record of registrar decisions, the blocked-digest
 * list, redaction requests from holders, reports from the public, and the one narrow path by
 * which the sealed details of a closed account are deleted.
 */
export class CreateRegistrarTools1796161169142 implements MigrationInterface {
  name = 'CreateRegistrarTools1796161169142';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE "registrar_actions" (
        "id" bigint GENERATED ALWAYS AS IDENTITY,
        "at" timestamptz NOT NULL DEFAULT now(),
        "actor" varchar(64) NOT NULL,
        "action" varchar(32) NOT NULL,
        "subject" varchar(120) NOT NULL,
        "reason" varchar(2000),
        "details" jsonb NOT NULL DEFAULT '{}'::jsonb,
        CONSTRAINT "pk_registrar_actions" PRIMARY KEY ("id"),
        CONSTRAINT "ck_registrar_actions_action" CHECK ("action" IN (
          'approved', 'rejected', 'suspended', 'reinstated', 'redacted',
          'redaction-declined', 'report-closed'))
      )`);
    await q.query(`CREATE INDEX "ix_registrar_actions_at" ON "registrar_actions" ("at", "id")`);
    await q.query(`CREATE INDEX "ix_registrar_actions_subject" ON "registrar_actions" ("subject")`);
    await q.query(`
      CREATE FUNCTION "beadroll_refuse_record_change"() RETURNS trigger LANGUAGE plpgsql AS $$
      BEGIN
        RAISE EXCEPTION '% on % is refused: the registrar''s record is append-only', TG_OP, TG_TABLE_NAME
          USING ERRCODE = 'insufficient_privilege';
      END $$`);
    await q.query(`
      CREATE TRIGGER "tr_registrar_actions_append_only" BEFORE UPDATE OR DELETE ON "registrar_actions"
      FOR EACH ROW EXECUTE FUNCTION "beadroll_refuse_record_change"()`);
    await q.query(`
      CREATE TRIGGER "tr_registrar_actions_no_truncate" BEFORE TRUNCATE ON "registrar_actions"
      FOR EACH STATEMENT EXECUTE FUNCTION "beadroll_refuse_record_change"()`);

    await q.query(`
      CREATE TABLE "blocked_digests" (
        "digest" char(64) NOT NULL,
        "lot" varchar(9) NOT NULL,
        "seq" integer NOT NULL,
        "reason" varchar(32) NOT NULL,
        "created_at" timestamptz NOT NULL DEFAULT now(),
        CONSTRAINT "pk_blocked_digests" PRIMARY KEY ("digest"),
        CONSTRAINT "ck_blocked_digests_digest" CHECK ("digest" ~ '^[0-9a-f]{64}$')
      )`);
    await q.query(`
      CREATE TRIGGER "tr_blocked_digests_append_only" BEFORE UPDATE OR DELETE ON "blocked_digests"
      FOR EACH ROW EXECUTE FUNCTION "beadroll_refuse_record_change"()`);

    await q.query(`
      CREATE TABLE "redaction_requests" (
        "id" uuid NOT NULL DEFAULT gen_random_uuid(),
        "lot" varchar(9) NOT NULL,
        "seq" integer NOT NULL,
        "requester" uuid NOT NULL,
        "note" varchar(1000) NOT NULL,
        "status" varchar(16) NOT NULL DEFAULT 'open',
        "decided_by" uuid,
        "decided_at" timestamptz,
        "decision_note" varchar(1000),
        "created_at" timestamptz NOT NULL DEFAULT now(),
        CONSTRAINT "pk_redaction_requests" PRIMARY KEY ("id"),
        CONSTRAINT "ck_redaction_requests_status" CHECK ("status" IN ('open', 'approved', 'declined')),
        CONSTRAINT "fk_redaction_requests_requester" FOREIGN KEY ("requester") REFERENCES "accounts"("id")
      )`);
    await q.query(
      `CREATE UNIQUE INDEX "uq_redaction_requests_open" ON "redaction_requests" ("lot", "seq") WHERE "status" = 'open'`,
    );
    await q.query(
      `CREATE INDEX "ix_redaction_requests_status" ON "redaction_requests" ("status", "created_at")`,
    );

    await q.query(`
      CREATE TABLE "reports" (
        "id" uuid NOT NULL DEFAULT gen_random_uuid(),
        "lot" varchar(9) NOT NULL,
        "category" varchar(32) NOT NULL,
        "text" varchar(2000) NOT NULL,
        "reporter_email" varchar(254),
        "status" varchar(16) NOT NULL DEFAULT 'open',
        "resolution" varchar(2000),
        "closed_by" uuid,
        "closed_at" timestamptz,
        "created_at" timestamptz NOT NULL DEFAULT now(),
        CONSTRAINT "pk_reports" PRIMARY KEY ("id"),
        CONSTRAINT "ck_reports_status" CHECK ("status" IN ('open', 'closed')),
        CONSTRAINT "ck_reports_category" CHECK ("category" IN (
          'wrong-attribution', 'counterfeit', 'personal-data', 'other'))
      )`);
    await q.query(`CREATE INDEX "ix_reports_status_created" ON "reports" ("status", "created_at")`);
    await q.query(`CREATE INDEX "ix_reports_lot" ON "reports" ("lot")`);

    // Sealed values stay immutable, with one exception: once an account is closed, the values it
    // recorded itself may be deleted, inside a transaction that names that account.
    await q.query(`DROP TRIGGER "tr_sealed_fields_append_only" ON "sealed_fields"`);
    await q.query(`
      CREATE FUNCTION "beadroll_sealed_fields_guard"() RETURNS trigger LANGUAGE plpgsql AS $$
      BEGIN
        IF TG_OP = 'DELETE' AND coalesce(current_setting('beadroll.closing_account', true), '') <> ''
           AND EXISTS (
             SELECT 1 FROM "entries" e JOIN "accounts" a ON a."id"::text = e."actor"
             WHERE e."id" = OLD."entry_id" AND e."actor" = current_setting('beadroll.closing_account', true)
               AND a."status" = 'closed') THEN
          RETURN OLD;
        END IF;
        RAISE EXCEPTION '% on sealed_fields is refused: sealed values change only when their account is closed', TG_OP
          USING ERRCODE = 'insufficient_privilege';
      END $$`);
    await q.query(`
      CREATE TRIGGER "tr_sealed_fields_guard" BEFORE UPDATE OR DELETE ON "sealed_fields"
      FOR EACH ROW EXECUTE FUNCTION "beadroll_sealed_fields_guard"()`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TRIGGER "tr_sealed_fields_guard" ON "sealed_fields"`);
    await q.query(`DROP FUNCTION "beadroll_sealed_fields_guard"()`);
    await q.query(`
      CREATE TRIGGER "tr_sealed_fields_append_only" BEFORE UPDATE OR DELETE ON "sealed_fields"
      FOR EACH ROW EXECUTE FUNCTION "beadroll_refuse_change"()`);
    await q.query(`DROP TABLE "reports"`);
    await q.query(`DROP TABLE "redaction_requests"`);
    await q.query(`DROP TABLE "blocked_digests"`);
    await q.query(`DROP TABLE "registrar_actions"`);
    await q.query(`DROP FUNCTION "beadroll_refuse_record_change"()`);
  }
}
