import { Module } from '@nestjs/common';
import { LedgerModule } from '../ledger/ledger.module';
import { LotViewProjector } from './lot-view.projector';
import { LotsService } from './lots.service';

@Module({
  imports: [LedgerModule],
  providers: [LotsService, LotViewProjector],
  exports: [LotsService],
})
export class LotsModule {}
