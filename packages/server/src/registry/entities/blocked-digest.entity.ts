import { Check, Entity, PrimaryColumn } from 'typeorm';
import * as Col from '../../database/columns';

/** The SHA-256 of a file the registrar removed: the same bytes are refused if uploaded again. */
@Entity({ name: 'blocked_digests' })
@Check('ck_blocked_digests_digest', `"digest" ~ '^[0-9a-f]{64}$'`)
export class BlockedDigest {
  @PrimaryColumn({ type: 'char', length: 64, primaryKeyConstraintName: 'pk_blocked_digests' })
  digest: string;

  /** The lot and entry whose redaction blocked it. */
  @Col.LotCode()
  lot: string;

  @Col.Integer()
  seq: number;

  @Col.Varchar(32)
  reason: string;

  @Col.CreatedAt()
  createdAt: Date;
}
