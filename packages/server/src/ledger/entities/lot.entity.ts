import type { RollState } from '@beadroll/core';
import { Check, Column, CreateDateColumn, Entity, PrimaryGeneratedColumn, Unique } from 'typeorm';

/**
 * A lot's identity and the head of its roll. The head moves on every append (under a row
 * lock); the entries themselves never change. Lots are never deleted.
 */
@Entity({ name: 'lots' })
@Unique('uq_lots_code', ['code'])
@Check('ck_lots_code', `"code" ~ '^[0-9A-HJKMNP-TV-Z]{9}$'`)
@Check('ck_lots_head_seq', `"head_seq" >= 0`)
export class LotEntity {
  @PrimaryGeneratedColumn('uuid', { primaryKeyConstraintName: 'pk_lots' })
  id: string;

  /** Canonical lot code (9 symbols, no hyphens). */
  @Column({ type: 'varchar', length: 9 })
  code: string;

  @Column({ name: 'head_seq', type: 'integer' })
  headSeq: number;

  @Column({ name: 'head_hash', type: 'char', length: 64 })
  headHash: string;

  /** Entry time of the head, exactly as written in its header. */
  @Column({ name: 'head_time', type: 'varchar', length: 24 })
  headTime: string;

  /** The reducer's state after the head entry (core's RollState), read under the row lock. */
  @Column({ type: 'jsonb' })
  state: RollState;

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt: Date;
}
