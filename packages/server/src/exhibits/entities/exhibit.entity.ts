import type { ExhibitRef } from '@beadroll/core';
import { Column, Entity, Index } from 'typeorm';
import * as Col from '../../database/columns';

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
  @Col.UuidPrimary('exhibits')
  id: string;

  @Col.LotId()
  lotId: string;

  @Col.LotCode()
  lotCode: string;

  @Col.Integer()
  seq: number;

  /** Account id of the dealer who added it (the entry's actor). */
  @Col.Actor()
  addedBy: string;

  @Col.Boolean()
  sealed: boolean;

  @Col.Sha256()
  originalSha256: string;

  /**
   * SHA-256 of the file exactly as the dealer sent it, before normalisation (null on rows from
   * before it was kept). Server-side only: it names bytes that may still hold what the stored
   * file had removed (a photo's GPS position), so it goes on no roll and in no response but the
   * dealer's own personal-data download. A redaction blocks it with the stored files.
   */
  @Col.Sha256({ nullable: true, select: false })
  sentSha256: string | null;

  @Col.Jsonb()
  ref: ExhibitRef;

  /** Bytes of the original and its derivatives, counted against the account's quota. */
  @Column({ type: 'bigint', transformer: { to: (v: number) => v, from: (v: string) => Number(v) } })
  bytes: number;

  @Col.CreatedAt()
  createdAt: Date;
}
