import { Injectable } from '@nestjs/common';
import type { ThrottlerStorage } from '@nestjs/throttler';
import { DataSource } from 'typeorm';

/** What the throttler guard needs back from one counted attempt. */
interface WindowRecord {
  totalHits: number;
  timeToExpire: number;
  isBlocked: boolean;
  timeToBlockExpire: number;
}

/**
 * Rate-limit counts in PostgreSQL (`rate_limit_windows`), shared by every server instance: a
 * fixed window per key that starts with the first attempt and lasts `ttl`; attempts past the
 * limit are refused until the window ends. One upsert per attempt; windows that ended long ago
 * are swept now and then.
 */
@Injectable()
export class PgThrottlerStorage implements ThrottlerStorage {
  private attempts = 0;

  constructor(private readonly dataSource: DataSource) {}

  async increment(
    key: string,
    ttl: number,
    limit: number,
    _block: number,
    name: string,
  ): Promise<WindowRecord> {
    const [row] = (await this.dataSource.query(
      `INSERT INTO "rate_limit_windows" AS w ("key", "limit_name", "window_end", "hits")
       VALUES ($1, $2, now() + make_interval(secs => $3::double precision / 1000), 1)
       ON CONFLICT ("key", "limit_name") DO UPDATE SET
         "hits" = CASE WHEN w."window_end" <= now() THEN 1 ELSE w."hits" + 1 END,
         "window_end" = CASE WHEN w."window_end" <= now() THEN EXCLUDED."window_end" ELSE w."window_end" END
       RETURNING "hits", EXTRACT(EPOCH FROM ("window_end" - now())) AS "left"`,
      [key, name, ttl],
    )) as Array<{ hits: number; left: string }>;
    if (++this.attempts % 200 === 0) {
      await this.dataSource.query(
        `DELETE FROM "rate_limit_windows" WHERE "window_end" < now() - interval '1 hour'`,
      );
    }
    const seconds = Math.max(1, Math.ceil(Number(row!.left)));
    const isBlocked = row!.hits > limit;
    return {
      totalHits: row!.hits,
      timeToExpire: seconds,
      isBlocked,
      timeToBlockExpire: isBlocked ? seconds : 0,
    };
  }
}
