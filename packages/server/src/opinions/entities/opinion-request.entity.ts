import { Check, Entity, Index } from 'typeorm';
import * as Col from '../../database/columns';

export type OpinionRequestStatus = 'open' | 'answered' | 'cancelled';

/** A holder's request for an opinion on a lot (not on the roll: the opinion that answers it is). */
@Entity({ name: 'opinion_requests' })
@Index('ix_opinion_requests_lot_status', ['lotId', 'status'])
@Index('ix_opinion_requests_assessor', ['assessor', 'status'])
@Index('ix_opinion_requests_requester', ['requester', 'createdAt'])
@Check('ck_opinion_requests_status', `"status" IN ('open', 'answered', 'cancelled')`)
export class OpinionRequestEntity extends Col.LotRowColumns('opinion_requests') {
  /** The holder who asked. */
  @Col.Actor()
  requester: string;

  /** The named assessor, or null: any verified assessor. */
  @Col.Actor({ nullable: true })
  assessor: string | null;

  @Col.Text({ nullable: true })
  note: string | null;

  @Col.Word()
  status: OpinionRequestStatus;

  @Col.Timestamp({ now: true })
  createdAt: Date;

  @Col.Timestamp({ nullable: true })
  closedAt: Date | null;

  @Col.Actor({ nullable: true })
  answeredBy: string | null;

  @Col.Integer({ nullable: true })
  opinionSeq: number | null;
}
