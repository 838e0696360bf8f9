import { Column, Entity, PrimaryColumn } from 'typeorm';
import * as Col from '../../database/columns';

/**
 * One idempotency key an account used for a write: a digest of the request it came with, and
 * the answer the server gave, written in the same transaction as the write itself. Kept 24 hours.
 */
@Entity({ name: 'idempotency_keys' })
export class IdempotencyRecord {
  /** The account's id, or '' for a request made without a sign-in. */
  @PrimaryColumn({ name: 'account', type: 'text', primaryKeyConstraintName: 'pk_idempotency_keys' })
  account!: string;

  @PrimaryColumn({ type: 'text', primaryKeyConstraintName: 'pk_idempotency_keys' })
  key!: string;

  /** SHA-256 (hex) of the method, the path and the request's body. */
  @Col.Sha256()
  requestDigest!: string;

  @Column({ type: 'smallint' })
  status!: number;

  /** The answer's JSON text, exactly as it was first sent (null when there was no body). */
  @Col.Text({ nullable: true })
  body!: string | null;

  @Col.Timestamp({ now: true })
  createdAt!: Date;
}
