import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * An applicant's optional document (PDF, JPEG or PNG), kept in blob storage under its SHA-256;
 * the account keeps the digest, type, size and the file name as sent, for the registrar.
 */
export class ApplicantDocument1796491000000 implements MigrationInterface {
  name = 'ApplicantDocument1796491000000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE "accounts" ADD COLUMN "document_sha256" char(64)`);
    await q.query(`ALTER TABLE "accounts" ADD COLUMN "document_type" varchar(40)`);
    await q.query(`ALTER TABLE "accounts" ADD COLUMN "document_size" integer`);
    await q.query(`ALTER TABLE "accounts" ADD COLUMN "document_name" varchar(200)`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE "accounts" DROP COLUMN "document_name"`);
    await q.query(`ALTER TABLE "accounts" DROP COLUMN "document_size"`);
    await q.query(`ALTER TABLE "accounts" DROP COLUMN "document_type"`);
    await q.query(`ALTER TABLE "accounts" DROP COLUMN "document_sha256"`);
  }
}
