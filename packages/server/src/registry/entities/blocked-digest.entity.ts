import { Check, Column, CreateDateColumn, Entity, PrimaryColumn } from 'typeorm';

/** The SHA-256 of a file the registrar removed: the same bytes are refused if uploaded again. */
@Entity({ name: 'blocked_digests' })
@Check('ck_blocked_digests_digest', `"digest" ~ '^[0-9a-f]{64}$'`)
export class BlockedDigest {
  @PrimaryColumn({ type: 'char', length: 64, primaryKeyConstraintName: 'pk_blocked_digests' })
  digest: string;

  /** The lot and entry whose redaction blocked it. */
  @Column({ type: 'varchar', length: 9 })
  lot: string;

  @Column({ type: 'integer' })
  seq: number;

  @Column({ type: 'varchar', length: 32 })
  reason: string;

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt: Date;
}
