import { Module } from '@nestjs/common';
import { LedgerModule } from '../ledger/ledger.module';
import { LotsModule } from '../lots/lots.module';
import { LineageController } from './lineage.controller';
import { LineageService } from './lineage.service';

/** Splits, combinations and the ancestry graph. */
@Module({
  imports: [LedgerModule, LotsModule],
  controllers: [LineageController],
  providers: [LineageService],
  exports: [LineageService],
})
export class LineageModule {}
