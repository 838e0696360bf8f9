import { EntryBodyEntity } from '../ledger/entities/entry-body.entity';
import { EntryEntity } from '../ledger/entities/entry.entity';
import { LotEntity } from '../ledger/entities/lot.entity';
import { SealedFieldEntity } from '../ledger/entities/sealed-field.entity';
import { LotViewEntity } from '../lots/entities/lot-view.entity';

// Every TypeORM entity, listed explicitly (no globbing): add a feature's entities here.
export const ENTITIES: Array<new (...args: never[]) => object> = [
  LotEntity,
  EntryEntity,
  EntryBodyEntity,
  SealedFieldEntity,
  LotViewEntity,
];
