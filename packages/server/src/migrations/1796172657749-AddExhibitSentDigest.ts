import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * The SHA-256 of an exhibit's file exactly as the dealer sent it, before normalisation. It is
 * kept on the server only (never on the roll): a redaction blocks it too, so sending the same
 * file again is refused even when re-encoding it would now give other stored bytes. Rows from
 * before this column have none.
 */
export class AddExhibitSentDigest1796172657749 implements MigrationInterface {
  name = 'AddExhibitSentDigest1796172657749';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE "exhibits" ADD COLUMN "sent_sha256" char(64)`);
    await q.query(
      `ALTER TABLE "exhibits" ADD CONSTRAINT "ck_exhibits_sent_sha256" CHECK ("sent_sha256" ~ '^[0-9a-f]{64}$')`,
    );
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE "exhibits" DROP CONSTRAINT "ck_exhibits_sent_sha256"`);
    await q.query(`ALTER TABLE "exhibits" DROP COLUMN "sent_sha256"`);
  }
}
