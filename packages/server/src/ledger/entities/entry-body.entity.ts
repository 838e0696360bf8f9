import { Entity } from 'typeorm';
import * as Col from '../../database/columns';
import { EntryEntity } from './entry.entity';

/**
 * The canonical body string of an entry, kept apart from its header so that a redaction can
 * delete the body while the header (with the body's digest) stays. The database refuses any
 * UPDATE, and a DELETE unless a `redacted` entry on the same roll names that entry.
 */
@Entity({ name: 'entry_bodies' })
export class EntryBodyEntity {
  @Col.SharedKey('entry_bodies', 'entry_id')
  entryId: string;

  @Col.BelongsTo(() => EntryEntity, 'entry_bodies', 'entry_id', { onDelete: 'RESTRICT', one: true })
  entry?: EntryEntity;

  @Col.Text()
  body: string;
}
