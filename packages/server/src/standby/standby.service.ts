import { Inject, Injectable, Logger, type OnApplicationShutdown } from '@nestjs/common';
import { DataSource, type EntityManager } from 'typeorm';
import type { AppConfig } from '../config/app-config';
import { APP_CONFIG } from '../config/config.module';
import { ENTITIES } from '../database/entities';

/** Where a read was answered from. */
export type ReadSource = 'standby' | 'primary';

/** The standby as the last look found it. */
export interface StandbyStatus {
  configured: boolean;
  /** Replay lag in milliseconds (0 when the standby has replayed all it received); null when unknown. */
  lagMs: number | null;
  /** true when public reads go to the standby now. */
  usable: boolean;
}

/** How long one look at the standby's lag is trusted, so a burst of reads costs one extra query. */
const LAG_CHECK_MS = 500;

/**
 * Public reads from a streaming hot standby, when one is configured and its replay lag is under
 * `STANDBY_MAX_LAG_MS`; otherwise (no standby, too far behind, not streaming, unreachable) from
 * the primary. Writes never come here: they always go to the primary through the ledger. A
 * signed-in writer's own reads go through the ordinary routes on the primary, so a dealer always
 * sees what they just wrote.
 */
@Injectable()
export class StandbyService implements OnApplicationShutdown {
  private readonly log = new Logger('standby');
  private source: DataSource | null = null;
  private starting: Promise<DataSource> | null = null;
  private last: { at: number; status: StandbyStatus } = {
    at: 0,
    status: { configured: false, lagMs: null, usable: false },
  };
  private checking: Promise<StandbyStatus> | null = null;

  constructor(
    @Inject(APP_CONFIG) private readonly config: AppConfig,
    private readonly primary: DataSource,
  ) {}

  /**
   * The manager for a public read and where it reads from. A `writer` (a signed-in reader, who
   * may have just written) always reads the primary, so they see their own writes at once.
   */
  async reader(writer = false): Promise<{ manager: EntityManager; from: ReadSource }> {
    if (writer) return { manager: this.primary.manager, from: 'primary' };
    const status = await this.status();
    if (status.usable && this.source) return { manager: this.source.manager, from: 'standby' };
    return { manager: this.primary.manager, from: 'primary' };
  }

  /** The standby's replay lag and whether reads use it (looked at most every half second). */
  async status(): Promise<StandbyStatus> {
    if (!this.config.standby) return { configured: false, lagMs: null, usable: false };
    if (Date.now() - this.last.at < LAG_CHECK_MS) return this.last.status;
    this.checking ??= this.look().finally(() => (this.checking = null));
    return this.checking;
  }

  private async look(): Promise<StandbyStatus> {
    const bound = this.config.standby!.maxLagMs;
    let status: StandbyStatus;
    try {
      const ds = await this.connect();
      // On a standby: 0 when everything received is replayed, else the age of the last replayed
      // transaction; not usable unless WAL is streaming from the primary. A promoted standby is
      // a primary and is read as such.
      const [row] = (await ds.query(
        `SELECT pg_is_in_recovery() AS "recovering",
                (SELECT "status" FROM pg_stat_wal_receiver) AS "receiver",
                CASE WHEN pg_last_wal_receive_lsn() = pg_last_wal_replay_lsn() THEN 0
                     ELSE EXTRACT(EPOCH FROM (now() - pg_last_xact_replay_timestamp())) * 1000 END AS "lag"`,
      )) as Array<{ recovering: boolean; receiver: string | null; lag: string | number | null }>;
      const lagMs = !row!.recovering ? 0 : row!.lag === null ? null : Math.round(Number(row!.lag));
      const streaming = !row!.recovering || row!.receiver === 'streaming';
      status = { configured: true, lagMs, usable: streaming && lagMs !== null && lagMs <= bound };
    } catch (e) {
      if (this.last.status.usable)
        this.log.warn(`standby unreachable, reading from the primary: ${String(e)}`);
      status = { configured: true, lagMs: null, usable: false };
    }
    this.last = { at: Date.now(), status };
    return status;
  }

  private async connect(): Promise<DataSource> {
    if (this.source?.isInitialized) return this.source;
    this.starting ??= (async () => {
      const { host, port } = this.config.standby!;
      const db = this.config.db;
      const ds = new DataSource({
        type: 'postgres',
        host,
        port,
        username: db.user,
        password: db.password,
        database: db.database,
        // The same entities as the primary, so a public read can use its repositories here too.
        entities: ENTITIES,
        synchronize: false,
        migrationsRun: false,
        logging: ['error'],
        extra: { max: 5, application_name: `beadroll-standby-reads`, connectionTimeoutMillis: 2000 },
      });
      await ds.initialize();
      this.source = ds;
      return ds;
    })().finally(() => (this.starting = null));
    return this.starting;
  }

  async onApplicationShutdown(): Promise<void> {
    if (this.source?.isInitialized) await this.source.destroy();
  }
}
