import { Column, Entity, Index, JoinColumn, OneToOne, PrimaryColumn } from 'typeorm';
import type { Observations } from '@beadroll/core';
import { LotEntity } from '../../ledger/entities/lot.entity';

/**
 * The derived view of one lot, for listing, filtering and search. Rewritten in the same
 * transaction as every append to the lot; never a source of truth (pages verify the raw roll).
 */
@Entity({ name: 'lot_views' })
@Index('ix_lot_views_holder', ['holder'])
@Index('ix_lot_views_listed_registered', ['listed', 'registeredAt'])
@Index('ix_lot_views_status', ['status'])
@Index('ix_lot_views_code', ['code'], { unique: true })
@Index('ix_lot_views_holder_updated', ['holder', 'updatedAt'])
export class LotViewEntity {
  @PrimaryColumn({ name: 'lot_id', type: 'uuid', primaryKeyConstraintName: 'pk_lot_views' })
  lotId: string;

  @OneToOne(() => LotEntity, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'lot_id', foreignKeyConstraintName: 'fk_lot_views_lot' })
  lot?: LotEntity;

  @Column({ type: 'varchar', length: 9 })
  code: string;

  /** Empty while the newest description is redacted. */
  @Column({ type: 'varchar', length: 200 })
  title: string;

  @Column({ type: 'varchar', length: 16, nullable: true })
  form: string | null;

  @Column({ type: 'varchar', length: 16 })
  status: string;

  @Column({ type: 'varchar', length: 64 })
  holder: string;

  @Column({ type: 'boolean' })
  listed: boolean;

  /** Origin of the attribution on record, if any. */
  @Column({ type: 'varchar', length: 32, nullable: true })
  origin: string | null;

  /** Whose opinion the attribution on record is: 'holder', 'earlier-holder' or 'ancestor'. */
  @Column({ name: 'origin_source', type: 'varchar', length: 16, nullable: true })
  originSource: string | null;

  /** Technique of the attribution on record, if any. */
  @Column({ type: 'varchar', length: 32, nullable: true })
  technique: string | null;

  /** Period of the attribution on record, if any. */
  @Column({ name: 'period_from', type: 'integer', nullable: true })
  periodFrom: number | null;

  @Column({ name: 'period_to', type: 'integer', nullable: true })
  periodTo: number | null;

  @Column({ name: 'count_value', type: 'integer' })
  countValue: number;

  @Column({ name: 'count_estimated', type: 'boolean' })
  countEstimated: boolean;

  @Column({ name: 'dissent_count', type: 'integer' })
  dissentCount: number;

  /** Recipient of the open offer, who may read the lot while it is offered. */
  @Column({ name: 'offer_recipient', type: 'varchar', length: 64, nullable: true })
  offerRecipient: string | null;

  /** The newest recorded observations. */
  @Column({ type: 'jsonb', nullable: true })
  observations: Observations | null;

  @Column({ name: 'head_seq', type: 'integer' })
  headSeq: number;

  /** Title, summary, colours, decoration, condition and the attribution's words, for text search. */
  @Column({ name: 'search_text', type: 'text' })
  searchText: string;

  @Column({ name: 'registered_at', type: 'timestamptz' })
  registeredAt: Date;

  @Column({ name: 'updated_at', type: 'timestamptz' })
  updatedAt: Date;
}
