import { Entity } from 'typeorm';
import * as Col from '../../database/columns';
import type { AccountStatus, Role } from '../../auth/auth.decorators';

/** A sign-in: a dealer, an assessor or the registrar. Its id is the actor id on every roll entry. */
@Entity({ name: 'accounts' })
export class Account {
  @Col.UuidPrimary('accounts')
  id: string;

  @Col.Word()
  role: Role;

  @Col.Word()
  status: AccountStatus;

  /** Lower-case, unique, chosen at sign-up and never changed. */
  @Col.Varchar(32)
  handle: string;

  /** Stored as given; unique without regard to case (index on lower(email)). */
  @Col.Varchar(254)
  email: string;

  @Col.Varchar(80)
  displayName: string;

  @Col.Varchar(120)
  business: string;

  @Col.Varchar(80)
  town: string;

  @Col.Varchar(80)
  country: string;

  /** The business's postal address, as the applicant gave it (for the registrar). */
  @Col.Varchar(300, { default: '' })
  address: string;

  @Col.Varchar(200, { nullable: true })
  website: string | null;

  /** Dealers, fairs or associations who know the applicant's trade (for the registrar). */
  @Col.Text({ default: '' })
  tradeReferences: string;

  /** The applicant's optional document, in blob storage under this SHA-256 (for the registrar). */
  @Col.Sha256({ nullable: true })
  documentSha256: string | null;

  @Col.Varchar(40, { nullable: true })
  documentType: string | null;

  @Col.Integer({ nullable: true })
  documentSize: number | null;

  /** The file name as the applicant sent it (shown, never used as a path). */
  @Col.Varchar(200, { nullable: true })
  documentName: string | null;

  /** `scrypt$N$r$p$salt$key`; null until a password is set (a new registrar). */
  @Col.Varchar(255, { nullable: true })
  passwordHash: string | null;

  @Col.Timestamp({ nullable: true })
  emailVerifiedAt: Date | null;

  /** When the registrar first verified the account (kept through a later suspension). */
  @Col.Timestamp({ nullable: true })
  verifiedAt: Date | null;

  /** The registrar's reason for the latest rejection or suspension. */
  @Col.Varchar(500, { nullable: true })
  statusReason: string | null;

  @Col.CreatedAt()
  createdAt: Date;

  @Col.UpdatedAt()
  updatedAt: Date;
}
