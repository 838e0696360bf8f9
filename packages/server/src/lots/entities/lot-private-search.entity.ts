import { Entity, Index, PrimaryColumn } from 'typeorm';
import * as Col from '../../database/columns';
import { LotEntity } from '../../ledger/entities/lot.entity';

/**
 * A reader's own searchable words for a lot (their storage place), matched only in that
 * reader's searches. Kept in step with the roll by the lot view projector; never shown.
 */
@Entity({ name: 'lot_private_search' })
@Index('ix_lot_private_search_account', ['accountId'])
export class LotPrivateSearchEntity {
  @Col.SharedKey('lot_private_search', 'lot_id')
  lotId: string;

  @PrimaryColumn({
    name: 'account_id',
    type: 'varchar',
    length: 64,
    primaryKeyConstraintName: 'pk_lot_private_search',
  })
  accountId: string;

  @Col.BelongsTo(() => LotEntity, 'lot_private_search', 'lot_id', { onDelete: 'CASCADE' })
  lot?: LotEntity;

  @Col.Text()
  searchText: string;
}
