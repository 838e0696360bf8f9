import type { Money } from '@beadroll/core';
import { Check, Entity, Index } from 'typeorm';
import * as Col from '../../database/columns';

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
export class TransferInvitationEntity extends Col.LotRowColumns('transfer_invitations') {
  @Col.Uuid()
  inviter: string;

  @Col.Varchar(254)
  email: string;

  @Col.Text({ nullable: true })
  note: string | null;

  /** The price to seal on the offer once it is written. */
  @Col.Jsonb({ nullable: true })
  price: Money | null;

  @Col.Word()
  status: InvitationStatus;

  @Col.Varchar(500, { nullable: true })
  statusReason: string | null;

  /** The account that joined with the address, once known. */
  @Col.Uuid({ nullable: true })
  invitee: string | null;

  @Col.Integer({ nullable: true })
  offerSeq: number | null;

  @Col.CreatedAt()
  createdAt: Date;

  @Col.UpdatedAt()
  updatedAt: Date;
}
