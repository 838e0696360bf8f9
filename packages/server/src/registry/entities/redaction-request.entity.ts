import { Entity, Index } from 'typeorm';
import * as Col from '../../database/columns';

export const REQUEST_STATUSES = ['open', 'approved', 'declined'] as const;
export type RedactionRequestStatus = (typeof REQUEST_STATUSES)[number];

/** A holder's request that the registrar remove one of the holder's own entries. */
@Entity({ name: 'redaction_requests' })
@Index('ix_redaction_requests_status', ['status', 'createdAt'])
export class RedactionRequest {
  @Col.UuidPrimary('redaction_requests')
  id: string;

  @Col.LotCode()
  lot: string;

  @Col.Integer()
  seq: number;

  @Col.Uuid()
  requester: string;

  @Col.Varchar(1000)
  note: string;

  @Col.Word({ default: 'open' })
  status: RedactionRequestStatus;

  @Col.Uuid({ nullable: true })
  decidedBy: string | null;

  @Col.Timestamp({ nullable: true })
  decidedAt: Date | null;

  @Col.Varchar(1000, { nullable: true })
  decisionNote: string | null;

  @Col.CreatedAt()
  createdAt: Date;
}
