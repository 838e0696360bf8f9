import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * A checkpoint is kept under its origin as well as its size: when the service's public address
 * changes, the log signs its current size again under the new origin, and the checkpoint signed
 * under the old one stays (valid under the old key). Cosignatures name the checkpoint the same way.
 */
export class CheckpointOrigins1796491100000 implements MigrationInterface {
  name = 'CheckpointOrigins1796491100000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE "log_cosignatures" DROP CONSTRAINT "fk_log_cosignatures_checkpoint"`);
    await q.query(`ALTER TABLE "log_cosignatures" DROP CONSTRAINT "pk_log_cosignatures"`);
    await q.query(`ALTER TABLE "log_checkpoints" DROP CONSTRAINT "pk_log_checkpoints"`);
    await q.query(`ALTER TABLE "log_checkpoints" ADD COLUMN "origin" varchar(300)`);
    // The origin is the note's first line (C2SP tlog-checkpoint).
    await q.query(`UPDATE "log_checkpoints" SET "origin" = split_part("note", E'\\n', 1)`);
    await q.query(`ALTER TABLE "log_checkpoints" ALTER COLUMN "origin" SET NOT NULL`);
    await q.query(
      `ALTER TABLE "log_checkpoints" ADD CONSTRAINT "pk_log_checkpoints" PRIMARY KEY ("origin", "size")`,
    );
    await q.query(
      `CREATE INDEX "ix_log_checkpoints_newest" ON "log_checkpoints" ("size" DESC, "signed_at" DESC)`,
    );
    await q.query(`ALTER TABLE "log_cosignatures" ADD COLUMN "checkpoint_origin" varchar(300)`);
    await q.query(
      `UPDATE "log_cosignatures" s SET "checkpoint_origin" = c."origin"
         FROM "log_checkpoints" c WHERE c."size" = s."checkpoint_size"`,
    );
    await q.query(`ALTER TABLE "log_cosignatures" ALTER COLUMN "checkpoint_origin" SET NOT NULL`);
    await q.query(
      `ALTER TABLE "log_cosignatures" ADD CONSTRAINT "pk_log_cosignatures"
         PRIMARY KEY ("checkpoint_origin", "checkpoint_size", "witness_id")`,
    );
    await q.query(
      `ALTER TABLE "log_cosignatures" ADD CONSTRAINT "fk_log_cosignatures_checkpoint"
         FOREIGN KEY ("checkpoint_origin", "checkpoint_size")
         REFERENCES "log_checkpoints" ("origin", "size") ON DELETE CASCADE`,
    );
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE "log_cosignatures" DROP CONSTRAINT "fk_log_cosignatures_checkpoint"`);
    await q.query(`ALTER TABLE "log_cosignatures" DROP CONSTRAINT "pk_log_cosignatures"`);
    // One checkpoint per size again: the newest of each size stays, with its cosignatures.
    await q.query(
      `DELETE FROM "log_cosignatures" s USING "log_checkpoints" c
        WHERE c."origin" = s."checkpoint_origin" AND c."size" = s."checkpoint_size"
          AND EXISTS (SELECT 1 FROM "log_checkpoints" n
                       WHERE n."size" = c."size" AND n."signed_at" > c."signed_at")`,
    );
    await q.query(
      `DELETE FROM "log_checkpoints" c
        WHERE EXISTS (SELECT 1 FROM "log_checkpoints" n
                       WHERE n."size" = c."size" AND n."signed_at" > c."signed_at")`,
    );
    await q.query(`ALTER TABLE "log_cosignatures" DROP COLUMN "checkpoint_origin"`);
    await q.query(`DROP INDEX "ix_log_checkpoints_newest"`);
    await q.query(`ALTER TABLE "log_checkpoints" DROP CONSTRAINT "pk_log_checkpoints"`);
    await q.query(`ALTER TABLE "log_checkpoints" DROP COLUMN "origin"`);
    await q.query(`ALTER TABLE "log_checkpoints" ADD CONSTRAINT "pk_log_checkpoints" PRIMARY KEY ("size")`);
    await q.query(
      `ALTER TABLE "log_cosignatures" ADD CONSTRAINT "pk_log_cosignatures" PRIMARY KEY ("checkpoint_size", "witness_id")`,
    );
    await q.query(
      `ALTER TABLE "log_cosignatures" ADD CONSTRAINT "fk_log_cosignatures_checkpoint"
         FOREIGN KEY ("checkpoint_size") REFERENCES "log_checkpoints" ("size") ON DELETE CASCADE`,
    );
  }
}
