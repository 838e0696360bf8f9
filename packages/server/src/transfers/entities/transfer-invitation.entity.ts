import type { Money } from '@beadroll/core';
import {
  Check,
  Column,
  CreateDateColumn,
  Entity,
  Index,
  PrimaryGeneratedColumn,
  UpdateDateColumn,
} from 'typeorm';

export const INVITATION_STATUSES = ['waiting', 'offered', 'stalled', 'cancelled'] as const;
export type InvitationStatus = (typeof INVITATION_STATUSES)[number];

/**
 * An offer to an e-mail address whose owner is not yet a verified dealer. Nothing is written on
 * the roll until they are: then the offer is made in the inviter's name. The address stays here,
 * never on a roll; `stalled` means the offer could not be made when they were verified (the
 * inviter may try again from the list).
 */
@Entity({ name: 'transfer_invitations' })
@Check('ck_transfer_invitations_status', `"status" IN ('waiting', 'offered', 'stalled', 'cancelled')`)
@Index('ix_transfer_invitations_inviter', ['inviter', 'createdAt'])
export class TransferInvitationEntity {
  @PrimaryGeneratedColumn('uuid', { primaryKeyConstraintName: 'pk_transfer_invitations' })
  id: string;

  @Column({ name: 'lot_id', type: 'uuid' })
  lotId: string;

  @Column({ type: 'varchar', length: 9 })
  code: string;

  @Column({ type: 'uuid' })
  inviter: string;

  @Column({ type: 'varchar', length: 254 })
  email: string;

  @Column({ type: 'text', nullable: true })
  note: string | null;

  /** The price to seal on the offer once it is written. */
  @Column({ type: 'jsonb', nullable: true })
  price: Money | null;

  @Column({ type: 'varchar', length: 16 })
  status: InvitationStatus;

  @Column({ name: 'status_reason', type: 'varchar', length: 500, nullable: true })
  statusReason: string | null;

  /** The account that joined with the address, once known. */
  @Column({ type: 'uuid', nullable: true })
  invitee: string | null;

  @Column({ name: 'offer_seq', type: 'integer', nullable: true })
  offerSeq: number | null;

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt: Date;

  @UpdateDateColumn({ name: 'updated_at', type: 'timestamptz' })
  updatedAt: Date;
}
