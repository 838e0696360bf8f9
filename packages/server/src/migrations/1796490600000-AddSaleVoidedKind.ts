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
  'retired',
  'redacted',
  'note',
];

const list = (kinds: string[]) => kinds.map((k) => `'${k}'`).join(', ');

/** Rolls take a `sale-voided` entry: the seller undoes a sale recorded by mistake. */
export class AddSaleVoidedKind1796490600000 implements MigrationInterface {
  name = 'AddSaleVoidedKind1796490600000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE "entries" DROP CONSTRAINT "ck_entries_kind"`);
    await q.query(
      `ALTER TABLE "entries" ADD CONSTRAINT "ck_entries_kind" CHECK ("kind" IN (${list([...BEFORE, 'sale-voided'])}))`,
    );
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE "entries" DROP CONSTRAINT "ck_entries_kind"`);
    await q.query(
      `ALTER TABLE "entries" ADD CONSTRAINT "ck_entries_kind" CHECK ("kind" IN (${list(BEFORE)}))`,
    );
  }
}
