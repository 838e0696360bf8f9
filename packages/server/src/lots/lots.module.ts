import { Module } from '@nestjs/common';
import { AccountsModule } from '../accounts/accounts.module';
import { LedgerModule } from '../ledger/ledger.module';
import { LotViewProjector } from './lot-view.projector';
import { LotViewsModule } from './lot-views.module';
import { LotsController } from './lots.controller';
import { LotsService } from './lots.service';
import { PublicLotsController } from './public-lots.controller';
import { PublicLotsService } from './public-lots.service';

@Module({
  imports: [LedgerModule, AccountsModule, LotViewsModule],
  controllers: [LotsController, PublicLotsController],
  providers: [LotsService, LotViewProjector, PublicLotsService],
  exports: [LotsService, LotViewsModule],
})
export class LotsModule {}
