import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * A holder's request for an opinion on a lot, to one named assessor or to any verified
 * assessor. While it is open the assessor may read the lot (listed or not) and record an
 * opinion on it; it closes when an opinion is recorded or the holder cancels.
 */
export class OpinionRequests1796490400000 implements MigrationInterface {
  name = 'OpinionRequests1796490400000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE "opinion_requests" (
        "id" uuid NOT NULL DEFAULT gen_random_uuid(),
        "lot_id" uuid NOT NULL,
        "code" varchar(9) NOT NULL,
        "requester" varchar(64) NOT NULL,
        "assessor" varchar(64),
        "note" text,
        "status" varchar(16) NOT NULL,
        "created_at" timestamptz NOT NULL DEFAULT now(),
        "closed_at" timestamptz,
        "answered_by" varchar(64),
        "opinion_seq" integer,
        CONSTRAINT "pk_opinion_requests" PRIMARY KEY ("id"),
        CONSTRAINT "fk_opinion_requests_lot" FOREIGN KEY ("lot_id") REFERENCES "lots"("id") ON DELETE RESTRICT,
        CONSTRAINT "ck_opinion_requests_status" CHECK ("status" IN ('open', 'answered', 'cancelled'))
      )`);
    await q.query(`CREATE INDEX "ix_opinion_requests_lot_status" ON "opinion_requests" ("lot_id", "status")`);
    await q.query(`CREATE INDEX "ix_opinion_requests_assessor" ON "opinion_requests" ("assessor", "status")`);
    await q.query(
      `CREATE INDEX "ix_opinion_requests_requester" ON "opinion_requests" ("requester", "created_at")`,
    );
    // One open request per lot and assessor (or per lot for "any verified assessor").
    await q.query(
      `CREATE UNIQUE INDEX "uq_opinion_requests_open" ON "opinion_requests" ("lot_id", coalesce("assessor", ''))
         WHERE "status" = 'open'`,
    );
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE "opinion_requests"`);
  }
}
