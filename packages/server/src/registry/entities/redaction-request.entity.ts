import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';

export const REQUEST_STATUSES = ['open', 'approved', 'declined'] as const;
export type RedactionRequestStatus = (typeof REQUEST_STATUSES)[number];

/** A holder's request that the registrar remove one of the holder's own entries. */
@Entity({ name: 'redaction_requests' })
@Index('ix_redaction_requests_status', ['status', 'createdAt'])
export class RedactionRequest {
  @PrimaryGeneratedColumn('uuid', { primaryKeyConstraintName: 'pk_redaction_requests' })
  id: string;

  @Column({ type: 'varchar', length: 9 })
  lot: string;

  @Column({ type: 'integer' })
  seq: number;

  @Column({ type: 'uuid' })
  requester: string;

  @Column({ type: 'varchar', length: 1000 })
  note: string;

  @Column({ type: 'varchar', length: 16, default: 'open' })
  status: RedactionRequestStatus;

  @Column({ name: 'decided_by', type: 'uuid', nullable: true })
  decidedBy: string | null;

  @Column({ name: 'decided_at', type: 'timestamptz', nullable: true })
  decidedAt: Date | null;

  @Column({ name: 'decision_note', type: 'varchar', length: 1000, nullable: true })
  decisionNote: string | null;

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt: Date;
}
