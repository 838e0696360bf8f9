import type { MigrationInterface, QueryRunner } from 'typeorm';

const BEFORE = [
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
  'sale-voided',
  'retired',
  'redacted',
  'note',
];

const list = (kinds: string[]) => kinds.map((k) => `'${k}'`).join(', ');

/**
 * Opinion requests go on the roll (ledger format version 3): rolls take `opinion-requested` and
 * `opinion-request-closed`, and each request row keeps the seq of its `opinion-requested` entry
 * (null for requests made before, which stay off the roll).
 */
export class OpinionRequestsOnTheRoll1796490900000 implements MigrationInterface {
  name = 'OpinionRequestsOnTheRoll1796490900000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE "entries" DROP CONSTRAINT "ck_entries_kind"`);
    await q.query(
      `ALTER TABLE "entries" ADD CONSTRAINT "ck_entries_kind" CHECK ("kind" IN (${list([...BEFORE, 'opinion-requested', 'opinion-request-closed'])}))`,
    );
    await q.query(`ALTER TABLE "opinion_requests" ADD "request_seq" integer`);
    await q.query(
      `CREATE UNIQUE INDEX "uq_opinion_requests_seq" ON "opinion_requests" ("lot_id", "request_seq")
         WHERE "request_seq" IS NOT NULL`,
    );
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP INDEX "uq_opinion_requests_seq"`);
    await q.query(`ALTER TABLE "opinion_requests" DROP COLUMN "request_seq"`);
    await q.query(`ALTER TABLE "entries" DROP CONSTRAINT "ck_entries_kind"`);
    await q.query(
      `ALTER TABLE "entries" ADD CONSTRAINT "ck_entries_kind" CHECK ("kind" IN (${list(BEFORE)}))`,
    );
  }
}
