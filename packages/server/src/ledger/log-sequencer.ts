import {
  Inject,
  Injectable,
  Logger,
  Optional,
  type OnModuleDestroy,
  type OnModuleInit,
} from '@nestjs/common';
import { DataSource, type EntityManager } from 'typeorm';
import { outsideRequestTransaction } from '../idempotency/request-transaction';
import { NO_LOG_JOBS } from '../log/log-jobs';

/** Transaction advisory lock held by the one pass of the log sequencer at a time ("BRLOGSQ1"). */
export const SEQUENCER_LOCK_KEY = 0x42524c4f47535131n;
/** Most entries one pass numbers. */
const BATCH = 5000;
/** A pass also runs this often, for entries committed by an instance that stopped before its own pass. */
const SWEEP_MS = 1000;

/**
 * Numbers committed entries that have no log index yet, in one transaction under the
 * sequencer's lock: the next indices after the log's size, in the order the entries became
 * visible, a transaction's entries together in the order they were written. Returns how many
 * it numbered. Entries of one roll are committed one after the other (under the lot's row
 * lock), so their indices follow their seqs.
 */
export async function sequencePass(manager: EntityManager): Promise<number> {
  await manager.query('SELECT pg_advisory_xact_lock($1::bigint)', [SEQUENCER_LOCK_KEY.toString()]);
  const rows: Array<{ n: string }> = await manager.query(
    `WITH "new" AS (
       SELECT "id", min("id") OVER (PARTITION BY "xmin"::text) AS "tx"
         FROM "entries" WHERE "log_index" IS NULL ORDER BY "id" LIMIT ${BATCH}),
     "todo" AS (SELECT "id", row_number() OVER (ORDER BY "tx", "id") AS "ord" FROM "new"),
     "head" AS (
       UPDATE "log_head" SET "size" = "size" + (SELECT count(*) FROM "todo") WHERE "id" = 1
       RETURNING "size" - (SELECT count(*) FROM "todo") AS "first"),
     "done" AS (
       UPDATE "entries" e SET "log_index" = (SELECT "first" FROM "head") + t."ord" - 1
         FROM "todo" t WHERE e."id" = t."id" RETURNING 1)
     SELECT count(*) AS "n" FROM "done"`,
  );
  return Number(rows[0]?.n ?? 0);
}

/**
 * The log sequencer: appends do not wait for it. After each commit the ledger kicks it, and
 * one pass (one instance at a time, by an advisory lock) numbers every entry committed since
 * the last; a sweep every second catches anything left. Appends to different lots therefore
 * never serialise on the log.
 */
@Injectable()
export class LogSequencer implements OnModuleInit, OnModuleDestroy {
  private readonly logger = new Logger('log-sequencer');
  private running?: Promise<void>;
  private again = false;
  private timer?: NodeJS.Timeout;

  constructor(
    private readonly dataSource: DataSource,
    @Optional() @Inject(NO_LOG_JOBS) private readonly noJobs?: boolean,
  ) {}

  onModuleInit(): void {
    if (this.noJobs) return;
    this.timer = setInterval(() => this.kick(), SWEEP_MS);
    this.timer.unref();
  }

  /** Stops the sweep and lets a pass under way finish before the database connections close. */
  async onModuleDestroy(): Promise<void> {
    if (this.timer) clearInterval(this.timer);
    while (this.running) await this.running;
  }

  /** Asks for a pass soon; calls during a pass coalesce into one more pass after it. */
  kick(): void {
    if (this.running) {
      this.again = true;
      return;
    }
    // Kicked from inside an append, perhaps within a request's transaction: the pass runs on a
    // connection of its own, never on the request's (its COMMIT would end the request's work).
    this.running = outsideRequestTransaction(() => this.loop()).finally(() => {
      this.running = undefined;
    });
  }

  /** Numbers every entry committed so far (runs passes until none is left); for tests and the signer. */
  async settle(): Promise<void> {
    while (this.running) await this.running;
    for (;;) {
      const n = await this.dataSource.transaction('READ COMMITTED', sequencePass);
      if (n === 0) return;
    }
  }

  private async loop(): Promise<void> {
    do {
      this.again = false;
      try {
        let n: number;
        do n = await this.dataSource.transaction('READ COMMITTED', sequencePass);
        while (n === BATCH);
      } catch (err) {
        if (this.dataSource.isInitialized)
          this.logger.error(`sequencer pass failed: ${(err as Error).message}`);
        return;
      }
    } while (this.again);
  }
}
