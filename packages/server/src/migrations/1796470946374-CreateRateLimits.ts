import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Rate-limit windows kept in PostgreSQL, so every server behind a load balancer counts the same
 * attempts: one row per (key, limit) with the end of its current window and the hits in it.
 */
export class CreateRateLimits1796470946374 implements MigrationInterface {
  name = 'CreateRateLimits1796470946374';

  async up(q: QueryRunner): Promise<void> {
    await q.query(
      `CREATE TABLE "rate_limit_windows" (
        "key" text NOT NULL,
        "limit_name" text NOT NULL,
        "window_end" timestamptz NOT NULL,
        "hits" integer NOT NULL,
        CONSTRAINT "pk_rate_limit_windows" PRIMARY KEY ("key", "limit_name"),
        CONSTRAINT "ck_rate_limit_windows_hits" CHECK ("hits" >= 0)
      )`,
    );
    await q.query(`CREATE INDEX "ix_rate_limit_windows_end" ON "rate_limit_windows" ("window_end")`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE "rate_limit_windows"`);
  }
}
