import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Derived lists of transfer offers and sales (kept in step with the rolls inside each append
 * transaction), and offers waiting for an invited dealer to join and be verified.
 */
export class CreateTransfers1796159943028 implements MigrationInterface {
  name = 'CreateTransfers1796159943028';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE "transfer_offers" (
        "id" uuid NOT NULL DEFAULT gen_random_uuid(),
        "lot_id" uuid NOT NULL,
        "code" varchar(9) NOT NULL,
        "title" varchar(200) NOT NULL,
        "offer_seq" integer NOT NULL,
        "offerer" varchar(64) NOT NULL,
        "recipient" varchar(64),
        "status" varchar(16) NOT NULL,
        "note" text,
        "offered_at" timestamptz NOT NULL,
        "answer_seq" integer,
        "answer_note" text,
        "answered_at" timestamptz,
        CONSTRAINT "pk_transfer_offers" PRIMARY KEY ("id"),
        CONSTRAINT "uq_transfer_offers_lot_seq" UNIQUE ("lot_id", "offer_seq"),
        CONSTRAINT "ck_transfer_offers_status" CHECK ("status" IN ('open', 'accepted', 'declined', 'withdrawn', 'lapsed')),
        CONSTRAINT "fk_transfer_offers_lot" FOREIGN KEY ("lot_id") REFERENCES "lots"("id") ON DELETE RESTRICT
      )`);
    await q.query(`CREATE INDEX "ix_transfer_offers_offerer" ON "transfer_offers" ("offerer", "offered_at")`);
    await q.query(
      `CREATE INDEX "ix_transfer_offers_recipient" ON "transfer_offers" ("recipient", "offered_at")`,
    );
    await q.query(
      `CREATE INDEX "ix_transfer_offers_open" ON "transfer_offers" ("offered_at") WHERE "status" = 'open'`,
    );
    await q.query(`
      CREATE TABLE "sales" (
        "id" uuid NOT NULL DEFAULT gen_random_uuid(),
        "lot_id" uuid NOT NULL,
        "code" varchar(9) NOT NULL,
        "title" varchar(200) NOT NULL,
        "seq" integer NOT NULL,
        "seller" varchar(64) NOT NULL,
        "sold_on" date NOT NULL,
        "recorded_at" timestamptz NOT NULL,
        "receipt_sent_at" timestamptz,
        CONSTRAINT "pk_sales" PRIMARY KEY ("id"),
        CONSTRAINT "uq_sales_lot" UNIQUE ("lot_id"),
        CONSTRAINT "fk_sales_lot" FOREIGN KEY ("lot_id") REFERENCES "lots"("id") ON DELETE RESTRICT
      )`);
    await q.query(`CREATE INDEX "ix_sales_seller" ON "sales" ("seller", "sold_on")`);
    await q.query(`
      CREATE TABLE "transfer_invitations" (
        "id" uuid NOT NULL DEFAULT gen_random_uuid(),
        "lot_id" uuid NOT NULL,
        "code" varchar(9) NOT NULL,
        "inviter" uuid NOT NULL,
        "email" varchar(254) NOT NULL,
        "note" text,
        "price" jsonb,
        "status" varchar(16) NOT NULL,
        "status_reason" varchar(500),
        "invitee" uuid,
        "offer_seq" integer,
        "created_at" timestamptz NOT NULL DEFAULT now(),
        "updated_at" timestamptz NOT NULL DEFAULT now(),
        CONSTRAINT "pk_transfer_invitations" PRIMARY KEY ("id"),
        CONSTRAINT "ck_transfer_invitations_status" CHECK ("status" IN ('waiting', 'offered', 'stalled', 'cancelled')),
        CONSTRAINT "fk_transfer_invitations_lot" FOREIGN KEY ("lot_id") REFERENCES "lots"("id") ON DELETE RESTRICT,
        CONSTRAINT "fk_transfer_invitations_inviter" FOREIGN KEY ("inviter") REFERENCES "accounts"("id") ON DELETE RESTRICT
      )`);
    await q.query(
      `CREATE INDEX "ix_transfer_invitations_inviter" ON "transfer_invitations" ("inviter", "created_at")`,
    );
    await q.query(
      `CREATE INDEX "ix_transfer_invitations_email" ON "transfer_invitations" (lower("email")) WHERE "status" = 'waiting'`,
    );
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE "transfer_invitations"`);
    await q.query(`DROP TABLE "sales"`);
    await q.query(`DROP TABLE "transfer_offers"`);
  }
}
