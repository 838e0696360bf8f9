import { Column, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';

/** Kinds of decisions on the registrar's record. */
export const REGISTRAR_ACTIONS = [
  'approved',
  'rejected',
  'suspended',
  'reinstated',
  'redacted',
  'redaction-declined',
  'report-closed',
] as const;
export type RegistrarActionKind = (typeof REGISTRAR_ACTIONS)[number];

/**
 * One decision of a registrar: who, when, what, why. Rows are append-only; the database refuses
 * UPDATE, DELETE and TRUNCATE.
 */
@Entity({ name: 'registrar_actions' })
@Index('ix_registrar_actions_at', ['at', 'id'])
@Index('ix_registrar_actions_subject', ['subject'])
export class RegistrarAction {
  @PrimaryGeneratedColumn('identity', {
    type: 'bigint',
    generatedIdentity: 'ALWAYS',
    primaryKeyConstraintName: 'pk_registrar_actions',
  })
  id: string;

  @Column({ type: 'timestamptz', default: () => 'now()' })
  at: Date;

  /** The registrar's account id. */
  @Column({ type: 'varchar', length: 64 })
  actor: string;

  @Column({ type: 'varchar', length: 32 })
  action: RegistrarActionKind;

  /** An account id, `LOT/seq` for an entry, or `report:ID`. */
  @Column({ type: 'varchar', length: 120 })
  subject: string;

  @Column({ type: 'varchar', length: 2000, nullable: true })
  reason: string | null;

  @Column({ type: 'jsonb', default: () => `'{}'::jsonb` })
  details: Record<string, unknown>;
}
