import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Idempotency keys of writes: who used the key, what request it came with and what was answered,
 * so a repeated request is answered again without writing again. Rows older than 24 hours are
 * ignored and swept.
 */
export class CreateIdempotencyKeys1796480000000 implements MigrationInterface {
  name = 'CreateIdempotencyKeys1796480000000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`CREATE TABLE "idempotency_keys" (
      "account" text NOT NULL,
      "key" text NOT NULL,
      "request_digest" char(64) NOT NULL,
      "status" smallint NOT NULL,
      "body" text,
      "created_at" timestamptz NOT NULL DEFAULT now(),
      CONSTRAINT "pk_idempotency_keys" PRIMARY KEY ("account", "key"),
      CONSTRAINT "ck_idempotency_keys_key" CHECK (length("key") BETWEEN 1 AND 255),
      CONSTRAINT "ck_idempotency_keys_digest" CHECK ("request_digest" ~ '^[0-9a-f]{64}$'),
      CONSTRAINT "ck_idempotency_keys_status" CHECK ("status" BETWEEN 100 AND 599)
    )`);
    await q.query(`CREATE INDEX "ix_idempotency_keys_created_at" ON "idempotency_keys" ("created_at")`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE "idempotency_keys"`);
  }
}
