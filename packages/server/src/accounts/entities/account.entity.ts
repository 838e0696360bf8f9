import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn, UpdateDateColumn } from 'typeorm';
import type { AccountStatus, Role } from '../../auth/auth.decorators';

/** A sign-in: a dealer, an assessor or the registrar. Its id is the actor id on every roll entry. */
@Entity({ name: 'accounts' })
export class Account {
  @PrimaryGeneratedColumn('uuid', { primaryKeyConstraintName: 'pk_accounts' })
  id: string;

  @Column({ type: 'varchar', length: 16 })
  role: Role;

  @Column({ type: 'varchar', length: 16 })
  status: AccountStatus;

  /** Lower-case, unique, chosen at sign-up and never changed. */
  @Column({ type: 'varchar', length: 32 })
  handle: string;

  /** Stored as given; unique without regard to case (index on lower(email)). */
  @Column({ type: 'varchar', length: 254 })
  email: string;

  @Column({ name: 'display_name', type: 'varchar', length: 80 })
  displayName: string;

  @Column({ type: 'varchar', length: 120 })
  business: string;

  @Column({ type: 'varchar', length: 80 })
  town: string;

  @Column({ type: 'varchar', length: 80 })
  country: string;

  /** The business's postal address, as the applicant gave it (for the registrar). */
  @Column({ type: 'varchar', length: 300, default: '' })
  address: string;

  @Column({ type: 'varchar', length: 200, nullable: true })
  website: string | null;

  /** Dealers, fairs or associations who know the applicant's trade (for the registrar). */
  @Column({ name: 'trade_references', type: 'text', default: '' })
  tradeReferences: string;

  /** The applicant's optional document, in blob storage under this SHA-256 (for the registrar). */
  @Column({ name: 'document_sha256', type: 'char', length: 64, nullable: true })
  documentSha256: string | null;

  @Column({ name: 'document_type', type: 'varchar', length: 40, nullable: true })
  documentType: string | null;

  @Column({ name: 'document_size', type: 'integer', nullable: true })
  documentSize: number | null;

  /** The file name as the applicant sent it (shown, never used as a path). */
  @Column({ name: 'document_name', type: 'varchar', length: 200, nullable: true })
  documentName: string | null;

  /** `scrypt$N$r$p$salt$key`; null until a password is set (a new registrar). */
  @Column({ name: 'password_hash', type: 'varchar', length: 255, nullable: true })
  passwordHash: string | null;

  @Column({ name: 'email_verified_at', type: 'timestamptz', nullable: true })
  emailVerifiedAt: Date | null;

  /** When the registrar first verified the account (kept through a later suspension). */
  @Column({ name: 'verified_at', type: 'timestamptz', nullable: true })
  verifiedAt: Date | null;

  /** The registrar's reason for the latest rejection or suspension. */
  @Column({ name: 'status_reason', type: 'varchar', length: 500, nullable: true })
  statusReason: string | null;

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt: Date;

  @UpdateDateColumn({ name: 'updated_at', type: 'timestamptz' })
  updatedAt: Date;
}
