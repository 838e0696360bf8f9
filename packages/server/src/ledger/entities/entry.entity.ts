import { Check, Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn, Unique } from 'typeorm';
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
  @PrimaryGeneratedColumn('identity', {
    type: 'bigint',
    generatedIdentity: 'ALWAYS',
    primaryKeyConstraintName: 'pk_entries',
  })
  id: string;

  @Column({ name: 'lot_id', type: 'uuid' })
  lotId: string;

  @ManyToOne(() => LotEntity, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'lot_id', foreignKeyConstraintName: 'fk_entries_lot' })
  lot?: LotEntity;

  @Column({ type: 'integer' })
  seq: number;

  @Column({ type: 'varchar', length: 32 })
  kind: string;

  @Column({ type: 'varchar', length: 64 })
  actor: string;

  /** Entry time, exactly as written in the header. */
  @Column({ type: 'varchar', length: 24 })
  time: string;

  @Column({ type: 'char', length: 64 })
  hash: string;

  /** The canonical header string (RFC 8785) that the entry hash covers. */
  @Column({ type: 'text' })
  header: string;

  /** Position in the ledger-wide log that signed checkpoints will cover; not hashed. */
  @Column({ name: 'log_index', type: 'bigint', nullable: true })
  logIndex: string | null;

  /** For a `redacted` entry, the seq whose body it removes (lets the database check a body deletion). */
  @Column({ name: 'redacts_seq', type: 'integer', nullable: true })
  redactsSeq: number | null;

  @Column({ name: 'recorded_at', type: 'timestamptz', default: () => 'now()' })
  recordedAt: Date;
}
