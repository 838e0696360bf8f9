import type { RollState } from '@beadroll/core';
import { Check, Entity, Unique } from 'typeorm';
import * as Col from '../../database/columns';

/**
 * A lot's identity and the head of its roll. The head moves on every append (under a row
 * lock); the entries themselves never change. Lots are never deleted.
 */
@Entity({ name: 'lots' })
@Unique('uq_lots_code', ['code'])
@Check('ck_lots_code', `"code" ~ '^[0-9A-HJKMNP-TV-Z]{9}$'`)
@Check('ck_lots_head_seq', `"head_seq" >= 0`)
export class LotEntity {
  @Col.UuidPrimary('lots')
  id: string;

  /** Canonical lot code (9 symbols, no hyphens). */
  @Col.LotCode()
  code: string;

  @Col.Integer()
  headSeq: number;

  @Col.Sha256()
  headHash: string;

  /** Entry time of the head, exactly as written in its header. */
  @Col.Varchar(24)
  headTime: string;

  /** The reducer's state after the head entry (core's RollState), read under the row lock. */
  @Col.Jsonb()
  state: RollState;

  @Col.CreatedAt()
  createdAt: Date;
}
