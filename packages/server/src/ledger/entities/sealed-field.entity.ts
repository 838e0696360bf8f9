import { Check, Column, Entity, Unique } from 'typeorm';
import * as Col from '../../database/columns';
import { EntryEntity } from './entry.entity';

/**
 * One sealed field of an entry: its salt and value, which only the accounts in `visibleTo` may
 * ever read (the dealer who recorded it; for a transfer price, both parties). The header holds
 * only the root of the commitments. Rows never change.
 */
@Entity({ name: 'sealed_fields' })
@Unique('uq_sealed_fields_entry_name', ['entryId', 'name'])
@Check('ck_sealed_fields_salt', `"salt" ~ '^[0-9a-f]{32}$'`)
@Check('ck_sealed_fields_commitment', `"commitment" ~ '^[0-9a-f]{64}$'`)
export class SealedFieldEntity {
  @Col.IdentityPrimary('sealed_fields')
  id: string;

  @Column({ name: 'entry_id', type: 'bigint' })
  entryId: string;

  @Col.BelongsTo(() => EntryEntity, 'sealed_fields', 'entry_id', { onDelete: 'RESTRICT' })
  entry?: EntryEntity;

  @Col.Varchar(40)
  name: string;

  @Column({ type: 'char', length: 32 })
  salt: string;

  /** The value as canonical JSON, exactly as committed. */
  @Col.Text()
  value: string;

  @Col.Sha256()
  commitment: string;

  /** Account ids that may read this value. */
  @Col.Actor({ array: true })
  visibleTo: string[];
}
