import { Check, Column, Entity, Index, PrimaryGeneratedColumn, Unique } from 'typeorm';

export const OFFER_STATUSES = ['open', 'accepted', 'declined', 'withdrawn', 'lapsed'] as const;
export type OfferStatus = (typeof OFFER_STATUSES)[number];

/**
 * One `transfer-offered` entry and how it ended, for the incoming and outgoing lists. Written
 * in the append transaction of each transfer entry; the roll stays the source of truth.
 */
@Entity({ name: 'transfer_offers' })
@Unique('uq_transfer_offers_lot_seq', ['lotId', 'offerSeq'])
@Check('ck_transfer_offers_status', `"status" IN ('open', 'accepted', 'declined', 'withdrawn', 'lapsed')`)
@Index('ix_transfer_offers_offerer', ['offerer', 'offeredAt'])
@Index('ix_transfer_offers_recipient', ['recipient', 'offeredAt'])
export class TransferOfferEntity {
  @PrimaryGeneratedColumn('uuid', { primaryKeyConstraintName: 'pk_transfer_offers' })
  id: string;

  @Column({ name: 'lot_id', type: 'uuid' })
  lotId: string;

  @Column({ type: 'varchar', length: 9 })
  code: string;

  /** The lot's title when it was offered (later descriptions are not shown to a former party). */
  @Column({ type: 'varchar', length: 200 })
  title: string;

  @Column({ name: 'offer_seq', type: 'integer' })
  offerSeq: number;

  @Column({ type: 'varchar', length: 64 })
  offerer: string;

  /** null only when the offer's body was redacted. */
  @Column({ type: 'varchar', length: 64, nullable: true })
  recipient: string | null;

  @Column({ type: 'varchar', length: 16 })
  status: OfferStatus;

  @Column({ type: 'text', nullable: true })
  note: string | null;

  @Column({ name: 'offered_at', type: 'timestamptz' })
  offeredAt: Date;

  @Column({ name: 'answer_seq', type: 'integer', nullable: true })
  answerSeq: number | null;

  @Column({ name: 'answer_note', type: 'text', nullable: true })
  answerNote: string | null;

  @Column({ name: 'answered_at', type: 'timestamptz', nullable: true })
  answeredAt: Date | null;
}
