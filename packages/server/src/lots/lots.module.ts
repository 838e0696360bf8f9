import { Module } from '@nestjs/common';
import { LedgerModule } from '../ledger/ledger.module';
import { LotViewProjector } from './lot-view.projector';
import { LotsController } from './lots.controller';
import { LotsService } from './lots.service';
import { PublicLotsController } from './public-lots.controller';
import { PublicLotsService } from './public-lots.service';

@Module({
  imports: [LedgerModule],
  controllers: [LotsController, PublicLotsController],
  providers: [LotsService, LotViewProjector, PublicLotsService],
  exports: [LotsService],
})
export class LotsModule {}
