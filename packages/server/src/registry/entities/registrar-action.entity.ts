import { Entity, Index } from 'typeorm';
import * as Col from '../../database/columns';

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
  @Col.IdentityPrimary('registrar_actions')
  id: string;

  @Col.Timestamp({ now: true })
  at: Date;

  /** The registrar's account id. */
  @Col.Actor()
  actor: string;

  @Col.Varchar(32)
  action: RegistrarActionKind;

  /** An account id, `LOT/seq` for an entry, or `report:ID`. */
  @Col.Varchar(120)
  subject: string;

  @Col.Varchar(2000, { nullable: true })
  reason: string | null;

  @Col.Jsonb({ default: () => `'{}'::jsonb` })
  details: Record<string, unknown>;
}
