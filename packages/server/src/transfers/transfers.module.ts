import { Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { AccountsModule } from '../accounts/accounts.module';
import { LedgerModule } from '../ledger/ledger.module';
import { LotsModule } from '../lots/lots.module';
import { TransferInvitationEntity } from './entities/transfer-invitation.entity';
import { TransferOfferEntity } from './entities/transfer-offer.entity';
import { OfferLapseService } from './offer-lapse.service';
import { SalesService } from './sales.service';
import { TransferProjector } from './transfer.projector';
import { TransfersController } from './transfers.controller';
import { TransfersService } from './transfers.service';
import { DealsReader } from './deals.reader';

/** Transfers between dealers (offers, answers, lapses, invitations) and sales to private buyers. */
@Module({
  imports: [
    LedgerModule,
    LotsModule,
    AccountsModule,
    TypeOrmModule.forFeature([TransferOfferEntity, TransferInvitationEntity]),
  ],
  controllers: [TransfersController],
  providers: [TransfersService, SalesService, OfferLapseService, TransferProjector, DealsReader],
  exports: [TransfersService, OfferLapseService, DealsReader],
})
export class TransfersModule {}
