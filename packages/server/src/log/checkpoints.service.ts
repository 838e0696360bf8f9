import {
  Inject,
  Injectable,
  Logger,
  Optional,
  type OnApplicationBootstrap,
  type OnModuleDestroy,
  type OnModuleInit,
} from '@nestjs/common';
import { SchedulerRegistry } from '@nestjs/schedule';
import {
  formatCheckpoint,
  formatVerifierKey,
  hashHex,
  logOrigin,
  type MerkleTree,
  noteSigner,
  signNote,
  verifyConsistency,
  type NoteSigner,
} from '@beadroll/core';
import { DataSource } from 'typeorm';
import type { AppConfig } from '../config/app-config';
import { APP_CONFIG } from '../config/config.module';
import { LogLeavesService } from '../ledger/log-leaves.service';
import { loadLogSeed } from './log-key';
import { NO_LOG_JOBS } from './log-jobs';
import { LogGapError, LogTreeService } from './log-tree.service';

/** Transaction advisory lock held by the one instance that signs a checkpoint ("BRLOGSG1"). */
export const CHECKPOINT_LOCK_KEY = 0x42524c4f47534731n;
const JOB = 'log:checkpoint';
/** How long an instance reuses the latest checkpoint it read before asking the database again. */
const LATEST_TTL_MS = 1000;

/** The latest signed checkpoint, with every cosignature collected for it. */
export interface LatestCheckpoint {
  size: number;
  /** Root hash, 64 hex. */
  root: string;
  /** The signed note: the log's signature, then the witnesses' cosignatures. */
  note: string;
  signedAt: Date;
}

/** Why the signer refuses to sign a grown log; it refuses every pass until the log is whole again. */
export type SignRefusal = 'entry-missing' | 'log-shrank' | 'entry-changed';

/** What a refusal means, in words fit for anyone who asks the service's health. */
export const REFUSAL_WORDS: Record<SignRefusal, string> = {
  'entry-missing': 'the log’s signer refuses to sign: an entry the log numbered is missing',
  'log-shrank': 'the log’s signer refuses to sign: the log holds fewer entries than its last checkpoint',
  'entry-changed': 'the log’s signer refuses to sign: a past entry no longer matches the last checkpoint',
};

/** Outcome of one signing pass. */
export interface SignRun {
  signed: boolean;
  size?: number;
  /** Why a grown log was not signed: it is not consistent with the last checkpoint. */
  refused?: string;
}

/**
 * Signs checkpoints of the ledger-wide log (C2SP tlog-checkpoint, Ed25519) when it has grown,
 * at most every CHECKPOINT_SECONDS, one instance at a time (a PostgreSQL advisory lock). Every
 * checkpoint is kept, and a new one is signed only if the tree read again from the database is
 * consistent with the last: the log never signs two inconsistent checkpoints.
 */
@Injectable()
export class CheckpointsService implements OnModuleInit, OnApplicationBootstrap, OnModuleDestroy {
  private readonly logger = new Logger('log');
  private signerValue?: NoteSigner;
  private running?: Promise<SignRun>;
  private latestCache?: { at: number; value: LatestCheckpoint | null };
  /** The last refusal logged, so a refusal that stands is logged once, not every pass. */
  private refusal?: string;
  private refusalKind?: SignRefusal;

  constructor(
    @Inject(APP_CONFIG) private readonly config: AppConfig,
    private readonly dataSource: DataSource,
    private readonly tree: LogTreeService,
    private readonly leaves: LogLeavesService,
    private readonly scheduler: SchedulerRegistry,
    @Optional() @Inject(NO_LOG_JOBS) private readonly noJobs?: boolean,
  ) {}

  /** The log's signer, its key read (or made) on first use, which may come before module init. */
  private get signer(): NoteSigner {
    this.signerValue ??= noteSigner(
      logOrigin(this.config.publicBaseUrl),
      loadLogSeed(this.config.log.keyFile),
    );
    return this.signerValue;
  }

  onModuleInit(): void {
    if (this.noJobs) return;
    const timer = setInterval(() => {
      this.signIfDue().catch((err: unknown) =>
        this.logger.error(`checkpoint pass failed: ${(err as Error).message}`),
      );
    }, CheckpointsService.tickMs(this.config.log.checkpointSeconds));
    timer.unref();
    this.scheduler.addInterval(JOB, timer);
  }

  async onApplicationBootstrap(): Promise<void> {
    if (this.noJobs) return;
    this.logger.log(`log verifier key: ${this.verifierKey()}`);
    // The first start signs at once, so the checkpoint route always has an answer.
    await this.signIfDue().catch((err: unknown) =>
      this.logger.error(`checkpoint pass failed: ${(err as Error).message}`),
    );
  }

  /**
   * How often each instance looks whether a checkpoint is due: a tenth of the period (at least a
   * second), so a checkpoint follows growth within about CHECKPOINT_SECONDS and never sooner.
   */
  static tickMs(checkpointSeconds: number): number {
    return Math.max(1, Math.floor(checkpointSeconds / 10)) * 1000;
  }

  /** Stops the timed passes and lets one under way finish before the database connections close. */
  async onModuleDestroy(): Promise<void> {
    if (this.scheduler.doesExist('interval', JOB)) this.scheduler.deleteInterval(JOB);
    await this.running?.catch(() => undefined);
  }

  /** The log's origin line, which is also its key name. */
  get origin(): string {
    return this.signer.name;
  }

  /** The verifier key text `name+keyid+base64(0x01 ‖ public key)`. */
  verifierKey(): string {
    return formatVerifierKey(this.signer.name, this.signer.publicKey);
  }

