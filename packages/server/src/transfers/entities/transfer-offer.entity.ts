import { Check, Entity, Index, Unique } from 'typeorm';
import * as Col from '../../database/columns';

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
export class TransferOfferEntity extends Col.LotRowColumns('transfer_offers') {
  /** The lot's title when it was offered (later descriptions are not shown to a former party). */
  @Col.Varchar(200)
  title: string;

  @Col.Integer()
  offerSeq: number;

  @Col.Actor()
  offerer: string;

  /** null only when the offer's body was redacted. */
  @Col.Actor({ nullable: true })
  recipient: string | null;

  @Col.Word()
  status: OfferStatus;

  @Col.Text({ nullable: true })
  note: string | null;

  @Col.Timestamp()
  offeredAt: Date;

  @Col.Integer({ nullable: true })
  answerSeq: number | null;

  @Col.Text({ nullable: true })
  answerNote: string | null;

  @Col.Timestamp({ nullable: true })
  answeredAt: Date | null;
}
