import { Global, Injectable, Module, type OnModuleDestroy, type OnModuleInit } from '@nestjs/common';
import { APP_INTERCEPTOR } from '@nestjs/core';
import { DataSource } from 'typeorm';
import { IdempotencyInterceptor } from './idempotency.interceptor';
import { installRequestTransactions } from './request-transaction';

const SWEEP_MS = 60 * 60 * 1000;

/** Sweeps idempotency keys older than 24 hours, hourly (a key that old is ignored anyway). */
@Injectable()
export class IdempotencySweeper implements OnModuleInit, OnModuleDestroy {
  private timer?: NodeJS.Timeout;

  constructor(private readonly dataSource: DataSource) {}

  onModuleInit(): void {
    installRequestTransactions(this.dataSource);
    this.timer = setInterval(() => void this.sweep().catch(() => undefined), SWEEP_MS);
    this.timer.unref();
  }

  onModuleDestroy(): void {
    clearInterval(this.timer);
  }

  async sweep(): Promise<number> {
    const rows: unknown[] = await this.dataSource.query(
      `DELETE FROM "idempotency_keys" WHERE "created_at" < now() - interval '24 hours' RETURNING 1`,
    );
    return rows.length;
  }
}

/** Idempotency keys on every write route (see {@link IdempotencyInterceptor}). */
@Global()
@Module({
  providers: [
    IdempotencyInterceptor,
    IdempotencySweeper,
    { provide: APP_INTERCEPTOR, useExisting: IdempotencyInterceptor },
  ],
  exports: [IdempotencyInterceptor, IdempotencySweeper],
})
export class IdempotencyModule {}
