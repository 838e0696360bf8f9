import { Entity, Index } from 'typeorm';
import * as Col from '../../database/columns';
import type { Observations } from '@beadroll/core';
import { LotEntity } from '../../ledger/entities/lot.entity';

/**
 * The derived view of one lot, for listing, filtering and search. Rewritten in the same
 * transaction as every append to the lot; never a source of truth (pages verify the raw roll).
 * Indexes the decorators cannot describe live in the migrations alone: the words' GIN index,
 * the code's prefix index and the holder's lots in the list's two default orders.
 */
@Entity({ name: 'lot_views' })
@Index('ix_lot_views_holder', ['holder'])
@Index('ix_lot_views_listed_registered', ['listed', 'registeredAt'])
@Index('ix_lot_views_status', ['status'])
@Index('ix_lot_views_code', ['code'], { unique: true })
@Index('ix_lot_views_holder_updated', ['holder', 'updatedAt'])
export class LotViewEntity {
  @Col.SharedKey('lot_views', 'lot_id')
  lotId: string;

  @Col.BelongsTo(() => LotEntity, 'lot_views', 'lot_id', { onDelete: 'RESTRICT', one: true })
  lot?: LotEntity;

  @Col.LotCode()
  code: string;

  /** Empty while the newest description is redacted. */
  @Col.Varchar(200)
  title: string;

  @Col.Word({ nullable: true })
  form: string | null;

  @Col.Word()
  status: string;

  @Col.Actor()
  holder: string;

  @Col.Boolean()
  listed: boolean;

  /** Origin of the attribution on record, if any. */
  @Col.Varchar(32, { nullable: true })
  origin: string | null;

  /** Whose opinion the attribution on record is: 'holder', 'earlier-holder' or 'ancestor'. */
  @Col.Word({ nullable: true })
  originSource: string | null;

  /** Technique of the attribution on record, if any. */
  @Col.Varchar(32, { nullable: true })
  technique: string | null;

  /** Period of the attribution on record, if any. */
  @Col.Integer({ nullable: true })
  periodFrom: number | null;

  @Col.Integer({ nullable: true })
  periodTo: number | null;

  @Col.Integer()
  countValue: number;

  @Col.Boolean()
  countEstimated: boolean;

  @Col.Integer()
  dissentCount: number;

  /** Recipient of the open offer, who may read the lot while it is offered. */
  @Col.Actor({ nullable: true })
  offerRecipient: string | null;

  /** The newest recorded observations. */
  @Col.Jsonb({ nullable: true })
  observations: Observations | null;

  @Col.Integer()
  headSeq: number;

  /** Title, summary, colours, decoration, condition and the attribution's words, for text search. */
  @Col.Text()
  searchText: string;

  @Col.Timestamp()
  registeredAt: Date;

  @Col.Timestamp()
  updatedAt: Date;
}
