import { Module } from '@nestjs/common';
import { AccountsModule } from '../accounts/accounts.module';
import { LedgerModule } from '../ledger/ledger.module';
import { LotsModule } from '../lots/lots.module';
import { AttributionAidController } from './attribution-aid.controller';
import { OpinionRequestsController } from './opinion-requests.controller';
import { OpinionRequestsService } from './opinion-requests.service';
import { OpinionsController } from './opinions.controller';
import { OpinionsService } from './opinions.service';

/** Attribution opinions, their withdrawal, the holder's answers and requests; the attribution aid route. */
@Module({
  imports: [LedgerModule, LotsModule, AccountsModule],
  controllers: [OpinionsController, OpinionRequestsController, AttributionAidController],
  providers: [OpinionsService, OpinionRequestsService],
})
export class OpinionsModule {}
