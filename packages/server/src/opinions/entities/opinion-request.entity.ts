import { Check, Column, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';

export type OpinionRequestStatus = 'open' | 'answered' | 'cancelled';

/** A holder's request for an opinion on a lot (not on the roll: the opinion that answers it is). */
@Entity({ name: 'opinion_requests' })
@Index('ix_opinion_requests_lot_status', ['lotId', 'status'])
@Index('ix_opinion_requests_assessor', ['assessor', 'status'])
@Index('ix_opinion_requests_requester', ['requester', 'createdAt'])
@Check('ck_opinion_requests_status', `"status" IN ('open', 'answered', 'cancelled')`)
export class OpinionRequestEntity {
  @PrimaryGeneratedColumn('uuid', { primaryKeyConstraintName: 'pk_opinion_requests' })
  id: string;

  @Column({ name: 'lot_id', type: 'uuid' })
  lotId: string;

  @Column({ type: 'varchar', length: 9 })
  code: string;

  /** The holder who asked. */
  @Column({ type: 'varchar', length: 64 })
  requester: string;

  /** The named assessor, or null: any verified assessor. */
  @Column({ type: 'varchar', length: 64, nullable: true })
  assessor: string | null;

  @Column({ type: 'text', nullable: true })
  note: string | null;

  @Column({ type: 'varchar', length: 16 })
  status: OpinionRequestStatus;

  @Column({ name: 'created_at', type: 'timestamptz', default: () => 'now()' })
  createdAt: Date;

  @Column({ name: 'closed_at', type: 'timestamptz', nullable: true })
  closedAt: Date | null;

  @Column({ name: 'answered_by', type: 'varchar', length: 64, nullable: true })
  answeredBy: string | null;

  @Column({ name: 'opinion_seq', type: 'integer', nullable: true })
  opinionSeq: number | null;
}
