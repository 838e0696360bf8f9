import { Module } from '@nestjs/common';
import { LedgerModule } from '../ledger/ledger.module';
import { StockController } from './stock.controller';
import { StockService } from './stock.service';
import { LotViewsModule } from '../lots/lot-views.module';
import { TransfersModule } from '../transfers/transfers.module';

/** The dealer's own stock and sales figures and the stock export. */
@Module({
  imports: [LedgerModule, LotViewsModule, TransfersModule],
  controllers: [StockController],
  providers: [StockService],
})
export class StockModule {}
