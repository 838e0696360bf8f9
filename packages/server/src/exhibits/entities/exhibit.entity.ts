import type { ExhibitRef } from '@beadroll/core';
import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';

/**
 * Where the files of one `exhibit-added` entry are, for serving per (lot, entry). The roll
 * entry is the record; this row is written in the same transaction and never outlives it
 * (a redaction deletes it). `ref` repeats the exhibit as committed: in the public body, or
 * inside the sealed field when `sealed`.
 */
@Entity({ name: 'exhibits' })
@Index('ux_exhibits_lot_seq', ['lotId', 'seq'], { unique: true })
@Index('ix_exhibits_added_by', ['addedBy'])
@Index('ix_exhibits_original', ['originalSha256'])
export class ExhibitEntity {
  @PrimaryGeneratedColumn('uuid', { primaryKeyConstraintName: 'pk_exhibits' })
  id: string;

  @Column({ name: 'lot_id', type: 'uuid' })
  lotId: string;

  @Column({ name: 'lot_code', type: 'varchar', length: 9 })
  lotCode: string;

  @Column({ type: 'integer' })
  seq: number;

  /** Account id of the dealer who added it (the entry's actor). */
  @Column({ name: 'added_by', type: 'varchar', length: 64 })
  addedBy: string;

  @Column({ type: 'boolean' })
  sealed: boolean;

  @Column({ name: 'original_sha256', type: 'char', length: 64 })
  originalSha256: string;

  /**
   * SHA-256 of the file exactly as the dealer sent it, before normalisation (null on rows from
   * before it was kept). Server-side only: it names bytes that may still hold what the stored
   * file had removed (a photo's GPS position), so it goes on no roll and in no response but the
   * dealer's own personal-data download. A redaction blocks it with the stored files.
   */
  @Column({ name: 'sent_sha256', type: 'char', length: 64, nullable: true, select: false })
  sentSha256: string | null;

  @Column({ type: 'jsonb' })
  ref: ExhibitRef;

  /** Bytes of the original and its derivatives, counted against the account's quota. */
  @Column({ type: 'bigint', transformer: { to: (v: number) => v, from: (v: string) => Number(v) } })
  bytes: number;

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt: Date;
}
