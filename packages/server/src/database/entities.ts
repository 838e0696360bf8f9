import { Account } from '../accounts/entities/account.entity';
import { EmailToken } from '../auth/entities/email-token.entity';
import { RefreshToken, Session } from '../auth/entities/session.entity';
import { EntryBodyEntity } from '../ledger/entities/entry-body.entity';
import { EntryEntity } from '../ledger/entities/entry.entity';
import { LotEntity } from '../ledger/entities/lot.entity';
import { SealedFieldEntity } from '../ledger/entities/sealed-field.entity';
import { LotPrivateSearchEntity } from '../lots/entities/lot-private-search.entity';
import { LotViewEntity } from '../lots/entities/lot-view.entity';
import { SaleEntity } from '../transfers/entities/sale.entity';
import { TransferInvitationEntity } from '../transfers/entities/transfer-invitation.entity';
import { TransferOfferEntity } from '../transfers/entities/transfer-offer.entity';
import { BlockedDigest } from '../registry/entities/blocked-digest.entity';
import { RedactionRequest } from '../registry/entities/redaction-request.entity';
import { RegistrarAction } from '../registry/entities/registrar-action.entity';
import { Report } from '../registry/entities/report.entity';
import { ExhibitEntity } from '../exhibits/entities/exhibit.entity';
import { IdempotencyRecord } from '../idempotency/entities/idempotency-record.entity';
import { OpinionRequestEntity } from '../opinions/entities/opinion-request.entity';

// Every TypeORM entity, listed explicitly (no globbing): add a feature's entities here.
export const ENTITIES: Array<new (...args: never[]) => object> = [
  Account,
  Session,
  RefreshToken,
  EmailToken,
  LotEntity,
  EntryEntity,
  EntryBodyEntity,
  SealedFieldEntity,
  LotViewEntity,
  LotPrivateSearchEntity,
  TransferOfferEntity,
  SaleEntity,
  TransferInvitationEntity,
  RegistrarAction,
  BlockedDigest,
  RedactionRequest,
  Report,
  ExhibitEntity,
  IdempotencyRecord,
  OpinionRequestEntity,
];
