import { Check, Column, Entity, Index, Unique } from 'typeorm';
import * as Col from '../../database/columns';
import { LotEntity } from './lot.entity';

/**
 * One roll entry: the canonical header string exactly as hashed, and its entry hash. Rows are
 * append-only; the database refuses UPDATE and DELETE (only `log_index`, reserved for the
 * ledger-wide log, may be filled in once). `actor` is an opaque account id, deliberately not a
 * foreign key: it may be the service's own system actor, and a roll outlives any account row.
 */
@Entity({ name: 'entries' })
@Unique('uq_entries_lot_seq', ['lotId', 'seq'])
@Unique('uq_entries_hash', ['hash'])
@Unique('uq_entries_log_index', ['logIndex'])
@Check('ck_entries_seq', `"seq" >= 0`)
@Check('ck_entries_hash', `"hash" ~ '^[0-9a-f]{64}$'`)
@Check('ck_entries_log_index', `"log_index" IS NULL OR "log_index" >= 0`)
@Index('ix_entries_actor', ['actor'])
export class EntryEntity {
  @Col.IdentityPrimary('entries')
  id: string;

  @Col.LotId()
  lotId: string;

  @Col.BelongsTo(() => LotEntity, 'entries', 'lot_id', { onDelete: 'RESTRICT' })
  lot?: LotEntity;

  @Col.Integer()
  seq: number;

  @Col.Varchar(32)
  kind: string;

  @Col.Actor()
  actor: string;

  /** Entry time, exactly as written in the header. */
  @Col.Varchar(24)
  time: string;

  @Col.Sha256()
  hash: string;

  /** The canonical header string (RFC 8785) that the entry hash covers. */
  @Col.Text()
  header: string;

  /** Position in the ledger-wide log that signed checkpoints will cover; not hashed. */
  @Column({ name: 'log_index', type: 'bigint', nullable: true })
  logIndex: string | null;

  /** For a `redacted` entry, the seq whose body it removes (lets the database check a body deletion). */
  @Col.Integer({ nullable: true })
  redactsSeq: number | null;

  @Col.Timestamp({ now: true })
  recordedAt: Date;
}
