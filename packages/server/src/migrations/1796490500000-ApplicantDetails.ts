import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * What an applicant tells the registrar about their business: its address, website and trade
 * references. Accounts from before this migration have none (empty text, no website).
 */
export class ApplicantDetails1796490500000 implements MigrationInterface {
  name = 'ApplicantDetails1796490500000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE "accounts" ADD COLUMN "address" varchar(300) NOT NULL DEFAULT ''`);
    await q.query(`ALTER TABLE "accounts" ADD COLUMN "website" varchar(200)`);
    await q.query(`ALTER TABLE "accounts" ADD COLUMN "trade_references" text NOT NULL DEFAULT ''`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE "accounts" DROP COLUMN "trade_references"`);
    await q.query(`ALTER TABLE "accounts" DROP COLUMN "website"`);
    await q.query(`ALTER TABLE "accounts" DROP COLUMN "address"`);
  }
}
