import { Inject, Injectable, Logger, type OnModuleDestroy, type OnModuleInit } from '@nestjs/common';
import { SchedulerRegistry } from '@nestjs/schedule';
import { SYSTEM_ACTOR } from '@beadroll/core';
import { DataSource, LessThanOrEqual, type QueryRunner } from 'typeorm';
import { AppError } from '../common/app-error';
import type { AppConfig } from '../config/app-config';
import { APP_CONFIG } from '../config/config.module';
import { LedgerClock } from '../ledger/ledger.clock';
import { LedgerService } from '../ledger/ledger.service';
import { TransferOfferEntity } from './entities/transfer-offer.entity';
import { TransfersService } from './transfers.service';

/** Session advisory lock held by the one server that runs a lapse pass at a time ("BRLAPSE1"). */
export const LAPSE_LOCK_KEY = 0x42524c4150534531n;
const BATCH = 200;
const JOB = 'transfers:lapse-offers';

/** Outcome of one pass of the lapse job. */
export interface LapseRun {
  /** false when another server held the lock, so this one did nothing. */
  ran: boolean;
  lapsed: number;
}

/**
 * The one writer of `transfer-lapsed`, as the system account: the timed pass lapses offers nobody
 * answered within the configured days, and `lapseOffersOf` lapses every open offer of an account
 * that is suspended or closed. Both run under one PostgreSQL advisory lock, so one server at a
 * time lapses anything; each lapse is its own append under the lot's row lock and re-checks that
 * the offer is still open, so an answer arriving at the same moment wins or loses cleanly.
 */
@Injectable()
export class OfferLapseService implements OnModuleInit, OnModuleDestroy {
  private readonly logger = new Logger('offer-lapse');
  private running?: Promise<LapseRun>;

  constructor(
    @Inject(APP_CONFIG) private readonly config: AppConfig,
    private readonly dataSource: DataSource,
    private readonly ledger: LedgerService,
    private readonly clock: LedgerClock,
    private readonly transfers: TransfersService,
    private readonly scheduler: SchedulerRegistry,
  ) {}

  onModuleInit(): void {
    const seconds = this.config.transfers.lapseCheckSeconds;
    if (seconds <= 0) return;
    const timer = setInterval(() => {
      this.runOnce().catch((err: unknown) =>
        this.logger.error(`lapse pass failed: ${(err as Error).message}`),
      );
    }, seconds * 1000);
    timer.unref();
    this.scheduler.addInterval(JOB, timer);
  }

  /** Stops the timed passes and lets one under way finish before the database connections close. */
  async onModuleDestroy(): Promise<void> {
    if (this.scheduler.doesExist('interval', JOB)) this.scheduler.deleteInterval(JOB);
    await this.running?.catch(() => undefined);
  }

  /** One pass: lapses every offer open longer than the lapse period, unless another server is at it. */
  runOnce(): Promise<LapseRun> {
    this.running ??= this.pass().finally(() => {
      this.running = undefined;
    });
    return this.running;
  }

  private async pass(): Promise<LapseRun> {
    const result = await this.underLock(false, async () => {
      let lapsed = 0;
      const cutoff = new Date(this.clock.now().getTime() - this.config.transfers.lapseDays * 86_400_000);
      for (;;) {
        const due: TransferOfferEntity[] = await this.offers().find({
          where: { status: 'open', offeredAt: LessThanOrEqual(cutoff) },
          order: { offeredAt: 'ASC' },
          take: BATCH,
        });
        let done = 0;
        for (const offer of due) if (await this.lapse(offer, cutoff)) done += 1;
        lapsed += done;
        if (due.length < BATCH || done === 0) break;
      }
      return lapsed;
    });
    return result === undefined ? { ran: false, lapsed: 0 } : { ran: true, lapsed: result };
  }

  /**
   * Lapses every open offer the account made or was made, at once (its account was suspended or
   * closed); waits for a pass another server is running. Returns the codes of the lots whose
   * offers lapsed.
   */
  async lapseOffersOf(accountId: string): Promise<string[]> {
    const codes = await this.underLock(true, async () => {
      const open = await this.offers().find({
        where: [
          { status: 'open', offerer: accountId },
          { status: 'open', recipient: accountId },
        ],
        order: { code: 'ASC' },
      });
      const lapsed: string[] = [];
      for (const offer of open) if (await this.lapse(offer)) lapsed.push(offer.code);
      return lapsed;
    });
    if (codes?.length) this.logger.log(`lapsed ${codes.length} open offer(s) of account ${accountId}`);
    return codes ?? [];
  }

  private offers() {
    return this.dataSource.getRepository(TransferOfferEntity);
  }

  /** Runs `work` holding the lapse lock on a connection of its own; undefined when not waiting and taken. */
  private async underLock<T>(wait: boolean, work: () => Promise<T>): Promise<T | undefined> {
    const runner: QueryRunner = this.dataSource.createQueryRunner();
    await runner.connect();
    const key = LAPSE_LOCK_KEY.toString();
    try {
      if (wait) await runner.query('SELECT pg_advisory_lock($1::bigint)', [key]);
      else {
        const [{ locked }] = (await runner.query('SELECT pg_try_advisory_lock($1::bigint) AS "locked"', [
          key,
        ])) as Array<{ locked: boolean }>;
        if (!locked) return undefined;
      }
      try {
        return await work();
      } finally {
        await runner.query('SELECT pg_advisory_unlock($1::bigint)', [key]);
      }
    } finally {
      await runner.release();
    }
  }

  /** Lapses one offer; with a cutoff only when it was still open at that time. */
  private async lapse(offer: TransferOfferEntity, cutoff?: Date): Promise<boolean> {
    try {
      await this.ledger.withLots([offer.code], async (tx) => {
        await this.transfers.requireOpen(tx, offer);
        if (cutoff && new Date(tx.state(offer.code).openOffer!.time) > cutoff)
          throw new AppError('offer_closed', 'not due yet');
        await tx.append(offer.code, {
          kind: 'transfer-lapsed',
          actor: SYSTEM_ACTOR,
          body: { offerSeq: offer.offerSeq },
        });
      });
    } catch (err) {
      // Answered or withdrawn a moment ago: the answer won, nothing to do.
      if (err instanceof AppError && err.code === 'offer_closed') return false;
      this.logger.error(`could not lapse offer ${offer.id}: ${(err as Error).message}`);
      return false;
    }
    const done = await this.offers().findOne({ where: { id: offer.id } });
    if (done) await this.transfers.mailOfferEnded(done, 'lapsed');
    return true;
  }
}
