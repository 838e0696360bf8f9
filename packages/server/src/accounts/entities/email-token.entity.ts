import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn } from 'typeorm';

export type EmailTokenPurpose = 'verify-email' | 'reset-password' | 'set-password';

/** A single-use, short-lived token sent in an e-mail link; only its SHA-256 is stored. */
@Entity({ name: 'email_tokens' })
export class EmailToken {
  @PrimaryGeneratedColumn('uuid', { primaryKeyConstraintName: 'pk_email_tokens' })
  id: string;

  @Column({ name: 'account_id', type: 'uuid' })
  accountId: string;

  @Column({ type: 'varchar', length: 16 })
  purpose: EmailTokenPurpose;

  @Column({ name: 'token_hash', type: 'char', length: 64 })
  tokenHash: string;

  @Column({ name: 'expires_at', type: 'timestamptz' })
  expiresAt: Date;

  @Column({ name: 'used_at', type: 'timestamptz', nullable: true })
  usedAt: Date | null;

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt: Date;
}