  /**
   * One signing pass: signs a checkpoint of the committed log if it grew since the last one and
   * that one is at least CHECKPOINT_SECONDS old (or `force`), unless another instance holds the
   * signer's lock. Concurrent calls in this instance share one pass.
   */
  signIfDue(force = false): Promise<SignRun> {
    this.running ??= this.pass(force).finally(() => {
      this.running = undefined;
    });
    return this.running;
  }

  private async pass(force: boolean): Promise<SignRun> {
    const runner = this.dataSource.createQueryRunner();
    await runner.connect();
    await runner.startTransaction('READ COMMITTED');
    try {
      const [{ locked }] = (await runner.query('SELECT pg_try_advisory_xact_lock($1::bigint) AS "locked"', [
        CHECKPOINT_LOCK_KEY.toString(),
      ])) as Array<{ locked: boolean }>;
      if (!locked) return { signed: false };
      const last = (
        (await runner.query(
          `SELECT "origin", "size", "root", extract(epoch FROM now() - "signed_at") AS "age"
             FROM "log_checkpoints" ORDER BY "size" DESC, "signed_at" DESC LIMIT 1`,
        )) as Array<{ origin: string; size: string; root: string; age: string }>
      )[0];
      const size = await this.leaves.size(runner.manager);
      // The public address moved (another host or port): the newest checkpoint names the old
      // origin, which the new key does not verify. Sign the current size again under the new one.
      const moved = last !== undefined && last.origin !== this.signer.name;
      if (last && !moved && Number(last.size) === size) return { signed: false, size };
      if (last && !moved && !force && Number(last.age) < this.config.log.checkpointSeconds)
        return { signed: false, size };
      let tree: MerkleTree;
      try {
        tree = await this.tree.forSigning(size, this.refusalKind !== undefined);
      } catch (err) {
        // A removed entry leaves a hole no checkpoint may cover: refuse, every pass, until the
        // entry is back (restored from a backup), rather than sign a log with a leaf missing.
        if (!(err instanceof LogGapError)) throw err;
        return this.refuse(
          size,
          `the log of ${size} entries has no entry at index ${err.index}: an entry was removed`,
          'entry-missing',
        );
      }
      const root = tree.root(size);
      if (last) {
        const lastSize = Number(last.size);
        if (lastSize > size)
          return this.refuse(
            size,
            `the log holds ${size} entries, fewer than its last checkpoint of ${lastSize}`,
            'log-shrank',
          );
        const consistent = verifyConsistency(
          lastSize,
          size,
          tree.consistencyProof(lastSize, size),
          Uint8Array.from(Buffer.from(last.root, 'hex')),
          root,
        );
        if (!consistent)
          return this.refuse(
            size,
            `the log of ${size} entries is not consistent with its last checkpoint of ${lastSize}: a past entry changed`,
            'entry-changed',
          );
      }
      const note = signNote(formatCheckpoint({ origin: this.signer.name, size, root }), this.signer);
      // Back to an origin signed before at this size: the same text and key give the same note,
      // which becomes the newest again.
      await runner.query(
        `INSERT INTO "log_checkpoints" ("origin", "size", "root", "note") VALUES ($1, $2, $3, $4)
         ON CONFLICT ON CONSTRAINT "pk_log_checkpoints" DO UPDATE SET "signed_at" = now()`,
        [this.signer.name, size, hashHex(root), note],
      );
      await runner.commitTransaction();
      this.latestCache = undefined;
      this.refusal = undefined;
      this.refusalKind = undefined;
      return { signed: true, size };
    } finally {
      if (runner.isTransactionActive) await runner.rollbackTransaction();
      await runner.release();
    }
  }

  private refuse(size: number, refused: string, kind: SignRefusal): SignRun {
    if (refused !== this.refusal) this.logger.error(`checkpoint refused: ${refused}`);
    this.refusal = refused;
    this.refusalKind = kind;
    return { signed: false, size, refused };
  }

  /**
   * The refusal standing since this instance's last signing pass, or null: the signer signed, or
   * this instance has not found the log broken. Only the instance holding the signer's lock looks.
   */
  standingRefusal(): SignRefusal | null {
    return this.refusalKind ?? null;
  }

  /** The latest signed checkpoint with its cosignatures, or null before the first. */
  async latest(): Promise<LatestCheckpoint | null> {
    const now = Date.now();
    if (this.latestCache && now - this.latestCache.at < LATEST_TTL_MS) return this.latestCache.value;
    const rows: Array<{ size: string; root: string; note: string; signed_at: Date; lines: string[] | null }> =
      await this.dataSource.query(
        `SELECT c."size", c."root", c."note", c."signed_at",
                (SELECT array_agg(s."line" ORDER BY s."received_at", s."witness_id")
                   FROM "log_cosignatures" s
                  WHERE s."checkpoint_origin" = c."origin" AND s."checkpoint_size" = c."size") AS "lines"
           FROM "log_checkpoints" c ORDER BY c."size" DESC, c."signed_at" DESC LIMIT 1`,
      );
    const r = rows[0];
    const value = r
      ? {
          size: Number(r.size),
          root: r.root,
          note: r.note + (r.lines ?? []).map((l) => `${l}\n`).join(''),
          signedAt: r.signed_at,
        }
      : null;
    this.latestCache = { at: now, value };
    return value;
  }

  /** Forgets the cached latest checkpoint (after a cosignature arrived). */
  invalidate(): void {
    this.latestCache = undefined;
  }
}
